package lariat.stage;

import org.apache.kafka.common.KafkaException;

/**
 * A restore of newly assigned partitions did not finish within {@code restore.timeout.ms}
 * (committed offsets or a snapshot partition could not be read). Not retriable with the same
 * clients: {@link FailureKind} classifies it as fatal, so the stage recreates its clients.
 */
public final class RestoreTimeoutException extends KafkaException {

    private static final long serialVersionUID = 1L;

    public RestoreTimeoutException(String message, Throwable cause) {
        super(message, cause);
    }
}

package lariat.stage;

import org.apache.kafka.common.KafkaException;
import org.apache.kafka.common.errors.AuthenticationException;
import org.apache.kafka.common.errors.AuthorizationException;
import org.apache.kafka.common.errors.InvalidProducerEpochException;
import org.apache.kafka.common.errors.OutOfOrderSequenceException;
import org.apache.kafka.common.errors.ProducerFencedException;
import org.apache.kafka.common.errors.TimeoutException;
import org.apache.kafka.common.errors.TransactionAbortableException;
import org.apache.kafka.common.errors.UnsupportedVersionException;
import org.apache.kafka.common.errors.FencedInstanceIdException;

/**
 * How the loop reacts to an exception thrown by a Kafka client during a cycle.
 * Skippable failures (bad records) never reach here: the router turns them into dead letters.
 */
public enum FailureKind {
    /** Abort the transaction, restore the assigned partitions from snapshots, seek to committed offsets. */
    ABORTABLE,
    /** Close both clients, create new ones, restore, seek: the producer can no longer be trusted. */
    FATAL;

    /**
     * Classifies {@code e}. Fencing, authorization, authentication, an unsupported protocol, a
     * timeout during commit (whose outcome is unknown) and a restore that timed out while
     * partitions were being assigned ({@link RestoreTimeoutException}) are fatal; any other Kafka exception is
     * abortable. Non-Kafka exceptions are fatal, since the cause is unknown.
     *
     * @param duringCommit whether {@code e} came from {@code commitTransaction}
     */
    public static FailureKind of(Throwable e, boolean duringCommit) {
        Throwable t = e;
        for (int depth = 0; t != null && depth < 8; depth++, t = t.getCause()) {
            if (t instanceof RestoreTimeoutException || t instanceof ProducerFencedException
                    || t instanceof InvalidProducerEpochException
                    || t instanceof FencedInstanceIdException || t instanceof AuthorizationException
                    || t instanceof AuthenticationException || t instanceof UnsupportedVersionException
                    || t instanceof OutOfOrderSequenceException) {
                return FATAL;
            }
            if (t instanceof TransactionAbortableException) {
                return ABORTABLE;
            }
        }
        if (e instanceof TimeoutException) {
            return duringCommit ? FATAL : ABORTABLE;
        }
        return e instanceof KafkaException ? ABORTABLE : FATAL;
    }
}

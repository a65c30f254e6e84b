package lariat.stage;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.apache.kafka.common.KafkaException;
import org.apache.kafka.common.errors.ProducerFencedException;
import org.apache.kafka.common.errors.TimeoutException;
import org.junit.jupiter.api.Test;

/** Which failures recreate the clients: the classification of {@link FailureKind#of}, case by case. */
class FailureKindTest {

    @Test
    void of_restoreTimeoutFromTheRebalanceCallback_isFatal() {
        RestoreTimeoutException e = new RestoreTimeoutException("restore of [in-0] timed out",
                new TimeoutException("committed offsets"));
        assertEquals(FailureKind.FATAL, FailureKind.of(e, false));
        assertEquals(FailureKind.FATAL, FailureKind.of(new KafkaException("User rebalance callback throws an error", e),
                false));
    }

    @Test
    void of_timeoutOutsideCommit_isAbortable() {
        assertEquals(FailureKind.ABORTABLE, FailureKind.of(new TimeoutException("poll"), false));
    }

    @Test
    void of_timeoutDuringCommitOrFencing_isFatal() {
        assertEquals(FailureKind.FATAL, FailureKind.of(new TimeoutException("EndTxn"), true));
        assertEquals(FailureKind.FATAL, FailureKind.of(new ProducerFencedException("fenced"), false));
    }
}

package lariat.it.support;

import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Properties;
import java.util.Set;

import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.common.TopicPartition;

/**
 * Reads one partition from its beginning to its end offset as seen at the start of the read. For a
 * {@code read_committed} consumer the end offset is the last stable offset, so the result is
 * every committed record and no aborted or open one.
 */
public final class PartitionReader {

    private static final Duration POLL = Duration.ofMillis(200);

    private PartitionReader() {
    }

    /**
     * Returns the records of {@code partition} in offset order.
     *
     * @param consumerProperties consumer properties with byte-array deserializers; no group
     *                           membership is used (the partition is assigned, not subscribed)
     * @throws IllegalStateException if the end is not reached within {@code timeout}
     */
    public static List<ConsumerRecord<byte[], byte[]>> readToEnd(Properties consumerProperties,
            TopicPartition partition, Duration timeout) {
        List<ConsumerRecord<byte[], byte[]>> records = new ArrayList<>();
        try (KafkaConsumer<byte[], byte[]> consumer = new KafkaConsumer<>(consumerProperties)) {
            consumer.assign(Set.of(partition));
            consumer.seekToBeginning(Set.of(partition));
            long end = consumer.endOffsets(Set.of(partition), timeout).get(partition);
            long deadline = System.nanoTime() + timeout.toNanos();
            while (consumer.position(partition, timeout) < end) {
                if (System.nanoTime() > deadline) {
                    throw new IllegalStateException("reading " + partition + " did not reach offset "
                            + end + " within " + timeout + "; at " + consumer.position(partition));
                }
                consumer.poll(POLL).records(partition).forEach(records::add);
            }
        }
        return records;
    }
}

package lariat.stage;

import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.clients.producer.Producer;

/**
 * Creates the stage's Kafka clients. The loop creates each once, and again only after a fatal
 * error has closed them.
 */
public interface ClientFactory {

    /** A read_committed consumer in the stage's group, manual commits, byte-array deserializers. */
    Consumer<byte[], byte[]> groupConsumer();

    /** A read_committed consumer without a group, for reading snapshot partitions by assignment. */
    Consumer<byte[], byte[]> restoreConsumer();

    /** A read_committed consumer without a group, for reading the claims topic by assignment. */
    Consumer<byte[], byte[]> claimConsumer();

    /** A transactional, idempotent producer with byte-array serializers; transactions not yet initialised. */
    Producer<byte[], byte[]> producer();

    /** An admin client for topic setup. */
    Admin admin();
}

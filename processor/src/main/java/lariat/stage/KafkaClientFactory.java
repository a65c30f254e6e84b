package lariat.stage;

import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.AdminClientConfig;
import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.Producer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.common.serialization.ByteArrayDeserializer;
import org.apache.kafka.common.serialization.ByteArraySerializer;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.util.Map;

/**
 * Real Kafka clients from the pass-through client properties, with the settings exactly-once
 * needs forced on top (a user value that conflicts is replaced and logged): read_committed,
 * manual commits, the group id, transactional id {@code stage.id-stage.instance}, idempotence,
 * {@code acks=all}, byte-array (de)serializers. Defaults a user value overrides: consumer
 * {@code auto.offset.reset=earliest}; producer {@code linger.ms=5}, {@code retry.backoff.ms=10} and
 * {@code max.request.size} from the snapshot message size.
 */
public final class KafkaClientFactory implements ClientFactory {

    private static final Logger LOG = LoggerFactory.getLogger(KafkaClientFactory.class);

    private final StageSettings s;

    public KafkaClientFactory(StageSettings settings) {
        this.s = settings;
    }

    @Override
    public Consumer<byte[], byte[]> groupConsumer() {
        Map<String, Object> p = consumer();
        p.putIfAbsent(ConsumerConfig.AUTO_OFFSET_RESET_CONFIG, "earliest");
        force(p, ConsumerConfig.GROUP_ID_CONFIG, s.groupId());
        force(p, ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        force(p, ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, "false");
        p.put(ConsumerConfig.CLIENT_ID_CONFIG, s.transactionalId() + "-consumer");
        return new KafkaConsumer<>(p, new ByteArrayDeserializer(), new ByteArrayDeserializer());
    }

    @Override
    public Consumer<byte[], byte[]> restoreConsumer() {
        return ungrouped("-restore");
    }

    @Override
    public Consumer<byte[], byte[]> claimConsumer() {
        return ungrouped("-claims");
    }

    /** The producer's {@code batch.size} unless configured. */
    static final int BATCH_BYTES = 256 * 1024;

    @Override
    public Producer<byte[], byte[]> producer() {
        Map<String, Object> p = s.producerProperties();
        p.remove(ProducerConfig.KEY_SERIALIZER_CLASS_CONFIG);
        p.remove(ProducerConfig.VALUE_SERIALIZER_CLASS_CONFIG);
        force(p, ProducerConfig.TRANSACTIONAL_ID_CONFIG, s.transactionalId());
        force(p, ProducerConfig.ENABLE_IDEMPOTENCE_CONFIG, "true");
        force(p, ProducerConfig.ACKS_CONFIG, "all");
        p.putIfAbsent(ProducerConfig.MAX_REQUEST_SIZE_CONFIG, s.snapshotMaxMessageBytes());
        p.putIfAbsent(ProducerConfig.LINGER_MS_CONFIG, 5);
        // Each cycle commits a transaction; while the coordinator still writes the previous commit's
        // markers it answers CONCURRENT_TRANSACTIONS, and the client's default first backoff of 100 ms
        // then adds about that much to the next commit. Backoff still grows exponentially up to
        // retry.backoff.max.ms (1 s by default) during an outage.
        p.putIfAbsent(ProducerConfig.RETRY_BACKOFF_MS_CONFIG, 10);
        // A cycle's snapshots of one partition (about 10 KiB a key at 32 channels) filled several
        // batches of the default 16 KiB, and the first transaction of a new producer then waited
        // about 200 ms for the later produce requests to partitions the transaction did not hold
        // yet; with 256 KiB batches each partition's snapshots go in one request (bench stage,
        // P = 32, K = 8: commit 0.06 - 0.10 s against 0.28 - 0.36 s).
        p.putIfAbsent(ProducerConfig.BATCH_SIZE_CONFIG, BATCH_BYTES);
        p.put(ProducerConfig.CLIENT_ID_CONFIG, s.transactionalId() + "-producer");
        return new KafkaProducer<>(p, new ByteArraySerializer(), new ByteArraySerializer());
    }

    @Override
    public Admin admin() {
        Map<String, Object> p = s.adminProperties();
        p.put(AdminClientConfig.CLIENT_ID_CONFIG, s.transactionalId() + "-admin");
        return Admin.create(p);
    }

    /** A read_committed consumer without a group, reading from the earliest offset, client id suffixed. */
    private Consumer<byte[], byte[]> ungrouped(String clientIdSuffix) {
        Map<String, Object> p = consumer();
        p.remove(ConsumerConfig.GROUP_ID_CONFIG);
        p.remove(ConsumerConfig.GROUP_INSTANCE_ID_CONFIG);
        p.remove(ConsumerConfig.GROUP_PROTOCOL_CONFIG);
        force(p, ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        p.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, "false");
        p.put(ConsumerConfig.AUTO_OFFSET_RESET_CONFIG, "earliest");
        p.put(ConsumerConfig.MAX_PARTITION_FETCH_BYTES_CONFIG, Math.max(s.snapshotMaxMessageBytes(), 1 << 20));
        p.put(ConsumerConfig.CLIENT_ID_CONFIG, s.transactionalId() + clientIdSuffix);
        return new KafkaConsumer<>(p, new ByteArrayDeserializer(), new ByteArrayDeserializer());
    }

    private Map<String, Object> consumer() {
        Map<String, Object> p = s.consumerProperties();
        p.remove(ConsumerConfig.KEY_DESERIALIZER_CLASS_CONFIG);
        p.remove(ConsumerConfig.VALUE_DESERIALIZER_CLASS_CONFIG);
        return p;
    }

    private static void force(Map<String, Object> p, String key, Object value) {
        Object old = p.put(key, value);
        if (old != null && !String.valueOf(old).equals(String.valueOf(value))) {
            LOG.warn("client property {}={} replaced by {}, which exactly-once processing requires", key, old, value);
        }
    }
}

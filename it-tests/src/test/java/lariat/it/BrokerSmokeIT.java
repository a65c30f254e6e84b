package lariat.it;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.Properties;
import java.util.Set;
import java.util.concurrent.ExecutionException;

import lariat.broker.EmbeddedBroker;
import lariat.it.support.ClientProperties;
import lariat.it.support.PartitionReader;
import lariat.it.support.TestKafka;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.NewTopic;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.clients.consumer.OffsetAndMetadata;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.IsolationLevel;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A real broker accepts transactions: records of a committed transaction are visible to a
 * {@code read_committed} consumer, records of an aborted one are written to the log but hidden,
 * and an embedded broker restarted on the same data folder and port still holds its committed
 * records and consumer offsets. Kafka's transaction semantics (KIP-98) are the reference.
 */
class BrokerSmokeIT {

    private static final Duration TIMEOUT = Duration.ofSeconds(30);

    @Test
    void transactions_commitAbortCommit_readCommittedSeesOnlyCommitted()
            throws InterruptedException, ExecutionException {
        String topic = TestKafka.uniqueTopic("smoke-tx");
        TestKafka.createTopic(topic, 1, Map.of());
        TopicPartition partition = new TopicPartition(topic, 0);

        writeCommitAbortCommit(TestKafka.transactionalProducerProperties(topic + "-tx"), topic);

        List<String> committed = values(PartitionReader.readToEnd(
                TestKafka.consumerProperties(topic + "-committed"), partition, TIMEOUT));
        assertEquals(List.of("c0", "c1", "c2", "c3"), committed);

        Properties uncommitted = TestKafka.consumerProperties(topic + "-uncommitted");
        uncommitted.setProperty(ConsumerConfig.ISOLATION_LEVEL_CONFIG, IsolationLevel.READ_UNCOMMITTED.toString());
        List<String> everything = values(PartitionReader.readToEnd(uncommitted, partition, TIMEOUT));
        assertEquals(List.of("c0", "c1", "c2", "a0", "a1", "c3"), everything);
    }

    @Test
    void restart_sameDataDirAndPort_keepsCommittedRecordsAndOffsets(@TempDir Path dataDir)
            throws InterruptedException, ExecutionException {
        String topic = "smoke-restart";
        TopicPartition partition = new TopicPartition(topic, 0);
        try (EmbeddedBroker broker = EmbeddedBroker.builder().dataDir(dataDir).start()) {
            String bootstrap = broker.bootstrapServers();
            try (Admin admin = Admin.create(ClientProperties.admin(bootstrap))) {
                admin.createTopics(List.of(new NewTopic(topic, 1, (short) 1))).all().get();
            }
            writeCommitAbortCommit(ClientProperties.transactionalProducer(bootstrap, "restart-tx"), topic);
            try (KafkaConsumer<byte[], byte[]> consumer =
                    new KafkaConsumer<>(ClientProperties.consumer(bootstrap, "restart-group"))) {
                consumer.commitSync(Map.of(partition, new OffsetAndMetadata(2)));
            }

            broker.stop();
            assertFalse(broker.isRunning());
            broker.restart();

            assertTrue(broker.isRunning());
            assertEquals(bootstrap, broker.bootstrapServers());
            List<String> committed = values(PartitionReader.readToEnd(
                    ClientProperties.consumer(bootstrap, "restart-reader"), partition, TIMEOUT));
            assertEquals(List.of("c0", "c1", "c2", "c3"), committed);
            try (KafkaConsumer<byte[], byte[]> consumer =
                    new KafkaConsumer<>(ClientProperties.consumer(bootstrap, "restart-group"))) {
                OffsetAndMetadata offset = consumer.committed(Set.of(partition), TIMEOUT).get(partition);
                assertEquals(2, offset.offset());
            }
        }
        assertTrue(Files.isDirectory(dataDir), "a data folder given by the caller is kept on close");
    }

    /** Writes c0..c2 committed, a0..a1 aborted, then c3 committed, in one partition. */
    private static void writeCommitAbortCommit(Properties producerProperties, String topic) {
        try (KafkaProducer<byte[], byte[]> producer = new KafkaProducer<>(producerProperties)) {
            producer.initTransactions();
            producer.beginTransaction();
            for (String v : List.of("c0", "c1", "c2")) {
                producer.send(record(topic, v));
            }
            producer.commitTransaction();
            producer.beginTransaction();
            for (String v : List.of("a0", "a1")) {
                producer.send(record(topic, v));
            }
            producer.flush();
            producer.abortTransaction();
            producer.beginTransaction();
            producer.send(record(topic, "c3"));
            producer.commitTransaction();
        }
    }

    private static ProducerRecord<byte[], byte[]> record(String topic, String value) {
        return new ProducerRecord<>(topic, 0, null, value.getBytes(StandardCharsets.UTF_8));
    }

    private static List<String> values(List<ConsumerRecord<byte[], byte[]>> records) {
        return records.stream().map(r -> new String(r.value(), StandardCharsets.UTF_8)).toList();
    }
}

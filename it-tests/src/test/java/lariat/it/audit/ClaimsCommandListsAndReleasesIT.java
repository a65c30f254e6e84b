package lariat.it.audit;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.ByteBuffer;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.Properties;

import lariat.cli.Main;
import lariat.it.support.StageTestKit;
import lariat.it.support.TestKafka;
import lariat.schema.KeyClaim;
import lariat.stage.ClaimLog;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.serialization.ByteArraySerializer;
import org.junit.jupiter.api.Test;
import picocli.CommandLine;

/**
 * {@code lariat claims} against a real broker: it lists the claims on a claims topic as the stage applies
 * them (a tombstone removes a claim, a record that is not a claim is passed over, the earliest claim of a key
 * owns it), exits 1 while a key is claimed on two partitions, and {@code --release} writes the tombstone
 * that ends the conflict. The claims are written transactionally in the stage's own encoding
 * ({@link ClaimLog#recordKey}, Avro single-object {@link KeyClaim}).
 */
class ClaimsCommandListsAndReleasesIT {

    private static final ObjectMapper JSON = new ObjectMapper();

    @Test
    void claims_keyOnTwoPartitions_listedWithOwnerUntilTheLaterClaimIsReleased() throws Exception {
        String topic = TestKafka.uniqueTopic("claims-cmd");
        TestKafka.createTopic(topic, 1, Map.of("cleanup.policy", "compact"));
        Properties p = TestKafka.producerProperties();
        p.put(ProducerConfig.TRANSACTIONAL_ID_CONFIG, topic + "-writer");
        try (KafkaProducer<byte[], byte[]> producer = new KafkaProducer<>(p, new ByteArraySerializer(),
                new ByteArraySerializer())) {
            producer.initTransactions();
            producer.beginTransaction();
            producer.send(claim(topic, "pumps", 0, "st-07", 12L));
            producer.send(claim(topic, "pumps", 0, "st-08", 30L));
            producer.send(claim(topic, "pumps", 2, "st-09", null));
            producer.send(new ProducerRecord<>(topic, 0, ClaimLog.recordKey("pumps", 2, "st-09"), null));
            producer.send(new ProducerRecord<>(topic, 0, "not|a|claim".getBytes(), new byte[] {1, 2, 3}));
            producer.send(claim(topic, "pumps", 1, "st-07", 40L));
            producer.commitTransaction();
        }

        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        assertEquals(1, cli(out, err, "claims", "--bootstrap-servers", TestKafka.bootstrapServers(),
                "--claim-topic", topic), err.toString());
        String table = out.toString();
        assertTrue(table.contains("3 claims on " + topic + ", 1 record that is not a claim passed over"), table);
        assertTrue(table.contains("KEY ON TWO OR MORE PARTITIONS: pumps st-07 on partitions [0, 1] (owner: partition 0)"),
                table);
        assertTrue(err.toString().contains("1 model key is claimed on two or more partitions"), err.toString());

        out = new StringWriter();
        assertEquals(1, cli(out, new StringWriter(), "claims", "--bootstrap-servers", TestKafka.bootstrapServers(),
                "--claim-topic", topic, "--key", "st-07", "--json"));
        JsonNode j = JSON.readTree(out.toString());
        assertEquals(2, j.get("claims").size());
        JsonNode first = j.get("claims").get(0);
        assertEquals(0, first.get("partition").asInt());
        assertTrue(first.get("owner").asBoolean());
        assertEquals(12L, first.get("firstOffset").asLong());
        JsonNode second = j.get("claims").get(1);
        assertEquals(1, second.get("partition").asInt());
        assertFalse(second.get("owner").asBoolean());
        assertEquals("pumps-1", second.get("claimedBy").asText());

        out = new StringWriter();
        err = new StringWriter();
        assertEquals(0, cli(out, err, "claims", "--bootstrap-servers", TestKafka.bootstrapServers(),
                "--claim-topic", topic, "--release", "--input-topic", "pumps", "--key", "st-07", "--partition", "1"),
                err.toString());
        assertTrue(out.toString().contains("released the claim of key 'st-07' on partition 1 of 'pumps'"), out.toString());

        List<ConsumerRecord<byte[], byte[]>> records = StageTestKit.readCommitted(topic, Duration.ofSeconds(30));
        ConsumerRecord<byte[], byte[]> last = records.get(records.size() - 1);
        assertEquals("pumps|1|st-07", new String(last.key()));
        assertNull(last.value(), "the release is a tombstone");

        out = new StringWriter();
        assertEquals(0, cli(out, new StringWriter(), "claims", "--bootstrap-servers", TestKafka.bootstrapServers(),
                "--claim-topic", topic), out.toString());
        assertTrue(out.toString().contains("2 claims on " + topic), out.toString());

        err = new StringWriter();
        assertEquals(1, cli(new StringWriter(), err, "claims", "--bootstrap-servers", TestKafka.bootstrapServers(),
                "--claim-topic", topic, "--release", "--input-topic", "pumps", "--key", "st-07", "--partition", "1"));
        assertTrue(err.toString().contains("no claim of key 'st-07' on partition 1"), err.toString());

        err = new StringWriter();
        assertEquals(2, cli(new StringWriter(), err, "claims", "--bootstrap-servers", TestKafka.bootstrapServers(),
                "--claim-topic", topic + "-missing", "--timeout-ms", "5000"));
        assertTrue(err.toString().contains("does not exist"), err.toString());
    }

    private static ProducerRecord<byte[], byte[]> claim(String topic, String input, int partition, String key,
                                                        Long firstOffset) throws Exception {
        ByteBuffer b = KeyClaim.newBuilder().setKey(key).setInputTopic(input).setInputPartition(partition)
                .setClaimedBy("pumps-" + partition).setFirstOffset(firstOffset)
                .setClaimedAtMs(Instant.parse("2026-03-04T00:00:00Z")).build().toByteBuffer();
        byte[] value = new byte[b.remaining()];
        b.get(value);
        return new ProducerRecord<>(topic, 0, ClaimLog.recordKey(input, partition, key), value);
    }

    private static int cli(StringWriter out, StringWriter err, String... args) {
        CommandLine cl = new CommandLine(new Main());
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        return cl.execute(args);
    }
}

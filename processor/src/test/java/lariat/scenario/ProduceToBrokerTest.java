package lariat.scenario;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.InputStream;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Properties;

import lariat.broker.EmbeddedBroker;
import lariat.cli.ProduceCommand;
import org.apache.avro.Schema;
import org.apache.avro.generic.GenericData;
import org.apache.avro.generic.GenericRecord;
import org.apache.avro.message.BinaryMessageDecoder;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.serialization.ByteArrayDeserializer;
import org.junit.jupiter.api.AfterAll;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

/**
 * The {@code produce} command against Apache Kafka's own broker run in this JVM
 * ({@link EmbeddedBroker}); what a consumer reads back is compared with the CSV copy.
 */
class ProduceToBrokerTest {

    private static EmbeddedBroker broker;

    @TempDir
    Path dir;

    @BeforeAll
    static void startBroker() {
        broker = EmbeddedBroker.start();
    }

    @AfterAll
    static void stopBroker() {
        broker.close();
    }

    @Test
    void produce_createTopicWithCsv_consumerReadsCsvRowsKeyedByStationInOrder() throws Exception {
        Path csv = dir.resolve("sent.csv");
        int rc = run("--bootstrap-servers", broker.bootstrapServers(), "--topic", "readings", "--create-topic",
                "--partitions", "3", "--stations", "4", "--records-per-station", "150", "--rate", "0",
                "--csv", csv.toString());
        assertEquals(0, rc);
        List<String> lines = Files.readAllLines(csv, StandardCharsets.UTF_8);
        assertEquals(1 + 4 * 150, lines.size());
        Map<Integer, List<ConsumerRecord<byte[], byte[]>>> byPartition = readAll("readings", 3, 600);
        BinaryMessageDecoder<GenericRecord> decoder = new BinaryMessageDecoder<>(GenericData.get(), schema());
        List<String> columns = List.of(lines.get(0).split(","));
        Map<String, Integer> partitionOf = new HashMap<>();
        for (Map.Entry<Integer, List<ConsumerRecord<byte[], byte[]>>> e : byPartition.entrySet()) {
            List<String> expected = new ArrayList<>();
            for (ConsumerRecord<byte[], byte[]> r : e.getValue()) {
                partitionOf.merge(new String(r.key(), StandardCharsets.UTF_8), e.getKey(), (a, b) -> {
                    assertEquals(a, b, "a station on two partitions");
                    return a;
                });
            }
            for (String line : lines.subList(1, lines.size())) {
                if (e.getKey().equals(partitionOf.get(line.substring(0, line.indexOf(','))))) {
                    expected.add(line);
                }
            }
            List<String> read = new ArrayList<>();
            for (ConsumerRecord<byte[], byte[]> r : e.getValue()) {
                read.add(csvLine(decoder.decode(r.value()), columns));
            }
            assertEquals(expected, read, "partition " + e.getKey());
        }
        assertEquals(4, partitionOf.size());
    }

    @Test
    void produce_missingTopicWithoutCreate_exitOneWithOneLine() {
        StringWriter err = new StringWriter();
        CommandLine cl = new CommandLine(new ProduceCommand());
        cl.setErr(new PrintWriter(err, true));
        cl.setOut(new PrintWriter(new StringWriter(), true));
        int rc = cl.execute("--bootstrap-servers", broker.bootstrapServers(), "--topic", "absent");
        assertEquals(1, rc);
        assertEquals(1, err.toString().lines().count(), err.toString());
        assertTrue(err.toString().contains("absent"));
    }

    private static int run(String... args) {
        CommandLine cl = new CommandLine(new ProduceCommand());
        cl.setOut(new PrintWriter(new StringWriter(), true));
        cl.setErr(new PrintWriter(new StringWriter(), true));
        return cl.execute(args);
    }

    private static String csvLine(GenericRecord rec, List<String> columns) {
        StringBuilder b = new StringBuilder();
        b.append(rec.get("station")).append(',').append((long) (Long) rec.get("time"));
        Map<?, ?> channels = (Map<?, ?>) rec.get("channels");
        Map<String, Object> byName = new HashMap<>();
        channels.forEach((k, v) -> byName.put(k.toString(), v));
        for (String c : columns.subList(2, columns.size() - 1)) {
            b.append(',').append((double) (Double) byName.get(c));
        }
        return b.append(',').append((double) (Double) rec.get("weight")).toString();
    }

    private static Map<Integer, List<ConsumerRecord<byte[], byte[]>>> readAll(String topic, int partitions, int total) {
        Properties p = new Properties();
        p.setProperty(ConsumerConfig.BOOTSTRAP_SERVERS_CONFIG, broker.bootstrapServers());
        p.setProperty(ConsumerConfig.KEY_DESERIALIZER_CLASS_CONFIG, ByteArrayDeserializer.class.getName());
        p.setProperty(ConsumerConfig.VALUE_DESERIALIZER_CLASS_CONFIG, ByteArrayDeserializer.class.getName());
        Map<Integer, List<ConsumerRecord<byte[], byte[]>>> out = new HashMap<>();
        try (KafkaConsumer<byte[], byte[]> c = new KafkaConsumer<>(p)) {
            List<TopicPartition> tps = new ArrayList<>();
            for (int i = 0; i < partitions; i++) {
                tps.add(new TopicPartition(topic, i));
                out.put(i, new ArrayList<>());
            }
            c.assign(tps);
            c.seekToBeginning(tps);
            int n = 0;
            long deadline = System.nanoTime() + Duration.ofSeconds(60).toNanos();
            while (n < total && System.nanoTime() < deadline) {
                for (ConsumerRecord<byte[], byte[]> r : c.poll(Duration.ofMillis(500))) {
                    out.get(r.partition()).add(r);
                    n++;
                }
            }
        }
        return out;
    }

    private Schema schema() throws Exception {
        try (InputStream in = getClass().getResourceAsStream("/lariat/schemas/StationReading.avsc")) {
            return new Schema.Parser().parse(in);
        }
    }
}

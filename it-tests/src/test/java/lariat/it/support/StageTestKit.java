package lariat.it.support;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Properties;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.atomic.AtomicReference;

import lariat.codec.SchemaTrust;
import lariat.config.StageConfig;
import lariat.schema.ModelVersion;
import lariat.schema.StationReading;
import lariat.stage.Stage;
import lariat.stage.StageAssembly;
import lariat.stage.StageMetrics;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.OffsetSpec;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.clients.consumer.OffsetAndMetadata;
import org.apache.kafka.clients.producer.Producer;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.clients.producer.RecordMetadata;
import org.apache.kafka.common.PartitionInfo;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.header.Header;

/**
 * What the stage integration tests share: encoding and sending readings, reading a topic's
 * committed records (read_committed), decoding model records, running a stage on a thread of the
 * test JVM, and waiting until a consumer group has committed given offsets. A stage in a child JVM
 * is {@link StageProcess}.
 */
public final class StageTestKit {

    private static final long STOP_WAIT_MS = 30_000;

    private StageTestKit() {
    }

    /**
     * Puts into {@code config} the cluster and an input of station readings: {@code input} in Avro
     * single-object encoding, the model key in field station, the event time in field time, the weight
     * in field weight, and the channels (these features and the target) in the map field channels.
     */
    public static void stationInput(Map<String, String> config, String input, List<String> features, String target) {
        config.put("bootstrap.servers", TestKafka.bootstrapServers());
        config.put("input.topic", input);
        config.put("input.format", "avro-single-object");
        config.put("field.key", "station");
        config.put("field.time", "time");
        config.put("field.weight", "weight");
        config.put("field.features.map", "channels");
        config.put("field.features", String.join(",", features));
        config.put("field.target", target);
    }

    /** Puts into {@code config} the four output topics of a stage, and its claims topic named after the snapshots. */
    public static void outputTopics(Map<String, String> config, String models, String alerts, String snapshots,
                                    String deadLetters) {
        config.put("model.topic", models);
        config.put("alert.topic", alerts);
        config.put("snapshot.topic", snapshots);
        config.put("deadletter.topic", deadLetters);
        config.put("claim.topic", claimTopicOf(snapshots));
    }

    /** The claims topic {@link #outputTopics} names for the snapshot topic {@code snapshots}. */
    public static String claimTopicOf(String snapshots) {
        return snapshots + ".claims";
    }

    /** Avro single-object encoding of {@code r}, as the stage's {@code avro-single-object} format reads. */
    public static byte[] encode(StationReading r) {
        try {
            ByteBuffer b = r.toByteBuffer();
            byte[] out = new byte[b.remaining()];
            b.get(out);
            return out;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Channel name to value: {@code features[j]} to {@code z[j]}, then {@code target} to the last {@code z}. */
    public static Map<String, Double> channels(String[] features, String target, double[] z) {
        Map<String, Double> ch = new LinkedHashMap<>();
        for (int j = 0; j < features.length; j++) {
            ch.put(features[j], z[j]);
        }
        ch.put(target, z[features.length]);
        return ch;
    }

    /** A reading of {@code station} at {@code timeMs} with these channels (features and target) and weight. */
    public static byte[] reading(String station, long timeMs, Map<String, Double> channels, double weight) {
        return encode(StationReading.newBuilder().setStation(station).setTime(Instant.ofEpochMilli(timeMs))
                .setChannels(new HashMap<>(channels)).setWeight(weight).build());
    }

    /** Sends {@code value} keyed by {@code key} (UTF-8) to {@code topic} and waits for the acknowledgement. */
    public static RecordMetadata send(Producer<byte[], byte[]> producer, String topic, String key, byte[] value)
            throws ExecutionException, InterruptedException {
        return producer.send(new ProducerRecord<>(topic, key.getBytes(StandardCharsets.UTF_8), value)).get();
    }

    /**
     * Every committed record of {@code topic}, partition by partition, each in offset order, read by a
     * read_committed consumer up to the end offsets seen when each partition's read starts.
     */
    public static List<ConsumerRecord<byte[], byte[]>> readCommitted(String topic, Duration timeout) {
        Properties p = TestKafka.consumerProperties("reader-" + topic);
        List<PartitionInfo> partitions;
        try (KafkaConsumer<byte[], byte[]> c = new KafkaConsumer<>(p)) {
            partitions = c.partitionsFor(topic, timeout);
        }
        List<ConsumerRecord<byte[], byte[]>> out = new ArrayList<>();
        for (PartitionInfo info : partitions) {
            out.addAll(PartitionReader.readToEnd(p, new TopicPartition(topic, info.partition()), timeout));
        }
        return out;
    }

    /** The last value of header {@code name} as UTF-8, or null. */
    public static String header(ConsumerRecord<byte[], byte[]> r, String name) {
        Header h = r.headers().lastHeader(name);
        return h == null ? null : new String(h.value(), StandardCharsets.UTF_8);
    }

    /** The model version single-object encoded in {@code value}. */
    public static ModelVersion model(byte[] value) throws IOException {
        SchemaTrust.ensure();
        return ModelVersion.fromByteBuffer(ByteBuffer.wrap(value));
    }

    /** Runs a stage on {@code props} until its group has consumed every partition of {@code input}, then stops it. */
    public static void runUntilConsumed(Map<String, String> props, String input, Duration timeout) throws Exception {
        InProcessStage stage = InProcessStage.start(props);
        stage.awaitConsumed(input, timeout);
        stage.stop();
    }

    /**
     * Waits until {@code group} has committed at least the offset given for every partition of
     * {@code atLeast}, polling every 200 ms.
     *
     * @param failure a failure that ends the wait at once when it becomes non-null
     * @param context appended to the message of a timeout
     * @throws IllegalStateException when {@code failure} is set or {@code timeout} passes first
     */
    public static void awaitCommitted(String group, Map<TopicPartition, Long> atLeast,
                                      AtomicReference<Throwable> failure, Duration timeout, String context)
            throws Exception {
        long deadline = System.nanoTime() + timeout.toNanos();
        try (Admin admin = Admin.create(TestKafka.adminProperties())) {
            while (true) {
                Map<TopicPartition, OffsetAndMetadata> committed = admin.listConsumerGroupOffsets(group)
                        .partitionsToOffsetAndMetadata().get();
                if (atLeast.entrySet().stream().allMatch(e -> committed.get(e.getKey()) != null
                        && committed.get(e.getKey()).offset() >= e.getValue())) {
                    return;
                }
                if (failure.get() != null) {
                    throw new IllegalStateException("stage stopped", failure.get());
                }
                if (System.nanoTime() > deadline) {
                    throw new IllegalStateException("group " + group + " did not commit " + atLeast + " within "
                            + timeout + "; committed " + committed + context);
                }
                Thread.sleep(200);
            }
        }
    }

    /** The end offsets of every partition of {@code topic} now. */
    public static Map<TopicPartition, Long> endOffsets(String topic) throws Exception {
        try (Admin admin = Admin.create(TestKafka.adminProperties())) {
            int n = admin.describeTopics(List.of(topic)).allTopicNames().get().get(topic).partitions().size();
            Map<TopicPartition, OffsetSpec> latest = new HashMap<>();
            for (int p = 0; p < n; p++) {
                latest.put(new TopicPartition(topic, p), OffsetSpec.latest());
            }
            Map<TopicPartition, Long> ends = new HashMap<>();
            admin.listOffsets(latest).all().get().forEach((tp, info) -> ends.put(tp, info.offset()));
            return ends;
        }
    }

    /** A {@link Stage} running on its own thread of the test JVM; what it threw is kept. */
    public static final class InProcessStage {

        private final Stage stage;
        private final String group;
        private final AtomicReference<Throwable> failure = new AtomicReference<>();

        private InProcessStage(Stage stage, String group) {
            this.stage = stage;
            this.group = group;
        }

        /** Assembles the stage from {@code props} and starts its loop on a thread named stage-under-test. */
        public static InProcessStage start(Map<String, String> props) {
            StageConfig config = StageConfig.of(props);
            String group = props.getOrDefault("group.id", "");
            InProcessStage s = new InProcessStage(StageAssembly.create(config, Path.of("")),
                    group.isEmpty() ? props.get("stage.id") : group);
            Thread loop = new Thread(() -> {
                try {
                    s.stage.run();
                } catch (InterruptedException e) {
                    Thread.currentThread().interrupt();
                } catch (RuntimeException e) {
                    s.failure.set(e);
                }
            }, "stage-under-test");
            loop.start();
            return s;
        }

        /** The stage's counters and gauges. */
        public StageMetrics metrics() {
            return stage.metrics();
        }

        /** What the stage's loop threw, or null while it runs or after a clean stop. */
        public Throwable failure() {
            return failure.get();
        }

        /** Waits until the stage's group has committed the current end offset of every partition of {@code input}. */
        public void awaitConsumed(String input, Duration timeout) throws Exception {
            awaitCommitted(group, endOffsets(input), failure, timeout, "");
        }

        /** Asks the stage to stop and requires it to have stopped within 30 s. */
        public void stop() throws InterruptedException {
            stage.shutdown();
            if (!stage.awaitStopped(STOP_WAIT_MS)) {
                throw new AssertionError("stage did not stop within " + STOP_WAIT_MS + " ms");
            }
        }
    }
}

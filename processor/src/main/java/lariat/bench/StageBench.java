package lariat.bench;

import java.lang.management.CompilationMXBean;
import java.lang.management.ManagementFactory;
import java.lang.management.ThreadMXBean;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.UUID;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;

import lariat.broker.EmbeddedBroker;
import lariat.config.StageConfig;
import lariat.stage.Stage;
import lariat.stage.StageAssembly;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.AdminClientConfig;
import org.apache.kafka.clients.admin.NewTopic;
import org.apache.kafka.clients.admin.OffsetSpec;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.consumer.ConsumerRecords;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.clients.consumer.OffsetAndMetadata;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.serialization.ByteArrayDeserializer;
import org.apache.kafka.common.serialization.ByteArraySerializer;

/**
 * {@code bench stage}: the stage's throughput next to a plain consumer's on the same topic.
 *
 * <p>One input topic is loaded once with {@link StageBenchRecords}. Then, for each round, in turn:
 * a plain read_committed {@code KafkaConsumer} with byte-array deserializers, assigned every
 * partition from the beginning, polls until it has read every record, without decoding (timed
 * from its first poll to its last record); and a new {@link Stage} (new group, transactional
 * id and output topics, so nothing is restored) with the refit schedule and selection of the
 * example configuration, timed from the moment it is ready (partitions assigned and restored)
 * to the commit of the transaction whose offsets reach the end of every input partition. The
 * last round is the reported one; earlier rounds warm the JVM up.
 */
public final class StageBench {

    /** Refit schedule and selection of the benchmarked stage. */
    static final Map<String, String> STAGE_SETTINGS = Map.of(
            "moments.block.records", "64",
            "refit.every.records", "1000",
            "cycle.interval.ms", "1000",
            "path.method", "lasso",
            "select.rule", "bic",
            "select.refit", "true",
            "alert.persist.refits", "2",
            "metrics.port", "0");

    /** Keys the benchmark sets from its input and run; {@code --set} cannot override them. */
    static final Set<String> INPUT_KEYS = Set.of("bootstrap.servers", "stage.id", "stage.instance", "input.topic",
            "input.format", "field.key", "field.time", "field.weight", "field.features.map", "field.target",
            "field.features", "model.topic", "alert.topic", "snapshot.topic", "deadletter.topic", "claim.topic");

    private static final Duration RUN_TIMEOUT = Duration.ofMinutes(10);

    private StageBench() {
    }

    /**
     * Runs the benchmark against {@code bootstrapServers}, or an embedded broker when it is null.
     *
     * @throws IllegalArgumentException naming the argument when a count is below 1
     */
    public static StageBenchResult run(int features, int keys, int records, int partitions, int rounds,
                                       long seed, String bootstrapServers) throws InterruptedException {
        return run(features, keys, records, partitions, rounds, seed, bootstrapServers, Map.of());
    }

    /**
     * Runs the benchmark with {@code overrides} laid over {@link #STAGE_SETTINGS} (Lariat keys and Kafka
     * client properties of the benchmarked stage).
     *
     * @throws IllegalArgumentException naming the argument when a count is below 1, or naming the key when
     *                                  an override names a key the benchmark sets from its input
     *                                  ({@link #INPUT_KEYS}) or the stage configuration refuses it
     */
    public static StageBenchResult run(int features, int keys, int records, int partitions, int rounds,
                                       long seed, String bootstrapServers, Map<String, String> overrides)
            throws InterruptedException {
        if (rounds < 1) {
            throw new IllegalArgumentException("rounds must be at least 1, got " + rounds);
        }
        Map<String, String> settings = settings(overrides);
        StageConfig.of(stageProperties("localhost:9092", "check", "check", features, settings));
        StageBenchRecords input = StageBenchRecords.of(features, keys, records, partitions, seed);
        double loadBefore = loadAverage();
        if (bootstrapServers != null) {
            return measure(input, partitions, rounds, bootstrapServers, settings, loadBefore);
        }
        try (EmbeddedBroker broker = EmbeddedBroker.start()) {
            return measure(input, partitions, rounds, broker.bootstrapServers(), settings, loadBefore);
        }
    }

    /**
     * {@link #STAGE_SETTINGS} with {@code overrides} laid over them, in key order.
     *
     * @throws IllegalArgumentException naming the key when an override names one of {@link #INPUT_KEYS}
     */
    static Map<String, String> settings(Map<String, String> overrides) {
        Map<String, String> out = new java.util.TreeMap<>(STAGE_SETTINGS);
        for (Map.Entry<String, String> e : overrides.entrySet()) {
            if (INPUT_KEYS.contains(e.getKey())) {
                throw new IllegalArgumentException(e.getKey() + ": set by the benchmark from its input, "
                        + "cannot be overridden");
            }
            out.put(e.getKey(), e.getValue());
        }
        return out;
    }

    private static StageBenchResult measure(StageBenchRecords input, int partitions, int rounds, String servers,
                                            Map<String, String> settings, double loadBefore)
            throws InterruptedException {
        String run = "lariat-bench-" + UUID.randomUUID().toString().substring(0, 8);
        String topic = run + ".input";
        Map<TopicPartition, Long> ends = load(servers, topic, partitions, input);
        List<StageBenchResult.Round> done = new ArrayList<>();
        for (int r = 0; r < rounds; r++) {
            StageBenchResult.Phase consumer = plainConsumer(servers, topic, input.count(), ends.keySet());
            StageBenchResult.Phase stage = stage(servers, topic, run + "-r" + r, input, settings, ends);
            done.add(StageBenchResult.Round.of(consumer, stage));
        }
        return StageBenchResult.of(input.features(), input.keys(), input.count(), partitions, input.meanValueBytes(),
                settings, done, Runtime.getRuntime().availableProcessors(), loadBefore, loadAverage());
    }

    /** Creates the topic, sends every record, and returns each partition's end offset. */
    private static Map<TopicPartition, Long> load(String servers, String topic, int partitions,
                                                  StageBenchRecords input) throws InterruptedException {
        try (Admin admin = Admin.create(Map.of(AdminClientConfig.BOOTSTRAP_SERVERS_CONFIG, servers))) {
            admin.createTopics(List.of(new NewTopic(topic, partitions, (short) 1))).all().get();
            Map<String, Object> p = new HashMap<>();
            p.put(ProducerConfig.BOOTSTRAP_SERVERS_CONFIG, servers);
            p.put(ProducerConfig.ACKS_CONFIG, "all");
            p.put(ProducerConfig.LINGER_MS_CONFIG, 10);
            p.put(ProducerConfig.BATCH_SIZE_CONFIG, 256 * 1024);
            try (KafkaProducer<byte[], byte[]> producer = new KafkaProducer<>(p, new ByteArraySerializer(),
                    new ByteArraySerializer())) {
                for (int i = 0; i < input.count(); i++) {
                    producer.send(new ProducerRecord<>(topic, input.partition(i), input.key(i), input.value(i)));
                }
                producer.flush();
            }
            Map<TopicPartition, OffsetSpec> latest = new HashMap<>();
            for (int i = 0; i < partitions; i++) {
                latest.put(new TopicPartition(topic, i), OffsetSpec.latest());
            }
            Map<TopicPartition, Long> ends = new HashMap<>();
            admin.listOffsets(latest).all().get().forEach((tp, info) -> ends.put(tp, info.offset()));
            long total = ends.values().stream().mapToLong(Long::longValue).sum();
            if (total != input.count()) {
                throw new IllegalStateException("topic " + topic + " holds " + total + " records, expected "
                        + input.count());
            }
            return ends;
        } catch (ExecutionException e) {
            throw new IllegalStateException("loading topic " + topic + " failed: " + e.getCause(), e.getCause());
        }
    }

    private static StageBenchResult.Phase plainConsumer(String servers, String topic, int records,
                                                        Set<TopicPartition> partitions) {
        Map<String, Object> p = new HashMap<>();
        p.put(ConsumerConfig.BOOTSTRAP_SERVERS_CONFIG, servers);
        p.put(ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        p.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, "false");
        try (KafkaConsumer<byte[], byte[]> c = new KafkaConsumer<>(p, new ByteArrayDeserializer(),
                new ByteArrayDeserializer())) {
            c.assign(partitions);
            c.seekToBeginning(partitions);
            long deadline = System.nanoTime() + RUN_TIMEOUT.toNanos();
            long cpu0 = processCpuNanos();
            long jit0 = jitMillis();
            long poll0 = CpuClock.nanos();
            long t0 = System.nanoTime();
            long t1 = t0;
            long bytes = 0;
            int read = 0;
            while (read < records) {
                ConsumerRecords<byte[], byte[]> batch = c.poll(Duration.ofMillis(100));
                for (var r : batch) {
                    bytes += r.value().length;
                    read++;
                }
                t1 = System.nanoTime();
                if (t1 > deadline) {
                    throw new IllegalStateException("the plain consumer read " + read + " of " + records
                            + " records of " + topic + " within " + RUN_TIMEOUT);
                }
            }
            if (bytes == 0) {
                throw new IllegalStateException("the plain consumer read only empty values");
            }
            long poll1 = CpuClock.nanos();
            return StageBenchResult.Phase.of(records, (t1 - t0) / 1e9, (processCpuNanos() - cpu0) / 1e9,
                    (poll1 - poll0) / 1e9, jitSeconds(jit0, jitMillis()), 0, 0);
        }
    }

    private static StageBenchResult.Phase stage(String servers, String topic, String id, StageBenchRecords input,
                                                Map<String, String> settings, Map<TopicPartition, Long> ends)
            throws InterruptedException {
        Stage stage = StageAssembly.create(StageConfig.of(stageProperties(servers, topic, id, input.features(),
                settings)), Path.of("."));
        Map<Integer, Long> committed = new HashMap<>();
        CountDownLatch atEnd = new CountDownLatch(1);
        long[] endNanos = new long[1];
        double[] commitSecondsAtEnd = new double[1];
        stage.onCommit(offsets -> {
            for (Map.Entry<TopicPartition, OffsetAndMetadata> e : offsets.entrySet()) {
                committed.put(e.getKey().partition(), e.getValue().offset());
            }
            if (reachedEnd(committed, ends) && atEnd.getCount() > 0) {
                endNanos[0] = System.nanoTime();
                commitSecondsAtEnd[0] = stage.metrics().commitSeconds();
                atEnd.countDown();
            }
        });
        Thread loop = new Thread(() -> {
            try {
                stage.run();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }, "lariat-bench-stage");
        loop.start();
        long deadline = System.nanoTime() + RUN_TIMEOUT.toNanos();
        while (!stage.ready() && loop.isAlive() && atEnd.getCount() > 0) {
            if (System.nanoTime() > deadline) {
                break;
            }
            Thread.sleep(1);
        }
        long t0 = System.nanoTime();
        long cpu0 = processCpuNanos();
        long jit0 = jitMillis();
        long poll0 = threadCpuNanos(loop);
        boolean finished = atEnd.await(RUN_TIMEOUT.toMillis(), TimeUnit.MILLISECONDS);
        long cpu1 = processCpuNanos();
        long jit1 = jitMillis();
        long poll1 = threadCpuNanos(loop);
        stage.shutdown();
        stage.awaitStopped(RUN_TIMEOUT.toMillis());
        if (!finished) {
            throw new IllegalStateException("the stage " + id + " did not commit the end of " + topic + " within "
                    + RUN_TIMEOUT + " (committed " + committed + ")");
        }
        long in = stage.metrics().recordsIn();
        if (in != input.count()) {
            throw new IllegalStateException("the stage consumed " + in + " records, expected " + input.count());
        }
        return StageBenchResult.Phase.of(input.count(), (endNanos[0] - t0) / 1e9, (cpu1 - cpu0) / 1e9,
                (poll1 - poll0) / 1e9, jitSeconds(jit0, jit1), stage.metrics().transactionsCommitted(),
                commitSecondsAtEnd[0]);
    }

    private static boolean reachedEnd(Map<Integer, Long> committed, Map<TopicPartition, Long> ends) {
        for (Map.Entry<TopicPartition, Long> e : ends.entrySet()) {
            if (committed.getOrDefault(e.getKey().partition(), 0L) < e.getValue()) {
                return false;
            }
        }
        return true;
    }

    static Map<String, String> stageProperties(String servers, String topic, String id, int features) {
        return stageProperties(servers, topic, id, features, STAGE_SETTINGS);
    }

    private static Map<String, String> stageProperties(String servers, String topic, String id, int features,
                                                       Map<String, String> settings) {
        Map<String, String> p = new LinkedHashMap<>(settings);
        p.put("bootstrap.servers", servers);
        p.put("stage.id", id);
        p.put("stage.instance", "0");
        p.put("input.topic", topic);
        p.put("input.format", "avro-single-object");
        p.put("field.key", "station");
        p.put("field.time", "time");
        p.put("field.weight", "weight");
        p.put("field.features.map", "channels");
        p.put("field.target", StageBenchRecords.TARGET);
        p.put("field.features", String.join(",", StageBenchRecords.featureNames(features)));
        p.put("model.topic", id + ".models");
        p.put("alert.topic", id + ".alerts");
        p.put("snapshot.topic", id + ".snapshots");
        p.put("deadletter.topic", id + ".deadletters");
        p.put("claim.topic", id + ".claims");
        return p;
    }

    private static long processCpuNanos() {
        if (ManagementFactory.getOperatingSystemMXBean() instanceof com.sun.management.OperatingSystemMXBean os) {
            return os.getProcessCpuTime();
        }
        return 0;
    }

    /** The JIT compiler's accumulated time in milliseconds (summed over its threads), or -1 if not reported. */
    private static long jitMillis() {
        CompilationMXBean jit = ManagementFactory.getCompilationMXBean();
        return jit != null && jit.isCompilationTimeMonitoringSupported() ? jit.getTotalCompilationTime() : -1L;
    }

    private static double jitSeconds(long before, long after) {
        return before < 0 || after < 0 ? -1.0 : (after - before) / 1e3;
    }

    /** CPU time of {@code thread} in nanoseconds, or 0 when the JVM cannot measure it. */
    private static long threadCpuNanos(Thread thread) {
        ThreadMXBean mx = ManagementFactory.getThreadMXBean();
        return mx.isThreadCpuTimeSupported() ? Math.max(0L, mx.getThreadCpuTime(thread.getId())) : 0L;
    }

    private static double loadAverage() {
        return ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage();
    }
}

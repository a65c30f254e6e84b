package lariat.it.faults;

import java.io.IOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Properties;
import java.util.Set;
import java.util.TreeMap;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.Future;
import java.util.function.BooleanSupplier;

import lariat.it.support.StageProcess;
import lariat.it.support.StageTestKit;
import lariat.it.support.TestKafka;
import lariat.schema.StationReading;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.ConsumerGroupDescription;
import org.apache.kafka.clients.admin.MemberDescription;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.clients.producer.RecordMetadata;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.errors.GroupIdNotFoundException;

/**
 * One fault-injection run against the shared real broker: its own input, model, alert,
 * snapshot and dead-letter topics and stage id; a configuration file per stage instance; the
 * child JVMs started for it; an idempotent producer feeding the input (records keyed by station,
 * so Kafka's default partitioner keeps each station on one partition); and read_committed readers
 * of the outputs. Closing it stops every child still running.
 */
final class FaultRun implements AutoCloseable {

    /** Records per moments block, the stage's {@code moments.block.records}. */
    static final int BLOCK = 16;
    /** Forgetting half-life in event-time ms, the stage's {@code forget.half.life.ms}. */
    static final long HALF_LIFE_MS = 600_000;
    private static final Duration READ_TIMEOUT = Duration.ofSeconds(60);
    private static final Path RUNS = Path.of("target", "fault-runs");

    final String name;
    final String input;
    final String models;
    final String alerts;
    final String snapshots;
    final String deadLetters;
    final String claims;
    private final Map<String, String> extra;
    private final List<StageProcess> started = new ArrayList<>();
    private final KafkaProducer<byte[], byte[]> producer;

    private FaultRun(String name, Map<String, String> extra) {
        this.name = name;
        this.input = name + ".readings";
        this.models = name + ".models";
        this.alerts = name + ".alerts";
        this.snapshots = name + ".snapshots";
        this.deadLetters = name + ".deadletters";
        this.claims = StageTestKit.claimTopicOf(snapshots);
        this.extra = new TreeMap<>(extra);
        Properties p = TestKafka.producerProperties();
        p.setProperty(ProducerConfig.LINGER_MS_CONFIG, "5");
        this.producer = new KafkaProducer<>(p);
    }

    /**
     * A run named after {@code prefix} whose input topic has {@code partitions} partitions;
     * {@code extra} are configuration lines added to (or replacing) the defaults of every instance.
     */
    static FaultRun create(String prefix, int partitions, Map<String, String> extra)
            throws InterruptedException, ExecutionException {
        FaultRun run = new FaultRun(TestKafka.uniqueTopic(prefix), extra);
        TestKafka.createTopic(run.input, partitions, Map.of());
        return run;
    }

    /** The configuration of instance {@code instance}: short cycles, a refit every cycle with new records. */
    Map<String, String> config(String instance) {
        Map<String, String> c = new TreeMap<>();
        StageTestKit.stationInput(c, input, StationFeed.FEATURES, StationFeed.TARGET);
        c.put("stage.id", name);
        c.put("stage.instance", instance);
        c.put("moments.block.records", Integer.toString(BLOCK));
        c.put("forget.half.life.ms", Long.toString(HALF_LIFE_MS));
        c.put("refit.every.records", "1");
        c.put("cycle.interval.ms", "250");
        c.put("select.rule", "bic");
        StageTestKit.outputTopics(c, models, alerts, snapshots, deadLetters);
        c.put("metrics.port", "0");
        c.put("shutdown.timeout.ms", "5000");
        c.put("session.timeout.ms", "6000");
        c.put("heartbeat.interval.ms", "1000");
        c.putAll(extra);
        return c;
    }

    /** The folder of this run's configuration files and logs (created on first use). */
    Path directory() throws IOException {
        return Files.createDirectories(RUNS.resolve(name));
    }

    /** Writes instance {@code instance}'s configuration and starts it as a child JVM. */
    StageProcess start(String instance) throws IOException {
        return start(instance, Map.of());
    }

    /** {@link #start(String)} with {@code lines} added to this instance's configuration only. */
    StageProcess start(String instance, Map<String, String> lines) throws IOException {
        Path dir = directory();
        Path file = dir.resolve(instance + ".properties");
        Properties p = new Properties();
        p.putAll(config(instance));
        p.putAll(lines);
        try (Writer w = Files.newBufferedWriter(file, StandardCharsets.UTF_8)) {
            p.store(w, "fault-injection run " + name + ", instance " + instance);
        }
        StageProcess s = StageProcess.start(file, dir.resolve(instance + ".log"));
        started.add(s);
        return s;
    }

    /** Sends a good reading keyed by its station. */
    void send(StationReading r) {
        producer.send(new ProducerRecord<>(input, utf8(r.getStation().toString()), StageTestKit.encode(r)));
    }

    /** Sends a good reading keyed by its station to input partition {@code partition}, whatever the key's hash. */
    Future<RecordMetadata> sendTo(int partition, StationReading r) {
        return producer.send(new ProducerRecord<>(input, partition, utf8(r.getStation().toString()),
                StageTestKit.encode(r)));
    }

    /** Sends raw value bytes keyed by {@code key}. */
    Future<RecordMetadata> sendRaw(String key, byte[] value) {
        return producer.send(new ProducerRecord<>(input, key == null ? null : utf8(key), value));
    }

    void flush() {
        producer.flush();
    }

    /** Every committed record of {@code topic}, partition by partition, each in offset order. */
    List<ConsumerRecord<byte[], byte[]>> readAll(String topic) {
        return StageTestKit.readCommitted(topic, READ_TIMEOUT);
    }

    /** The oracle fed every committed input record (all must be good readings), in partition order. */
    MomentOracle oracleFromInput() {
        MomentOracle o = MomentOracle.of(BLOCK, HALF_LIFE_MS);
        for (ConsumerRecord<byte[], byte[]> r : readAll(input)) {
            o.add(StationFeed.decode(r.value()));
        }
        return o;
    }

    /** The committed model versions per key, each key's in offset order. */
    Map<String, List<PublishedModel>> modelsByKey() {
        Map<String, List<PublishedModel>> out = new TreeMap<>();
        if (!topicExists(models)) {
            return out;
        }
        for (ConsumerRecord<byte[], byte[]> r : readAll(models)) {
            PublishedModel mv = PublishedModel.decode(r.value());
            out.computeIfAbsent(mv.key(), k -> new ArrayList<>()).add(mv);
        }
        return out;
    }

    private boolean topicExists(String topic) {
        try (Admin admin = Admin.create(TestKafka.adminProperties())) {
            return admin.listTopics().names().get().contains(topic);
        } catch (ExecutionException e) {
            throw new IllegalStateException("listing topics failed", e.getCause());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted listing topics", e);
        }
    }

    /**
     * The input offsets the stage's consumer group has committed, summed over partitions: they
     * move only when a cycle's transaction commits.
     */
    long committedInput() {
        return committedByPartition().values().stream().mapToLong(Long::longValue).sum();
    }

    /** The group's committed input offset per partition (absent: none yet). */
    Map<Integer, Long> committedByPartition() {
        try (Admin admin = Admin.create(TestKafka.adminProperties())) {
            Map<Integer, Long> out = new TreeMap<>();
            admin.listConsumerGroupOffsets(name).partitionsToOffsetAndMetadata().get().forEach((tp, o) -> {
                if (o != null) {
                    out.put(tp.partition(), o.offset());
                }
            });
            return out;
        } catch (ExecutionException e) {
            throw new IllegalStateException("listing the offsets of group " + name + " failed", e.getCause());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted listing group offsets", e);
        }
    }

    /** The input topic's end offset per partition. */
    Map<Integer, Long> inputEnds() {
        try (KafkaConsumer<byte[], byte[]> c = new KafkaConsumer<>(TestKafka.consumerProperties(name + "-probe"))) {
            List<TopicPartition> tps = c.partitionsFor(input, READ_TIMEOUT).stream()
                    .map(i -> new TopicPartition(input, i.partition())).toList();
            Map<Integer, Long> out = new TreeMap<>();
            c.endOffsets(tps, READ_TIMEOUT).forEach((tp, e) -> out.put(tp.partition(), e));
            return out;
        }
    }

    /** Whether the group has committed, on every partition, at least the offsets {@code ends}. */
    boolean committedPast(Map<Integer, Long> ends) {
        Map<Integer, Long> c = committedByPartition();
        return ends.entrySet().stream().allMatch(e -> e.getValue() == 0 || c.getOrDefault(e.getKey(), 0L) >= e.getValue());
    }

    /** Input partitions assigned to each stage instance now in the group, by {@code stage.instance}. */
    Map<String, Set<Integer>> assignments() {
        String prefix = name + "-";
        try (Admin admin = Admin.create(TestKafka.adminProperties())) {
            Map<String, Set<Integer>> out = new TreeMap<>();
            ConsumerGroupDescription d = admin.describeConsumerGroups(List.of(name)).describedGroups().get(name).get();
            for (MemberDescription m : d.members()) {
                String id = m.clientId();
                String instance = id.startsWith(prefix) && id.endsWith("-consumer")
                        ? id.substring(prefix.length(), id.length() - "-consumer".length()) : id;
                Set<Integer> parts = new java.util.TreeSet<>();
                m.assignment().topicPartitions().forEach(tp -> parts.add(tp.partition()));
                out.put(instance, parts);
            }
            return out;
        } catch (ExecutionException e) {
            if (e.getCause() instanceof GroupIdNotFoundException) {
                return Map.of();
            }
            throw new IllegalStateException("describing group " + name + " failed", e.getCause());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted describing the group", e);
        }
    }

    /** Waits until {@link #committedInput()} exceeds {@code before}: some instance committed a cycle since. */
    void awaitProgress(long before, Duration timeout) throws InterruptedException {
        await("a committed cycle past input offset sum " + before, timeout, () -> committedInput() > before);
    }

    /** Whether every key of {@code counts} has a last model covering exactly that many records. */
    boolean modelsCover(Map<String, Long> counts) {
        Map<String, List<PublishedModel>> m = modelsByKey();
        for (Map.Entry<String, Long> e : counts.entrySet()) {
            List<PublishedModel> v = m.get(e.getKey());
            if (v == null || v.get(v.size() - 1).recordCount() != e.getValue()) {
                return false;
            }
        }
        return true;
    }

    /**
     * Polls {@code condition} every 500 ms until it holds.
     *
     * @throws AssertionError naming {@code what}, with the instances' log tails, after {@code timeout}
     */
    void await(String what, Duration timeout, BooleanSupplier condition) throws InterruptedException {
        long deadline = System.nanoTime() + timeout.toNanos();
        while (!condition.getAsBoolean()) {
            if (System.nanoTime() > deadline) {
                throw new AssertionError("not within " + timeout + ": " + what + "\n" + logTails());
            }
            Thread.sleep(500);
        }
    }

    /** The last 4000 characters of each instance's log. */
    String logTails() {
        StringBuilder b = new StringBuilder();
        for (StageProcess s : started) {
            try {
                String t = s.logText();
                b.append("---- ").append(s.log()).append(" (pid ").append(s.pid()).append(s.alive() ? ", alive" : ", exited")
                        .append(")\n").append(t.substring(Math.max(0, t.length() - 4000))).append('\n');
            } catch (IOException e) {
                b.append("---- ").append(s.log()).append(": ").append(e).append('\n');
            }
        }
        return b.toString();
    }

    /** Per key, the versions in the order a read_committed reader sees them. */
    static Map<String, List<Long>> versions(Map<String, List<PublishedModel>> models) {
        Map<String, List<Long>> out = new LinkedHashMap<>();
        models.forEach((k, v) -> out.put(k, v.stream().map(PublishedModel::version).toList()));
        return out;
    }

    private static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }

    @Override
    public void close() {
        producer.close(Duration.ofSeconds(10));
        for (StageProcess s : started) {
            s.close();
        }
    }
}

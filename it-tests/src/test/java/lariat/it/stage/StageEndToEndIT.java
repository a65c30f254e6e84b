package lariat.it.stage;

import lariat.config.StageConfig;
import lariat.it.support.StageTestKit;
import lariat.it.support.StageTestKit.InProcessStage;
import lariat.it.support.TestKafka;
import lariat.moments.MomentStream;
import lariat.moments.Moments;
import lariat.path.LassoPath;
import lariat.path.PathEngine;
import lariat.path.PathOptions;
import lariat.schema.ActiveFeature;
import lariat.schema.ModelVersion;
import lariat.select.ModelSelector;
import lariat.select.RegressionMoments;
import lariat.select.SelectedModel;
import lariat.select.SelectionRule;
import lariat.select.SelectionSpec;
import lariat.stage.DeadLetters;
import lariat.stage.Stage;
import lariat.stage.StageAssembly;
import lariat.stage.TopicSetup;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.clients.producer.RecordMetadata;
import org.junit.jupiter.api.Test;

import java.io.IOException;
import java.net.ServerSocket;
import java.net.URI;
import java.net.http.HttpClient;
import java.net.http.HttpRequest;
import java.net.http.HttpResponse;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.Set;
import java.util.TreeMap;
import java.util.concurrent.Future;
import java.util.stream.Collectors;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The stage against a real broker (TestKafka): readings of several stations with known
 * coefficients and a few bad records in between go in; every published model version must equal,
 * bit for bit, an offline fit (MomentStream, PathEngine, ModelSelector) of the same station's
 * good records up to the version's end offset, in the same order; versions are 1, 2, ... per
 * station; every bad record is a dead letter with its reason and source coordinates.
 */
class StageEndToEndIT {

    private static final String[] FEATURES = {"flow_m3h", "suction_kpa", "discharge_kpa", "vibration_mm_s",
        "bearing_temp_c", "speed_rpm"};
    private static final String TARGET = "motor_current_a";
    private static final int RECORDS_PER_STATION = 900;
    private static final int BLOCK = 16;
    private static final long SEED = 20240611L;
    private static final Duration WAIT = Duration.ofSeconds(90);

    /** One reading as produced: the station and z = features then target. */
    private static final class Sent {
        final String station;
        final double[] z;
        final long timeMs;
        final int partition;
        final long offset;

        Sent(String station, double[] z, long timeMs, int partition, long offset) {
            this.station = station;
            this.z = z;
            this.timeMs = timeMs;
            this.partition = partition;
            this.offset = offset;
        }
    }

    @Test
    void run_stationsWithKnownCoefficients_versionsEqualOfflineFitBitForBit() throws Exception {
        String input = TestKafka.uniqueTopic("e2e-in");
        String models = TestKafka.uniqueTopic("e2e-models");
        String deadLetters = TestKafka.uniqueTopic("e2e-dlq");
        TestKafka.createTopic(input, 3, Map.of());
        int metricsPort = freePort();
        Map<String, String> props = config(input, models, deadLetters, metricsPort);

        List<Sent> good = new ArrayList<>();
        Map<String, String> badReasons = new LinkedHashMap<>();
        Map<String, Long> badOffsets = new HashMap<>();
        InProcessStage stage = InProcessStage.start(props);
        Random rnd = new Random(SEED);
        int bursts = 3;
        for (int b = 0; b < bursts; b++) {
            produce(input, good, badOffsets, badReasons, b * RECORDS_PER_STATION / bursts,
                    (b + 1) * RECORDS_PER_STATION / bursts, rnd);
            stage.awaitConsumed(input, WAIT);
        }
        String metrics = httpGet(metricsPort, "/metrics");
        int ready = httpStatus(metricsPort, "/readyz");
        stage.stop();

        assertEquals(200, ready, "readyz after restore");
        assertTrue(metrics.contains("lariat_records_in_total " + (good.size() + badOffsets.size())),
                "records in counted on /metrics");

        Map<String, List<ModelVersion>> byKey = readModels(models);
        Set<String> stations = good.stream().map(g -> g.station).collect(Collectors.toSet());
        assertEquals(stations, byKey.keySet(), "every station published");
        for (Map.Entry<String, List<ModelVersion>> e : byKey.entrySet()) {
            assertTrue(e.getValue().size() >= bursts, e.getKey() + " published " + e.getValue().size() + " versions");
        }
        assertContiguousAndOffline(byKey, good, "versions contiguous from 1");
        assertDeadLetters(deadLetters, input, badOffsets, badReasons);
    }

    @Test
    void run_restartedWithSameInstance_versionsContinueAndEqualOfflineFit() throws Exception {
        String input = TestKafka.uniqueTopic("restart-in");
        String models = TestKafka.uniqueTopic("restart-models");
        String deadLetters = TestKafka.uniqueTopic("restart-dlq");
        TestKafka.createTopic(input, 3, Map.of());
        Map<String, String> props = config(input, models, deadLetters, 0);
        List<Sent> good = new ArrayList<>();
        Map<String, Long> badOffsets = new HashMap<>();
        Map<String, String> badReasons = new LinkedHashMap<>();
        Random rnd = new Random(SEED + 1);
        produce(input, good, badOffsets, badReasons, 0, RECORDS_PER_STATION / 2, rnd);
        StageTestKit.runUntilConsumed(props, input, WAIT);
        Map<String, Long> lastBefore = new HashMap<>();
        readModels(models).forEach((k, v) -> lastBefore.put(k, v.get(v.size() - 1).getVersion()));
        produce(input, good, badOffsets, badReasons, RECORDS_PER_STATION / 2, RECORDS_PER_STATION, rnd);
        StageTestKit.runUntilConsumed(props, input, WAIT);

        Map<String, List<ModelVersion>> byKey = readModels(models);
        assertEquals(lastBefore.keySet(), byKey.keySet(), "stations before and after the restart");
        for (Map.Entry<String, List<ModelVersion>> e : byKey.entrySet()) {
            assertTrue(e.getValue().size() > lastBefore.get(e.getKey()), e.getKey() + " published after the restart");
        }
        assertContiguousAndOffline(byKey, good, "versions contiguous across restart");
        assertDeadLetters(deadLetters, input, badOffsets, badReasons);
    }

    @Test
    void run_snapshotTopicWithOtherPartitionCount_refusesNamingTopic() throws Exception {
        String snapshots = TestKafka.uniqueTopic("mismatch-snap");
        TestKafka.createTopic(snapshots, 1, Map.of("cleanup.policy", "compact"));
        String message = refusal("mismatch", 3, "snapshot.topic", snapshots);
        assertTrue(message.contains(snapshots) && message.contains("1 partitions") && message.contains("has 3"),
                message);
    }

    @Test
    void run_claimTopicNotCompacted_refusesNamingTopic() throws Exception {
        String claims = TestKafka.uniqueTopic("claims-deleted");
        TestKafka.createTopic(claims, 1, Map.of("cleanup.policy", "delete"));
        String message = refusal("claims", 2, "claim.topic", claims);
        assertTrue(message.contains("claim topic '" + claims + "'")
                && message.contains("cleanup.policy=delete but must be compact only"), message);
    }

    /**
     * The message with which a stage on a new input of {@code inputPartitions} partitions refuses to run
     * when {@code key} names the existing {@code topic}; other topics are new, named after {@code prefix}.
     */
    private static String refusal(String prefix, int inputPartitions, String key, String topic) throws Exception {
        String input = TestKafka.uniqueTopic(prefix + "-in");
        TestKafka.createTopic(input, inputPartitions, Map.of());
        Map<String, String> props = config(input, TestKafka.uniqueTopic(prefix + "-models"),
                TestKafka.uniqueTopic(prefix + "-dlq"), 0);
        props.put(key, topic);
        Stage stage = StageAssembly.create(StageConfig.of(props), Path.of(""));
        return assertThrows(TopicSetup.TopicMismatchException.class, stage::run).getMessage();
    }

    private static Map<String, String> config(String input, String models, String deadLetters, int metricsPort) {
        Map<String, String> p = new TreeMap<>();
        StageTestKit.stationInput(p, input, List.of(FEATURES), TARGET);
        p.put("moments.block.records", Integer.toString(BLOCK));
        p.put("refit.every.records", "200");
        p.put("cycle.interval.ms", "100");
        p.put("select.rule", "bic");
        p.put("select.refit", "true");
        StageTestKit.outputTopics(p, models, input + "-alerts", input + "-snapshots", deadLetters);
        p.put("stage.id", input + "-stage");
        p.put("metrics.port", Integer.toString(metricsPort));
        p.put("shutdown.timeout.ms", "10000");
        p.put("consumer.max.poll.records", "97");
        return p;
    }

    /** Known coefficients per station; zeros are features that must stay out. */
    private static double[] coefficients(int station) {
        double[][] table = {
            {2.0, 0.0, -1.5, 0.0, 0.7, 0.0},
            {0.0, 1.2, 0.0, -0.8, 0.0, 0.4},
            {1.0, -1.0, 0.5, 0.0, 0.0, 0.0},
            {0.0, 0.0, 0.0, 3.0, -0.6, 0.9},
        };
        return table[station];
    }

    private static void produce(String input, List<Sent> good, Map<String, Long> badOffsets,
                                Map<String, String> badReasons, int from, int to, Random rnd) throws Exception {
        int stations = 4;
        long t0 = 1_700_000_000_000L;
        List<Object[]> pending = new ArrayList<>();
        try (KafkaProducer<byte[], byte[]> producer = new KafkaProducer<>(TestKafka.producerProperties())) {
            for (int i = from; i < to; i++) {
                for (int s = 0; s < stations; s++) {
                    String station = "north-0" + (s + 1);
                    double[] beta = coefficients(s);
                    double[] z = new double[FEATURES.length + 1];
                    double y = 10.0 + s;
                    for (int j = 0; j < FEATURES.length; j++) {
                        z[j] = 50.0 * (j + 1) + (1 + j % 3) * rnd.nextGaussian();
                        y += beta[j] * z[j];
                    }
                    z[FEATURES.length] = y + 0.05 * rnd.nextGaussian();
                    long t = t0 + 1000L * i;
                    pending.add(new Object[] {station, z, t, producer.send(new ProducerRecord<>(input,
                            station.getBytes(StandardCharsets.UTF_8), reading(station, t, z, 1.0)))});
                }
                if (i % 150 == 75) {
                    int k = i / 150;
                    String station = "north-0" + (k % stations + 1);
                    sendBad(producer, input, station, k, badOffsets, badReasons);
                }
            }
            producer.flush();
        }
        for (Object[] e : pending) {
            @SuppressWarnings("unchecked")
            RecordMetadata md = ((Future<RecordMetadata>) e[3]).get();
            good.add(new Sent((String) e[0], (double[]) e[1], (Long) e[2], md.partition(), md.offset()));
        }
    }

    private static void sendBad(KafkaProducer<byte[], byte[]> producer, String input, String station, int kind,
                                Map<String, Long> badOffsets, Map<String, String> badReasons) throws Exception {
        byte[] value;
        String reason;
        switch (kind % 6) {
            case 0:
                value = new byte[] {1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11};
                reason = "BAD_MARKER";
                break;
            case 1: {
                double[] z = new double[FEATURES.length + 1];
                z[FEATURES.length] = Double.NaN;
                value = reading(station, 1_700_000_000_000L, z, 1.0);
                reason = "NON_FINITE";
                break;
            }
            case 2: {
                double[] z = new double[FEATURES.length + 1];
                Map<String, Double> ch = channels(z);
                ch.remove(FEATURES[2]);
                value = StageTestKit.reading(station, 1L, ch, 1.0);
                reason = "MISSING_FIELD";
                break;
            }
            case 3: {
                byte[] full = reading(station, 1_700_000_000_000L, new double[FEATURES.length + 1], 1.0);
                value = java.util.Arrays.copyOf(full, full.length / 2);
                reason = null;
                break;
            }
            case 4:
                value = reading(station, 1_700_000_000_000L, new double[FEATURES.length + 1], -2.0);
                reason = null;
                break;
            default:
                value = reading(station, 1_700_000_000_000L, new double[FEATURES.length + 1], 1.0);
                value[3] ^= 0x55;
                reason = "UNKNOWN_SCHEMA";
                break;
        }
        RecordMetadata md = StageTestKit.send(producer, input, station, value);
        String id = md.partition() + "/" + md.offset();
        badOffsets.put(id, md.offset());
        badReasons.put(id, reason);
    }

    private static byte[] reading(String station, long t, double[] z, double weight) {
        return StageTestKit.reading(station, t, channels(z), weight);
    }

    private static Map<String, Double> channels(double[] z) {
        return StageTestKit.channels(FEATURES, TARGET, z);
    }

    /** Each key's versions are 1, 2, ... in order and each equals the offline fit of its records. */
    private static void assertContiguousAndOffline(Map<String, List<ModelVersion>> byKey, List<Sent> good,
                                                   String contiguous) {
        for (Map.Entry<String, List<ModelVersion>> e : byKey.entrySet()) {
            List<ModelVersion> versions = e.getValue();
            for (int i = 0; i < versions.size(); i++) {
                assertEquals(i + 1, versions.get(i).getVersion(), e.getKey() + " " + contiguous);
                assertEqualsOffline(versions.get(i), good);
            }
        }
    }

    /** The offline oracle: the station's good records before the version's end offset, in order. */
    private static void assertEqualsOffline(ModelVersion mv, List<Sent> good) {
        MomentStream stream = new MomentStream(FEATURES.length + 1, BLOCK, Double.POSITIVE_INFINITY);
        long n = 0;
        for (Sent g : good) {
            if (g.station.equals(mv.getKey()) && g.offset < mv.getInputEndOffset()) {
                assertEquals(mv.getInputPartition(), g.partition, "station on one partition");
                stream.add(g.z, 1.0, g.timeMs);
                n++;
            }
        }
        String where = mv.getKey() + " v" + mv.getVersion();
        assertEquals(n, mv.getRecordCount(), where + " record count");
        Moments m = stream.snapshot();
        assertEquals(m.fingerprint(), mv.getMomentsFingerprint(), where + " moments fingerprint");
        int p = FEATURES.length;
        int[] cols = {0, 1, 2, 3, 4, 5};
        RegressionMoments rm = RegressionMoments.of(m, cols, p);
        LassoPath path = new PathEngine(p).fit(rm.gramInput(), PathOptions.builder().build());
        SelectedModel sel = ModelSelector.select(path, rm, SelectionSpec.of(SelectionRule.BIC, Double.NaN, false,
                true), null);
        assertEquals(Double.doubleToLongBits(sel.intercept()), Double.doubleToLongBits(mv.getIntercept()),
                where + " intercept bits");
        assertEquals(Double.doubleToLongBits(sel.penalty()), Double.doubleToLongBits(mv.getPenalty()),
                where + " penalty bits");
        assertEquals(Double.doubleToLongBits(sel.r2()), Double.doubleToLongBits(mv.getR2()), where + " R2 bits");
        Map<String, Double> published = new TreeMap<>();
        for (ActiveFeature f : mv.getFeatures()) {
            published.put(f.getName(), f.getCoefficient());
        }
        Map<String, Double> offline = new TreeMap<>();
        double[] raw = sel.rawCoefficients();
        for (int j : sel.active()) {
            offline.put(FEATURES[j], raw[j]);
        }
        assertEquals(offline.keySet(), published.keySet(), where + " active set");
        for (String f : offline.keySet()) {
            assertEquals(Double.doubleToLongBits(offline.get(f)), Double.doubleToLongBits(published.get(f)),
                    where + " coefficient bits of " + f);
        }
        assertEquals(p, mv.getChannels().size(), where + " channels");
        assertEquals(TARGET, mv.getTarget(), where + " target");
        assertFalse(mv.getConfigHash().isEmpty(), where + " config hash");
    }

    private static Map<String, List<ModelVersion>> readModels(String topic) throws Exception {
        Map<String, List<ModelVersion>> byKey = new TreeMap<>();
        for (ConsumerRecord<byte[], byte[]> r : StageTestKit.readCommitted(topic, WAIT)) {
            ModelVersion mv = StageTestKit.model(r.value());
            assertEquals(mv.getKey(), new String(r.key(), StandardCharsets.UTF_8), "record key is the model key");
            byKey.computeIfAbsent(mv.getKey(), k -> new ArrayList<>()).add(mv);
        }
        return byKey;
    }

    private static void assertDeadLetters(String topic, String input, Map<String, Long> badOffsets,
                                          Map<String, String> badReasons) throws Exception {
        List<ConsumerRecord<byte[], byte[]>> dls = StageTestKit.readCommitted(topic, WAIT);
        assertEquals(badOffsets.size(), dls.size(), "one dead letter per bad record");
        for (ConsumerRecord<byte[], byte[]> d : dls) {
            assertEquals(input, StageTestKit.header(d, DeadLetters.SOURCE_TOPIC), "source topic header");
            String id = StageTestKit.header(d, DeadLetters.SOURCE_PARTITION) + "/"
                    + StageTestKit.header(d, DeadLetters.SOURCE_OFFSET);
            assertTrue(badOffsets.containsKey(id), "dead letter " + id + " is one of the bad records");
            String expected = badReasons.get(id);
            String reason = StageTestKit.header(d, DeadLetters.REASON);
            assertNotNull(reason, "reason header");
            if (expected != null) {
                assertEquals(expected, reason, "reason of " + id);
            }
            assertFalse(reason.isEmpty(), "reason of " + id);
        }
    }

    private static int freePort() throws IOException {
        try (ServerSocket s = new ServerSocket(0)) {
            return s.getLocalPort();
        }
    }

    private static String httpGet(int port, String path) throws IOException, InterruptedException {
        return HttpClient.newHttpClient().send(HttpRequest.newBuilder(URI.create("http://localhost:" + port + path))
                .build(), HttpResponse.BodyHandlers.ofString()).body();
    }

    private static int httpStatus(int port, String path) throws IOException, InterruptedException {
        return HttpClient.newHttpClient().send(HttpRequest.newBuilder(URI.create("http://localhost:" + port + path))
                .build(), HttpResponse.BodyHandlers.discarding()).statusCode();
    }
}

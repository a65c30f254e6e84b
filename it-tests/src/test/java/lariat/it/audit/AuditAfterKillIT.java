package lariat.it.audit;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import lariat.audit.AuditReport;
import lariat.audit.AuditScope;
import lariat.audit.Auditor;
import lariat.audit.ClusterClients;
import lariat.audit.KeyHistory;
import lariat.audit.ModelTopicReader;
import lariat.audit.Progress;
import lariat.audit.PublishedVersion;
import lariat.audit.Recomputer;
import lariat.audit.VersionVerdict;
import lariat.cli.Main;
import lariat.config.StageConfig;
import lariat.it.support.StageProcess;
import lariat.it.support.StageTestKit;
import lariat.it.support.TestKafka;
import lariat.schema.ActiveFeature;
import lariat.schema.ModelVersion;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.RecordsToDelete;
import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.Producer;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.serialization.ByteArraySerializer;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.MethodOrderer;
import org.junit.jupiter.api.Order;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.TestInstance;
import org.junit.jupiter.api.TestMethodOrder;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.HashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Properties;
import java.util.Random;
import java.util.Set;
import java.util.concurrent.atomic.AtomicReference;
import java.util.function.Function;
import java.util.stream.Collectors;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Audit, history and recompute against a real broker and a real stage history that includes a
 * SIGKILL and a restart: the stage (a child JVM) reads half of the input, is killed mid-run,
 * then restarted for the rest. The oracle for the history checks is the input this test wrote
 * (which offsets hold which key and event time); the oracle for the audit is the published
 * history itself and copies of it altered in one field.
 */
@TestInstance(TestInstance.Lifecycle.PER_CLASS)
@TestMethodOrder(MethodOrderer.OrderAnnotation.class)
class AuditAfterKillIT {

    private static final int RECORDS = 1600;
    private static final long T0 = 1_767_225_600_000L;
    private static final List<String> KEYS = List.of("st-a", "st-b");
    private static final Duration TIMEOUT = Duration.ofSeconds(30);

    @TempDir
    static Path dir;

    private String input;
    private String models;
    private String group;
    private Path config;
    private StageConfig stageConfig;
    private final List<String> keyAt = new ArrayList<>();
    private final List<Long> timeAt = new ArrayList<>();
    private List<PublishedVersion> published;

    @BeforeAll
    void runStageWithKill() throws Exception {
        input = TestKafka.uniqueTopic("audit-in");
        models = TestKafka.uniqueTopic("audit-models");
        group = TestKafka.uniqueTopic("audit-stage");
        TestKafka.createTopic(input, 1, Map.of());
        config = writeConfig(dir.resolve("stage.properties"), Map.of());
        stageConfig = StageConfig.load(config);
        Path log = dir.resolve("stage.log");
        produce(0, RECORDS / 2);
        try (StageProcess first = StageProcess.start(config, log)) {
            awaitCommitted(RECORDS / 4);
            if (!first.alive()) {
                throw new IllegalStateException("the first stage exited before it could be killed; see " + log);
            }
            first.kill();
        }
        produce(RECORDS / 2, RECORDS);
        try (StageProcess second = StageProcess.start(config, log)) {
            awaitCommitted(RECORDS);
            second.close();
        }
        published = read(models);
    }

    @Test
    @Order(1)
    void audit_stageHistoryWithKillAndRestart_everyVersionPasses() {
        AuditReport r = auditor(stageConfig).audit(models, AuditScope.all());
        // How many versions a key gets depends on how the stage's cycles batched the records (wall
        // time decides when a refit happens); what is certain is one version of each key from before
        // the kill (each key had 200 records, above refit.every.records, when the kill came) and one
        // from after it.
        for (String key : KEYS) {
            long n = r.verdicts().stream().filter(v -> v.key().equals(key)).count();
            assertTrue(n >= 2, "versions of " + key + " audited: " + n);
        }
        for (VersionVerdict v : r.verdicts()) {
            assertEquals(VersionVerdict.Status.PASS, v.status(), v.key() + " v" + v.version() + " "
                    + v.differences() + " " + v.detail());
            assertEquals(v.expectedFingerprint(), v.actualFingerprint());
        }
        assertTrue(r.passed());
    }

    @Test
    @Order(2)
    void auditCommand_allVersions_exitsZeroAndWritesJson() throws IOException {
        Path out = dir.resolve("audit.json");
        StringWriter text = new StringWriter();
        int code = cli(text, "audit", "--config", config.toString(), "--quiet", "--key", "st-a", "--json",
                out.toString());
        JsonNode json = new ObjectMapper().readTree(out.toFile());
        assertEquals(0, code, text.toString());
        assertTrue(json.get("passed").asBoolean());
        assertEquals(history("st-a").versions().size(), json.get("results").size());
    }

    @Test
    @Order(3)
    void audit_alteredCoefficient_failsNamingTheField() throws Exception {
        PublishedVersion target = withFeatures("st-a");
        String altered = copyWith(target, mv -> {
            ActiveFeature f = mv.getFeatures().get(0);
            f.setCoefficient(Math.nextUp(f.getCoefficient()));
            return mv;
        });
        VersionVerdict v = single(altered, target);
        assertEquals(VersionVerdict.Status.FAIL, v.status());
        assertEquals("features[0].coefficient", v.firstDifferingField());
        assertEquals(1, v.differences().size());
        assertEquals(v.expectedFingerprint(), v.actualFingerprint());
    }

    @Test
    @Order(4)
    void audit_configHashDiffers_failsNamingConfigHash() throws Exception {
        PublishedVersion target = history("st-b").versions().get(1);
        String altered = copyWith(target, mv -> {
            mv.setConfigHash("0".repeat(64));
            return mv;
        });
        VersionVerdict v = single(altered, target);
        assertEquals(VersionVerdict.Status.FAIL, v.status());
        assertFalse(v.configHashMatches());
        assertEquals(List.of("configHash"), fields(v));
    }

    @Test
    @Order(5)
    void audit_otherConfiguration_failsEveryVersionOnConfigHash() throws IOException {
        StageConfig other = StageConfig.load(writeConfig(dir.resolve("other.properties"),
                Map.of("forget.half.life.ms", "600000")));
        AuditReport r = auditor(other).audit(models, AuditScope.of("st-a", 1, Long.MIN_VALUE, Long.MAX_VALUE));
        VersionVerdict v = r.verdicts().get(0);
        assertFalse(r.passed());
        assertFalse(v.configHashMatches());
        assertTrue(fields(v).contains("configHash"), fields(v).toString());
    }

    @Test
    @Order(6)
    void audit_endOffsetShiftedByOne_failsNamingInputEndOffset() throws Exception {
        PublishedVersion target = history("st-a").versions().get(0);
        String altered = copyWith(target, mv -> {
            mv.setInputEndOffset(mv.getInputEndOffset() + 1);
            return mv;
        });
        VersionVerdict v = single(altered, target);
        assertEquals(VersionVerdict.Status.FAIL, v.status());
        assertEquals(List.of("inputEndOffset"), fields(v), "the record at the old end offset is st-b's, so only "
                + "the recorded offset differs");
    }

    @Test
    @Order(7)
    void history_versionsAgainstTheInput_matchOffsetsCountsAndEventTimes() {
        for (String key : KEYS) {
            KeyHistory h = history(key);
            assertEquals(List.of(), h.gaps());
            assertEquals(List.of(), h.duplicates());
            for (PublishedVersion p : h.versions()) {
                int end = (int) p.inputEndOffset();
                assertEquals(key, keyAt.get(end - 1), "the last included record is the key's own");
                long count = keyAt.subList(0, end).stream().filter(key::equals).count();
                ModelVersion mv = p.record();
                assertEquals(count, mv.getRecordCount());
                assertEquals((long) timeAt.get(end - 1), p.lastEventTimeMs());
                assertEquals((long) timeAt.get(keyAt.indexOf(key)), mv.getFirstEventTimeMs().toEpochMilli());
            }
        }
    }

    @Test
    @Order(8)
    void history_asOfEventAndPublishTime_findTheKnownVersion() {
        KeyHistory h = history("st-b");
        for (PublishedVersion p : h.versions()) {
            assertEquals(p.version(), h.asOfEventTime(p.lastEventTimeMs()).orElseThrow().version());
            Optional<PublishedVersion> before = h.asOfEventTime(p.lastEventTimeMs() - 1);
            assertEquals(p.version() - 1, before.map(PublishedVersion::version).orElse(0L));
            assertEquals(p.version(), h.asOfPublishTime(p.publishedAtMs()).orElseThrow().version());
        }
        assertTrue(h.asOfPublishTime(h.versions().get(0).publishedAtMs() - 1).isEmpty());
    }

    @Test
    @Order(9)
    void historyCommand_diffJson_listsEnteredAndLeftAsTheRecordsDo() throws IOException {
        KeyHistory h = history("st-a");
        ModelVersion a = h.versions().get(0).record();
        ModelVersion b = h.versions().get(h.versions().size() - 1).record();
        StringWriter out = new StringWriter();
        int code = cli(out, "history", "--bootstrap-servers", TestKafka.bootstrapServers(), "--model-topic", models,
                "--key", "st-a", "--diff", Long.toString(a.getVersion()), Long.toString(b.getVersion()), "--json");
        JsonNode d = new ObjectMapper().readTree(out.toString());
        Set<String> before = names(a);
        Set<String> after = names(b);
        assertEquals(0, code);
        assertEquals(difference(after, before), strings(d.get("entered")));
        assertEquals(difference(before, after), strings(d.get("left")));
        Set<String> union = new HashSet<>(before);
        union.addAll(after);
        assertEquals(union.size(), d.get("coefficientChanges").size(),
                "a refit on more records changes every coefficient it touches");
    }

    @Test
    @Order(10)
    void recompute_sameConfiguration_reproducesPublishedVersionsBitForBit() throws Exception {
        Recomputer rc = new Recomputer(clients(), stageConfig, dir, TIMEOUT, Progress.NONE);
        List<Recomputer.Recomputed> rs = rc.recompute(models, AuditScope.all());
        assertEquals(published.size(), rs.size());
        for (Recomputer.Recomputed r : rs) {
            assertEquals(List.of(), r.differences());
            assertArrayEquals(bytes(r.published().record()), r.refitted().records().get(0).value(),
                    r.published().toString());
        }
        String out = TestKafka.uniqueTopic("audit-recomputed");
        TestKafka.createTopic(out, 1, Map.of());
        try (Producer<byte[], byte[]> p = clients().producer()) {
            assertEquals(rs.size(), Recomputer.send(rs, p, out));
        }
        assertEquals(published.size(), read(out).size());
    }

    @Test
    @Order(11)
    void recompute_otherSelectionRule_changesTheActiveSets() throws IOException {
        StageConfig other = StageConfig.load(writeConfig(dir.resolve("max1.properties"),
                Map.of("select.rule", "max-active", "select.max.active", "1")));
        List<Recomputer.Recomputed> rs = new Recomputer(clients(), other, dir, TIMEOUT, Progress.NONE)
                .recompute(models, AuditScope.of("st-a", 0, Long.MIN_VALUE, Long.MAX_VALUE));
        for (Recomputer.Recomputed r : rs) {
            assertTrue(r.refitted().model().getFeatures().size() <= 1);
            assertTrue(fieldNames(r).contains("configHash"));
        }
        assertEquals(history("st-a").versions().size(), rs.size());
    }

    @Test
    @Order(20)
    void audit_inputTruncatedByDeleteRecords_reportsTheMissingOffsets() throws Exception {
        try (Admin admin = Admin.create(TestKafka.adminProperties())) {
            admin.deleteRecords(Map.of(new TopicPartition(input, 0), RecordsToDelete.beforeOffset(100))).all().get();
        }
        AuditReport r = auditor(stageConfig).audit(models, AuditScope.all());
        assertFalse(r.passed());
        assertEquals(published.size(), r.verdicts().size());
        for (VersionVerdict v : r.verdicts()) {
            assertEquals(VersionVerdict.Status.MISSING_INPUT, v.status());
            assertEquals(0, v.missingFrom());
            assertEquals(99, v.missingTo());
        }
    }

    // ---------------------------------------------------------------- helpers

    private Path writeConfig(Path file, Map<String, String> overrides) throws IOException {
        Map<String, String> p = new HashMap<>();
        p.put("bootstrap.servers", TestKafka.bootstrapServers());
        p.put("stage.id", group);
        p.put("input.topic", input);
        p.put("input.format", "json");
        p.put("field.key", "station");
        p.put("field.time", "time");
        p.put("field.target", "current");
        p.put("field.features", "flow,pressure,speed");
        p.put("refit.every.records", "150");
        p.put("cycle.interval.ms", "200");
        p.put("select.rule", "bic");
        StageTestKit.outputTopics(p, models, models + "-alerts", models + "-snapshots", models + "-dead");
        p.put("metrics.port", "0");
        p.put("shutdown.timeout.ms", "5000");
        p.put("session.timeout.ms", "6000");
        p.put("heartbeat.interval.ms", "1000");
        p.putAll(overrides);
        StringBuilder b = new StringBuilder();
        p.forEach((k, v) -> b.append(k).append('=').append(v).append('\n'));
        Files.writeString(file, b.toString(), StandardCharsets.UTF_8);
        return file;
    }

    /** Readings of two stations alternating, current = 2 flow - 0.5 pressure + noise, speed unrelated. */
    private void produce(int from, int to) throws Exception {
        Random rnd = new Random(20260314L + from);
        Properties pp = TestKafka.producerProperties();
        try (KafkaProducer<byte[], byte[]> p = new KafkaProducer<>(pp, new ByteArraySerializer(),
                new ByteArraySerializer())) {
            for (int i = from; i < to; i++) {
                String key = KEYS.get(i % 2);
                long t = T0 + 1000L * i;
                double flow = 80 + 10 * rnd.nextGaussian();
                double pressure = 400 + 20 * rnd.nextGaussian();
                double speed = 1450 + 5 * rnd.nextGaussian();
                double current = 2 * flow - 0.5 * pressure + 0.5 * rnd.nextGaussian();
                String json = String.format(Locale.ROOT, "{\"station\":\"%s\",\"time\":%d,\"flow\":%s,"
                        + "\"pressure\":%s,\"speed\":%s,\"current\":%s}", key, t, flow, pressure, speed, current);
                p.send(new ProducerRecord<>(input, 0, key.getBytes(StandardCharsets.UTF_8),
                        json.getBytes(StandardCharsets.UTF_8))).get();
                keyAt.add(key);
                timeAt.add(t);
            }
        }
    }

    private void awaitCommitted(long offset) throws Exception {
        StageTestKit.awaitCommitted(group, Map.of(new TopicPartition(input, 0), offset), new AtomicReference<>(),
                Duration.ofSeconds(90), "; see " + dir.resolve("stage.log"));
    }

    private ClusterClients clients() {
        return ClusterClients.of(Map.of("bootstrap.servers", TestKafka.bootstrapServers()), "audit-it");
    }

    private Auditor auditor(StageConfig c) {
        return new Auditor(clients(), c, dir, TIMEOUT, Progress.NONE);
    }

    private List<PublishedVersion> read(String topic) {
        try (Consumer<byte[], byte[]> c = clients().consumer()) {
            return new ModelTopicReader(c, TIMEOUT).read(topic, k -> true).versions();
        }
    }

    private KeyHistory history(String key) {
        return KeyHistory.of(key, published);
    }

    private PublishedVersion withFeatures(String key) {
        return history(key).versions().stream().filter(v -> !v.record().getFeatures().isEmpty()).findFirst()
                .orElseThrow();
    }

    /** A new model topic holding every published version, with {@code target} altered by {@code change}. */
    private String copyWith(PublishedVersion target, Function<ModelVersion, ModelVersion> change) throws Exception {
        String topic = TestKafka.uniqueTopic("audit-altered");
        TestKafka.createTopic(topic, 1, Map.of());
        try (Producer<byte[], byte[]> p = clients().producer()) {
            for (PublishedVersion v : published) {
                ModelVersion mv = v.record();
                if (v.key().equals(target.key()) && v.version() == target.version()) {
                    mv = change.apply(mv);
                }
                p.send(new ProducerRecord<>(topic, v.key().getBytes(StandardCharsets.UTF_8), bytes(mv))).get();
            }
        }
        return topic;
    }

    private VersionVerdict single(String topic, PublishedVersion target) {
        AuditReport r = auditor(stageConfig).audit(topic, AuditScope.of(target.key(), target.version(),
                Long.MIN_VALUE, Long.MAX_VALUE));
        assertEquals(1, r.verdicts().size());
        assertFalse(r.passed());
        return r.verdicts().get(0);
    }

    private static List<String> fields(VersionVerdict v) {
        return v.differences().stream().map(d -> d.field()).collect(Collectors.toList());
    }

    private static List<String> fieldNames(Recomputer.Recomputed r) {
        return r.differences().stream().map(d -> d.field()).collect(Collectors.toList());
    }

    private static byte[] bytes(ModelVersion mv) throws IOException {
        ByteBuffer b = mv.toByteBuffer();
        byte[] out = new byte[b.remaining()];
        b.get(out);
        return out;
    }

    private static Set<String> names(ModelVersion v) {
        Set<String> s = new HashSet<>();
        v.getFeatures().forEach(f -> s.add(f.getName()));
        return s;
    }

    private static Set<String> difference(Set<String> a, Set<String> b) {
        Set<String> s = new HashSet<>(a);
        s.removeAll(b);
        return s;
    }

    private static Set<String> strings(JsonNode array) {
        Set<String> s = new HashSet<>();
        array.forEach(n -> s.add(n.asText()));
        return s;
    }

    private static int cli(StringWriter out, String... args) {
        CommandLine cl = new CommandLine(new Main());
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(new StringWriter(), true));
        return cl.execute(args);
    }
}

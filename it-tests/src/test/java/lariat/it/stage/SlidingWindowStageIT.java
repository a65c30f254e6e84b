package lariat.it.stage;

import lariat.it.support.StageTestKit;
import lariat.it.support.TestKafka;
import lariat.moments.PaneWindow;
import lariat.schema.ModelVersion;
import lariat.stage.DeadLetters;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.clients.producer.RecordMetadata;
import org.junit.jupiter.api.Test;

import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;

/**
 * The stage with a sliding event-time window against a real broker (TestKafka): one station's readings
 * in event-time order with some records far older than the window in between. Every record older than
 * the window must be a dead letter with reason TOO_LATE_FOR_WINDOW, and every published version's
 * moments fingerprint must equal an offline {@link PaneWindow} fed the same records in the same order
 * up to the version's end offset.
 */
class SlidingWindowStageIT {

    private static final String[] FEATURES = {"flow_m3h", "suction_kpa", "discharge_kpa"};
    private static final String TARGET = "motor_current_a";
    private static final long PANE_MS = 10_000L;
    private static final int PANES = 6;
    private static final int RECORDS = 600;
    private static final Duration WAIT = Duration.ofSeconds(90);

    @Test
    void run_windowWithLateRecords_lateAreDeadLetteredAndFingerprintsEqualOfflineWindow() throws Exception {
        String input = TestKafka.uniqueTopic("window-in");
        String models = TestKafka.uniqueTopic("window-models");
        String deadLetters = TestKafka.uniqueTopic("window-dlq");
        TestKafka.createTopic(input, 1, Map.of());
        Map<String, String> props = config(input, models, deadLetters);

        List<long[]> sentTimesAndOffsets = new ArrayList<>();
        List<double[]> sentRows = new ArrayList<>();
        Set<Long> lateOffsets = new TreeSet<>();
        Random rnd = new Random(20240701L);
        long t0 = 1_700_000_000_000L;
        try (KafkaProducer<byte[], byte[]> producer = new KafkaProducer<>(TestKafka.producerProperties())) {
            for (int i = 0; i < RECORDS; i++) {
                double[] z = new double[FEATURES.length + 1];
                double y = 5.0;
                for (int j = 0; j < FEATURES.length; j++) {
                    z[j] = 20.0 * (j + 1) + rnd.nextGaussian();
                    y += (j + 1) * z[j];
                }
                z[FEATURES.length] = y + 0.1 * rnd.nextGaussian();
                boolean late = i > 100 && i % 37 == 0;
                long t = late ? t0 + 1000L * i - (PANES + 2) * PANE_MS : t0 + 1000L * i;
                RecordMetadata md = producer.send(new ProducerRecord<>(input,
                        "south-01".getBytes(StandardCharsets.UTF_8), reading("south-01", t, z))).get();
                sentTimesAndOffsets.add(new long[] {t, md.offset()});
                sentRows.add(z);
                if (late) {
                    lateOffsets.add(md.offset());
                }
            }
        }
        StageTestKit.runUntilConsumed(props, input, WAIT);

        List<ConsumerRecord<byte[], byte[]>> dls = StageTestKit.readCommitted(deadLetters, WAIT);
        Set<Long> dlOffsets = new TreeSet<>();
        for (ConsumerRecord<byte[], byte[]> d : dls) {
            assertEquals(DeadLetters.TOO_LATE_FOR_WINDOW, StageTestKit.header(d, DeadLetters.REASON),
                    "reason of a late record");
            dlOffsets.add(Long.parseLong(StageTestKit.header(d, DeadLetters.SOURCE_OFFSET)));
        }
        assertFalse(lateOffsets.isEmpty(), "the scenario sends late records");
        assertEquals(lateOffsets, dlOffsets, "exactly the late records are dead letters");

        List<ModelVersion> versions = readModels(models);
        assertFalse(versions.isEmpty(), "a version is published");
        for (int v = 0; v < versions.size(); v++) {
            ModelVersion mv = versions.get(v);
            assertEquals(v + 1, mv.getVersion(), "versions contiguous from 1");
            PaneWindow offline = new PaneWindow(FEATURES.length + 1, PANE_MS, PANES);
            for (int i = 0; i < sentRows.size(); i++) {
                long[] to = sentTimesAndOffsets.get(i);
                if (to[1] < mv.getInputEndOffset()) {
                    offline.add(sentRows.get(i), 1.0, to[0]);
                }
            }
            assertEquals(offline.merged().fingerprint(), mv.getMomentsFingerprint(),
                    "v" + mv.getVersion() + " fingerprint of the window's merged moments");
        }
    }

    private static Map<String, String> config(String input, String models, String deadLetters) {
        Map<String, String> p = new TreeMap<>();
        StageTestKit.stationInput(p, input, List.of(FEATURES), TARGET);
        p.put("window.pane.ms", Long.toString(PANE_MS));
        p.put("window.panes", Integer.toString(PANES));
        p.put("refit.every.records", "100");
        p.put("cycle.interval.ms", "100");
        p.put("select.rule", "bic");
        StageTestKit.outputTopics(p, models, input + "-alerts", input + "-snapshots", deadLetters);
        p.put("stage.id", input + "-stage");
        p.put("metrics.port", "0");
        p.put("shutdown.timeout.ms", "10000");
        p.put("consumer.max.poll.records", "53");
        return p;
    }

    private static byte[] reading(String station, long t, double[] z) {
        return StageTestKit.reading(station, t, StageTestKit.channels(FEATURES, TARGET, z), 1.0);
    }

    private static List<ModelVersion> readModels(String topic) throws Exception {
        List<ModelVersion> out = new ArrayList<>();
        for (ConsumerRecord<byte[], byte[]> r : StageTestKit.readCommitted(topic, WAIT)) {
            out.add(StageTestKit.model(r.value()));
        }
        return out;
    }
}

package lariat.it.stage;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.Random;
import java.util.TreeMap;

import lariat.it.support.StageTestKit;
import lariat.it.support.StageTestKit.InProcessStage;
import lariat.it.support.TestKafka;
import lariat.schema.ModelVersion;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.OffsetAndMetadata;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.common.TopicPartition;
import org.junit.jupiter.api.Test;

/**
 * When an operator moves a stopped stage's committed offset on purpose (here forward, to skip part of a
 * backlog), its next restore finds a snapshot whose position is not the committed offset. The stage waits
 * up to {@code restore.timeout.ms} for a newer snapshot (an open transaction could still hide one), then
 * resumes at the committed offset with the snapshot it has. It counts that restore in
 * {@code lariat_restore_offset_mismatches_total}, and the published model then counts exactly the records
 * before the snapshot and from the new offset on; the skipped ones are in no moments.
 */
class OffsetsMovedOnPurposeAreCountedIT {

    private static final List<String> FEATURES = List.of("flow_m3h", "suction_kpa", "discharge_kpa");
    private static final String TARGET = "motor_current_a";
    private static final String STATION = "north-03";
    private static final int FIRST = 300;
    private static final int SECOND = 400;
    private static final int SKIPPED = 150;
    private static final Duration WAIT = Duration.ofSeconds(120);

    @Test
    void committedOffsetMovedForward_restoreCountedAndSkippedRecordsLeftOut() throws Exception {
        String input = TestKafka.uniqueTopic("moved-in");
        TestKafka.createTopic(input, 1, Map.of());
        String models = TestKafka.uniqueTopic("moved-models");
        Map<String, String> props = new TreeMap<>();
        StageTestKit.stationInput(props, input, FEATURES, TARGET);
        StageTestKit.outputTopics(props, models, input + "-alerts", input + "-snapshots", input + "-dlq");
        props.put("stage.id", input + "-stage");
        props.put("refit.every.records", "1");
        props.put("cycle.interval.ms", "200");
        props.put("metrics.port", "0");
        props.put("transaction.timeout.ms", "5000");
        props.put("restore.timeout.ms", "20000");
        Random rnd = new Random(20261202L);
        try (KafkaProducer<byte[], byte[]> producer = new KafkaProducer<>(TestKafka.producerProperties())) {
            send(producer, input, rnd, 0, FIRST);
            StageTestKit.runUntilConsumed(props, input, WAIT);
            send(producer, input, rnd, FIRST, SECOND);
        }
        TopicPartition tp = new TopicPartition(input, 0);
        try (Admin admin = Admin.create(TestKafka.adminProperties())) {
            admin.alterConsumerGroupOffsets(props.get("stage.id"),
                    Map.of(tp, new OffsetAndMetadata(FIRST + SKIPPED))).all().get();
        }
        InProcessStage stage = InProcessStage.start(props);
        stage.awaitConsumed(input, WAIT);
        assertEquals(1, stage.metrics().restoreOffsetMismatches(), "one partition restored behind its offset");
        stage.stop();
        ModelVersion last = null;
        for (ConsumerRecord<byte[], byte[]> r : StageTestKit.readCommitted(models, Duration.ofSeconds(10))) {
            ModelVersion m = StageTestKit.model(r.value());
            if (last == null || m.getVersion() > last.getVersion()) {
                last = m;
            }
        }
        assertEquals(FIRST + SECOND, last.getInputEndOffset(), "the last model covers the input's end");
        assertEquals(FIRST + SECOND - SKIPPED, last.getRecordCount(),
                "the records before the snapshot and after the moved offset, none of the skipped ones");
    }

    private static void send(KafkaProducer<byte[], byte[]> producer, String topic, Random rnd, int from, int count)
            throws Exception {
        String[] names = FEATURES.toArray(new String[0]);
        for (int i = from; i < from + count; i++) {
            double[] z = new double[names.length + 1];
            for (int j = 0; j < names.length; j++) {
                z[j] = rnd.nextGaussian();
            }
            z[names.length] = 2.0 * z[0] - z[1] + 0.1 * rnd.nextGaussian();
            StageTestKit.send(producer, topic, STATION, StageTestKit.reading(STATION, 1_700_000_000_000L + 60_000L * i,
                    StageTestKit.channels(names, TARGET, z), 1.0));
        }
        producer.flush();
    }
}

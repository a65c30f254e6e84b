package lariat.it.faults;

import lariat.it.support.StageProcess;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.Map;
import java.util.Properties;

import lariat.it.support.TestKafka;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.junit.jupiter.api.Test;

/**
 * A dead instance's open transaction does not make a restore lose records. An instance killed
 * inside its transaction, before the offsets were added, leaves that transaction open on the
 * snapshot topic until the coordinator aborts it after {@code transaction.timeout.ms}. Meanwhile
 * the partition's new owner commits snapshots behind it, which a read_committed reader cannot see
 * (its reads end at the last stable offset, held back by the open transaction), while the group
 * offsets, kept in another log, move on. A restore in that window (here: the owner is killed and
 * restarted) reads a stale snapshot; seeking to the newer committed offset would skip every
 * record in between.
 *
 * <p>The dead instance is played by a transactional producer of this JVM that opens a transaction
 * on snapshot partition 0 (one record under a key the stage ignores) and never ends it; its
 * transaction timeout is 12 s. Checked: versions 1..n and last moments equal to the offline
 * {@link MomentOracle}'s, bit for bit, for every station.
 */
class DeadInstanceOpenTransactionLosesNothingIT {

    private static final long SEED = 0x5EED_0006L;
    private static final int STATIONS = 6;
    private static final Duration STEP = Duration.ofSeconds(90);
    private static final Duration SETTLE = Duration.ofSeconds(90);

    @Test
    void restoreWhileDeadInstanceTransactionOpen_snapshotBehindOffsets_nothingSkipped() throws Exception {
        Map<String, String> member = Map.of("group.instance.id", "zombie-member-0");
        try (FaultRun run = FaultRun.create("zombie", 1, Map.of());
             ReadingFeeder feeder = ReadingFeeder.start(run, SEED, STATIONS, 60, 100_000)) {
            StageProcess stage = run.start("0", member);
            run.awaitProgress(run.committedInput(), STEP);
            Properties p = TestKafka.transactionalProducerProperties(run.name + "-dead-instance");
            p.setProperty(ProducerConfig.TRANSACTION_TIMEOUT_CONFIG, "12000");
            try (KafkaProducer<byte[], byte[]> dead = new KafkaProducer<>(p)) {
                dead.initTransactions();
                dead.beginTransaction();
                dead.send(new ProducerRecord<>(run.snapshots, 0, "x|dead".getBytes(StandardCharsets.UTF_8),
                        new byte[] {1}));
                dead.flush();
                Map<Integer, Long> ends = run.inputEnds();
                run.await("the stage commits past the dead instance's open transaction", STEP,
                        () -> run.committedPast(ends));
                stage.kill();
                stage = run.start("0", member);
                run.awaitProgress(run.committedInput(), STEP);
                feeder.finish();
                MomentOracle oracle = run.oracleFromInput();
                run.await("the last models cover every reading", SETTLE, () -> run.modelsCover(oracle.counts()));
                ExactlyOnce.assertHolds(run.modelsByKey(), oracle, run.logTails());
            }
        }
    }
}

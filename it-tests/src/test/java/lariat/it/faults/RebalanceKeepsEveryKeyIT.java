package lariat.it.faults;

import lariat.it.support.StageProcess;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;

import java.time.Duration;
import java.util.Map;
import java.util.Random;
import java.util.Set;

import org.junit.jupiter.api.Test;

/**
 * Rebalances keep every key. Two stage instances (child JVMs with distinct {@code stage.instance},
 * so distinct transactional ids) share a four-partition input; one is killed with SIGKILL and not
 * restarted, so its partitions move to the survivor once its session expires; then a third
 * instance joins and takes partitions from the survivor. Readings keep arriving throughout.
 * {@code transaction.timeout.ms} is 10 s: a killed instance's open transaction holds back every
 * read_committed reader of the partitions it wrote until the coordinator aborts it, and with the
 * 60 s default the run would mostly wait for that.
 *
 * <p>At the end the two live instances hold every partition, every station has models, each
 * station's versions are 1..n in order (monotonic, contiguous, across owners), and each last
 * model's moments fingerprint equals the offline {@link MomentOracle}'s, bit for bit.
 */
class RebalanceKeepsEveryKeyIT {

    private static final long SEED = 0x5EED_0002L;
    private static final int STATIONS = 10;
    private static final int PARTITIONS = 4;
    private static final Duration STEP = Duration.ofSeconds(90);
    private static final Duration SETTLE = Duration.ofSeconds(180);

    @Test
    void killOneAddOne_midRun_everyKeyKeepsContiguousVersionsAndOracleMoments() throws Exception {
        Random moments = new Random(SEED);
        try (FaultRun run = FaultRun.create("rebalance", PARTITIONS, Map.of("transaction.timeout.ms", "10000"));
             ReadingFeeder feeder = ReadingFeeder.start(run, SEED, STATIONS, 80, 100_000)) {
            StageProcess a = run.start("a");
            StageProcess b = run.start("b");
            run.await("instances a and b share the partitions", STEP, () -> run.assignments().size() == 2
                    && run.assignments().values().stream().noneMatch(Set::isEmpty));
            run.awaitProgress(run.committedInput(), STEP);
            Thread.sleep(moments.nextInt(2_000));
            a.kill();
            Map<Integer, Long> atKill = run.inputEnds();
            run.await("b alone commits past every record sent before a died", STEP,
                    () -> run.committedPast(atKill));
            StageProcess c = run.start("c");
            run.await("instances b and c share the partitions", STEP, () -> {
                Map<String, Set<Integer>> now = run.assignments();
                return now.keySet().equals(Set.of("b", "c")) && now.values().stream().noneMatch(Set::isEmpty);
            });
            Map<Integer, Long> atJoin = run.inputEnds();
            run.await("b and c commit past every record sent before c joined", STEP,
                    () -> run.committedPast(atJoin));
            feeder.finish();
            MomentOracle oracle = run.oracleFromInput();
            run.await("the last models cover every reading", SETTLE, () -> run.modelsCover(oracle.counts()));
            ExactlyOnce.assertHolds(run.modelsByKey(), oracle, run.logTails());
            assertEquals(PARTITIONS, run.assignments().values().stream().mapToInt(Set::size).sum(),
                    "the live instances hold every partition");
            assertFalse(a.alive(), "a stays dead");
        }
    }
}

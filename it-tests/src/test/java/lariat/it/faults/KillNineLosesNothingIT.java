package lariat.it.faults;

import lariat.it.support.StageProcess;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.Map;
import java.util.Random;

import org.junit.jupiter.api.Test;

/**
 * SIGKILL at random moments loses and duplicates nothing. The stage runs as a child JVM and is
 * killed with {@code kill -9} while a producer feeds readings of several stations over three
 * partitions, then restarted with the same {@code stage.instance} (the same transactional id fences
 * the dead one's open transaction, and static group membership hands the new process the
 * partitions at once). Each kill waits until the instance has committed at least one cycle, then a
 * seeded random delay of up to 3 s, so it lands in polling, refitting, inside the transaction or
 * between cycles, never only in JVM start-up.
 *
 * <p>At the end a read_committed reader must see, per station, versions 1..n with no gap or
 * duplicate, and a last model whose moments fingerprint equals the offline {@link MomentOracle}'s
 * for the same readings in partition order, bit for bit. {@code -Dlariat.soak=true} runs 40 kills.
 */
class KillNineLosesNothingIT {

    private static final long SEED = 0x5EED_0009L;
    private static final int KILLS = Boolean.getBoolean("lariat.soak") ? 40 : 6;
    private static final int STATIONS = 6;
    private static final Duration STEP = Duration.ofSeconds(90);
    private static final Duration SETTLE = Duration.ofSeconds(180);

    @Test
    void killNine_atRandomMomentsWhileProcessing_versionsContiguousAndMomentsEqualOracle() throws Exception {
        Random moments = new Random(SEED);
        Map<String, String> member = Map.of("group.instance.id", "kill-member-0");
        try (FaultRun run = FaultRun.create("kill", 3, Map.of());
             ReadingFeeder feeder = ReadingFeeder.start(run, SEED, STATIONS, 60, 100_000)) {
            StageProcess stage = run.start("0", member);
            for (int k = 0; k < KILLS; k++) {
                run.awaitProgress(run.committedInput(), STEP);
                Thread.sleep(moments.nextInt(3_000));
                stage.kill();
                stage = run.start("0", member);
            }
            feeder.finish();
            MomentOracle oracle = run.oracleFromInput();
            run.await("the last models cover every reading", SETTLE, () -> run.modelsCover(oracle.counts()));
            ExactlyOnce.assertHolds(run.modelsByKey(), oracle, run.logTails());
            assertTrue(stage.alive(), "the stage must still run\n" + run.logTails());
        }
    }
}

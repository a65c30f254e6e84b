package lariat.it.faults;

import lariat.it.support.StageProcess;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.time.Duration;
import java.util.Map;
import java.util.Random;
import java.util.Set;

import org.junit.jupiter.api.Test;

/**
 * A frozen instance that wakes up late commits nothing. Two instances share a four-partition
 * input; one is frozen with SIGSTOP (every thread stops: no heartbeats, no transaction progress)
 * at a seeded random moment after a committed cycle, and stays frozen past its session timeout
 * (6 s) and its transaction timeout (5 s, {@code transaction.timeout.ms} passed through to the
 * producer) until the other instance has taken its partitions and committed past every reading
 * sent before the freeze. Then it gets SIGCONT: whatever it had polled, refitted or opened belongs
 * to a group generation and a producer epoch that are gone, so its late transaction must be
 * refused or aborted (Kafka's group-metadata fencing of {@code sendOffsetsToTransaction} and
 * the coordinator's abort of timed-out transactions), and it must rejoin and work on. This is done
 * twice, freezing each instance once.
 *
 * <p>Checked through a read_committed reader: versions 1..n per station with no duplicate, and the
 * last model's moments fingerprint equal to the offline {@link MomentOracle}'s, bit for bit.
 */
class FencedInstanceCommitsNothingIT {

    private static final long SEED = 0x5EED_0003L;
    private static final int STATIONS = 10;
    private static final Duration FROZEN_AT_LEAST = Duration.ofSeconds(12);
    private static final Duration STEP = Duration.ofSeconds(90);
    private static final Duration SETTLE = Duration.ofSeconds(180);

    @Test
    void sigstopPastTimeouts_thenSigcont_lateTransactionFencedAndNothingDuplicated() throws Exception {
        Random moments = new Random(SEED);
        Map<String, String> timeouts = Map.of("transaction.timeout.ms", "5000");
        try (FaultRun run = FaultRun.create("fence", 4, timeouts);
             ReadingFeeder feeder = ReadingFeeder.start(run, SEED, STATIONS, 80, 100_000)) {
            Map<String, StageProcess> stages = Map.of("a", run.start("a"), "b", run.start("b"));
            awaitBothWorking(run);
            for (String frozen : new String[] {"a", "b"}) {
                run.awaitProgress(run.committedInput(), STEP);
                Thread.sleep(moments.nextInt(1_000));
                StageProcess f = stages.get(frozen);
                f.pause();
                long frozenAt = System.nanoTime();
                Map<Integer, Long> atFreeze = run.inputEnds();
                run.await("the other instance holds every partition and commits past the freeze", STEP,
                        () -> run.assignments().keySet().equals(Set.of(other(frozen)))
                                && run.committedPast(atFreeze));
                long left = FROZEN_AT_LEAST.toMillis() - (System.nanoTime() - frozenAt) / 1_000_000;
                if (left > 0) {
                    Thread.sleep(left);
                }
                f.resume();
                awaitBothWorking(run);
            }
            feeder.finish();
            MomentOracle oracle = run.oracleFromInput();
            run.await("the last models cover every reading", SETTLE, () -> run.modelsCover(oracle.counts()));
            ExactlyOnce.assertHolds(run.modelsByKey(), oracle, run.logTails());
            assertTrue(stages.values().stream().allMatch(StageProcess::alive), "both instances still run");
        }
    }

    private static String other(String instance) {
        return instance.equals("a") ? "b" : "a";
    }

    private static void awaitBothWorking(FaultRun run) throws InterruptedException {
        run.await("instances a and b share the partitions", STEP, () -> {
            Map<String, Set<Integer>> now = run.assignments();
            return now.keySet().equals(Set.of("a", "b")) && now.values().stream().noneMatch(Set::isEmpty);
        });
        Map<Integer, Long> ends = run.inputEnds();
        run.await("a and b commit past every reading sent so far", STEP, () -> run.committedPast(ends));
    }
}

package lariat.it.faults;

import lariat.it.support.StageProcess;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.time.Duration;
import java.util.Map;
import java.util.Optional;
import java.util.Random;

import lariat.broker.EmbeddedBroker;
import lariat.it.support.TestKafka;
import org.junit.jupiter.api.Test;

/**
 * The stage rides out broker restarts. While the stage runs as a child JVM and readings keep
 * arriving, the embedded broker is stopped (its data kept) and restarted on the same ports, twice:
 * a short outage of 2 to 6 s and a long one of 15 to 20 s (seeded), each at a moment after a
 * committed cycle. The stage's clients see refused connections, timeouts and coordinators
 * reloading their state from the logs; it must come back without a restart of its own. The
 * producer's {@code max.block.ms} is 5 s, shorter than the long outage, so a commit times out (a
 * fatal error: its outcome is unknown) and the new producer's {@code initTransactions} times out
 * too while the broker is down: the stage must keep retrying rather than exit (it used to exit).
 * A coordinator still loading after the restart can hold back the committed-offset fetch of a
 * restore; {@code restore.timeout.ms} is 30 s here (the transaction timeout is 15 s, and the restore
 * must wait 15 s longer), so that the stage gives up on such a restore and starts new clients well
 * within the test's wait.
 *
 * <p>Checked afterwards through a read_committed reader: versions 1..n per station and last models
 * whose moments fingerprints equal the offline {@link MomentOracle}'s, bit for bit. Needs the
 * embedded broker (skipped on a container or an external cluster, which a test cannot restart).
 */
class BrokerRestartRecoversIT {

    private static final long SEED = 0x5EED_0005L;
    private static final int STATIONS = 6;
    private static final Duration STEP = Duration.ofSeconds(120);
    private static final Duration SETTLE = Duration.ofSeconds(180);

    @Test
    void brokerStopAndRestart_outageLongerThanMaxBlockMs_stageRecreatesClientsAndLosesNothing() throws Exception {
        Optional<EmbeddedBroker> embedded = TestKafka.embeddedBroker();
        assumeTrue(embedded.isPresent(), "needs the embedded broker, which the test can stop and restart");
        EmbeddedBroker broker = embedded.get();
        Random moments = new Random(SEED);
        long[] outagesMs = {2_000 + moments.nextInt(4_000), 15_000 + moments.nextInt(5_000)};
        try (FaultRun run = FaultRun.create("restart", 3, Map.of("producer.max.block.ms", "5000",
                "transaction.timeout.ms", "15000", "restore.timeout.ms", "30000"));
             ReadingFeeder feeder = ReadingFeeder.start(run, SEED, STATIONS, 60, 100_000)) {
            StageProcess stage = run.start("0");
            for (long outage : outagesMs) {
                run.awaitProgress(run.committedInput(), STEP);
                Thread.sleep(moments.nextInt(1_000));
                broker.stop();
                Thread.sleep(outage);
                broker.restart();
                Map<Integer, Long> ends = run.inputEnds();
                run.await("the stage commits past every reading sent before the restart", STEP,
                        () -> run.committedPast(ends));
            }
            feeder.finish();
            MomentOracle oracle = run.oracleFromInput();
            run.await("the last models cover every reading", SETTLE, () -> run.modelsCover(oracle.counts()));
            ExactlyOnce.assertHolds(run.modelsByKey(), oracle, run.logTails());
            assertTrue(stage.alive(), "the stage must still run\n" + run.logTails());
        }
    }
}

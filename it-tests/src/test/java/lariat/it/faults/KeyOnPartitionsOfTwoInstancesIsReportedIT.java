package lariat.it.faults;

import static lariat.it.faults.KeyClaimChecks.assertFromPartition;
import static lariat.it.faults.KeyClaimChecks.assertOwnedElsewhere;
import static lariat.it.faults.KeyClaimChecks.sendSt00;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;

import java.time.Duration;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.Future;

import lariat.it.support.StageTestKit.InProcessStage;
import lariat.schema.ModelVersion;
import lariat.stage.DeadLetters;
import org.apache.kafka.clients.producer.RecordMetadata;
import org.junit.jupiter.api.Test;

/**
 * A model key sent to two input partitions that two stage instances own is reported, not modelled
 * twice. Two instances in one group share a two-partition input, one partition each. Station st-00
 * is sent to partition 0 (with st-01) until its owner has published models, and the other instance
 * has read st-00's claim; then st-00 is sent to partition 1 (with st-02, and more st-01 on 0).
 *
 * <p>Checked: every st-00 record of partition 1 is a dead letter with reason KEY_ON_TWO_PARTITIONS
 * naming partition 0 as the owner; st-00's versions all come from partition 0, numbered 1..n, the last
 * covering its partition-0 records; st-01 and st-02 keep every record; the claims topic holds one claim
 * per (key, partition) pair that holds a state, st-00's by the owner of partition 0; no state was dropped.
 */
class KeyOnPartitionsOfTwoInstancesIsReportedIT {

    private static final long SEED = 0x5EED_0011L;
    private static final Duration STEP = Duration.ofSeconds(90);
    private static final int FIRST = 40;
    private static final int SECOND = 30;
    private static final int OTHERS = 10;

    @Test
    void keyOnSecondPartition_ownedByOtherInstance_deadLetteredAndModelledFromFirstOnly() throws Exception {
        StationFeed feed = StationFeed.of(SEED, 3);
        try (FaultRun run = FaultRun.create("two-owners", 2, Map.of())) {
            InProcessStage a = InProcessStage.start(run.config("a"));
            InProcessStage b = InProcessStage.start(run.config("b"));
            try {
                run.await("instances a and b own one partition each", STEP, () -> {
                    Map<String, Set<Integer>> now = run.assignments();
                    return now.size() == 2 && now.values().stream().allMatch(p -> p.size() == 1);
                });
                Map<String, Set<Integer>> owners = run.assignments();
                String ownerOf0 = owners.get("a").contains(0) ? "a" : "b";
                InProcessStage other = ownerOf0.equals("a") ? b : a;

                sendSt00(run, feed, 0, FIRST, OTHERS, true);
                run.await("st-00 modelled from partition 0 and its claim read by the owner of partition 1", STEP,
                        () -> other.metrics().keyClaims() == 3 && covered(run, "st-00", FIRST));

                List<Future<RecordMetadata>> stray = sendSt00(run, feed, 1, SECOND, OTHERS, true);
                a.awaitConsumed(run.input, STEP);

                assertOwnedElsewhere(run, "st-00", 1, KeyClaimChecks.offsets(stray), 0);
                Map<String, List<ModelVersion>> models = KeyClaimChecks.models(run);
                assertFromPartition(models.get("st-00"), 0, FIRST);
                assertFromPartition(models.get("st-01"), 0, 2 * OTHERS);
                assertFromPartition(models.get("st-02"), 1, 2 * OTHERS);
                List<String> claims = KeyClaimChecks.claims(run);
                String id0 = run.name + "-" + ownerOf0;
                String id1 = run.name + "-" + (ownerOf0.equals("a") ? "b" : "a");
                assertEquals(Set.of("st-00@0 by " + id0, "st-01@0 by " + id0, "st-02@1 by " + id1), Set.copyOf(claims));
                assertEquals(3, claims.size(), "one claim per pair: " + claims);
                assertEquals(SECOND, other.metrics().rejectedCount(DeadLetters.KEY_ON_TWO_PARTITIONS));
                assertEquals(0, a.metrics().keyClaimConflicts() + b.metrics().keyClaimConflicts(),
                        "the claim was known before the stray records came: no state to drop");
                assertEquals(owners, run.assignments(), "no rebalance during the run");
                assertNull(a.failure());
                assertNull(b.failure());
            } finally {
                a.stop();
                b.stop();
            }
        }
    }

    /** Whether {@code key}'s last committed version covers {@code records} records. */
    private static boolean covered(FaultRun run, String key, long records) {
        try {
            List<ModelVersion> v = KeyClaimChecks.models(run).get(key);
            return v != null && v.get(v.size() - 1).getRecordCount() == records;
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }
}

package lariat.it.faults;

import static lariat.it.faults.KeyClaimChecks.assertFromPartition;
import static lariat.it.faults.KeyClaimChecks.assertOwnedElsewhere;
import static lariat.it.faults.KeyClaimChecks.sendSt00;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.time.Instant;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.concurrent.Future;

import lariat.it.support.StageTestKit.InProcessStage;
import lariat.it.support.TestKafka;
import lariat.schema.KeyClaim;
import lariat.schema.ModelVersion;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.clients.producer.RecordMetadata;
import org.junit.jupiter.api.Test;

/**
 * Two instances that start the same model key on two partitions at about the same time end with one
 * owner: the partition whose claim is earlier on the claims topic. The race is made deterministic with
 * a real transaction: a second writer (a transactional producer standing in for the instance owning
 * partition 0) writes the claim of st-00 on partition 0 and leaves its transaction open; the stage,
 * owning both partitions, then starts st-00 from records sent to partition 1 and commits its own claim,
 * which lands after the open one. Its read_committed claims reader sees neither until the second writer
 * commits; then it reads partition 0's claim first.
 *
 * <p>The second writer's transaction also holds a claim of st-01 on partition 1 for another input
 * topic, and a record on st-01's claim key that is no claim: if either counted, st-01 would be dropped
 * from partition 0, or the stage would stop.
 *
 * <p>Checked: the stage counts one conflict and drops st-00 from partition 1 (its snapshot there ends
 * in a tombstone), later st-00 records of partition 1 are dead letters naming partition 0; the versions
 * st-00 got from partition 1 before the drop stay numbered 1..n and none covers a later record; st-01
 * and st-02 keep every record; the stage still runs.
 */
class RacedKeyClaimDropsTheLaterPartitionIT {

    private static final long SEED = 0x5EED_0012L;
    private static final Duration STEP = Duration.ofSeconds(90);
    private static final int BEFORE = 20;
    private static final int AFTER = 15;
    private static final int OTHERS = 10;

    @Test
    void keyClaimedEarlierByOtherPartition_laterPartitionDropsItsStateAndDeadLettersTheRest() throws Exception {
        StationFeed feed = StationFeed.of(SEED, 3);
        try (FaultRun run = FaultRun.create("raced-claim", 2, Map.of());
             KafkaProducer<byte[], byte[]> rival = new KafkaProducer<>(
                     TestKafka.transactionalProducerProperties("raced-claim-rival"))) {
            InProcessStage stage = InProcessStage.start(run.config("0"));
            try {
                run.await("the stage owns both partitions", STEP,
                        () -> run.assignments().equals(Map.of("0", Set.of(0, 1))));
                rival.initTransactions();
                rival.beginTransaction();
                rival.send(new ProducerRecord<>(run.claims, 0, utf8(run.input + "|0|st-00"),
                        claim(run.input, "st-00", 0, "raced-claim-rival"))).get();
                String foreign = run.input + ".other";
                rival.send(new ProducerRecord<>(run.claims, 0, utf8(foreign + "|1|st-01"),
                        claim(foreign, "st-01", 1, "raced-claim-rival"))).get();
                rival.send(new ProducerRecord<>(run.claims, 0, utf8(run.input + "|1|st-01"),
                        utf8("not a claim"))).get();

                sendSt00(run, feed, 1, BEFORE, OTHERS, false);
                stage.awaitConsumed(run.input, STEP);
                assertEquals(0, stage.metrics().keyClaims(), "the open claim holds the claims reader back");
                assertFromPartition(KeyClaimChecks.models(run).get("st-00"), 1, BEFORE);

                rival.commitTransaction();
                run.await("the stage counts the conflict", STEP, () -> stage.metrics().keyClaimConflicts() == 1);

                List<Future<RecordMetadata>> stray = sendSt00(run, feed, 1, AFTER, OTHERS, true);
                stage.awaitConsumed(run.input, STEP);

                assertOwnedElsewhere(run, "st-00", 1, KeyClaimChecks.offsets(stray), 0);
                Map<String, List<ModelVersion>> models = KeyClaimChecks.models(run);
                assertFromPartition(models.get("st-00"), 1, BEFORE);
                assertFromPartition(models.get("st-01"), 0, 2 * OTHERS);
                assertFromPartition(models.get("st-02"), 1, OTHERS);
                assertTrue(lastManifestIsTombstone(run, 1, "st-00"), "st-00's snapshot on partition 1 is tombstoned");
                assertEquals(1, stage.metrics().keyClaimConflicts(), "one conflict, counted once");
                assertEquals(4, stage.metrics().keyClaims(), "st-00 on 0 and 1, st-01 on 0, st-02 on 1; the claim of "
                        + "another input topic and the record that is no claim are passed over");
                assertTrue(stage.metrics().render().contains("\nlariat_key_claim_conflicts_total 1\n"));
                assertNull(stage.failure());
            } finally {
                stage.stop();
            }
        }
    }

    private static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }

    /** The rival's claim, encoded as the stage encodes its own. */
    private static byte[] claim(String input, String key, int partition, String claimedBy) throws Exception {
        ByteBuffer b = KeyClaim.newBuilder().setKey(key).setInputTopic(input).setInputPartition(partition)
                .setClaimedBy(claimedBy).setFirstOffset(null).setClaimedAtMs(Instant.now()).build().toByteBuffer();
        byte[] out = new byte[b.remaining()];
        b.get(out);
        return out;
    }

    /** Whether the last committed record of {@code key}'s snapshot manifest on {@code partition} is a tombstone. */
    private static boolean lastManifestIsTombstone(FaultRun run, int partition, String key) {
        byte[] manifestKey = utf8("m|" + key);
        ConsumerRecord<byte[], byte[]> last = null;
        for (ConsumerRecord<byte[], byte[]> r : run.readAll(run.snapshots)) {
            if (r.partition() == partition && java.util.Arrays.equals(r.key(), manifestKey)) {
                last = r;
            }
        }
        return last != null && last.value() == null;
    }
}

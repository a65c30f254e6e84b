package lariat.it.faults;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.Future;

import lariat.codec.SchemaTrust;
import lariat.it.support.StageTestKit;
import lariat.schema.KeyClaim;
import lariat.schema.ModelVersion;
import lariat.stage.DeadLetters;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.producer.RecordMetadata;

/** What the key-claim integration tests read back: models with their input partition, dead letters, claims. */
final class KeyClaimChecks {

    private KeyClaimChecks() {
    }

    /** The committed model versions of {@code run}, per key, each key's in offset order. */
    static Map<String, List<ModelVersion>> models(FaultRun run) throws IOException {
        Map<String, List<ModelVersion>> out = new TreeMap<>();
        for (ConsumerRecord<byte[], byte[]> r : run.readAll(run.models)) {
            ModelVersion mv = StageTestKit.model(r.value());
            out.computeIfAbsent(mv.getKey(), k -> new ArrayList<>()).add(mv);
        }
        return out;
    }

    /** Every committed claim of {@code run}'s claims topic, as "key@partition by claimedBy", in topic order. */
    static List<String> claims(FaultRun run) throws IOException {
        SchemaTrust.ensure();
        List<String> out = new ArrayList<>();
        for (ConsumerRecord<byte[], byte[]> r : run.readAll(run.claims)) {
            KeyClaim c = KeyClaim.fromByteBuffer(ByteBuffer.wrap(r.value()));
            out.add(c.getKey() + "@" + c.getInputPartition() + " by " + c.getClaimedBy());
        }
        return out;
    }

    /**
     * Sends {@code count} readings of st-00 to input {@code partition}; after each of the first
     * {@code neighbours} also one of st-01 to partition 0 and, when {@code withSt02}, one of st-02 to
     * partition 1. Flushes, and returns the sends of st-00.
     */
    static List<Future<RecordMetadata>> sendSt00(FaultRun run, StationFeed feed, int partition, int count,
                                                 int neighbours, boolean withSt02) {
        List<Future<RecordMetadata>> out = new ArrayList<>();
        for (int i = 0; i < count; i++) {
            out.add(run.sendTo(partition, feed.nextFor("st-00")));
            if (i < neighbours) {
                run.sendTo(0, feed.nextFor("st-01"));
                if (withSt02) {
                    run.sendTo(1, feed.nextFor("st-02"));
                }
            }
        }
        run.flush();
        return out;
    }

    /** The offsets the broker gave the records sent. */
    static List<Long> offsets(List<Future<RecordMetadata>> sent) throws Exception {
        List<Long> out = new ArrayList<>();
        for (Future<RecordMetadata> f : sent) {
            out.add(f.get().offset());
        }
        return out;
    }

    /**
     * Requires the dead letters of {@code run} to be exactly the records of {@code key} at
     * {@code offsets} of input {@code partition}, each with reason KEY_ON_TWO_PARTITIONS and a detail
     * naming {@code owner} as the owning partition.
     */
    static void assertOwnedElsewhere(FaultRun run, String key, int partition, List<Long> offsets, int owner) {
        List<ConsumerRecord<byte[], byte[]>> dead = run.readAll(run.deadLetters);
        List<Long> deadOffsets = new ArrayList<>();
        for (ConsumerRecord<byte[], byte[]> r : dead) {
            assertEquals(key, new String(r.key(), StandardCharsets.UTF_8), "dead letter key");
            assertEquals(DeadLetters.KEY_ON_TWO_PARTITIONS, StageTestKit.header(r, DeadLetters.REASON));
            assertEquals(Integer.toString(partition), StageTestKit.header(r, DeadLetters.SOURCE_PARTITION));
            String detail = StageTestKit.header(r, DeadLetters.DETAIL);
            assertTrue(detail.contains("owned elsewhere") && detail.contains("input partition " + owner + " claimed"),
                    detail);
            deadOffsets.add(Long.parseLong(StageTestKit.header(r, DeadLetters.SOURCE_OFFSET)));
        }
        assertEquals(offsets, deadOffsets, "exactly the records of " + key + " on partition " + partition);
    }

    /**
     * Requires {@code versions} to come from input {@code partition} alone, numbered 1..n in order, the
     * last covering {@code records} records.
     */
    static void assertFromPartition(List<ModelVersion> versions, int partition, long records) {
        for (int i = 0; i < versions.size(); i++) {
            ModelVersion mv = versions.get(i);
            assertEquals(partition, mv.getInputPartition(), "version " + mv.getVersion() + " of " + mv.getKey());
            assertEquals(i + 1, mv.getVersion(), "versions of " + mv.getKey() + " are contiguous from 1");
        }
        assertEquals(records, versions.get(versions.size() - 1).getRecordCount(), "records in the last version");
    }
}

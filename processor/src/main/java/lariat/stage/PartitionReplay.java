package lariat.stage;

import lariat.codec.KeyLayouts;
import lariat.codec.RecordDecoder;
import lariat.config.StageConfig;
import org.apache.kafka.clients.producer.ProducerRecord;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;

/**
 * One input partition replayed through the stage's own code: every record goes through
 * {@link RecordRouter} (decoding, validation, routing, moments) and every refit through
 * {@link PathRefitter} with the {@link RefitRecipe} and {@link ModelRecords} the configuration
 * describes, exactly as {@link StageAssembly} wires the stage. What the caller decides is only
 * where the refits fall (after which offset) and the wall-clock time they record; by the
 * invariant that a model version is a function of the configuration and its key's ordered
 * records, replaying a partition from its beginning and refitting at a version's recorded end
 * offset reproduces that version.
 *
 * <p>One partition only: a key that the stage saw first on another partition, or that the claims
 * topic gives to another partition, is not rejected here as the stage would (the stage requires the
 * input to be partitioned by model key). Not thread-safe.
 */
public final class PartitionReplay {

    /** What became of one replayed record. */
    public enum Routed { ACCEPTED, SKIPPED, REJECTED }

    private final int partition;
    private final RecordRouter router;
    private final PathRefitter refitter;
    private final PartitionStates states = new PartitionStates();
    private final KeyLayouts layouts = KeyLayouts.create();
    private long wallClockMs;

    private PartitionReplay(int partition, RecordRouter router, RefitRecipe recipe, ModelRecords records,
                            StageSettings s) {
        this.partition = partition;
        this.router = router;
        this.refitter = new PathRefitter(recipe, records, s, () -> wallClockMs, new StageMetrics());
    }

    /**
     * A replay of input {@code partition} under configuration {@code c}; relative schema files
     * resolve against {@code baseDir}.
     *
     * @throws IllegalArgumentException naming the key when the stage could not run this configuration
     */
    public static PartitionReplay create(StageConfig c, Path baseDir, int partition) {
        if (partition < 0) {
            throw new IllegalArgumentException("partition must be >= 0, was " + partition);
        }
        if (c.get(StageConfig.WINDOW_PANE_MS) > 0) {
            throw new IllegalArgumentException(StageConfig.WINDOW_PANE_MS.name()
                    + ": sliding windows are not supported by the stage, got " + c.get(StageConfig.WINDOW_PANE_MS));
        }
        StageSettings s = StageAssembly.settings(c);
        RecordDecoder decoder = RecordDecoder.create(c, baseDir);
        RecordRouter router = new RecordRouter(c.get(StageConfig.FIELD_TARGET), decoder::decodeInto, s,
                RecordRouter.Ownership.ANY);
        ModelRecords records = new ModelRecords(s.inputTopic(), c.configHash(), StageAssembly.buildVersion());
        return new PartitionReplay(partition, router, RefitRecipe.of(c), records, s);
    }

    /** Routes the record at {@code offset}, as the stage loop does. */
    public Routed offer(long offset, byte[] recordKey, byte[] value, long timestampMs) {
        RecordRouter.Outcome o = router.route(states, layouts, partition, offset, recordKey, value, timestampMs);
        switch (o.kind) {
            case ACCEPTED:
                return Routed.ACCEPTED;
            case SKIPPED:
                return Routed.SKIPPED;
            default:
                return Routed.REJECTED;
        }
    }

    /** Whether {@code key} has accepted records so far. */
    public boolean hasKey(String key) {
        return states.get(key) != null;
    }

    /** Accepted records of {@code key} so far, 0 when none. */
    public long recordCount(String key) {
        KeyState k = states.get(key);
        return k == null ? 0 : k.count();
    }

    /** The version the next refit of {@code key} takes (1 for a key without refits). */
    public long nextVersion(String key) {
        KeyState k = states.get(key);
        return k == null ? 1 : k.nextVersion();
    }

    /** One past the offset of {@code key}'s last accepted record, 0 when none. */
    public long endOffset(String key) {
        KeyState k = states.get(key);
        return k == null ? 0 : k.lastOffset() + 1;
    }

    /**
     * Refits {@code key} now, as the stage's refit does, recording {@code publishedAtMs} as the
     * wall-clock time; returns the records the stage would send (the model version first, then a
     * change alert when one is announced), addressed to the configuration's topics.
     *
     * @throws IllegalArgumentException when {@code key} has no accepted records, or when the
     *                                  selection rule cannot be applied to its moments
     */
    public List<ProducerRecord<byte[], byte[]>> refit(String key, long publishedAtMs) {
        KeyState k = states.get(key);
        if (k == null) {
            throw new IllegalArgumentException("key '" + key + "' has no accepted records on partition " + partition);
        }
        wallClockMs = publishedAtMs;
        List<ProducerRecord<byte[], byte[]>> out = new ArrayList<>(refitter.refit(k));
        k.refitted();
        return out;
    }
}

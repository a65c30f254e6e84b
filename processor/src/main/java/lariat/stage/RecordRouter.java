package lariat.stage;

import lariat.codec.Decoded;
import lariat.codec.KeyLayouts;
import lariat.codec.Rejection;
import lariat.codec.RowBuffer;
import lariat.codec.Skipped;

import java.util.ArrayList;
import java.util.List;

/**
 * The stage's per-record step: decode one input record, validate it, route it to its key's state
 * (creating the state on the key's first accepted record, unless the {@link Ownership} gives the key to
 * another partition) and add it to the key's moments. The
 * stage loop and the replays of {@code lariat.audit} both call this one method, so a replay computes
 * the same state from the same records. Touches only the given states and layouts; sends nothing.
 */
final class RecordRouter {

    /** What became of one record. */
    enum Kind { ACCEPTED, SKIPPED, REJECTED }

    /** The outcome of one record: its kind and, for a rejection, the key when decoded, the dead-letter reason and detail. */
    static final class Outcome {
        private static final Outcome ACCEPTED = new Outcome(Kind.ACCEPTED, null, null, null, null);
        private static final Outcome SKIPPED = new Outcome(Kind.SKIPPED, null, null, null, null);

        final Kind kind;
        final String key;
        final String reason;
        final String detail;
        final String exceptionClass;

        private Outcome(Kind kind, String key, String reason, String detail, String exceptionClass) {
            this.kind = kind;
            this.key = key;
            this.reason = reason;
            this.detail = detail;
            this.exceptionClass = exceptionClass;
        }

        static Outcome rejected(String key, String reason, String detail, String exceptionClass) {
            return new Outcome(Kind.REJECTED, key, reason, detail, exceptionClass);
        }
    }

    /** Which input partition may start a state for a key that no state holds yet. */
    interface Ownership {
        /** Every partition may. */
        Ownership ANY = (modelKey, partition) -> null;

        /** Why {@code partition} may not hold {@code modelKey}, naming the owner; null when it may. */
        String refusal(String modelKey, int partition);
    }

    private final String targetName;
    private final InputDecoder decoder;
    private final StageSettings settings;
    private final Ownership ownership;
    private final RowBuffer row = RowBuffer.create();

    RecordRouter(String targetName, InputDecoder decoder, StageSettings settings, Ownership ownership) {
        this.targetName = targetName;
        this.decoder = decoder;
        this.settings = settings;
        this.ownership = ownership;
    }

    /**
     * Routes the record at {@code offset} of input {@code partition}. Modifies {@code states} (the
     * key's state) and {@code layouts} (the partition's channel layouts) only when the record is
     * accepted; a skipped or rejected record leaves both as they were.
     */
    Outcome route(PartitionStates states, KeyLayouts layouts, int partition, long offset, byte[] recordKey,
                  byte[] value, long timestampMs) {
        Decoded d = decoder.decode(recordKey, value, timestampMs, layouts, row);
        if (d instanceof Skipped) {
            return Outcome.SKIPPED;
        }
        if (d instanceof Rejection) {
            Rejection x = (Rejection) d;
            return Outcome.rejected(null, x.reason().name(), x.detail(), x.exceptionClass().orElse(null));
        }
        String key = row.key();
        KeyState state = states.get(key);
        if (state != null && state.partition() != partition) {
            return Outcome.rejected(key, DeadLetters.KEY_ON_TWO_PARTITIONS, "key lives on partition "
                    + state.partition(), null);
        }
        double[] z = row.z();
        if (state != null && state.width() != z.length) {
            return Outcome.rejected(key, DeadLetters.WRONG_WIDTH,
                    "key has width " + state.width() + ", record has " + z.length, null);
        }
        boolean fresh = state == null;
        String refusal = fresh ? ownership.refusal(key, partition) : null;
        if (refusal != null) {
            layouts.remove(key);
            return Outcome.rejected(key, DeadLetters.KEY_ON_TWO_PARTITIONS, refusal, null);
        }
        if (fresh) {
            List<String> names = new ArrayList<>(row.layout().names());
            names.add(targetName);
            state = KeyState.create(key, partition, names.toArray(new String[0]),
                    settings.emptyMoments(names.size()), settings.cvFolds());
        }
        try {
            if (!state.add(z, row.weight(), row.eventTimeMs(), offset)) {
                if (fresh) {
                    layouts.remove(key);
                }
                return Outcome.rejected(key, DeadLetters.TOO_LATE_FOR_WINDOW, "event time " + row.eventTimeMs()
                        + " ms is older than the key's sliding window", null);
            }
        } catch (IllegalArgumentException e) {
            if (fresh) {
                layouts.remove(key);
            }
            return Outcome.rejected(key, DeadLetters.NON_FINITE, e.getMessage(), e.getClass().getName());
        }
        if (fresh) {
            states.put(state);
        }
        return Outcome.ACCEPTED;
    }
}

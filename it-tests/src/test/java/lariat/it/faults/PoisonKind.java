package lariat.it.faults;

import java.util.Map;
import java.util.Random;

import org.apache.avro.generic.GenericRecord;

/**
 * The kinds of bad input the poison test sends, each with exactly one defect and the dead-letter
 * reason the stage's codec documents for it ({@code lariat.codec.RejectReason}). Record-level
 * kinds start from a good reading in {@link LooseReadings}' schema and break one field.
 */
enum PoisonKind {
    RANDOM_BYTES("BAD_MARKER"),
    WRONG_MARKER("BAD_MARKER"),
    TRUNCATED_AVRO("UNDECODABLE"),
    TRAILING_BYTES("UNDECODABLE"),
    UNKNOWN_FINGERPRINT("UNKNOWN_SCHEMA"),
    NAN_FEATURE("NON_FINITE"),
    INFINITE_TARGET("NON_FINITE"),
    HUGE_FEATURE_1E308("OUT_OF_RANGE"),
    HUGE_TARGET_1E308("OUT_OF_RANGE"),
    MISSING_TARGET("MISSING_FIELD"),
    MISSING_FEATURE("MISSING_FIELD"),
    NULL_FEATURE("MISSING_FIELD"),
    NULL_STATION("MISSING_FIELD"),
    TEXT_FEATURE("WRONG_TYPE"),
    BOOLEAN_TARGET("WRONG_TYPE"),
    TEXT_WEIGHT("WRONG_TYPE"),
    TEXT_TIME("WRONG_TYPE"),
    NUMBER_STATION("WRONG_TYPE"),
    NEGATIVE_WEIGHT("BAD_WEIGHT"),
    NAN_WEIGHT("BAD_WEIGHT"),
    NEGATIVE_TIME("BAD_TIME"),
    EMPTY_STATION("BAD_KEY");

    final String reason;

    PoisonKind(String reason) {
        this.reason = reason;
    }

    /** The bad value bytes of this kind, made from the good reading {@code good} of the loose schema. */
    byte[] make(GenericRecord good, Random rnd) {
        byte[] ok = LooseReadings.encode(good);
        switch (this) {
            case RANDOM_BYTES: {
                byte[] b = new byte[rnd.nextInt(64)];
                rnd.nextBytes(b);
                if (b.length > 0 && b[0] == (byte) 0xC3) {
                    b[0] = 0x00;
                }
                return b;
            }
            case WRONG_MARKER: {
                ok[1] = 0x02;
                return ok;
            }
            case TRUNCATED_AVRO:
                return java.util.Arrays.copyOf(ok, 2 + rnd.nextInt(ok.length - 2));
            case TRAILING_BYTES:
                return java.util.Arrays.copyOf(ok, ok.length + 1 + rnd.nextInt(8));
            case UNKNOWN_FINGERPRINT:
                return LooseReadings.encodeWithBundledSchema(good);
            default:
                GenericRecord r = LooseReadings.copy(good);
                breakField(r);
                return LooseReadings.encode(r);
        }
    }

    @SuppressWarnings("unchecked")
    private void breakField(GenericRecord r) {
        Map<String, Object> ch = (Map<String, Object>) r.get("channels");
        String feature = StationFeed.FEATURES.get(1);
        switch (this) {
            case NAN_FEATURE -> ch.put(feature, Double.NaN);
            case INFINITE_TARGET -> ch.put(StationFeed.TARGET, Double.NEGATIVE_INFINITY);
            case HUGE_FEATURE_1E308 -> ch.put(feature, 1e308);
            case HUGE_TARGET_1E308 -> ch.put(StationFeed.TARGET, -1e308);
            case MISSING_TARGET -> ch.remove(StationFeed.TARGET);
            case MISSING_FEATURE -> ch.remove(feature);
            case NULL_FEATURE -> ch.put(feature, null);
            case NULL_STATION -> r.put("station", null);
            case TEXT_FEATURE -> ch.put(feature, "high");
            case BOOLEAN_TARGET -> ch.put(StationFeed.TARGET, Boolean.TRUE);
            case TEXT_WEIGHT -> r.put("weight", "heavy");
            case TEXT_TIME -> r.put("time", "yesterday");
            case NUMBER_STATION -> r.put("station", 7.5);
            case NEGATIVE_WEIGHT -> r.put("weight", -1.0);
            case NAN_WEIGHT -> r.put("weight", Double.NaN);
            case NEGATIVE_TIME -> r.put("time", -5L);
            case EMPTY_STATION -> r.put("station", "");
            default -> throw new IllegalStateException("not a record-level kind: " + this);
        }
    }
}

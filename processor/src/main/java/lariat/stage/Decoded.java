package lariat.stage;

/**
 * One input record after decoding: a reading for a key, a rejection with its reason, or a
 * record to skip silently. Immutable; arrays are copied in and out.
 */
public final class Decoded {

    /** Which of the three outcomes this is. */
    public enum Kind { READING, REJECTED, SKIPPED }

    private final Kind kind;
    private final String modelKey;
    private final String[] channels;
    private final double[] z;
    private final double weight;
    private final long eventTimeMs;
    private final String reason;
    private final String detail;
    private final String exceptionClass;

    private Decoded(Kind kind, String modelKey, String[] channels, double[] z, double weight, long eventTimeMs,
                    String reason, String detail, String exceptionClass) {
        this.kind = kind;
        this.modelKey = modelKey;
        this.channels = channels;
        this.z = z;
        this.weight = weight;
        this.eventTimeMs = eventTimeMs;
        this.reason = reason;
        this.detail = detail;
        this.exceptionClass = exceptionClass;
    }

    /**
     * A reading: features then target in {@code z}, named by {@code channels} (same length).
     *
     * @throws IllegalArgumentException when the key is null or the lengths differ
     */
    public static Decoded reading(String modelKey, String[] channels, double[] z, double weight, long eventTimeMs) {
        if (modelKey == null) {
            throw new IllegalArgumentException("modelKey must not be null");
        }
        if (channels.length != z.length) {
            throw new IllegalArgumentException("channels length " + channels.length + " != z length " + z.length);
        }
        return new Decoded(Kind.READING, modelKey, channels.clone(), z.clone(), weight, eventTimeMs,
                null, null, null);
    }

    /** A rejection; {@code exceptionClass} may be null when no exception was involved. */
    public static Decoded rejected(String reason, String detail, String exceptionClass) {
        if (reason == null || reason.isEmpty()) {
            throw new IllegalArgumentException("reason must be non-empty, was '" + reason + "'");
        }
        return new Decoded(Kind.REJECTED, null, null, null, 0, 0, reason, detail == null ? "" : detail,
                exceptionClass);
    }

    /** A record that neither updates a key nor is a dead letter. */
    public static Decoded skipped(String detail) {
        return new Decoded(Kind.SKIPPED, null, null, null, 0, 0, null, detail, null);
    }

    public Kind kind() {
        return kind;
    }

    public String modelKey() {
        return modelKey;
    }

    public String[] channels() {
        return channels == null ? null : channels.clone();
    }

    public double[] z() {
        return z == null ? null : z.clone();
    }

    /** The row without copying, for the loop's hot path; callers must not modify it. */
    double[] zView() {
        return z;
    }

    String[] channelsView() {
        return channels;
    }

    public double weight() {
        return weight;
    }

    public long eventTimeMs() {
        return eventTimeMs;
    }

    public String reason() {
        return reason;
    }

    public String detail() {
        return detail;
    }

    public String exceptionClass() {
        return exceptionClass;
    }
}

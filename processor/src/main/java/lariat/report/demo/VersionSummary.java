package lariat.report.demo;

import java.util.Map;

/**
 * One published model version of a station: its number, the event-time range of the data it was
 * fitted on, the selected channels with their coefficients (in the caller's order, usually order
 * of entry), and R².
 */
public final class VersionSummary {

    private final long version;
    private final long fromTimeMs;
    private final long toTimeMs;
    private final Map<String, Double> coefficients;
    private final double r2;

    private VersionSummary(long version, long fromTimeMs, long toTimeMs, Map<String, Double> coefficients, double r2) {
        if (toTimeMs < fromTimeMs) {
            throw new IllegalArgumentException("toTimeMs must be >= fromTimeMs, got " + fromTimeMs + ", " + toTimeMs);
        }
        this.version = version;
        this.fromTimeMs = fromTimeMs;
        this.toTimeMs = toTimeMs;
        this.coefficients = Checks.coefficients(coefficients, "coefficients");
        this.r2 = Checks.finite(r2, "r2");
    }

    /**
     * @throws IllegalArgumentException if the range is reversed, a channel name is empty, or a
     *                                  coefficient or r2 is not finite
     */
    public static VersionSummary of(long version, long fromTimeMs, long toTimeMs, Map<String, Double> coefficients,
            double r2) {
        return new VersionSummary(version, fromTimeMs, toTimeMs, coefficients, r2);
    }

    public long version() {
        return version;
    }

    public long fromTimeMs() {
        return fromTimeMs;
    }

    /** Event time of the last record the version was fitted on. */
    public long toTimeMs() {
        return toTimeMs;
    }

    /** Active channel → coefficient (unmodifiable). */
    public Map<String, Double> coefficients() {
        return coefficients;
    }

    public double r2() {
        return r2;
    }
}

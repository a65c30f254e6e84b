package lariat.scenario;

/**
 * A stretch of one station's readings during which its true model holds: readings
 * {@code fromStep} (inclusive) to {@code toStep} (exclusive), event times
 * {@code [fromTimeMs, toTimeMs)}.
 */
public final class Regime {

    private final long fromStep;
    private final long toStep;
    private final long fromTimeMs;
    private final long toTimeMs;
    private final StationModel model;

    private Regime(long fromStep, long toStep, long fromTimeMs, long toTimeMs, StationModel model) {
        if (fromStep < 0 || toStep <= fromStep) {
            throw new IllegalArgumentException("steps must satisfy 0 <= fromStep < toStep, got "
                    + fromStep + ", " + toStep);
        }
        if (toTimeMs <= fromTimeMs) {
            throw new IllegalArgumentException("toTimeMs must be > fromTimeMs, got " + fromTimeMs + ", " + toTimeMs);
        }
        this.fromStep = fromStep;
        this.toStep = toStep;
        this.fromTimeMs = fromTimeMs;
        this.toTimeMs = toTimeMs;
        this.model = java.util.Objects.requireNonNull(model, "model");
    }

    public static Regime of(long fromStep, long toStep, long fromTimeMs, long toTimeMs, StationModel model) {
        return new Regime(fromStep, toStep, fromTimeMs, toTimeMs, model);
    }

    public long fromStep() {
        return fromStep;
    }

    public long toStep() {
        return toStep;
    }

    public long fromTimeMs() {
        return fromTimeMs;
    }

    public long toTimeMs() {
        return toTimeMs;
    }

    public StationModel model() {
        return model;
    }

    /** Whether the reading at {@code step} falls in this regime. */
    public boolean containsStep(long step) {
        return step >= fromStep && step < toStep;
    }

    @Override
    public String toString() {
        return "Regime{steps " + fromStep + ".." + toStep + ", " + model + "}";
    }
}

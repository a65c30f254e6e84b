package lariat.config;

/** Unit of the numeric event-time field ({@code field.time.unit}); the stage works in epoch milliseconds. */
public enum TimeUnitChoice implements Choice {
    /** Seconds since the epoch. */
    SECONDS("s", 1000L, 1L),
    /** Milliseconds since the epoch. */
    MILLISECONDS("ms", 1L, 1L),
    /** Microseconds since the epoch. */
    MICROSECONDS("us", 1L, 1000L),
    /** Nanoseconds since the epoch. */
    NANOSECONDS("ns", 1L, 1_000_000L);

    private final String id;
    private final long multiplier;
    private final long divisor;

    TimeUnitChoice(String id, long multiplier, long divisor) {
        this.id = id;
        this.multiplier = multiplier;
        this.divisor = divisor;
    }

    @Override
    public String id() {
        return id;
    }

    /** Milliseconds per unit as a double (0.001 for microseconds). */
    public double millisPerUnit() {
        return (double) multiplier / divisor;
    }

    /**
     * Converts an integral time in this unit to epoch milliseconds, rounding toward negative infinity.
     *
     * @throws ArithmeticException if the result does not fit a long
     */
    public long toMillis(long value) {
        return Math.floorDiv(Math.multiplyExact(value, multiplier), divisor);
    }
}

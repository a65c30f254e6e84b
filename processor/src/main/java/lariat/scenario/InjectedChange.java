package lariat.scenario;

import java.util.Objects;

/**
 * A change the generator made to one station's true model, resolved to the reading and event
 * time from which the new model holds, with the channel's raw coefficient before and after
 * (0 when not driving).
 */
public final class InjectedChange {

    private final String station;
    private final long step;
    private final long timeMs;
    private final ChangeKind kind;
    private final String channel;
    private final double before;
    private final double after;

    private InjectedChange(String station, long step, long timeMs, ChangeKind kind, String channel,
            double before, double after) {
        this.station = Objects.requireNonNull(station, "station");
        if (step < 1) {
            throw new IllegalArgumentException("step must be >= 1, got " + step);
        }
        this.step = step;
        this.timeMs = timeMs;
        this.kind = Objects.requireNonNull(kind, "kind");
        this.channel = Objects.requireNonNull(channel, "channel");
        this.before = before;
        this.after = after;
    }

    public static InjectedChange of(String station, long step, long timeMs, ChangeKind kind, String channel,
            double before, double after) {
        return new InjectedChange(station, step, timeMs, kind, channel, before, after);
    }

    public String station() {
        return station;
    }

    /** Index of the station's first reading under the new model. */
    public long step() {
        return step;
    }

    /** Event time of that reading, ms since the epoch. */
    public long timeMs() {
        return timeMs;
    }

    public ChangeKind kind() {
        return kind;
    }

    public String channel() {
        return channel;
    }

    /** Raw coefficient of the channel before the change, 0 if it did not drive the target. */
    public double before() {
        return before;
    }

    /** Raw coefficient of the channel after the change, 0 if it no longer drives the target. */
    public double after() {
        return after;
    }

    /** For example "bearing_de_temp_c enters". */
    public String describe() {
        return channel + " " + kind.verb();
    }

    @Override
    public String toString() {
        return station + " @" + java.time.Instant.ofEpochMilli(timeMs) + ": " + describe();
    }
}

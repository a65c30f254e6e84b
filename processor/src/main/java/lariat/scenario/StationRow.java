package lariat.scenario;

import java.util.Objects;

/**
 * One generated reading: station, its reading index, event time, the value of every column of
 * {@link Scenario#columns()} (the channels, then the target), and the weight.
 */
public final class StationRow {

    private final String station;
    private final long step;
    private final long timeMs;
    private final double[] values;
    private final double weight;

    private StationRow(String station, long step, long timeMs, double[] values, double weight) {
        this.station = Objects.requireNonNull(station, "station");
        this.step = step;
        this.timeMs = timeMs;
        this.values = values;
        this.weight = weight;
    }

    /** A row holding a copy of {@code values}. */
    public static StationRow of(String station, long step, long timeMs, double[] values, double weight) {
        return new StationRow(station, step, timeMs, values.clone(), weight);
    }

    /** A row taking ownership of {@code values}, for the generator. */
    static StationRow own(String station, long step, long timeMs, double[] values, double weight) {
        return new StationRow(station, step, timeMs, values, weight);
    }

    public String station() {
        return station;
    }

    /** Index of this reading among its station's readings, from 0. */
    public long step() {
        return step;
    }

    /** Event time, ms since the epoch. */
    public long timeMs() {
        return timeMs;
    }

    /** A copy of the column values, in {@link Scenario#columns()} order. */
    public double[] values() {
        return values.clone();
    }

    /** The value of column {@code i}. */
    public double value(int i) {
        return values[i];
    }

    public int width() {
        return values.length;
    }

    public double weight() {
        return weight;
    }
}

package lariat.scenario;

import java.time.Duration;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Objects;

/**
 * The parameters of a scenario run. Start from {@link #defaults()} and change what you need with
 * the {@code with…} methods, each of which returns a new value.
 *
 * <p>Defaults: 6 stations, 10 080 readings per station (one week at one reading per simulated
 * minute), event time from 2024-03-04T00:00:00Z, seed 7, noise of 1 A on the motor current, and
 * the default change plan ({@link #defaultChanges(int)}), trimmed to the stations present.
 */
public final class ScenarioSpec {

    /** Most stations a scenario may have. */
    public static final int MAX_STATIONS = 1000;

    private final int stations;
    private final long recordsPerStation;
    private final Duration interval;
    private final Instant start;
    private final long seed;
    private final double noiseSd;
    private final List<ChangeSpec> changes;

    private ScenarioSpec(int stations, long recordsPerStation, Duration interval, Instant start, long seed,
            double noiseSd, List<ChangeSpec> changes) {
        if (stations < 1 || stations > MAX_STATIONS) {
            throw new IllegalArgumentException("stations must be in 1.." + MAX_STATIONS + ", got " + stations);
        }
        if (recordsPerStation < 1) {
            throw new IllegalArgumentException("recordsPerStation must be >= 1, got " + recordsPerStation);
        }
        if (interval == null || interval.toMillis() < 1) {
            throw new IllegalArgumentException("interval must be at least 1 ms, got " + interval);
        }
        if (!(Double.isFinite(noiseSd) && noiseSd > 0)) {
            throw new IllegalArgumentException("noiseSd must be finite and > 0, got " + noiseSd);
        }
        this.stations = stations;
        this.recordsPerStation = recordsPerStation;
        this.interval = interval;
        this.start = Objects.requireNonNull(start, "start");
        this.seed = seed;
        this.noiseSd = noiseSd;
        this.changes = changes == null ? null : List.copyOf(changes);
    }

    /** The default scenario. */
    public static ScenarioSpec defaults() {
        return new ScenarioSpec(6, 10_080, Duration.ofMinutes(1), Instant.parse("2024-03-04T00:00:00Z"), 7, 1.0,
                null);
    }

    /**
     * The default change plan for stations 0 to 5: station 0 gains {@code bearing_de_temp_c} at
     * 35 %; station 1 loses {@code flow_m3h} at 45 %; station 2's {@code supply_voltage_v} flips
     * sign at 55 %; station 3 gains {@code vib_2x_mm_s} at 40 % and loses it again at 75 %;
     * stations 4 and 5 stay unchanged. Entries for stations at or beyond {@code stations} are left out.
     */
    public static List<ChangeSpec> defaultChanges(int stations) {
        List<ChangeSpec> plan = List.of(
                ChangeSpec.enters(0, 0.35, "bearing_de_temp_c", 4.0),
                ChangeSpec.leaves(1, 0.45, "flow_m3h"),
                ChangeSpec.signFlip(2, 0.55, "supply_voltage_v"),
                ChangeSpec.enters(3, 0.40, "vib_2x_mm_s", 3.5),
                ChangeSpec.leaves(3, 0.75, "vib_2x_mm_s"));
        List<ChangeSpec> kept = new ArrayList<>();
        for (ChangeSpec c : plan) {
            if (c.stationIndex() < stations) {
                kept.add(c);
            }
        }
        return List.copyOf(kept);
    }

    public ScenarioSpec withStations(int n) {
        return new ScenarioSpec(n, recordsPerStation, interval, start, seed, noiseSd, changes);
    }

    public ScenarioSpec withRecordsPerStation(long n) {
        return new ScenarioSpec(stations, n, interval, start, seed, noiseSd, changes);
    }

    /** Event time between two readings of one station. */
    public ScenarioSpec withInterval(Duration d) {
        return new ScenarioSpec(stations, recordsPerStation, d, start, seed, noiseSd, changes);
    }

    /** Event time of every station's first reading. */
    public ScenarioSpec withStart(Instant t) {
        return new ScenarioSpec(stations, recordsPerStation, interval, t, seed, noiseSd, changes);
    }

    public ScenarioSpec withSeed(long s) {
        return new ScenarioSpec(stations, recordsPerStation, interval, start, s, noiseSd, changes);
    }

    /** Standard deviation of the motor-current noise, in amperes. */
    public ScenarioSpec withNoiseSd(double sd) {
        return new ScenarioSpec(stations, recordsPerStation, interval, start, seed, sd, changes);
    }

    /** An explicit change plan replacing the default one; an empty list means no changes. */
    public ScenarioSpec withChanges(List<ChangeSpec> plan) {
        return new ScenarioSpec(stations, recordsPerStation, interval, start, seed, noiseSd,
                Objects.requireNonNull(plan, "changes"));
    }

    public int stations() {
        return stations;
    }

    public long recordsPerStation() {
        return recordsPerStation;
    }

    public Duration interval() {
        return interval;
    }

    public Instant start() {
        return start;
    }

    public long seed() {
        return seed;
    }

    public double noiseSd() {
        return noiseSd;
    }

    /** The change plan: the explicit one, or the default plan for this many stations. */
    public List<ChangeSpec> changes() {
        return changes == null ? defaultChanges(stations) : changes;
    }

    @Override
    public String toString() {
        return "ScenarioSpec{stations=" + stations + ", recordsPerStation=" + recordsPerStation
                + ", interval=" + interval + ", start=" + start + ", seed=" + seed + ", noiseSd=" + noiseSd
                + ", changes=" + changes() + "}";
    }
}

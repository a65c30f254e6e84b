package lariat.scenario;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;

/** What the generator did, per station, so a consumer of the stream can be scored against it. */
public final class GroundTruth {

    private final List<StationTruth> stations;

    private GroundTruth(List<StationTruth> stations) {
        this.stations = List.copyOf(stations);
    }

    public static GroundTruth of(List<StationTruth> stations) {
        return new GroundTruth(stations);
    }

    /** Every station's truth, in station order. */
    public List<StationTruth> stations() {
        return stations;
    }

    /**
     * @throws IllegalArgumentException if there is no station of that name
     */
    public StationTruth station(String name) {
        for (StationTruth s : stations) {
            if (s.station().equals(name)) {
                return s;
            }
        }
        throw new IllegalArgumentException("station must be one of the scenario's stations, got " + name);
    }

    /** Every injected change, by event time, then station order. */
    public List<InjectedChange> changes() {
        List<InjectedChange> all = new ArrayList<>();
        for (StationTruth s : stations) {
            all.addAll(s.changes());
        }
        all.sort(Comparator.comparingLong(InjectedChange::timeMs));
        return List.copyOf(all);
    }

    /** Names of the stations with no injected change, in station order. */
    public List<String> unchangedStations() {
        List<String> names = new ArrayList<>();
        for (StationTruth s : stations) {
            if (!s.changed()) {
                names.add(s.station());
            }
        }
        return List.copyOf(names);
    }
}

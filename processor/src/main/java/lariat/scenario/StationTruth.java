package lariat.scenario;

import java.util.List;
import java.util.Objects;

/** One station's ground truth: its consecutive regimes and the changes between them. */
public final class StationTruth {

    private final String station;
    private final List<Regime> regimes;
    private final List<InjectedChange> changes;

    private StationTruth(String station, List<Regime> regimes, List<InjectedChange> changes) {
        Objects.requireNonNull(station, "station");
        if (regimes.isEmpty()) {
            throw new IllegalArgumentException("regimes of " + station + " must not be empty");
        }
        if (changes.size() != regimes.size() - 1) {
            throw new IllegalArgumentException("station " + station + " needs one change between consecutive regimes, got "
                    + changes.size() + " changes for " + regimes.size() + " regimes");
        }
        for (int i = 1; i < regimes.size(); i++) {
            if (regimes.get(i).fromStep() != regimes.get(i - 1).toStep()) {
                throw new IllegalArgumentException("regimes of " + station + " must be consecutive, got "
                        + regimes.get(i - 1) + " then " + regimes.get(i));
            }
        }
        this.station = station;
        this.regimes = List.copyOf(regimes);
        this.changes = List.copyOf(changes);
    }

    public static StationTruth of(String station, List<Regime> regimes, List<InjectedChange> changes) {
        return new StationTruth(station, regimes, changes);
    }

    public String station() {
        return station;
    }

    /** The regimes in event-time order; consecutive, covering every reading. */
    public List<Regime> regimes() {
        return regimes;
    }

    /** The injected changes in event-time order; change i separates regime i from regime i + 1. */
    public List<InjectedChange> changes() {
        return changes;
    }

    /** Whether any change was injected at this station. */
    public boolean changed() {
        return !changes.isEmpty();
    }

    /** The true model of the reading at {@code step}; the last model for steps past the end. */
    public StationModel modelAtStep(long step) {
        for (Regime r : regimes) {
            if (step < r.toStep()) {
                return r.model();
            }
        }
        return regimes.get(regimes.size() - 1).model();
    }

    /**
     * The true active set at an event time: the model of the regime holding {@code timeMs} (the
     * first before the start, the last after the end).
     */
    public List<String> activeAt(long timeMs) {
        for (Regime r : regimes) {
            if (timeMs < r.toTimeMs()) {
                return r.model().active();
            }
        }
        return regimes.get(regimes.size() - 1).model().active();
    }
}

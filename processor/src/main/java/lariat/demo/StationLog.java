package lariat.demo;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import lariat.report.demo.AlertMark;
import lariat.report.demo.VersionSummary;
import lariat.schema.ActiveFeature;
import lariat.schema.ChangeAlert;
import lariat.schema.ModelVersion;

/**
 * What the stage published for one station, as read back from its topics: every model version
 * in order and every change alert after the first announcement (the first one only announces the
 * station's initial model, so it is kept apart and not scored as a change). Mutable; used by one
 * thread at a time.
 */
final class StationLog {

    private final String station;
    private final List<VersionSummary> versions = new ArrayList<>();
    private final List<AlertMark> alerts = new ArrayList<>();
    private ModelVersion latest;
    private ChangeAlert initial;

    StationLog(String station) {
        this.station = station;
    }

    String station() {
        return station;
    }

    /**
     * Adds a version; returns the active set of the version before it (empty for the first).
     *
     * @throws IllegalArgumentException if the version number does not follow the last one
     */
    Map<String, Double> add(ModelVersion mv) {
        long expected = latest == null ? 1 : latest.getVersion() + 1;
        if (mv.getVersion() != expected) {
            throw new IllegalArgumentException("station " + station + ": version " + mv.getVersion()
                    + " follows version " + (expected - 1));
        }
        Map<String, Double> before = latest == null ? Map.of() : coefficients(latest);
        latest = mv;
        versions.add(VersionSummary.of(mv.getVersion(), mv.getFirstEventTimeMs().toEpochMilli(),
                mv.getLastEventTimeMs().toEpochMilli(), coefficients(mv), mv.getR2()));
        return before;
    }

    /** Adds an alert; returns false for the first announcement of the station's model. */
    boolean add(ChangeAlert a) {
        if (a.getPreviousVersion() == null && initial == null) {
            initial = a;
            return false;
        }
        alerts.add(AlertMark.of(a.getEventTimeMs().toEpochMilli(), a.getVersion(), a.getEntered(), a.getLeft(),
                a.getSignFlipped()));
        return true;
    }

    List<VersionSummary> versions() {
        return List.copyOf(versions);
    }

    /** Alerts in event-time order. */
    List<AlertMark> alerts() {
        List<AlertMark> sorted = new ArrayList<>(alerts);
        sorted.sort((x, y) -> Long.compare(x.timeMs(), y.timeMs()));
        return List.copyOf(sorted);
    }

    /** The latest version, or null before the first. */
    ModelVersion latest() {
        return latest;
    }

    /** Active channel → raw coefficient of a version, in order of entry. */
    static Map<String, Double> coefficients(ModelVersion mv) {
        Map<String, Double> c = new LinkedHashMap<>();
        for (ActiveFeature f : mv.getFeatures()) {
            c.put(f.getName(), f.getCoefficient());
        }
        return c;
    }
}

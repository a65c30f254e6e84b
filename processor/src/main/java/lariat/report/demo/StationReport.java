package lariat.report.demo;

import java.util.Comparator;
import java.util.List;

/**
 * Everything the report shows for one station: its published versions in order, the knots of
 * the latest version's path (from λ/λ_max = 1 downwards), the penalty the latest version selected
 * (NaN if unknown), the injected changes and the alerts, each in event-time order.
 */
public final class StationReport {

    private final String station;
    private final List<VersionSummary> versions;
    private final List<PathPoint> path;
    private final double selectedRelativePenalty;
    private final List<ChangeMark> changes;
    private final List<AlertMark> alerts;

    private StationReport(String station, List<VersionSummary> versions, List<PathPoint> path,
            double selectedRelativePenalty, List<ChangeMark> changes, List<AlertMark> alerts) {
        this.station = Checks.name(station, "station");
        this.versions = Checks.list(versions, "versions").stream()
                .sorted(Comparator.comparingLong(VersionSummary::version)).toList();
        this.path = Checks.list(path, "path").stream()
                .sorted(Comparator.comparingDouble(PathPoint::relativePenalty).reversed()).toList();
        if (!Double.isNaN(selectedRelativePenalty) && !(selectedRelativePenalty >= 0 && selectedRelativePenalty <= 1)) {
            throw new IllegalArgumentException("selectedRelativePenalty must be in [0, 1] or NaN, got "
                    + selectedRelativePenalty);
        }
        this.selectedRelativePenalty = selectedRelativePenalty;
        this.changes = Checks.list(changes, "changes").stream()
                .sorted(Comparator.comparingLong(ChangeMark::timeMs)).toList();
        this.alerts = Checks.list(alerts, "alerts").stream()
                .sorted(Comparator.comparingLong(AlertMark::timeMs)).toList();
    }

    /**
     * @throws IllegalArgumentException if the station name is empty, a list is null, or the
     *                                  selected penalty is outside [0, 1] and not NaN
     */
    public static StationReport of(String station, List<VersionSummary> versions, List<PathPoint> path,
            double selectedRelativePenalty, List<ChangeMark> changes, List<AlertMark> alerts) {
        return new StationReport(station, versions, path, selectedRelativePenalty, changes, alerts);
    }

    public String station() {
        return station;
    }

    /** Versions by version number. */
    public List<VersionSummary> versions() {
        return versions;
    }

    /** Knots of the latest path by decreasing relative penalty. */
    public List<PathPoint> path() {
        return path;
    }

    public double selectedRelativePenalty() {
        return selectedRelativePenalty;
    }

    public List<ChangeMark> changes() {
        return changes;
    }

    public List<AlertMark> alerts() {
        return alerts;
    }
}

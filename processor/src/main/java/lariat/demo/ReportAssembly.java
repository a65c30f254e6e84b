package lariat.demo;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;

import lariat.report.demo.ChangeMark;
import lariat.report.demo.DemoReport;
import lariat.report.demo.StationReport;
import lariat.scenario.InjectedChange;
import lariat.scenario.Scenario;
import lariat.scenario.StationTruth;
import lariat.schema.ModelVersion;

/**
 * Builds the {@link DemoReport} of a run: per station, in scenario order, its published versions
 * and alerts as read back, the path of its latest version, and the changes the generator
 * injected.
 */
final class ReportAssembly {

    private ReportAssembly() {
    }

    /** The change as the report marks it. */
    static ChangeMark mark(InjectedChange c) {
        ChangeMark.Kind kind;
        switch (c.kind()) {
            case ENTERS:
                kind = ChangeMark.Kind.ENTERS;
                break;
            case LEAVES:
                kind = ChangeMark.Kind.LEAVES;
                break;
            default:
                kind = ChangeMark.Kind.SIGN_FLIP;
                break;
        }
        return ChangeMark.of(c.timeMs(), c.channel(), kind);
    }

    /**
     * @param logs  what was read back, by station (stations with no version yet may be absent)
     * @param paths the latest path per station (absent when there is none)
     */
    static DemoReport of(Scenario scenario, Map<String, StationLog> logs, Map<String, LatestPath> paths,
            String description) {
        List<StationReport> stations = new ArrayList<>();
        for (StationTruth t : scenario.truth().stations()) {
            StationLog log = logs.getOrDefault(t.station(), new StationLog(t.station()));
            LatestPath path = paths.get(t.station());
            List<ChangeMark> marks = new ArrayList<>();
            for (InjectedChange c : t.changes()) {
                marks.add(mark(c));
            }
            double selected = Double.NaN;
            if (path != null && path.verified()) {
                selected = path.selectedRelativePenalty();
            } else if (log.latest() != null) {
                selected = clamp(log.latest());
            }
            stations.add(StationReport.of(t.station(), log.versions(), path == null ? List.of() : path.points(),
                    selected, marks, log.alerts()));
        }
        return DemoReport.of(String.format(Locale.ROOT, "Lariat demo: %d pumping stations, seed %d",
                scenario.spec().stations(), scenario.spec().seed()), description, stations);
    }

    private static double clamp(ModelVersion mv) {
        double r = mv.getRelativePenalty();
        return Double.isFinite(r) ? Math.max(0, Math.min(1, r)) : Double.NaN;
    }
}

package lariat.report.demo;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import lariat.scenario.ChangeKind;
import lariat.scenario.InjectedChange;
import lariat.scenario.Scenario;
import lariat.scenario.ScenarioSpec;
import lariat.scenario.StationModel;
import lariat.scenario.StationTruth;

/**
 * A report built from the default scenario's ground truth as if a perfect stage had published a
 * version every {@link #VERSION_EVERY} readings with the true active set, alerting at the first
 * version after each change; its path has one knot per active channel, each channel entering
 * at penalty (k+1)/(m+1) and growing linearly to its true coefficient at penalty 0.
 */
final class DemoReportFixture {

    static final int VERSION_EVERY = 180;
    static final ScenarioSpec SPEC = ScenarioSpec.defaults().withRecordsPerStation(2880);
    static final Scenario SCENARIO = Scenario.of(SPEC);

    private DemoReportFixture() {
    }

    static DemoReport report() {
        List<StationReport> stations = new ArrayList<>();
        for (StationTruth t : SCENARIO.truth().stations()) {
            stations.add(station(t));
        }
        return DemoReport.of("Lariat demo <test> & report", "Fixture from the scenario's ground truth.", stations);
    }

    static StationReport station(StationTruth t) {
        List<VersionSummary> versions = new ArrayList<>();
        List<AlertMark> alerts = new ArrayList<>();
        long start = SCENARIO.timeOfStep(0);
        StationModel previous = null;
        long version = 1;
        for (long step = VERSION_EVERY; step <= SPEC.recordsPerStation(); step += VERSION_EVERY) {
            long to = SCENARIO.timeOfStep(step - 1);
            StationModel m = t.modelAtStep(step - 1);
            versions.add(VersionSummary.of(version, start, to, m.coefficients(), 0.9));
            if (previous != null && !previous.coefficients().equals(m.coefficients())) {
                alerts.add(alert(to, version, previous, m));
            }
            previous = m;
            version++;
        }
        List<ChangeMark> changes = new ArrayList<>();
        for (InjectedChange c : t.changes()) {
            changes.add(ChangeMark.of(c.timeMs(), c.channel(), kind(c.kind())));
        }
        return StationReport.of(t.station(), versions, path(previous), 0.2, changes, alerts);
    }

    static List<PathPoint> path(StationModel m) {
        List<String> active = m.active();
        int n = active.size();
        List<PathPoint> knots = new ArrayList<>();
        for (int k = n; k >= 0; k--) {
            double r = (double) k / (n + 1);
            Map<String, Double> b = new LinkedHashMap<>();
            for (int j = 0; j < n; j++) {
                double entry = (double) (n - j) / (n + 1);
                if (r < entry) {
                    b.put(active.get(j), m.coefficient(active.get(j)) * (entry - r) / entry);
                }
            }
            knots.add(PathPoint.of(k == n ? 1.0 : r, b));
        }
        return knots;
    }

    private static AlertMark alert(long time, long version, StationModel before, StationModel after) {
        List<String> entered = new ArrayList<>();
        List<String> left = new ArrayList<>();
        List<String> flipped = new ArrayList<>();
        for (String c : after.active()) {
            if (before.coefficient(c) == 0) {
                entered.add(c);
            } else if (Math.signum(before.coefficient(c)) != Math.signum(after.coefficient(c))) {
                flipped.add(c);
            }
        }
        for (String c : before.active()) {
            if (after.coefficient(c) == 0) {
                left.add(c);
            }
        }
        return AlertMark.of(time, version, entered, left, flipped);
    }

    private static ChangeMark.Kind kind(ChangeKind k) {
        switch (k) {
            case ENTERS:
                return ChangeMark.Kind.ENTERS;
            case LEAVES:
                return ChangeMark.Kind.LEAVES;
            default:
                return ChangeMark.Kind.SIGN_FLIP;
        }
    }
}

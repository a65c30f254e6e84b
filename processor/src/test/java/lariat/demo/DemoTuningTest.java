package lariat.demo;

import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

import lariat.config.StageConfig;
import lariat.moments.MomentStream;
import lariat.report.demo.AlertMark;
import lariat.report.demo.ChangeMark;
import lariat.report.demo.Detection;
import lariat.report.demo.StationReport;
import lariat.scenario.InjectedChange;
import lariat.scenario.Scenario;
import lariat.scenario.StationRow;
import lariat.scenario.StationTruth;
import lariat.stage.KeyFit;
import lariat.stage.RefitRecipe;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * The demo's stage configuration on the scenario without a broker: each station's readings go
 * through moments built as the stage builds them (sorted channel order, target last), refitted
 * with the stage's own {@link KeyFit} every {@link DemoPlan#REFIT_EVERY_RECORDS} readings; a
 * change of the selected set (channels with signs) is alerted once it has held for
 * {@link DemoPlan#ALERT_PERSIST_REFITS} consecutive refits (the rule documented for
 * {@code alert.persist.refits}); alerts are scored by the report's {@link Detection}. Every
 * injected change must be alerted and no unchanged station may alert, for three seeds.
 */
class DemoTuningTest {

    @ParameterizedTest
    @ValueSource(longs = {7, 8, 9})
    void demoConfiguration_threeSeeds_everyChangeAlertedNoFalseAlert(long seed) {
        DemoPlan plan = DemoPlan.of(6, seed, Duration.ofSeconds(90), "tuning");
        StageConfig config = StageConfig.of(plan.stageProperties("127.0.0.1:9092"));
        Scenario s = plan.scenario();
        Map<String, List<AlertMark>> alerts = replay(s, config);
        for (StationTruth t : s.truth().stations()) {
            List<ChangeMark> marks = new ArrayList<>();
            for (InjectedChange c : t.changes()) {
                marks.add(ReportAssembly.mark(c));
            }
            StationReport r = StationReport.of(t.station(), List.of(), List.of(), Double.NaN, marks,
                    alerts.getOrDefault(t.station(), List.of()));
            for (Detection d : Detection.of(r)) {
                assertTrue(d.detected(), "seed " + seed + ": " + t.station() + " " + d.change().describe());
            }
            if (!t.changed()) {
                assertEquals(0, Detection.otherAlerts(r), "seed " + seed + ": false alert at " + t.station());
            }
        }
    }

    private static Map<String, List<AlertMark>> replay(Scenario s, StageConfig config) {
        List<String> sorted = new ArrayList<>(s.channels());
        sorted.sort(String::compareTo);
        int[] column = new int[sorted.size() + 1];
        for (int j = 0; j < sorted.size(); j++) {
            column[j] = s.columns().indexOf(sorted.get(j));
        }
        column[sorted.size()] = s.columns().indexOf(s.target());
        RefitRecipe recipe = RefitRecipe.of(config);
        Map<String, MomentStream> moments = new HashMap<>();
        Map<String, Map<String, Integer>> announced = new HashMap<>();
        Map<String, Map<String, Integer>> candidate = new HashMap<>();
        Map<String, Integer> held = new HashMap<>();
        Map<String, Long> version = new HashMap<>();
        Map<String, List<AlertMark>> alerts = new TreeMap<>();
        double[] z = new double[column.length];
        Iterator<StationRow> rows = s.rows();
        while (rows.hasNext()) {
            StationRow r = rows.next();
            MomentStream m = moments.computeIfAbsent(r.station(), k -> new MomentStream(column.length,
                    config.get(StageConfig.MOMENTS_BLOCK_RECORDS),
                    (double) config.get(StageConfig.FORGET_HALF_LIFE_MS)));
            for (int j = 0; j < column.length; j++) {
                z[j] = r.value(column[j]);
            }
            m.add(z, r.weight(), r.timeMs());
            if (m.count() % DemoPlan.REFIT_EVERY_RECORDS != 0) {
                continue;
            }
            String st = r.station();
            long v = version.merge(st, 1L, Long::sum);
            double[] b = KeyFit.of(m.snapshot(), null, recipe).selected().rawCoefficients();
            Map<String, Integer> set = new TreeMap<>();
            for (int j = 0; j < b.length; j++) {
                if (b[j] != 0) {
                    set.put(sorted.get(j), (int) Math.signum(b[j]));
                }
            }
            Map<String, Integer> before = announced.get(st);
            if (set.equals(before)) {
                held.put(st, 0);
                continue;
            }
            int h = held.getOrDefault(st, 0) > 0 && set.equals(candidate.get(st)) ? held.get(st) + 1 : 1;
            candidate.put(st, set);
            held.put(st, h);
            if (h < DemoPlan.ALERT_PERSIST_REFITS) {
                continue;
            }
            if (before != null) {
                alerts.computeIfAbsent(st, k -> new ArrayList<>()).add(alert(r.timeMs(), v, before, set));
            }
            announced.put(st, set);
            held.put(st, 0);
        }
        return alerts;
    }

    private static AlertMark alert(long timeMs, long version, Map<String, Integer> before, Map<String, Integer> now) {
        List<String> entered = new ArrayList<>();
        List<String> left = new ArrayList<>();
        List<String> flipped = new ArrayList<>();
        for (Map.Entry<String, Integer> e : now.entrySet()) {
            Integer b = before.get(e.getKey());
            if (b == null) {
                entered.add(e.getKey());
            } else if (!b.equals(e.getValue())) {
                flipped.add(e.getKey());
            }
        }
        for (String c : before.keySet()) {
            if (!now.containsKey(c)) {
                left.add(c);
            }
        }
        return AlertMark.of(timeMs, version, entered, left, flipped);
    }
}

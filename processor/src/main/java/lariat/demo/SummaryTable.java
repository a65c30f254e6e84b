package lariat.demo;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

import lariat.report.TextTable;
import lariat.report.demo.Detection;
import lariat.report.demo.DemoReport;
import lariat.report.demo.StationReport;

/**
 * The end-of-run table: one row per injected change (or one row for a station without any):
 * versions and alerts of the station, the change, whether an alert reported it and after how
 * much event time. Fits in 80 columns. Scoring is {@link Detection}'s.
 */
final class SummaryTable {

    private SummaryTable() {
    }

    /** Totals of a report's scoring. */
    static final class Totals {
        int changes;
        int detected;
        int unchangedStations;
        int falseAlerts;
        int otherAlerts;
        final List<Long> delaysMs = new ArrayList<>();

        /** Whether every change was detected and no unchanged station raised an alert. */
        boolean clean() {
            return detected == changes && falseAlerts == 0;
        }
    }

    static Totals totals(DemoReport r) {
        Totals t = new Totals();
        for (StationReport s : r.stations()) {
            int other = Detection.otherAlerts(s);
            if (s.changes().isEmpty()) {
                t.unchangedStations++;
                t.falseAlerts += other;
            } else {
                t.otherAlerts += other;
            }
            for (Detection d : Detection.of(s)) {
                t.changes++;
                if (d.detected()) {
                    t.detected++;
                    t.delaysMs.add(d.delayMs());
                }
            }
        }
        return t;
    }

    static String render(DemoReport r) {
        TextTable table = new TextTable(List.of("station", "vers", "alerts", "injected change", "at", "found",
                "delay"), List.of(TextTable.Align.LEFT, TextTable.Align.RIGHT, TextTable.Align.RIGHT,
                TextTable.Align.LEFT, TextTable.Align.LEFT, TextTable.Align.LEFT, TextTable.Align.RIGHT));
        for (StationReport s : r.stations()) {
            String versions = Integer.toString(s.versions().size());
            String alerts = Integer.toString(s.alerts().size());
            if (s.changes().isEmpty()) {
                table.row(s.station(), versions, alerts, "none", "-",
                        s.alerts().isEmpty() ? "-" : Detection.otherAlerts(s) + " FALSE", "-");
                continue;
            }
            boolean first = true;
            for (Detection d : Detection.of(s)) {
                String change = d.change().channel() + " " + shortVerb(d.change().kind().verb());
                table.row(first ? s.station() : "", first ? versions : "", first ? alerts : "", change,
                        DemoConsole.shortTime(d.change().timeMs()),
                        d.detected() ? "yes v" + d.alert().version() : "MISSED",
                        d.detected() ? hours(d.delayMs()) : "-");
                first = false;
            }
        }
        return table.render();
    }

    /** One line of totals under the table. */
    static String totalsLine(Totals t) {
        StringBuilder b = new StringBuilder(String.format(Locale.ROOT, "Detected %d of %d injected changes",
                t.detected, t.changes));
        if (!t.delaysMs.isEmpty()) {
            List<Long> d = new ArrayList<>(t.delaysMs);
            d.sort(Long::compare);
            b.append(String.format(Locale.ROOT, " (delay %s to %s of event time)", hours(d.get(0)),
                    hours(d.get(d.size() - 1))));
        }
        b.append(String.format(Locale.ROOT, "; %d false alerts on %d unchanged stations.", t.falseAlerts,
                t.unchangedStations));
        if (t.otherAlerts > 0) {
            b.append(String.format(Locale.ROOT, " %d further alerts on changed stations.", t.otherAlerts));
        }
        return b.toString();
    }

    private static String shortVerb(String verb) {
        return verb.equals("flips sign") ? "flips" : verb;
    }

    static String hours(long ms) {
        return String.format(Locale.ROOT, "%.1f h", ms / 3_600_000.0);
    }
}

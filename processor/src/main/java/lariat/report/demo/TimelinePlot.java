package lariat.report.demo;

import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Set;

/**
 * A station's active set across versions as an SVG timeline: one row per channel that was ever
 * selected or was named by an injected change, event time on the x axis. A version holds from
 * the event time of its last record until the next version's (the last one to the end of the
 * plot); a bar marks each channel it selected, coloured by the coefficient's sign. Injected
 * changes are dashed vertical lines, alerts are triangles above the rows.
 */
final class TimelinePlot {

    static final String CSS_CLASS = "timeline";

    private static final double WIDTH = 660;
    private static final double LEFT = 150;
    private static final double RIGHT = 24;
    private static final double TOP = 40;
    private static final double ROW = 16;
    private static final double BOTTOM = 36;

    private TimelinePlot() {
    }

    static String draw(StationReport s) {
        List<String> rows = rows(s);
        double height = TOP + Math.max(1, rows.size()) * ROW + BOTTOM;
        Svg svg = new Svg(CSS_CLASS, WIDTH, height, "Active set of " + s.station() + " across model versions");
        double pw = WIDTH - LEFT - RIGHT;
        double bottom = TOP + Math.max(1, rows.size()) * ROW;
        long[] range = range(s);
        long t0 = range[0];
        long t1 = range[1];
        TimeScale x = t -> LEFT + (double) (t - t0) / (t1 - t0) * pw;
        for (int r = 0; r < rows.size(); r++) {
            double yy = TOP + r * ROW;
            svg.line(LEFT, yy + ROW, LEFT + pw, yy + ROW, "#eeeeee", 1, null);
            svg.text(LEFT - 6, yy + ROW - 4, "end", rows.get(r));
        }
        if (rows.isEmpty()) {
            svg.text(LEFT + pw / 2, TOP + ROW - 4, "middle", "no channel selected yet");
        }
        bars(svg, s, rows, x, t1);
        long step = Ticks.timeStep(t0, t1, 7);
        for (long t : Ticks.times(t0, t1, step)) {
            svg.line(x.at(t), bottom, x.at(t), bottom + 4, "#333", 1, null);
            svg.text(x.at(t), bottom + 16, "middle", Ticks.timeLabel(t, step));
        }
        svg.line(LEFT, bottom, LEFT + pw, bottom, "#333", 1, null);
        svg.text(LEFT + pw / 2, height - 4, "middle", "event time (UTC)");
        int k = 0;
        for (ChangeMark c : s.changes()) {
            double xc = x.at(c.timeMs());
            svg.line(xc, TOP - 12, xc, bottom, Svg.CHANGE, 1.5, "5 3");
            svg.text(xc, 10 + (k++ % 2) * 11, "middle", c.describe());
        }
        for (AlertMark a : s.alerts()) {
            svg.marker(x.at(a.timeMs()), TOP - 7, "#333333",
                    "alert " + a.describe() + " at " + Instant.ofEpochMilli(a.timeMs()));
        }
        return svg.finish();
    }

    private static void bars(Svg svg, StationReport s, List<String> rows, TimeScale x, long end) {
        List<VersionSummary> vs = s.versions();
        for (int i = 0; i < vs.size(); i++) {
            VersionSummary v = vs.get(i);
            long until = i + 1 < vs.size() ? vs.get(i + 1).toTimeMs() : end;
            double x0 = x.at(v.toTimeMs());
            double w = Math.max(1, x.at(until) - x0);
            for (Map.Entry<String, Double> e : v.coefficients().entrySet()) {
                int r = rows.indexOf(e.getKey());
                svg.rect(x0, TOP + r * ROW + 3, w, ROW - 6, e.getValue() >= 0 ? Svg.POSITIVE : Svg.NEGATIVE,
                        String.format(Locale.ROOT, "v%d %s = %.4g", v.version(), e.getKey(), e.getValue()));
            }
        }
    }

    static List<String> rows(StationReport s) {
        Set<String> order = new LinkedHashSet<>();
        for (VersionSummary v : s.versions()) {
            order.addAll(v.coefficients().keySet());
        }
        for (ChangeMark c : s.changes()) {
            order.add(c.channel());
        }
        return new ArrayList<>(order);
    }

    /** [first, last] event time over versions, changes and alerts; one hour wide when empty. */
    private static long[] range(StationReport s) {
        long lo = Long.MAX_VALUE;
        long hi = Long.MIN_VALUE;
        for (VersionSummary v : s.versions()) {
            lo = Math.min(lo, v.fromTimeMs());
            hi = Math.max(hi, v.toTimeMs());
        }
        for (ChangeMark c : s.changes()) {
            lo = Math.min(lo, c.timeMs());
            hi = Math.max(hi, c.timeMs());
        }
        for (AlertMark a : s.alerts()) {
            lo = Math.min(lo, a.timeMs());
            hi = Math.max(hi, a.timeMs());
        }
        if (lo == Long.MAX_VALUE) {
            lo = 0;
            hi = 0;
        }
        if (hi <= lo) {
            hi = lo + 3_600_000L;
        }
        return new long[] {lo, hi};
    }

    private interface TimeScale {
        double at(long t);
    }
}

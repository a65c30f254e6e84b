package lariat.report.demo;

import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.List;
import java.util.Locale;

/**
 * The report page: one self-contained HTML file (no scripts, no external resources) that is also
 * well-formed XML, with a summary table, the caution, and per station a path plot and a timeline.
 */
final class HtmlPage {

    static final String CAUTION = "A model shows statistical association, not cause. Maintenance and safety "
            + "decisions follow the site's procedures and qualified engineers.";

    private static final String STYLE = "body{font-family:sans-serif;margin:24px;max-width:760px;color:#222}"
            + "table{border-collapse:collapse;font-size:13px}th,td{border:1px solid #ccc;padding:3px 6px;"
            + "text-align:left;vertical-align:top}th{background:#f2f2f2}.caution{border-left:4px solid #b00020;"
            + "padding:6px 10px;background:#fff6f6}figure{margin:12px 0}figcaption{font-size:12px;color:#555}"
            + "code{font-size:12px}";

    private HtmlPage() {
    }

    static String render(DemoReport r) {
        StringBuilder h = new StringBuilder(65536);
        h.append("<!DOCTYPE html>\n<html lang=\"en\" xmlns=\"http://www.w3.org/1999/xhtml\">\n<head>\n")
                .append("<meta charset=\"utf-8\"/>\n<title>").append(Svg.escape(r.title())).append("</title>\n")
                .append("<style>").append(STYLE).append("</style>\n</head>\n<body>\n");
        h.append("<h1>").append(Svg.escape(r.title())).append("</h1>\n");
        if (!r.description().isEmpty()) {
            h.append("<p>").append(Svg.escape(r.description())).append("</p>\n");
        }
        h.append("<p class=\"caution\">").append(Svg.escape(CAUTION)).append("</p>\n");
        summary(h, r.stations());
        for (StationReport s : r.stations()) {
            h.append("<section class=\"station\" id=\"").append(Svg.escape(s.station())).append("\">\n<h2>")
                    .append(Svg.escape(s.station())).append("</h2>\n");
            h.append("<figure>\n").append(PathPlot.draw(s)).append("<figcaption>Coefficient path of the latest "
                    + "model: each line is one channel's standardized coefficient as the penalty falls; channels "
                    + "join the model where their line leaves zero.</figcaption>\n</figure>\n");
            h.append("<figure>\n").append(TimelinePlot.draw(s)).append("<figcaption>Active set across versions: "
                    + "blue bars positive, orange negative coefficients; dashed red lines are injected changes, "
                    + "triangles are alerts.</figcaption>\n</figure>\n</section>\n");
        }
        h.append("</body>\n</html>\n");
        return h.toString();
    }

    private static void summary(StringBuilder h, List<StationReport> stations) {
        h.append("<h2>Summary</h2>\n<table class=\"summary\">\n<tr><th>station</th><th>versions</th><th>alerts</th>"
                + "<th>injected changes and detection</th><th>other alerts</th><th>latest active set</th>"
                + "<th>latest R\u00b2</th></tr>\n");
        for (StationReport s : stations) {
            List<VersionSummary> vs = s.versions();
            VersionSummary last = vs.isEmpty() ? null : vs.get(vs.size() - 1);
            h.append("<tr><td>").append(Svg.escape(s.station())).append("</td><td>").append(vs.size())
                    .append("</td><td>").append(s.alerts().size()).append("</td><td>");
            List<Detection> ds = Detection.of(s);
            if (ds.isEmpty()) {
                h.append("none");
            }
            for (int i = 0; i < ds.size(); i++) {
                Detection d = ds.get(i);
                h.append(i > 0 ? "<br/>" : "").append(Svg.escape(d.change().describe())).append(" at ")
                        .append(minute(d.change().timeMs())).append(": ")
                        .append(d.detected() ? "detected after " + hours(d.delayMs()) : "not detected");
            }
            h.append("</td><td>").append(Detection.otherAlerts(s)).append("</td><td>")
                    .append(last == null ? "" : Svg.escape(String.join(", ", last.coefficients().keySet())))
                    .append("</td><td>").append(last == null ? "" : String.format(Locale.ROOT, "%.3f", last.r2()))
                    .append("</td></tr>\n");
        }
        h.append("</table>\n");
    }

    static String minute(long ms) {
        return Instant.ofEpochMilli(ms).truncatedTo(ChronoUnit.MINUTES).toString();
    }

    static String hours(long ms) {
        return String.format(Locale.ROOT, "%.1f h", ms / 3_600_000.0);
    }
}

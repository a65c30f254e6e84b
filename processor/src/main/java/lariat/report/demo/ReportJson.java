package lariat.report.demo;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.time.Instant;
import java.util.List;
import java.util.Map;

/**
 * The report's data as JSON: the same stations, versions, path knots, changes and alerts as the
 * page, plus the detection scoring. Times appear as ms since the epoch ({@code *_ms}) and as
 * ISO-8601 UTC text.
 */
final class ReportJson {

    private static final ObjectMapper MAPPER = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    private ReportJson() {
    }

    static String render(DemoReport r) {
        ObjectNode root = MAPPER.createObjectNode();
        root.put("title", r.title());
        root.put("description", r.description());
        root.put("caution", HtmlPage.CAUTION);
        ArrayNode stations = root.putArray("stations");
        for (StationReport s : r.stations()) {
            station(stations.addObject(), s);
        }
        try {
            return MAPPER.writeValueAsString(root) + "\n";
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException("cannot write the report as JSON", e);
        }
    }

    private static void station(ObjectNode o, StationReport s) {
        o.put("station", s.station());
        ArrayNode versions = o.putArray("versions");
        for (VersionSummary v : s.versions()) {
            ObjectNode n = versions.addObject();
            n.put("version", v.version());
            time(n, "from_time", v.fromTimeMs());
            time(n, "to_time", v.toTimeMs());
            coefficients(n.putObject("coefficients"), v.coefficients());
            n.put("r2", v.r2());
        }
        ArrayNode path = o.putArray("path");
        for (PathPoint k : s.path()) {
            ObjectNode n = path.addObject();
            n.put("relative_penalty", k.relativePenalty());
            coefficients(n.putObject("coefficients"), k.coefficients());
        }
        if (Double.isNaN(s.selectedRelativePenalty())) {
            o.putNull("selected_relative_penalty");
        } else {
            o.put("selected_relative_penalty", s.selectedRelativePenalty());
        }
        ArrayNode changes = o.putArray("changes");
        for (ChangeMark c : s.changes()) {
            ObjectNode n = changes.addObject();
            time(n, "time", c.timeMs());
            n.put("channel", c.channel());
            n.put("kind", c.kind().name().toLowerCase(java.util.Locale.ROOT));
        }
        ArrayNode alerts = o.putArray("alerts");
        for (AlertMark a : s.alerts()) {
            ObjectNode n = alerts.addObject();
            time(n, "time", a.timeMs());
            n.put("version", a.version());
            strings(n.putArray("entered"), a.entered());
            strings(n.putArray("left"), a.left());
            strings(n.putArray("flipped"), a.flipped());
        }
        ArrayNode detection = o.putArray("detection");
        for (Detection d : Detection.of(s)) {
            ObjectNode n = detection.addObject();
            n.put("change", d.change().describe());
            time(n, "change_time", d.change().timeMs());
            n.put("detected", d.detected());
            if (d.detected()) {
                n.put("delay_ms", d.delayMs());
                n.put("alert_version", d.alert().version());
            }
        }
        o.put("other_alerts", Detection.otherAlerts(s));
    }

    private static void time(ObjectNode n, String name, long ms) {
        n.put(name + "_ms", ms);
        n.put(name, Instant.ofEpochMilli(ms).toString());
    }

    private static void coefficients(ObjectNode n, Map<String, Double> c) {
        c.forEach(n::put);
    }

    private static void strings(ArrayNode a, List<String> values) {
        values.forEach(a::add);
    }
}

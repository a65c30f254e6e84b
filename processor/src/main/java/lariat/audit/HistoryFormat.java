package lariat.audit;

import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import lariat.report.TextTable;
import lariat.schema.ActiveFeature;
import lariat.schema.ModelVersion;

import java.time.Instant;
import java.util.List;
import java.util.Locale;

/** Text and JSON renderings of a key's history, one version and a diff, for the history command. */
public final class HistoryFormat {

    private static final JsonNodeFactory F = JsonNodeFactory.instance;

    private HistoryFormat() {
    }

    /** One row per version: version, event-time range, records, active set, R², penalty, published at. */
    public static String table(KeyHistory h) {
        TextTable t = new TextTable(List.of("version", "first event", "last event", "records", "active set", "R2",
                "penalty", "published at"), List.of(TextTable.Align.RIGHT, TextTable.Align.LEFT, TextTable.Align.LEFT,
                TextTable.Align.RIGHT, TextTable.Align.LEFT, TextTable.Align.RIGHT, TextTable.Align.RIGHT,
                TextTable.Align.LEFT));
        for (PublishedVersion p : h.versions()) {
            ModelVersion v = p.record();
            t.row(Long.toString(v.getVersion()), v.getFirstEventTimeMs().toString(), v.getLastEventTimeMs().toString(),
                    Long.toString(v.getRecordCount()), activeSet(v), String.format(Locale.ROOT, "%.6f", v.getR2()),
                    String.format(Locale.ROOT, "%.6g", v.getPenalty()), v.getPublishedAtMs().toString());
        }
        return "key " + h.key() + ": " + h.versions().size() + " versions\n" + t.render();
    }

    /** The rows of {@link #table} as JSON. */
    public static ArrayNode tableJson(KeyHistory h) {
        ArrayNode a = F.arrayNode();
        for (PublishedVersion p : h.versions()) {
            ModelVersion v = p.record();
            ObjectNode o = a.addObject();
            o.put("version", v.getVersion());
            o.put("firstEventTimeMs", v.getFirstEventTimeMs().toEpochMilli());
            o.put("lastEventTimeMs", v.getLastEventTimeMs().toEpochMilli());
            o.put("recordCount", v.getRecordCount());
            ArrayNode act = o.putArray("active");
            for (ActiveFeature f : v.getFeatures()) {
                act.add(f.getName());
            }
            o.put("r2", v.getR2());
            o.put("penalty", v.getPenalty());
            o.put("publishedAtMs", v.getPublishedAtMs().toEpochMilli());
        }
        return a;
    }

    /** The active set as {@code +name -name ...} in order of entry. */
    static String activeSet(ModelVersion v) {
        StringBuilder b = new StringBuilder();
        for (ActiveFeature f : v.getFeatures()) {
            b.append(b.length() == 0 ? "" : " ").append(f.getCoefficient() < 0 ? '-' : '+').append(f.getName());
        }
        return b.length() == 0 ? "(empty)" : b.toString();
    }

    /** One version in full, for a reader. */
    public static String show(ModelVersion v) {
        StringBuilder b = new StringBuilder();
        b.append("key ").append(v.getKey()).append(" version ").append(v.getVersion()).append('\n');
        line(b, "event time", v.getFirstEventTimeMs() + " .. " + v.getLastEventTimeMs());
        line(b, "records", v.getRecordCount() + String.format(Locale.ROOT, " (total weight %s, effective %s)",
                v.getTotalWeight(), v.getEffectiveWeight()));
        line(b, "input", v.getInputTopic() + "/" + v.getInputPartition() + " below offset " + v.getInputEndOffset());
        line(b, "target", v.getTarget());
        line(b, "selection", v.getSelectionRule() + (v.getSelectionParameter() == null ? ""
                : " " + v.getSelectionParameter()) + ", penalty " + v.getPenalty() + " (relative "
                + v.getRelativePenalty() + ")");
        line(b, "fit", "R2 " + v.getR2() + ", RSS " + v.getRss() + ", df " + v.getDf());
        line(b, "intercept", v.getIntercept() + (v.getRefitIntercept() == null ? "" : " (refit "
                + v.getRefitIntercept() + ")"));
        TextTable t = new TextTable(List.of("feature", "coefficient", "standardized", "refit"), List.of(
                TextTable.Align.LEFT, TextTable.Align.RIGHT, TextTable.Align.RIGHT, TextTable.Align.RIGHT));
        for (ActiveFeature f : v.getFeatures()) {
            t.row(f.getName(), Double.toString(f.getCoefficient()), Double.toString(f.getStandardizedCoefficient()),
                    f.getRefitCoefficient() == null ? "" : Double.toString(f.getRefitCoefficient()));
        }
        b.append(t.render());
        line(b, "change", "entered " + v.getChange().getEntered() + ", left " + v.getChange().getLeft()
                + ", sign flipped " + v.getChange().getSignFlipped());
        line(b, "path", v.getPath().size() + " knots");
        line(b, "fingerprint", v.getMomentsFingerprint());
        line(b, "config hash", v.getConfigHash());
        line(b, "build", v.getBuildVersion());
        line(b, "published at", v.getPublishedAtMs().toString());
        return b.toString();
    }

    private static void line(StringBuilder b, String label, String value) {
        b.append(String.format(Locale.ROOT, "%-13s %s%n", label, value));
    }

    /** A diff for a reader. */
    public static String diff(VersionDiff d) {
        StringBuilder b = new StringBuilder();
        b.append("key ").append(d.key()).append(": version ").append(d.fromVersion()).append(" -> ")
                .append(d.toVersion()).append('\n');
        line(b, "entered", d.entered().toString());
        line(b, "left", d.left().toString());
        line(b, "sign flipped", d.signFlipped().toString());
        if (!d.coefficientChanges().isEmpty()) {
            TextTable t = new TextTable(List.of("feature", "before", "after", "change"), List.of(TextTable.Align.LEFT,
                    TextTable.Align.RIGHT, TextTable.Align.RIGHT, TextTable.Align.RIGHT));
            for (VersionDiff.CoefficientChange c : d.coefficientChanges()) {
                t.row(c.name(), Double.toString(c.before()), Double.toString(c.after()), Double.toString(c.change()));
            }
            b.append(t.render());
        }
        for (FieldDifference f : d.selectionChanges()) {
            line(b, f.field(), f.expected() + " -> " + f.actual());
        }
        return b.toString();
    }

    /** A diff as JSON. */
    public static ObjectNode diffJson(VersionDiff d) {
        ObjectNode o = F.objectNode();
        o.put("key", d.key()).put("from", d.fromVersion()).put("to", d.toVersion());
        strings(o.putArray("entered"), d.entered());
        strings(o.putArray("left"), d.left());
        strings(o.putArray("signFlipped"), d.signFlipped());
        ArrayNode cs = o.putArray("coefficientChanges");
        for (VersionDiff.CoefficientChange c : d.coefficientChanges()) {
            cs.addObject().put("feature", c.name()).put("before", c.before()).put("after", c.after());
        }
        ArrayNode ss = o.putArray("selectionChanges");
        for (FieldDifference f : d.selectionChanges()) {
            ss.addObject().put("field", f.field()).put("before", f.expected()).put("after", f.actual());
        }
        return o;
    }

    private static void strings(ArrayNode a, List<String> xs) {
        xs.forEach(a::add);
    }

    /**
     * A time given on the command line: epoch milliseconds, or an ISO-8601 instant such as
     * {@code 2026-03-14T03:00:00Z}.
     *
     * @throws IllegalArgumentException naming {@code option} when the text is neither
     */
    public static long parseTime(String option, String text) {
        if (text.matches("-?\\d+")) {
            return Long.parseLong(text);
        }
        try {
            return Instant.parse(text).toEpochMilli();
        } catch (java.time.format.DateTimeParseException e) {
            throw new IllegalArgumentException(option + ": not epoch milliseconds or an ISO-8601 instant "
                    + "(2026-03-14T03:00:00Z): " + text);
        }
    }
}

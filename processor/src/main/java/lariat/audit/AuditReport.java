package lariat.audit;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;

import java.util.List;
import java.util.Locale;

/**
 * The result of an audit: one verdict per audited version, the replays performed, and what was
 * audited against. Passes only when every verdict passes and at least one version was audited.
 * Immutable.
 */
public final class AuditReport {

    /** One partition replay: what it read and how long it took. */
    public static final class Replay {
        private final String topic;
        private final int partition;
        private final long endOffset;
        private final long records;
        private final long accepted;
        private final double seconds;

        private Replay(String topic, int partition, long endOffset, long records, long accepted, double seconds) {
            this.topic = topic;
            this.partition = partition;
            this.endOffset = endOffset;
            this.records = records;
            this.accepted = accepted;
            this.seconds = seconds;
        }

        static Replay of(String topic, int partition, long endOffset, InputReplay.Result r) {
            return new Replay(topic, partition, endOffset, r.records(), r.accepted(), r.seconds());
        }

        public String topic() {
            return topic;
        }

        public int partition() {
            return partition;
        }

        public long records() {
            return records;
        }

        public double seconds() {
            return seconds;
        }
    }

    private static final ObjectMapper JSON = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    private final String modelTopic;
    private final String configHash;
    private final List<VersionVerdict> verdicts;
    private final List<Replay> replays;
    private final long undecodable;

    private AuditReport(String modelTopic, String configHash, List<VersionVerdict> verdicts, List<Replay> replays,
                        long undecodable) {
        this.modelTopic = modelTopic;
        this.configHash = configHash;
        this.verdicts = verdicts;
        this.replays = replays;
        this.undecodable = undecodable;
    }

    static AuditReport of(String modelTopic, String configHash, List<VersionVerdict> verdicts, List<Replay> replays,
                          long undecodable) {
        return new AuditReport(modelTopic, configHash, List.copyOf(verdicts), List.copyOf(replays), undecodable);
    }

    public List<VersionVerdict> verdicts() {
        return verdicts;
    }

    public List<Replay> replays() {
        return replays;
    }

    /** Whether at least one version was audited and every one passed. */
    public boolean passed() {
        return !verdicts.isEmpty() && verdicts.stream().allMatch(VersionVerdict::passed);
    }

    /** Verdicts with {@code status}. */
    public long count(VersionVerdict.Status status) {
        return verdicts.stream().filter(v -> v.status() == status).count();
    }

    /** Model-topic records that are not model versions. */
    public long undecodable() {
        return undecodable;
    }

    /** The report for a reader: one block per version, then the totals. */
    public String text() {
        StringBuilder b = new StringBuilder();
        b.append("audit of model topic ").append(modelTopic).append(" against configuration hash ")
                .append(configHash).append('\n');
        for (Replay r : replays) {
            b.append(String.format(Locale.ROOT, "replayed %s/%d offsets 0..%d: %d records (%d accepted) in %.2f s%n",
                    r.topic, r.partition, r.endOffset - 1, r.records, r.accepted, r.seconds));
        }
        if (undecodable > 0) {
            b.append(undecodable).append(" model-topic records are not model versions and were skipped\n");
        }
        for (VersionVerdict v : verdicts) {
            block(b, v);
        }
        b.append(String.format(Locale.ROOT, "%d versions: %d pass, %d fail, %d missing input -> %s%n",
                verdicts.size(), count(VersionVerdict.Status.PASS), count(VersionVerdict.Status.FAIL),
                count(VersionVerdict.Status.MISSING_INPUT), passed() ? "PASS" : "FAIL"));
        return b.toString();
    }

    private static void block(StringBuilder b, VersionVerdict v) {
        String status = v.status() == VersionVerdict.Status.MISSING_INPUT ? "MISSING INPUT" : v.status().name();
        b.append('\n').append(v.key()).append(" version ").append(v.version()).append(": ").append(status)
                .append("  (input ").append(v.inputTopic()).append('/').append(v.inputPartition())
                .append(", end offset ").append(v.inputEndOffset()).append(")\n");
        b.append("  config hash   recorded ").append(v.recordedConfigHash())
                .append(v.configHashMatches() ? "  = given\n" : "\n                given    " + v.givenConfigHash()
                        + "  DIFFERS\n");
        b.append("  fingerprint   published ").append(v.expectedFingerprint()).append('\n');
        if (v.actualFingerprint() != null) {
            b.append("                replayed  ").append(v.actualFingerprint())
                    .append(v.actualFingerprint().equals(v.expectedFingerprint()) ? "  =\n" : "  DIFFERS\n");
        }
        if (!v.differences().isEmpty()) {
            FieldDifference f = v.differences().get(0);
            b.append("  first difference  ").append(f.field()).append('\n')
                    .append("                published  ").append(f.expected()).append('\n')
                    .append("                recomputed ").append(f.actual()).append('\n');
            if (v.differences().size() > 1) {
                b.append("  ").append(v.differences().size() - 1).append(" more differing fields: ");
                for (int i = 1; i < v.differences().size() && i <= 8; i++) {
                    b.append(i > 1 ? ", " : "").append(v.differences().get(i).field());
                }
                b.append(v.differences().size() > 9 ? ", ...\n" : "\n");
            }
        }
        if (v.status() == VersionVerdict.Status.MISSING_INPUT) {
            b.append("  missing input offsets ").append(v.missingFrom()).append("..").append(v.missingTo())
                    .append(" of ").append(v.inputTopic()).append('/').append(v.inputPartition()).append('\n');
        }
        if (v.detail() != null) {
            b.append("  ").append(v.detail()).append('\n');
        }
    }

    /** The report as a JSON document. */
    public ObjectNode json() {
        ObjectNode root = JSON.createObjectNode();
        root.put("modelTopic", modelTopic);
        root.put("configHash", configHash);
        root.put("passed", passed());
        root.put("versions", verdicts.size());
        root.put("pass", count(VersionVerdict.Status.PASS));
        root.put("fail", count(VersionVerdict.Status.FAIL));
        root.put("missingInput", count(VersionVerdict.Status.MISSING_INPUT));
        root.put("undecodableModelRecords", undecodable);
        ArrayNode rs = root.putArray("replays");
        for (Replay r : replays) {
            rs.addObject().put("topic", r.topic).put("partition", r.partition).put("endOffset", r.endOffset)
                    .put("records", r.records).put("accepted", r.accepted).put("seconds", r.seconds);
        }
        ArrayNode vs = root.putArray("results");
        for (VersionVerdict v : verdicts) {
            ObjectNode o = vs.addObject();
            o.put("key", v.key()).put("version", v.version()).put("status", v.status().name().toLowerCase(Locale.ROOT))
                    .put("inputTopic", v.inputTopic()).put("inputPartition", v.inputPartition())
                    .put("inputEndOffset", v.inputEndOffset())
                    .put("recordedConfigHash", v.recordedConfigHash()).put("givenConfigHash", v.givenConfigHash())
                    .put("configHashMatches", v.configHashMatches())
                    .put("expectedFingerprint", v.expectedFingerprint())
                    .put("actualFingerprint", v.actualFingerprint())
                    .put("firstDifferingField", v.firstDifferingField());
            ArrayNode ds = o.putArray("differences");
            for (FieldDifference d : v.differences()) {
                ds.addObject().put("field", d.field()).put("published", d.expected()).put("recomputed", d.actual());
            }
            if (v.status() == VersionVerdict.Status.MISSING_INPUT) {
                o.putObject("missingOffsets").put("from", v.missingFrom()).put("to", v.missingTo());
            }
            o.put("detail", v.detail());
        }
        return root;
    }

    /** {@link #json()} as indented text. */
    public String jsonText() {
        try {
            return JSON.writeValueAsString(json());
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException("the report cannot be written as JSON", e);
        }
    }
}

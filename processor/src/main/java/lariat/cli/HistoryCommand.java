package lariat.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ObjectNode;
import lariat.audit.AvroJson;
import lariat.audit.ClusterClients;
import lariat.audit.HistoryFormat;
import lariat.audit.KeyHistory;
import lariat.audit.ModelTopicReader;
import lariat.audit.PublishedVersion;
import lariat.audit.VersionDiff;
import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.common.KafkaException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

import java.io.IOException;
import java.io.PrintWriter;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.TreeMap;
import java.util.concurrent.Callable;

/** The {@code history} command: browse, show, diff and look up a key's published model versions. */
@Command(name = "history", mixinStandardHelpOptions = true,
        description = {
            "Reads the model topic (read_committed) and, for a key, lists its versions (version, event-time "
                + "range, records, active set, R2, penalty, published at), shows one version in full, diffs two "
                + "versions (entered, left, sign flips, coefficient changes, selection change), or finds the version "
                + "in force at an event time (the newest whose records are all at or before it) or at a publish "
                + "time (the newest published at or before it). Without --key, lists the keys.",
            "",
            "Examples:",
            "  lariat history --bootstrap-servers localhost:9092 --key st-07",
            "  lariat history --key st-07 --diff 3 4",
            "  lariat history --key st-07 --at-event-time 2026-03-14T03:00:00Z --json",
            "",
            "Exit status: 0 on success, 1 when a version asked for does not exist, 2 on bad options or a failure."
        })
public final class HistoryCommand implements Callable<Integer> {

    private static final ObjectMapper JSON = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    @Spec
    CommandSpec spec;

    @Mixin
    ReplayClusterOptions cluster;

    @Option(names = "--model-topic", paramLabel = "TOPIC", defaultValue = "lariat.models",
            description = "Model topic (default: ${DEFAULT-VALUE}).")
    String modelTopic;

    @Option(names = "--key", paramLabel = "KEY", description = "Model key.")
    String key;

    @Option(names = "--show", paramLabel = "VERSION", description = "Show this version in full.")
    Long show;

    @Option(names = "--diff", arity = "2", paramLabel = "VERSION", description = "Diff two versions: FROM TO.")
    long[] diff;

    @Option(names = "--at-event-time", paramLabel = "TIME",
            description = "Version in force at this event time (epoch ms or ISO-8601 instant).")
    String atEventTime;

    @Option(names = "--at-publish-time", paramLabel = "TIME",
            description = "Version in force at this publish time (epoch ms or ISO-8601 instant).")
    String atPublishTime;

    @Option(names = "--json", description = "Write JSON instead of a table.")
    boolean json;


    @Override
    public Integer call() throws IOException {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        List<PublishedVersion> versions;
        try {
            ClusterClients clients = ClusterClients.of(cluster.clientProperties(Map.of()), "lariat-history");
            try (Consumer<byte[], byte[]> c = clients.consumer()) {
                versions = new ModelTopicReader(c, cluster.timeout())
                        .read(modelTopic, k -> key == null || key.equals(k)).versions();
            }
        } catch (IllegalArgumentException | IllegalStateException | KafkaException e) {
            err.println("history: " + e.getMessage());
            return 2;
        }
        if (key == null) {
            return keys(versions, out);
        }
        KeyHistory h = KeyHistory.of(key, versions);
        try {
            if (show != null) {
                return show(h, show, out, err);
            }
            if (diff != null) {
                return diff(h, out, err);
            }
            if (atEventTime != null || atPublishTime != null) {
                return asOf(h, out, err);
            }
        } catch (IllegalArgumentException e) {
            err.println("history: " + e.getMessage());
            return 2;
        }
        out.println(json ? JSON.writeValueAsString(HistoryFormat.tableJson(h)) : HistoryFormat.table(h));
        if (!h.gaps().isEmpty() || !h.duplicates().isEmpty()) {
            err.println("warning: missing versions " + h.gaps() + ", duplicated versions " + h.duplicates());
        }
        return 0;
    }

    private Integer keys(List<PublishedVersion> versions, PrintWriter out) throws IOException {
        Map<String, Long> latest = new TreeMap<>();
        for (PublishedVersion v : versions) {
            latest.merge(v.key(), v.version(), Math::max);
        }
        if (json) {
            ObjectNode o = JSON.createObjectNode();
            latest.forEach(o::put);
            out.println(JSON.writeValueAsString(o));
        } else {
            latest.forEach((k, v) -> out.println(k + "  latest version " + v));
        }
        return 0;
    }

    private Integer show(KeyHistory h, long version, PrintWriter out, PrintWriter err) throws IOException {
        Optional<PublishedVersion> v = h.get(version);
        if (v.isEmpty()) {
            err.println("history: key " + h.key() + " has no version " + version);
            return 1;
        }
        out.println(json ? JSON.writeValueAsString(AvroJson.of(v.get().record())) : HistoryFormat.show(v.get().record()));
        return 0;
    }

    private Integer diff(KeyHistory h, PrintWriter out, PrintWriter err) throws IOException {
        Optional<PublishedVersion> a = h.get(diff[0]);
        Optional<PublishedVersion> b = h.get(diff[1]);
        if (a.isEmpty() || b.isEmpty()) {
            err.println("history: key " + h.key() + " has no version " + (a.isEmpty() ? diff[0] : diff[1]));
            return 1;
        }
        VersionDiff d = VersionDiff.of(a.get().record(), b.get().record());
        out.println(json ? JSON.writeValueAsString(HistoryFormat.diffJson(d)) : HistoryFormat.diff(d));
        return 0;
    }

    private Integer asOf(KeyHistory h, PrintWriter out, PrintWriter err) throws IOException {
        Optional<PublishedVersion> v;
        String what;
        if (atEventTime != null) {
            long t = HistoryFormat.parseTime("--at-event-time", atEventTime);
            v = h.asOfEventTime(t);
            what = "event time " + java.time.Instant.ofEpochMilli(t);
        } else {
            long t = HistoryFormat.parseTime("--at-publish-time", atPublishTime);
            v = h.asOfPublishTime(t);
            what = "publish time " + java.time.Instant.ofEpochMilli(t);
        }
        if (v.isEmpty()) {
            err.println("history: key " + h.key() + " had no version in force at " + what);
            return 1;
        }
        if (json) {
            out.println(JSON.writeValueAsString(AvroJson.of(v.get().record())));
        } else {
            out.println("in force at " + what + ": version " + v.get().version());
            out.print(HistoryFormat.show(v.get().record()));
        }
        return 0;
    }
}

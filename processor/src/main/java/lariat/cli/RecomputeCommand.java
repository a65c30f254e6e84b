package lariat.cli;

import lariat.audit.AuditScope;
import lariat.audit.ClusterClients;
import lariat.audit.HistoryFormat;
import lariat.audit.Progress;
import lariat.audit.ProgressLine;
import lariat.audit.Recomputer;
import lariat.config.StageConfig;
import org.apache.kafka.clients.producer.Producer;
import org.apache.kafka.common.KafkaException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;

import java.io.IOException;
import java.io.PrintStream;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.Set;
import java.util.concurrent.Callable;

/** The {@code recompute} command: what published history would have been under another configuration. */
@Command(name = "recompute", mixinStandardHelpOptions = true,
        description = {
            "Replays the input behind a key's (or every key's) published versions under the configuration "
                + "--config (say another half-life or selection rule), refitting at each published version's end "
                + "offset, so recomputed version N covers exactly the input of published version N. Writes one "
                + "JSON line per version (the published record, the recomputed record, the differing fields) to "
                + "--output, and/or the recomputed model records to --output-topic. Live topics are only read; "
                + "an output topic equal to one of the configuration's topics is refused.",
            "",
            "Example:",
            "  lariat recompute --config half-life-1d.properties --published-topic lariat.models --output what-if.jsonl",
            "",
            "Exit status: 0 when every version was recomputed, 1 when some could not be (missing input), "
                + "2 on bad options or a failure."
        })
public final class RecomputeCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Option(names = "--config", paramLabel = "FILE", required = true,
            description = "The configuration to recompute under (.properties).")
    Path config;

    @Option(names = "--published-topic", paramLabel = "TOPIC",
            description = "Model topic holding the published history (default: the configuration's model.topic).")
    String publishedTopic;

    @Mixin
    ReplayClusterOptions cluster;

    @Option(names = "--key", paramLabel = "KEY", description = "Model key (default: every key).")
    String key;

    @Option(names = "--output", paramLabel = "FILE", description = "JSON-lines file to write.")
    Path output;

    @Option(names = "--output-topic", paramLabel = "TOPIC", description = "Topic to send recomputed model records to.")
    String outputTopic;

    @Option(names = "--quiet", description = "No progress lines on stderr.")
    boolean quiet;


    @Override
    public Integer call() throws IOException, InterruptedException {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        if (!Files.isRegularFile(config)) {
            err.println("--config: no such file: " + config);
            return 2;
        }
        if (output == null && outputTopic == null) {
            err.println("recompute: give --output FILE and/or --output-topic TOPIC");
            return 2;
        }
        List<Recomputer.Recomputed> results;
        try {
            StageConfig c = StageConfig.load(config);
            String published = publishedTopic != null ? publishedTopic : c.get(StageConfig.MODEL_TOPIC);
            Set<String> live = Set.of(published, c.get(StageConfig.MODEL_TOPIC), c.get(StageConfig.INPUT_TOPIC),
                    c.get(StageConfig.ALERT_TOPIC), c.get(StageConfig.SNAPSHOT_TOPIC), c.get(StageConfig.DEADLETTER_TOPIC),
                    c.get(StageConfig.CLAIM_TOPIC));
            if (outputTopic != null && live.contains(outputTopic)) {
                err.println("--output-topic: " + outputTopic + " is a live topic of the configuration; choose another");
                return 2;
            }
            ClusterClients clients = ClusterClients.of(cluster.clientProperties(c.consumerProperties()), "lariat-recompute");
            Progress progress = quiet ? Progress.NONE
                    : new ProgressLine(new PrintStream(System.err, true, StandardCharsets.UTF_8), 1000);
            results = new Recomputer(clients, c, config.toAbsolutePath().getParent(), cluster.timeout(),
                    progress).recompute(published, AuditScope.of(key, 0, Long.MIN_VALUE, Long.MAX_VALUE));
            if (output != null) {
                Recomputer.writeJson(results, output);
            }
            if (outputTopic != null) {
                try (Producer<byte[], byte[]> p = clients.producer()) {
                    Recomputer.send(results, p, outputTopic);
                }
            }
        } catch (IllegalArgumentException | IllegalStateException | KafkaException e) {
            err.println("recompute: " + e.getMessage());
            return 2;
        }
        long failed = results.stream().filter(r -> r.problem() != null).count();
        long changed = results.stream().filter(r -> r.problem() == null && !r.differences().isEmpty()).count();
        out.println(results.size() + " versions recomputed: " + (results.size() - failed - changed)
                + " identical to the published ones, " + changed + " different, " + failed + " not recomputable");
        for (Recomputer.Recomputed r : results) {
            if (r.problem() != null) {
                out.println("  " + r.published().key() + " v" + r.published().version() + ": " + r.problem());
            }
        }
        return failed == 0 ? 0 : 1;
    }
}

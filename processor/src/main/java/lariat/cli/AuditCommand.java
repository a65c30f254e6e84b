package lariat.cli;

import lariat.audit.AuditReport;
import lariat.audit.AuditScope;
import lariat.audit.Auditor;
import lariat.audit.ClusterClients;
import lariat.audit.HistoryFormat;
import lariat.audit.Progress;
import lariat.audit.ProgressLine;
import lariat.config.StageConfig;
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
import java.util.concurrent.Callable;

/** The {@code audit} command: proves that published model versions follow from the input and the configuration. */
@Command(name = "audit", mixinStandardHelpOptions = true,
        description = {
            "For a key and version, all versions of a key, all keys, or the versions published in a time range: "
                + "checks that each version's recorded configuration hash equals the hash of --config; replays "
                + "the input partition the version names from offset 0 up to its recorded end offset through the "
                + "stage's own decoding, validation, routing, moments, path and selection code; and compares the "
                + "moments fingerprint and every published field bit for bit (publishedAtMs and buildVersion "
                + "excepted). Progress goes to stderr; the report to stdout and, with --json, to a file.",
            "When retention or deleteRecords removed input a version depends on, the report names the missing "
                + "offsets instead of a mismatch.",
            "",
            "Example:",
            "  lariat audit --config stage.properties --key st-07 --json audit.json",
            "",
            "Exit status: 0 when every audited version passes, 1 when any fails or misses input (or none was "
                + "found), 2 on bad options or a failure."
        })
public final class AuditCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Option(names = "--config", paramLabel = "FILE", required = true,
            description = "The stage configuration to audit against (.properties).")
    Path config;

    @Mixin
    ReplayClusterOptions cluster;

    @Option(names = "--model-topic", paramLabel = "TOPIC",
            description = "Model topic to audit (default: the configuration's model.topic).")
    String modelTopic;

    @Option(names = "--key", paramLabel = "KEY", description = "Model key (default: every key).")
    String key;

    @Option(names = "--version", paramLabel = "N", defaultValue = "0",
            description = "Version of --key (default: every version).")
    long version;

    @Option(names = "--published-from", paramLabel = "TIME",
            description = "Only versions published at or after this time (epoch ms or ISO-8601 instant).")
    String from;

    @Option(names = "--published-to", paramLabel = "TIME",
            description = "Only versions published at or before this time (epoch ms or ISO-8601 instant).")
    String to;

    @Option(names = "--json", paramLabel = "OUT", description = "Also write the report as JSON to this file.")
    Path jsonOut;

    @Option(names = "--quiet", description = "No progress lines on stderr.")
    boolean quiet;


    @Override
    public Integer call() throws IOException {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        if (!Files.isRegularFile(config)) {
            err.println("--config: no such file: " + config);
            return 2;
        }
        AuditReport report;
        try {
            StageConfig c = StageConfig.load(config);
            AuditScope scope = AuditScope.of(key, version,
                    from == null ? Long.MIN_VALUE : HistoryFormat.parseTime("--published-from", from),
                    to == null ? Long.MAX_VALUE : HistoryFormat.parseTime("--published-to", to));
            ClusterClients clients = ClusterClients.of(cluster.clientProperties(c.consumerProperties()), "lariat-audit");
            Progress progress = quiet ? Progress.NONE
                    : new ProgressLine(new PrintStream(System.err, true, StandardCharsets.UTF_8), 1000);
            Auditor auditor = new Auditor(clients, c, config.toAbsolutePath().getParent(),
                    cluster.timeout(), progress);
            report = auditor.audit(modelTopic != null ? modelTopic : c.get(StageConfig.MODEL_TOPIC), scope);
        } catch (IllegalArgumentException | IllegalStateException | KafkaException e) {
            err.println("audit: " + e.getMessage());
            return 2;
        }
        out.print(report.text());
        out.flush();
        if (jsonOut != null) {
            Files.writeString(jsonOut, report.jsonText(), StandardCharsets.UTF_8);
        }
        return report.passed() ? 0 : 1;
    }
}

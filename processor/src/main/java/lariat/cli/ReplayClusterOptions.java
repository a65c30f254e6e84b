package lariat.cli;

import java.io.IOException;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Map;

import lariat.audit.ClusterClients;
import picocli.CommandLine.Option;

/**
 * The cluster options of the commands that read a stage's history from the cluster ({@code history},
 * {@code audit}, {@code recompute}): where a command reads a stage configuration, that names the
 * cluster and these options override it; {@code --bootstrap-servers} overrides the client file's.
 */
final class ReplayClusterOptions {

    @Option(names = "--bootstrap-servers", paramLabel = "HOSTS",
            description = "Kafka bootstrap servers (default: the client file's, else the configuration's).")
    String bootstrapServers;

    @Option(names = "--client-config", paramLabel = "FILE",
            description = "Kafka client properties (TLS, SASL, ...), over the configuration's where there is one.")
    Path clientConfig;

    @Option(names = "--timeout-ms", defaultValue = "30000", paramLabel = "MS",
            description = "Longest wait without progress (default: ${DEFAULT-VALUE}).")
    long timeoutMs;

    /** {@code --timeout-ms} as a duration. */
    Duration timeout() {
        return Duration.ofMillis(timeoutMs);
    }

    /** The configuration's client properties with these options applied over them. */
    Map<String, Object> clientProperties(Map<String, Object> fromConfiguration) throws IOException {
        return ClusterClients.properties(fromConfiguration, clientConfig, bootstrapServers);
    }
}

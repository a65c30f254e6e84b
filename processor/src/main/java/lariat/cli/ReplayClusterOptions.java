package lariat.cli;

import java.io.IOException;
import java.nio.file.Path;
import java.util.Map;

import lariat.audit.ClusterClients;
import picocli.CommandLine.Option;

/**
 * The cluster options of the commands that replay a stage configuration's history ({@code audit},
 * {@code recompute}): the configuration names the cluster; these options override it.
 */
final class ReplayClusterOptions {

    @Option(names = "--bootstrap-servers", paramLabel = "HOSTS",
            description = "Kafka bootstrap servers (default: the configuration's).")
    String bootstrapServers;

    @Option(names = "--client-config", paramLabel = "FILE",
            description = "Kafka client properties (TLS, SASL, ...), over the configuration's.")
    Path clientConfig;

    /** The configuration's client properties with these options applied over them. */
    Map<String, Object> clientProperties(Map<String, Object> fromConfiguration) throws IOException {
        return ClusterClients.properties(fromConfiguration, clientConfig, bootstrapServers);
    }
}

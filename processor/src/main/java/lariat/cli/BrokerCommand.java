package lariat.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;

import lariat.broker.EmbeddedBroker;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParameterException;
import picocli.CommandLine.Spec;

/** The {@code broker} command: runs a one-node Kafka broker in this process until stopped. */
@Command(name = "broker", mixinStandardHelpOptions = true,
        description = {
            "Runs Apache Kafka's own broker inside this process: one KRaft node that is both "
                    + "broker and controller, listening on 127.0.0.1 only, for trying Lariat "
                    + "without a Kafka cluster.",
            "Internal topics use replication factor 1, so transactions work; topics are not "
                    + "created on first use. Runs until Ctrl-C, then shuts down cleanly."},
        footer = {"", "Examples:",
            "  lariat broker",
            "  lariat broker --port 9092 --data-dir kafka-data"})
public final class BrokerCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Option(names = "--port", paramLabel = "N", defaultValue = "0",
            description = "Client (PLAINTEXT) port; 0 picks a free one. Default: ${DEFAULT-VALUE}.")
    int port;

    @Option(names = "--data-dir", paramLabel = "DIR",
            description = "Folder for the broker's logs, kept after exit; a second run on the same "
                    + "folder sees the same topics and records. Default: a temporary folder, "
                    + "deleted on exit.")
    Path dataDir;

    @Override
    public Integer call() throws InterruptedException {
        EmbeddedBroker.Builder builder = EmbeddedBroker.builder();
        try {
            builder.port(port);
            if (dataDir != null) {
                builder.dataDir(dataDir);
            }
        } catch (IllegalArgumentException e) {
            throw new ParameterException(spec.commandLine(), e.getMessage(), e);
        }
        EmbeddedBroker broker;
        try {
            broker = builder.start();
        } catch (IllegalStateException e) {
            spec.commandLine().getErr().println("lariat broker: " + e.getMessage());
            return 1;
        }
        CountDownLatch stopped = new CountDownLatch(1);
        Runtime.getRuntime().addShutdownHook(new Thread(() -> {
            broker.close();
            stopped.countDown();
        }, "lariat-broker-shutdown"));
        PrintWriter out = spec.commandLine().getOut();
        out.println("Kafka broker running.");
        out.println("  bootstrap.servers = " + broker.bootstrapServers());
        out.println("  data folder       = " + broker.dataDir()
                + (dataDir == null ? " (deleted on exit)" : " (kept)"));
        out.println("Press Ctrl-C to stop.");
        out.flush();
        stopped.await();
        return 0;
    }
}

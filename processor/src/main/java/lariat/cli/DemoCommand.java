package lariat.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.LocalDateTime;
import java.time.format.DateTimeFormatter;
import java.util.Locale;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.TimeUnit;

import lariat.demo.DemoPlan;
import lariat.demo.DemoRun;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParameterException;
import picocli.CommandLine.Spec;

/** The {@code demo} command: the generator, a real broker and the stage in one process, then a report. */
@Command(name = "demo", mixinStandardHelpOptions = true, sortOptions = false,
        description = {
            "Runs the whole job on an invented fleet of pumping stations: starts an embedded Kafka broker "
                    + "(unless --bootstrap-servers is given), sends a week of minute readings per station "
                    + "(event time runs far faster than wall time), runs the stage on them in this process "
                    + "and prints each model version and each active-set change alert as it is published.",
            "At the end it prints a table scoring the alerts against the changes the generator injected "
                    + "and writes a report folder: index.html (SVG plots of each station's latest path and of "
                    + "its active set over the versions) and report.json.",
            "Stops when every reading has been processed, when --duration is over, or on Ctrl-C."},
        footer = {"", "Example:", "  java -jar processor/target/lariat.jar demo --duration 90s --report demo-report",
            "", "Exit codes: 0 the demo ran and wrote its report; 1 broker, stage or report failure; 2 bad options."})
public final class DemoCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Option(names = "--duration", paramLabel = "D", defaultValue = "90s", converter = ProduceCommand.DurationText.class,
            description = "Longest wall-clock time of the run, e.g. 90s or 2m. Default: ${DEFAULT-VALUE}.")
    Duration duration;

    @Option(names = "--report", paramLabel = "DIR",
            description = "Report folder (created). Default: a new folder ./lariat-demo-<date>-<time>.")
    Path report;

    @Option(names = "--bootstrap-servers", paramLabel = "HOST:PORT",
            description = "Use this Kafka cluster instead of an embedded broker; the run's topics get a unique name.")
    String bootstrapServers;

    @Option(names = "--stations", paramLabel = "N", defaultValue = "6",
            description = "Stations, 1 to 12; stations 0-3 get injected changes, the others none. "
                    + "Default: ${DEFAULT-VALUE}.")
    int stations;

    @Option(names = "--seed", paramLabel = "K", defaultValue = "7",
            description = "Seed of the scenario. Default: ${DEFAULT-VALUE}.")
    long seed;

    private static final String LOG_DEFAULT = "org.slf4j.simpleLogger.defaultLogLevel";
    private static final String LOG_KAFKA = "org.slf4j.simpleLogger.log.org.apache.kafka";
    /** The embedded broker's own loggers (kafka.server etc.); its clients' failures reach the stage's log. */
    private static final String LOG_BROKER = "org.slf4j.simpleLogger.log.kafka";
    private static final String LOG_LARIAT = "org.slf4j.simpleLogger.log.lariat";
    private static final DateTimeFormatter FOLDER = DateTimeFormatter.ofPattern("yyyyMMdd-HHmmss", Locale.ROOT);

    @Override
    public Integer call() throws IOException, InterruptedException {
        quietLogs();
        if (stations < 1 || stations > 12) {
            throw new ParameterException(spec.commandLine(), "--stations must be in 1..12, got " + stations);
        }
        if (duration.toSeconds() < 10) {
            throw new ParameterException(spec.commandLine(), "--duration must be at least 10s, got " + duration);
        }
        String runId = LocalDateTime.now().format(FOLDER).replace('-', 't') + "-" + Long.toHexString(
                System.nanoTime() & 0xffff);
        DemoPlan plan = DemoPlan.of(stations, seed, duration, runId);
        Path dir = report != null ? report : newFolder();
        if (Files.isRegularFile(dir)) {
            throw new ParameterException(spec.commandLine(), "--report names a file, not a folder: " + dir);
        }
        PrintWriter out = spec.commandLine().getOut();
        DemoRun run = new DemoRun(plan, bootstrapServers, dir, out, System.console() != null);
        CountDownLatch done = new CountDownLatch(1);
        Thread hook = new Thread(() -> {
            run.stop();
            try {
                done.await(60, TimeUnit.SECONDS);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }, "lariat-demo-shutdown");
        Runtime.getRuntime().addShutdownHook(hook);
        try {
            run.run();
            return 0;
        } catch (IllegalStateException e) {
            spec.commandLine().getErr().println("demo: " + e.getMessage());
            return 1;
        } finally {
            out.flush();
            done.countDown();
            try {
                Runtime.getRuntime().removeShutdownHook(hook);
            } catch (IllegalStateException shuttingDown) {
                run.stop();
            }
        }
    }

    /** Kafka's clients and broker log at INFO by default; the demo's console is the output. */
    private static void quietLogs() {
        if (System.getProperty(LOG_DEFAULT) == null) {
            System.setProperty(LOG_DEFAULT, "warn");
        }
        if (System.getProperty(LOG_KAFKA) == null) {
            System.setProperty(LOG_KAFKA, "error");
        }
        if (System.getProperty(LOG_BROKER) == null) {
            System.setProperty(LOG_BROKER, "off");
        }
        if (System.getProperty(LOG_LARIAT) == null) {
            System.setProperty(LOG_LARIAT, "warn");
        }
    }

    private static Path newFolder() {
        String base = "lariat-demo-" + LocalDateTime.now().format(FOLDER);
        Path p = Path.of(base);
        for (int i = 2; Files.exists(p); i++) {
            p = Path.of(base + "-" + i);
        }
        return p;
    }
}

package lariat.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Properties;
import java.util.Set;
import java.util.concurrent.Callable;
import java.util.concurrent.CountDownLatch;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;

import lariat.scenario.CsvCopy;
import lariat.scenario.InjectedChange;
import lariat.scenario.ReadingEncoder;
import lariat.scenario.Scenario;
import lariat.scenario.ScenarioProducer;
import lariat.scenario.ScenarioSpec;
import lariat.scenario.WireFormat;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.AdminClientConfig;
import org.apache.kafka.clients.admin.NewTopic;
import org.apache.kafka.clients.admin.TopicDescription;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.Producer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.common.serialization.ByteArraySerializer;
import picocli.CommandLine;
import picocli.CommandLine.ArgGroup;
import picocli.CommandLine.Command;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.ParameterException;
import picocli.CommandLine.Spec;

/** The {@code produce} command: sends the invented pumping-station scenario to a Kafka topic. */
@Command(name = "produce", mixinStandardHelpOptions = true, sortOptions = false,
        description = {
            "Sends the invented demo scenario to a Kafka topic: a fleet of pumping stations, each "
                    + "reporting 24 sensor channels and motor_current_a once per simulated interval, "
                    + "with planned changes of which channels drive the current at some stations.",
            "Records are keyed by station (so the topic is partitioned by model key); values are "
                    + "lariat.schema.StationReading in Avro single-object encoding or JSON. The same "
                    + "seed sends the same records in the same order. Uses an idempotent producer "
                    + "with acks=all. Ctrl-C stops after flushing what was sent."},
        footer = {"", "Examples:",
            "  lariat produce --bootstrap-servers 127.0.0.1:9092 \\",
            "      --topic readings --create-topic",
            "  lariat produce --bootstrap-servers 127.0.0.1:9092 \\",
            "      --topic readings --duration 90s --rate 2000 --stations 8 \\",
            "      --csv sent.csv --format json",
            "", "Exit codes: 0 all records acknowledged; 1 broker, topic or send failure; 2 bad options."})
public final class ProduceCommand implements Callable<Integer> {

    @Spec
    CommandSpec spec;

    @Option(names = "--bootstrap-servers", required = true, paramLabel = "HOST:PORT",
            description = "Kafka bootstrap servers.")
    String bootstrapServers;

    @Option(names = "--topic", required = true, paramLabel = "T", description = "Topic to send to.")
    String topic;

    @Option(names = "--stations", paramLabel = "N", defaultValue = "6",
            description = "Number of stations, 1 to " + ScenarioSpec.MAX_STATIONS + ". Default: ${DEFAULT-VALUE}.")
    int stations;

    @ArgGroup(exclusive = true)
    Length length;

    @Option(names = "--rate", paramLabel = "R", defaultValue = "1000",
            description = "Records per second over all stations; 0 = as fast as possible. Default: ${DEFAULT-VALUE}.")
    double rate;

    @Option(names = "--interval", paramLabel = "D", defaultValue = "1m", converter = DurationText.class,
            description = "Simulated event time between two readings of a station. Default: ${DEFAULT-VALUE}.")
    Duration interval;

    @Option(names = "--seed", paramLabel = "K", defaultValue = "7",
            description = "Seed of the scenario. Default: ${DEFAULT-VALUE}.")
    long seed;

    @Option(names = "--format", paramLabel = "avro|json", defaultValue = "avro", converter = FormatText.class,
            description = "Value format: avro (single-object encoding) or json. Default: ${DEFAULT-VALUE}.")
    WireFormat format;

    @Option(names = "--csv", paramLabel = "OUT.csv",
            description = "Also write a CSV copy of exactly what was sent (station, time in ms, every channel, "
                    + "weight), in send order.")
    Path csv;

    @Option(names = "--create-topic", description = "Create the topic if it does not exist.")
    boolean createTopic;

    @Option(names = "--partitions", paramLabel = "P", defaultValue = "3",
            description = "Partitions of a topic made by --create-topic. Default: ${DEFAULT-VALUE}.")
    int partitions;

    @Option(names = "--timeout", paramLabel = "D", defaultValue = "15s", converter = DurationText.class,
            description = "How long to wait for the broker to answer. Default: ${DEFAULT-VALUE}.")
    Duration timeout;

    @Option(names = "--producer-property", paramLabel = "KEY=VALUE",
            description = "Extra Kafka client property (repeatable), e.g. security.protocol=SSL.")
    Map<String, String> clientProperties = Map.of();

    /** How many records: a count per station, or a wall-clock duration at the rate. */
    static final class Length {
        @Option(names = "--records-per-station", paramLabel = "N",
                description = "Readings per station. Default: 10080 (one week of minutes).")
        Long recordsPerStation;

        @Option(names = "--duration", paramLabel = "D", converter = DurationText.class,
                description = "Send for about this long at --rate, e.g. 90s: rate × duration records in all.")
        Duration duration;
    }

    /** Kafka clients log every failed connection attempt; this command reports failures in one line itself. */
    private static final String KAFKA_LOG_LEVEL_PROPERTY = "org.slf4j.simpleLogger.log.org.apache.kafka";

    @Override
    public Integer call() throws IOException, InterruptedException {
        if (System.getProperty(KAFKA_LOG_LEVEL_PROPERTY) == null) {
            System.setProperty(KAFKA_LOG_LEVEL_PROPERTY, "error");
        }
        Scenario scenario = scenario();
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        Properties client = clientProperties();
        String problem = prepareTopic(client, out);
        if (problem != null) {
            err.println("produce: " + problem);
            err.flush();
            return 1;
        }
        describe(scenario, out);
        return send(scenario, client, out, err);
    }

    private Scenario scenario() {
        if (partitions < 1) {
            throw new ParameterException(spec.commandLine(), "--partitions must be >= 1, got " + partitions);
        }
        if (!(rate >= 0 && Double.isFinite(rate))) {
            throw new ParameterException(spec.commandLine(), "--rate must be >= 0, got " + rate);
        }
        long perStation = 10_080;
        if (length != null && length.recordsPerStation != null) {
            perStation = length.recordsPerStation;
        } else if (length != null && length.duration != null) {
            if (rate == 0) {
                throw new ParameterException(spec.commandLine(), "--duration needs a --rate above 0");
            }
            perStation = Math.max(1, (long) Math.ceil(rate * length.duration.toMillis() / 1000.0 / Math.max(1, stations)));
        }
        try {
            return Scenario.of(ScenarioSpec.defaults().withStations(stations).withRecordsPerStation(perStation)
                    .withInterval(interval).withSeed(seed));
        } catch (IllegalArgumentException e) {
            throw new ParameterException(spec.commandLine(), e.getMessage(), e);
        }
    }

    private Properties clientProperties() {
        Properties p = new Properties();
        p.putAll(clientProperties);
        p.setProperty(AdminClientConfig.BOOTSTRAP_SERVERS_CONFIG, bootstrapServers);
        return p;
    }

    /** Checks the broker answers and the topic exists (creating it if asked); returns a problem or null. */
    private String prepareTopic(Properties client, PrintWriter out) throws InterruptedException {
        Properties p = new Properties();
        p.putAll(client);
        String ms = Long.toString(timeout.toMillis());
        p.setProperty(AdminClientConfig.REQUEST_TIMEOUT_MS_CONFIG, ms);
        p.setProperty(AdminClientConfig.DEFAULT_API_TIMEOUT_MS_CONFIG, ms);
        try (Admin admin = Admin.create(p)) {
            Set<String> names;
            try {
                admin.describeCluster().nodes().get(timeout.toMillis(), TimeUnit.MILLISECONDS);
                names = admin.listTopics().names().get(timeout.toMillis(), TimeUnit.MILLISECONDS);
            } catch (ExecutionException | TimeoutException e) {
                return "no Kafka broker answered at " + bootstrapServers + " within " + seconds(timeout);
            }
            try {
                if (names.contains(topic)) {
                    TopicDescription d = admin.describeTopics(Set.of(topic)).allTopicNames()
                            .get(timeout.toMillis(), TimeUnit.MILLISECONDS).get(topic);
                    out.printf(Locale.ROOT, "Topic %s exists with %d partitions.%n", topic, d.partitions().size());
                    return null;
                }
                if (!createTopic) {
                    return "topic " + topic + " does not exist at " + bootstrapServers
                            + "; create it or add --create-topic";
                }
                admin.createTopics(Set.of(new NewTopic(topic, Optional.of(partitions), Optional.empty())))
                        .all().get(timeout.toMillis(), TimeUnit.MILLISECONDS);
                out.printf(Locale.ROOT, "Created topic %s with %d partitions.%n", topic, partitions);
                return null;
            } catch (ExecutionException | TimeoutException e) {
                return "topic " + topic + ": " + (e.getCause() != null ? e.getCause().getMessage() : e.toString());
            }
        }
    }

    private void describe(Scenario scenario, PrintWriter out) {
        ScenarioSpec s = scenario.spec();
        out.printf(Locale.ROOT, "Scenario: %d stations x %d readings, one per %s of event time from %s, seed %d.%n",
                s.stations(), s.recordsPerStation(), seconds(s.interval()), s.start(), s.seed());
        for (InjectedChange c : scenario.truth().changes()) {
            out.printf(Locale.ROOT, "  change at %s: %s %s%n", minute(c.timeMs()), c.station(), c.describe());
        }
        if (!scenario.truth().unchangedStations().isEmpty()) {
            out.println("  unchanged: " + String.join(", ", scenario.truth().unchangedStations()));
        }
        out.flush();
    }

    private int send(Scenario scenario, Properties client, PrintWriter out, PrintWriter err)
            throws IOException {
        Properties p = new Properties();
        p.putAll(client);
        p.setProperty(ProducerConfig.ENABLE_IDEMPOTENCE_CONFIG, "true");
        p.setProperty(ProducerConfig.ACKS_CONFIG, "all");
        p.setProperty(ProducerConfig.LINGER_MS_CONFIG, "10");
        p.setProperty(ProducerConfig.MAX_BLOCK_MS_CONFIG, Long.toString(timeout.toMillis()));
        p.setProperty(ProducerConfig.KEY_SERIALIZER_CLASS_CONFIG, ByteArraySerializer.class.getName());
        p.setProperty(ProducerConfig.VALUE_SERIALIZER_CLASS_CONFIG, ByteArraySerializer.class.getName());
        ScenarioProducer sender = ScenarioProducer.of(scenario, ReadingEncoder.of(scenario, format), topic, rate);
        boolean terminal = System.console() != null;
        Progress progress = new Progress(err, terminal);
        CountDownLatch done = new CountDownLatch(1);
        Thread hook = new Thread(() -> {
            progress.stop = true;
            try {
                done.await(timeout.toMillis() + 5000, TimeUnit.MILLISECONDS);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }, "lariat-produce-shutdown");
        Runtime.getRuntime().addShutdownHook(hook);
        try {
            return sendAndReport(sender, p, scenario, progress, out, err);
        } finally {
            done.countDown();
            if (!progress.stop) {
                try {
                    Runtime.getRuntime().removeShutdownHook(hook);
                } catch (IllegalStateException shuttingDown) {
                    progress.stop = true;
                }
            }
        }
    }

    private int sendAndReport(ScenarioProducer sender, Properties p, Scenario scenario, Progress progress,
            PrintWriter out, PrintWriter err) throws IOException {
        ScenarioProducer.Result result;
        try (Producer<byte[], byte[]> producer = new KafkaProducer<>(p);
             CsvCopy copy = csv == null ? null : CsvCopy.open(writer(csv), scenario)) {
            result = sender.run(producer, copy, progress, () -> progress.stop);
        }
        progress.finish();
        if (result.failure() != null) {
            err.printf(Locale.ROOT, "produce: sending to %s failed after %d acknowledged records: %s%n", topic,
                    result.acknowledged(), result.failure().getMessage());
            err.flush();
            return 1;
        }
        out.printf(Locale.ROOT, "Sent %d records (%d acknowledged) to %s in %.1f s; event time reached %s.%s%n",
                result.sent(), result.acknowledged(), topic, result.elapsedSeconds(), minute(result.lastEventTimeMs()),
                progress.stop ? " Stopped early." : "");
        if (csv != null) {
            out.printf(Locale.ROOT, "CSV copy: %s (%d rows).%n", csv, result.sent());
        }
        out.flush();
        return result.acknowledged() == result.sent() ? 0 : 1;
    }

    private static Writer writer(Path file) throws IOException {
        Path parent = file.toAbsolutePath().getParent();
        if (parent != null) {
            Files.createDirectories(parent);
        }
        return Files.newBufferedWriter(file, StandardCharsets.UTF_8);
    }

    private static String minute(long ms) {
        return Instant.ofEpochMilli(ms).truncatedTo(ChronoUnit.MINUTES).toString();
    }

    private static String seconds(Duration d) {
        return d.toMillis() % 1000 == 0 ? d.toSeconds() + " s" : d.toMillis() + " ms";
    }

    /** One progress line on standard error: rewritten in place on a terminal, else one line per update. */
    private static final class Progress implements ScenarioProducer.Progress {
        private final PrintWriter err;
        private final boolean terminal;
        volatile boolean stop;
        private boolean any;

        Progress(PrintWriter err, boolean terminal) {
            this.err = err;
            this.terminal = terminal;
        }

        @Override
        public void update(long sent, long total, long eventTimeMs, double elapsedSeconds) {
            String line = String.format(Locale.ROOT, "sent %d/%d (%3.0f%%)  %.0f rec/s  event time %s", sent, total,
                    100.0 * sent / total, elapsedSeconds > 0 ? sent / elapsedSeconds : 0.0, minute(eventTimeMs));
            if (terminal) {
                err.print("\r" + line);
            } else {
                err.println(line);
            }
            err.flush();
            any = true;
        }

        void finish() {
            if (terminal && any) {
                err.println();
                err.flush();
            }
        }
    }

    /** Durations like 90s, 500ms, 2m, 1h, 1d, or ISO-8601 (PT90S). */
    static final class DurationText implements CommandLine.ITypeConverter<Duration> {
        @Override
        public Duration convert(String text) {
            String t = text.trim().toLowerCase(Locale.ROOT);
            try {
                if (t.startsWith("p")) {
                    return positive(Duration.parse(t.toUpperCase(Locale.ROOT)), text);
                }
                String[][] units = {{"ms", "1"}, {"s", "1000"}, {"m", "60000"}, {"h", "3600000"}, {"d", "86400000"}};
                for (String[] u : units) {
                    if (t.endsWith(u[0]) && !(u[0].equals("s") && t.endsWith("ms"))) {
                        double n = Double.parseDouble(t.substring(0, t.length() - u[0].length()));
                        return positive(Duration.ofMillis(Math.round(n * Long.parseLong(u[1]))), text);
                    }
                }
            } catch (NumberFormatException | java.time.format.DateTimeParseException e) {
                throw new CommandLine.TypeConversionException("not a duration: '" + text + "' (try 90s, 2m, 1h)");
            }
            throw new CommandLine.TypeConversionException("not a duration: '" + text + "' (give a unit: ms, s, m, h, d)");
        }

        private static Duration positive(Duration d, String text) {
            if (d.isNegative() || d.isZero()) {
                throw new CommandLine.TypeConversionException("duration must be positive, got '" + text + "'");
            }
            return d;
        }
    }

    /** avro or json. */
    static final class FormatText implements CommandLine.ITypeConverter<WireFormat> {
        @Override
        public WireFormat convert(String text) {
            try {
                return WireFormat.parse(text);
            } catch (IllegalArgumentException e) {
                throw new CommandLine.TypeConversionException(e.getMessage());
            }
        }
    }
}

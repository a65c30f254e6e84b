package lariat.demo;

import lariat.codec.SchemaTrust;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Properties;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;

import lariat.broker.EmbeddedBroker;
import lariat.config.StageConfig;
import lariat.report.demo.DemoReport;
import lariat.report.demo.DemoReportWriter;
import lariat.scenario.InjectedChange;
import lariat.scenario.Scenario;
import lariat.scenario.ScenarioProducer;
import lariat.schema.ModelVersion;
import lariat.stage.Stage;
import lariat.stage.StageAssembly;
import lariat.stage.TopicSetup;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.AdminClientConfig;
import org.apache.kafka.clients.admin.NewTopic;
import org.apache.kafka.clients.consumer.OffsetAndMetadata;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.Producer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.common.TopicPartition;
import org.apache.kafka.common.serialization.ByteArraySerializer;

/**
 * One demo run in one process: a broker (embedded unless given), the topics, the generator, the
 * stage and a reader of the stage's output, on their own threads; it ends when every reading has
 * been processed, when the duration is over, or when {@link #stop()} is called, whichever comes
 * first, then writes the summary and the report.
 */
public final class DemoRun {

    /** The caution printed with every summary and report. */
    public static final String CAUTION = "A model shows statistical association, not cause. Maintenance and "
            + "safety decisions follow the site's procedures and qualified engineers.";
    private static final long TIMEOUT_S = 30;

    private final DemoPlan plan;
    private final String bootstrapServers;
    /** File name of the run's stage configuration inside the report folder. */
    static final String STAGE_PROPERTIES = "stage.properties";

    private final Path reportDir;
    private final DemoConsole console;
    private final boolean terminal;
    private final long startNanos;
    private volatile boolean stopRequested;
    private volatile long sent;
    private volatile long eventTimeMs;
    private volatile boolean sendingDone;
    private volatile Exception sendFailure;

    /**
     * @param bootstrapServers an existing cluster, or null for an embedded broker
     * @param reportDir        where the report goes (created)
     * @param terminal         whether {@code out} is a terminal (progress rewritten in place)
     */
    public DemoRun(DemoPlan plan, String bootstrapServers, Path reportDir, PrintWriter out, boolean terminal) {
        this.plan = plan;
        this.bootstrapServers = bootstrapServers;
        this.reportDir = reportDir;
        this.console = new DemoConsole(out, terminal);
        this.terminal = terminal;
        this.startNanos = System.nanoTime();
    }

    /** Asks a running demo to finish early; safe from any thread (e.g. a shutdown hook). */
    public void stop() {
        stopRequested = true;
    }

    /** What a finished run found. */
    public static final class Outcome {
        private final DemoReport report;
        private final Path html;
        private final boolean clean;

        Outcome(DemoReport report, Path html, boolean clean) {
            this.report = report;
            this.html = html;
            this.clean = clean;
        }

        public DemoReport report() {
            return report;
        }

        /** The report's {@code index.html}. */
        public Path html() {
            return html;
        }

        /** Every injected change detected and no alert on unchanged stations. */
        public boolean clean() {
            return clean;
        }
    }

    /**
     * Runs the demo to its end.
     *
     * @throws IOException           if the report cannot be written
     * @throws IllegalStateException when the broker, the topics, the stage or the reader fail
     */
    public Outcome run() throws IOException, InterruptedException {
        SchemaTrust.ensure();
        EmbeddedBroker broker = null;
        try {
            String servers = bootstrapServers;
            if (servers == null) {
                console.line("Starting an embedded Kafka broker (KRaft, one node)...");
                broker = EmbeddedBroker.start();
                servers = broker.bootstrapServers();
            }
            console.line("Kafka at " + servers + String.format(Locale.ROOT, " (ready after %.1f s)", elapsed()));
            return runOn(servers);
        } finally {
            if (broker != null) {
                broker.close();
            }
        }
    }

    private Outcome runOn(String servers) throws IOException, InterruptedException {
        Map<String, String> stageProperties = plan.stageProperties(servers);
        StageConfig config = StageConfig.of(stageProperties);
        writeStageProperties(stageProperties);
        createTopics(servers, config);
        describe();
        Stage stage = StageAssembly.create(config, Path.of(""));
        Thread stageThread = thread("lariat-demo-stage", () -> {
            try {
                stage.run();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        });
        OutputWatcher watcher = new OutputWatcher(servers, plan.modelTopic(), plan.alertTopic(), console);
        Thread watcherThread = thread("lariat-demo-reader", watcher);
        stageThread.start();
        watcherThread.start();
        awaitReady(stage);
        long window = (long) (plan.duration().toMillis() * DemoPlan.SEND_SHARE) - elapsedMs();
        double rate = plan.sendRate(Duration.ofMillis(Math.max(window, plan.duration().toMillis() / 4)));
        Thread sender = thread("lariat-demo-generator", () -> send(servers, rate));
        sender.start();
        watch(stage, servers, config);
        stopRequested = true;
        sender.join(TimeUnit.SECONDS.toMillis(TIMEOUT_S));
        stage.shutdown();
        stage.awaitStopped(stage.closeTimeoutMs() + 5_000);
        watcher.finish();
        watcherThread.join(TimeUnit.SECONDS.toMillis(TIMEOUT_S));
        console.endProgress();
        if (watcher.failure() != null) {
            throw new IllegalStateException("reading the stage's output failed: " + watcher.failure(),
                    watcher.failure());
        }
        if (sendFailure != null) {
            console.line("generator: sending failed: " + sendFailure);
        }
        console.line(String.format(Locale.ROOT, "Stage: %d transactions committed, %d aborted and retried.",
                stage.metrics().transactionsCommitted(), stage.metrics().transactionsAborted()));
        return finish(config, watcher.logs());
    }

    /** Waits until the stage has joined its group and restored its partitions (at most 60 s). */
    private void awaitReady(Stage stage) throws InterruptedException {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(60);
        while (!stage.ready()) {
            if (System.nanoTime() > deadline || stopRequested) {
                return;
            }
            Thread.sleep(50);
        }
        console.line(String.format(Locale.ROOT, "Stage ready after %.1f s; sending.", elapsed()));
    }

    private void createTopics(String servers, StageConfig config) throws InterruptedException {
        Properties p = new Properties();
        p.setProperty(AdminClientConfig.BOOTSTRAP_SERVERS_CONFIG, servers);
        try (Admin admin = Admin.create(p)) {
            admin.createTopics(List.of(new NewTopic(plan.inputTopic(), Optional.of(DemoPlan.PARTITIONS),
                    Optional.empty()))).all().get(TIMEOUT_S, TimeUnit.SECONDS);
            TopicSetup.awaitLeaders(admin, plan.inputTopic(), DemoPlan.PARTITIONS, Duration.ofSeconds(TIMEOUT_S));
            new TopicSetup(admin, StageAssembly.settings(config)).ensure();
        } catch (ExecutionException | TimeoutException e) {
            throw new IllegalStateException("cannot create topic " + plan.inputTopic() + " at " + servers + ": " + e, e);
        }
    }

    private void describe() {
        Scenario s = plan.scenario();
        console.line(String.format(Locale.ROOT, "Scenario: %d pumping stations x %d readings, one a minute, %d channels,",
                s.spec().stations(), s.spec().recordsPerStation(), s.channels().size()));
        console.line(String.format(Locale.ROOT, "%s to %s, seed %d, target %s.",
                DemoConsole.longTime(s.timeOfStep(0)), DemoConsole.longTime(s.timeOfStep(s.spec().recordsPerStation() - 1)),
                s.spec().seed(), s.target()));
        for (InjectedChange c : s.truth().changes()) {
            console.line(String.format(Locale.ROOT, "  injected at %s: %s %s", DemoConsole.longTime(c.timeMs()),
                    c.station(), c.describe()));
        }
        if (!s.truth().unchangedStations().isEmpty()) {
            console.line("  unchanged: " + String.join(", ", s.truth().unchangedStations()));
        }
        console.line(String.format(Locale.ROOT, "Stage: refit every %d readings (%d h), half-life %d h, "
                + "lambda/lambda_max %s,", DemoPlan.REFIT_EVERY_RECORDS, DemoPlan.REFIT_EVERY_RECORDS / 60,
                DemoPlan.HALF_LIFE_HOURS, DemoPlan.RELATIVE_PENALTY));
        console.line(String.format(Locale.ROOT, "alert once a new active set has held for %d refits.",
                DemoPlan.ALERT_PERSIST_REFITS));
        console.line("Lines: v<version> <station> <event time> R2 <r2> <n> active +in -out ~flipped");
    }

    private void send(String servers, double rate) {
        Properties p = new Properties();
        p.setProperty(ProducerConfig.BOOTSTRAP_SERVERS_CONFIG, servers);
        p.setProperty(ProducerConfig.ENABLE_IDEMPOTENCE_CONFIG, "true");
        p.setProperty(ProducerConfig.ACKS_CONFIG, "all");
        p.setProperty(ProducerConfig.LINGER_MS_CONFIG, "10");
        ScenarioProducer producer = ScenarioProducer.of(plan.scenario(), plan.encoder(), plan.inputTopic(), rate);
        try (Producer<byte[], byte[]> kafka = new KafkaProducer<>(p, new ByteArraySerializer(),
                new ByteArraySerializer())) {
            ScenarioProducer.Result r = producer.run(kafka, null, (n, total, t, secs) -> {
                sent = n;
                eventTimeMs = t;
            }, () -> stopRequested);
            if (r.failure() != null) {
                sendFailure = r.failure();
            }
        } catch (IOException | RuntimeException e) {
            sendFailure = e;
        } finally {
            sendingDone = true;
        }
    }

    /** Prints progress until the stage has processed everything, the duration is over, or a stop. */
    private void watch(Stage stage, String servers, StageConfig config) throws InterruptedException {
        long deadline = startNanos + plan.duration().toNanos();
        long every = TimeUnit.SECONDS.toNanos(terminal ? 1 : 5);
        long nextPrint = System.nanoTime() + every;
        long lastSent = 0;
        long lastAt = System.nanoTime();
        Properties p = new Properties();
        p.setProperty(AdminClientConfig.BOOTSTRAP_SERVERS_CONFIG, servers);
        try (Admin admin = Admin.create(p)) {
            while (!stopRequested && System.nanoTime() < deadline && stage.live()) {
                Thread.sleep(200);
                long now = System.nanoTime();
                if (now >= nextPrint) {
                    long n = sent;
                    console.progress(n, plan.scenario().totalRecords(), Math.max(eventTimeMs,
                            plan.scenario().timeOfStep(0)), (n - lastSent) / ((now - lastAt) / 1e9),
                            Math.max(0, n - stage.metrics().recordsIn()), elapsed());
                    lastSent = n;
                    lastAt = now;
                    nextPrint = now + every;
                }
                if (sendingDone && committedAll(admin, config)) {
                    console.endProgress();
                    console.line(String.format(Locale.ROOT, "All %d readings processed after %.1f s.", sent,
                            elapsed()));
                    return;
                }
            }
        }
        console.endProgress();
        if (System.nanoTime() >= deadline) {
            console.line(String.format(Locale.ROOT, "Duration of %d s is over; stopping.",
                    plan.duration().toSeconds()));
        } else if (!stage.live()) {
            console.line("The stage stopped; see its log above.");
        } else {
            console.line("Stopping on request.");
        }
    }

    /** Whether the stage's committed offsets cover every reading sent. */
    private boolean committedAll(Admin admin, StageConfig config) throws InterruptedException {
        try {
            Map<TopicPartition, OffsetAndMetadata> offsets = admin.listConsumerGroupOffsets(config.groupId())
                    .partitionsToOffsetAndMetadata().get(TIMEOUT_S, TimeUnit.SECONDS);
            long total = 0;
            for (Map.Entry<TopicPartition, OffsetAndMetadata> e : offsets.entrySet()) {
                if (e.getKey().topic().equals(plan.inputTopic()) && e.getValue() != null) {
                    total += e.getValue().offset();
                }
            }
            return total >= sent;
        } catch (ExecutionException | TimeoutException e) {
            return false;
        }
    }

    private Outcome finish(StageConfig config, Map<String, StationLog> logs) throws IOException {
        Map<String, LatestPath> paths = new LinkedHashMap<>();
        int unverified = 0;
        for (StationLog log : logs.values()) {
            ModelVersion mv = log.latest();
            if (mv != null) {
                LatestPath path = LatestPath.of(plan.scenario(), config, log.station(), mv.getChannels(), mv.getRecordCount(),
                        mv.getMomentsFingerprint());
                paths.put(log.station(), path);
                unverified += path.verified() ? 0 : 1;
            }
        }
        DemoReport report = ReportAssembly.of(plan.scenario(), logs, paths, description(unverified));
        SummaryTable.Totals totals = SummaryTable.totals(report);
        console.line("");
        for (String l : SummaryTable.render(report).split("\n")) {
            console.line(l);
        }
        console.paragraph(SummaryTable.totalsLine(totals));
        Path html = DemoReportWriter.write(report, reportDir);
        console.line("Report: " + html + " (and report.json)");
        console.line("Configuration: " + reportDir.resolve(STAGE_PROPERTIES));
        console.paragraph("Caution: " + CAUTION);
        return new Outcome(report, html, totals.clean());
    }

    /**
     * Writes the exact stage configuration of this run beside the report, so that, on a cluster
     * that outlives the demo ({@code --bootstrap-servers}), {@code lariat audit --config} can
     * replay and check every published version.
     */
    private void writeStageProperties(Map<String, String> stageProperties) throws IOException {
        Files.createDirectories(reportDir);
        Properties props = new Properties();
        props.putAll(stageProperties);
        try (Writer w = Files.newBufferedWriter(reportDir.resolve(STAGE_PROPERTIES), StandardCharsets.UTF_8)) {
            props.store(w, "Lariat demo: the stage configuration of this run");
        }
    }

    private String description(int unverified) {
        Scenario s = plan.scenario();
        String paths = unverified == 0
                ? "Each path plot is the whole lasso path of the station's latest version, recomputed from the "
                        + "same readings; its moments fingerprint equals the published one."
                : unverified + " station(s) show no path: the recomputed moments did not match the published "
                        + "fingerprint.";
        return String.format(Locale.ROOT, "%d invented pumping stations, %d readings each, one a minute from %s "
                + "(seed %d), sent through Kafka to the stage and read back from its model and alert topics. "
                + "The stage refits every %d readings of a station with an event-time half-life of %d h, "
                + "publishes the point of the lasso path at penalty / largest penalty = %s and alerts once a changed active set has held for %d refits. %s "
                + "Path coefficients are in amperes per standard deviation of the channel.", s.spec().stations(),
                s.spec().recordsPerStation(), DemoConsole.longTime(s.timeOfStep(0)), s.spec().seed(),
                DemoPlan.REFIT_EVERY_RECORDS, DemoPlan.HALF_LIFE_HOURS, DemoPlan.RELATIVE_PENALTY,
                DemoPlan.ALERT_PERSIST_REFITS, paths);
    }

    private double elapsed() {
        return elapsedMs() / 1000.0;
    }

    private long elapsedMs() {
        return TimeUnit.NANOSECONDS.toMillis(System.nanoTime() - startNanos);
    }

    private static Thread thread(String name, Runnable r) {
        Thread t = new Thread(r, name);
        t.setDaemon(true);
        return t;
    }
}

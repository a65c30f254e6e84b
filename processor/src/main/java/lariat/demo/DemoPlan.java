package lariat.demo;

import java.time.Duration;
import java.util.LinkedHashMap;
import java.util.Map;

import lariat.scenario.ReadingEncoder;
import lariat.scenario.Scenario;
import lariat.scenario.ScenarioSpec;
import lariat.scenario.WireFormat;

/**
 * What one demo run does: the scenario (one week of minute readings per station, the default
 * change plan), the topic names, the stage configuration tuned so that every injected change is
 * alerted within the week, and the wall-clock schedule that squeezes the week into the run.
 *
 * <p>Tuning, in event time: a refit every {@value #REFIT_EVERY_RECORDS} readings (4 h), a
 * forgetting half-life of {@value #HALF_LIFE_HOURS} h so that an old regime weighs about 2 %
 * after a day, the point of the lasso path at λ/λ_max = {@value #RELATIVE_PENALTY}, and an alert
 * only when a new active set has held for {@value #ALERT_PERSIST_REFITS} consecutive refits, which
 * keeps the passage of a flipping coefficient through zero from being alerted as a channel
 * leaving. An offline replay of the scenario through the stage's own fit found this setting
 * alerts every injected change, with no alert on unchanged stations, for seeds 1 to 12; BIC
 * selection on this data kept adding and dropping weak channels correlated with the drivers, so
 * no set held for two refits and changes went unreported.
 */
public final class DemoPlan {

    /** Readings per station: one week of minutes. */
    public static final long RECORDS_PER_STATION = 10_080;
    /** Readings of a station between two of its refits. */
    public static final long REFIT_EVERY_RECORDS = 240;
    /** Forgetting half-life in hours of event time. */
    public static final long HALF_LIFE_HOURS = 4;
    /** The published point: λ/λ_max of the lasso path. */
    public static final String RELATIVE_PENALTY = "0.07";
    /** Consecutive refits a changed active set must hold before it is alerted. */
    public static final int ALERT_PERSIST_REFITS = 2;
    /** Share of the run's wall-clock time given to sending; the rest lets the stage catch up. */
    static final double SEND_SHARE = 0.7;
    /** Input partitions; the stations spread over them by key. */
    static final int PARTITIONS = 3;

    private final Scenario scenario;
    private final Duration duration;
    private final String runId;

    private DemoPlan(Scenario scenario, Duration duration, String runId) {
        this.scenario = scenario;
        this.duration = duration;
        this.runId = runId;
    }

    /**
     * @param runId names this run's topics and stage, so runs on a shared cluster stay apart;
     *              1 to 40 of {@code [a-z0-9-]}
     * @throws IllegalArgumentException naming the argument and its value
     */
    public static DemoPlan of(int stations, long seed, Duration duration, String runId) {
        if (duration == null || duration.toMillis() < 1000) {
            throw new IllegalArgumentException("duration must be at least 1 s, got " + duration);
        }
        if (runId == null || !runId.matches("[a-z0-9-]{1,40}")) {
            throw new IllegalArgumentException("runId must be 1 to 40 of [a-z0-9-], got " + runId);
        }
        Scenario s = Scenario.of(ScenarioSpec.defaults().withStations(stations).withSeed(seed)
                .withRecordsPerStation(RECORDS_PER_STATION).withInterval(Duration.ofMinutes(1)));
        return new DemoPlan(s, duration, runId);
    }

    public Scenario scenario() {
        return scenario;
    }

    public Duration duration() {
        return duration;
    }

    public String inputTopic() {
        return "lariat-demo-" + runId + ".readings";
    }

    public String modelTopic() {
        return "lariat-demo-" + runId + ".models";
    }

    public String alertTopic() {
        return "lariat-demo-" + runId + ".alerts";
    }

    /** The encoder of the readings the demo sends. */
    public ReadingEncoder encoder() {
        return ReadingEncoder.of(scenario, WireFormat.AVRO);
    }

    /** The stage configuration (lariat.config.StageConfig keys and Kafka client keys). */
    public Map<String, String> stageProperties(String bootstrapServers) {
        Map<String, String> p = new LinkedHashMap<>(encoder().stageInputProperties());
        p.put("bootstrap.servers", bootstrapServers);
        p.put("input.topic", inputTopic());
        p.put("model.topic", modelTopic());
        p.put("alert.topic", alertTopic());
        p.put("snapshot.topic", "lariat-demo-" + runId + ".snapshots");
        p.put("deadletter.topic", "lariat-demo-" + runId + ".deadletters");
        p.put("claim.topic", "lariat-demo-" + runId + ".claims");
        p.put("stage.id", "lariat-demo-" + runId);
        p.put("moments.block.records", "60");
        p.put("forget.half.life.ms", Long.toString(Duration.ofHours(HALF_LIFE_HOURS).toMillis()));
        p.put("refit.every.records", Long.toString(REFIT_EVERY_RECORDS));
        p.put("cycle.interval.ms", "500");
        p.put("path.method", "lasso");
        p.put("select.rule", "relative-penalty");
        p.put("select.relative.penalty", RELATIVE_PENALTY);
        p.put("select.refit", "true");
        p.put("alert.persist.refits", Integer.toString(ALERT_PERSIST_REFITS));
        p.put("metrics.port", "0");
        p.put("shutdown.timeout.ms", "5000");
        return p;
    }

    /** Records per second over all stations so the whole scenario is sent in {@code window}. */
    public double sendRate(Duration window) {
        double seconds = Math.max(1.0, window.toMillis() / 1000.0);
        return scenario.totalRecords() / seconds;
    }
}

package lariat.stage;

import lariat.codec.RecordDecoder;
import lariat.config.StageConfig;

import java.io.IOException;
import java.io.InputStream;
import java.nio.file.Path;
import java.util.Properties;

/**
 * Wires a {@link Stage} from a validated configuration: settings, decoder, refit recipe, record
 * builder and real Kafka clients.
 */
public final class StageAssembly {

    private StageAssembly() {
    }

    /**
     * The stage the configuration describes; relative schema files resolve against {@code baseDir}.
     *
     * @throws IllegalArgumentException naming the key when the configuration asks for something
     *                                  the stage cannot do
     */
    public static Stage create(StageConfig c, Path baseDir) {
        StageSettings s = settings(c);
        RecordDecoder decoder = RecordDecoder.create(c, baseDir);
        RefitRecipe recipe = RefitRecipe.of(c);
        StageMetrics metrics = new StageMetrics();
        ModelRecords records = new ModelRecords(s.inputTopic(), c.configHash(), buildVersion());
        PathRefitter refitter = new PathRefitter(recipe, records, s, System::currentTimeMillis, metrics);
        return new Stage(s, c.get(StageConfig.FIELD_TARGET), decoder::decodeInto, refitter, new KafkaClientFactory(s),
                metrics);
    }

    /** The Kafka-side settings the configuration describes. */
    public static StageSettings settings(StageConfig c) {
        long halfLife = c.get(StageConfig.FORGET_HALF_LIFE_MS);
        int port = c.get(StageConfig.METRICS_PORT);
        return StageSettings.builder()
                .clientProperties(c.producerProperties(), c.consumerProperties(), c.adminProperties())
                .topics(c.get(StageConfig.INPUT_TOPIC), c.get(StageConfig.MODEL_TOPIC), c.get(StageConfig.ALERT_TOPIC),
                        c.get(StageConfig.DEADLETTER_TOPIC), c.get(StageConfig.SNAPSHOT_TOPIC))
                .claimTopic(c.get(StageConfig.CLAIM_TOPIC))
                .stageId(c.get(StageConfig.STAGE_ID))
                .instanceId(c.get(StageConfig.STAGE_INSTANCE))
                .groupId(c.groupId())
                .cycleIntervalMs(c.get(StageConfig.CYCLE_INTERVAL_MS))
                .refitEveryRecords(c.get(StageConfig.REFIT_EVERY_RECORDS))
                .refitEveryEventMs(c.get(StageConfig.REFIT_EVERY_EVENT_MS))
                .alertPersistence(c.get(StageConfig.ALERT_PERSIST_REFITS))
                .snapshotChunkBytes(c.get(StageConfig.SNAPSHOT_CHUNK_BYTES))
                .snapshotMaxMessageBytes(Math.max(2 << 20, c.get(StageConfig.SNAPSHOT_CHUNK_BYTES) + (64 << 10)))
                .metricsPort(port == 0 ? -1 : port)
                .closeTimeoutMs(c.get(StageConfig.SHUTDOWN_TIMEOUT_MS))
                .restoreTimeoutMs(c.get(StageConfig.RESTORE_TIMEOUT_MS))
                .blockSize(c.get(StageConfig.MOMENTS_BLOCK_RECORDS))
                .halfLifeMs(halfLife == 0 ? Double.POSITIVE_INFINITY : (double) halfLife)
                .cvFolds(RefitRecipe.of(c).cvFolds())
                .window(c.get(StageConfig.WINDOW_PANE_MS), c.get(StageConfig.WINDOW_PANES))
                .build();
    }

    /** The {@code version} of the {@code lariat/build.properties} resource, or "unknown". */
    public static String buildVersion() {
        try (InputStream in = StageAssembly.class.getResourceAsStream("/lariat/build.properties")) {
            if (in == null) {
                return "unknown";
            }
            Properties p = new Properties();
            p.load(in);
            return p.getProperty("version", "unknown");
        } catch (IOException e) {
            return "unknown";
        }
    }
}

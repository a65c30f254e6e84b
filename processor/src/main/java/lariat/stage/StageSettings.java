package lariat.stage;

import lariat.moments.Accumulator;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * The Kafka-side settings of the stage: topics, identity, cycle and refit schedule, snapshot
 * sizes, metrics port and the client properties passed through to every Kafka client.
 * Immutable; built by {@link #builder()} (the run command fills it from the configuration).
 */
public final class StageSettings {

    private final Map<String, Object> producerProperties;
    private final Map<String, Object> consumerProperties;
    private final Map<String, Object> adminProperties;
    private final String inputTopic;
    private final String modelTopic;
    private final String alertTopic;
    private final String deadLetterTopic;
    private final String snapshotTopic;
    private final String claimTopic;
    private final String stageId;
    private final String instanceId;
    private final String groupId;
    private final long cycleIntervalMs;
    private final long refitEveryRecords;
    private final long refitEveryEventMs;
    private final int alertPersistence;
    private final int snapshotChunkBytes;
    private final int snapshotMaxMessageBytes;
    private final short replicationFactor;
    private final long modelRetentionMs;
    private final int metricsPort;
    private final long closeTimeoutMs;
    private final long restoreTimeoutMs;
    private final int blockSize;
    private final double halfLifeMs;
    private final int cvFolds;
    private final long windowPaneMs;
    private final int windowPanes;

    private StageSettings(Builder b) {
        this.producerProperties = Map.copyOf(b.producerProperties);
        this.consumerProperties = Map.copyOf(b.consumerProperties);
        this.adminProperties = Map.copyOf(b.adminProperties);
        this.inputTopic = require("input.topic", b.inputTopic);
        this.modelTopic = require("model.topic", b.modelTopic);
        this.alertTopic = require("alert.topic", b.alertTopic);
        this.deadLetterTopic = require("dead.letter.topic", b.deadLetterTopic);
        this.snapshotTopic = require("snapshot.topic", b.snapshotTopic);
        this.claimTopic = require("claim.topic", b.claimTopic);
        this.stageId = require("stage.id", b.stageId);
        this.instanceId = require("stage.instance", b.instanceId);
        this.groupId = b.groupId == null || b.groupId.isEmpty() ? stageId : b.groupId;
        this.cycleIntervalMs = atLeast("cycle.interval.ms", b.cycleIntervalMs, 1);
        this.refitEveryRecords = atLeast("refit.every.records", b.refitEveryRecords, 0);
        this.refitEveryEventMs = atLeast("refit.every.event.ms", b.refitEveryEventMs, 0);
        if (refitEveryRecords == 0 && refitEveryEventMs == 0) {
            throw new IllegalArgumentException("refit.every.records and refit.every.event.ms are both 0: no refit "
                    + "would ever run");
        }
        this.alertPersistence = (int) atLeast("alert.persistence.refits", b.alertPersistence, 1);
        this.snapshotChunkBytes = (int) atLeast("snapshot.chunk.bytes", b.snapshotChunkBytes, 1024);
        this.snapshotMaxMessageBytes = (int) atLeast("snapshot.max.message.bytes", b.snapshotMaxMessageBytes,
                b.snapshotChunkBytes + 1024L);
        if (b.replicationFactor < -1 || b.replicationFactor == 0) {
            throw new IllegalArgumentException("topic.replication.factor must be -1 (broker default) or >= 1, was "
                    + b.replicationFactor);
        }
        this.replicationFactor = b.replicationFactor;
        if (b.modelRetentionMs < -1 || b.modelRetentionMs == 0) {
            throw new IllegalArgumentException("model.topic.retention.ms must be -1 (forever) or >= 1, was "
                    + b.modelRetentionMs);
        }
        this.modelRetentionMs = b.modelRetentionMs;
        if (b.metricsPort < -1 || b.metricsPort > 65535) {
            throw new IllegalArgumentException("metrics.port must be -1 (off), 0 (any) or a port, was "
                    + b.metricsPort);
        }
        this.metricsPort = b.metricsPort;
        this.closeTimeoutMs = atLeast("shutdown.timeout.ms", b.closeTimeoutMs, 0);
        this.restoreTimeoutMs = atLeast("restore.timeout.ms", b.restoreTimeoutMs, 1);
        this.blockSize = (int) atLeast("moments.block.size", b.blockSize, 1);
        if (!(b.halfLifeMs > 0)) {
            throw new IllegalArgumentException("moments.half.life.ms must be > 0 or Infinity, was " + b.halfLifeMs);
        }
        this.halfLifeMs = b.halfLifeMs;
        if (b.cvFolds == 1 || b.cvFolds < 0) {
            throw new IllegalArgumentException("select.cv.folds must be 0 (off) or >= 2, was " + b.cvFolds);
        }
        this.cvFolds = b.cvFolds;
        this.windowPaneMs = atLeast("window.pane.ms", b.windowPaneMs, 0);
        this.windowPanes = (int) atLeast("window.panes", b.windowPanes, 1);
        if (windowPaneMs > 0 && halfLifeMs != Double.POSITIVE_INFINITY) {
            throw new IllegalArgumentException("window.pane.ms and forget.half.life.ms: choose forgetting or a "
                    + "window, not both, got " + windowPaneMs + " and " + halfLifeMs);
        }
    }

    private static String require(String key, String value) {
        if (value == null || value.isBlank()) {
            throw new IllegalArgumentException(key + " must be set, was '" + value + "'");
        }
        return value;
    }

    private static long atLeast(String key, long value, long min) {
        if (value < min) {
            throw new IllegalArgumentException(key + " must be >= " + min + ", was " + value);
        }
        return value;
    }

    public static Builder builder() {
        return new Builder();
    }

    /** Pass-through properties of the transactional producer (a new mutable map). */
    public Map<String, Object> producerProperties() {
        return new LinkedHashMap<>(producerProperties);
    }

    /** Pass-through properties of the consumers (a new mutable map). */
    public Map<String, Object> consumerProperties() {
        return new LinkedHashMap<>(consumerProperties);
    }

    /** Pass-through properties of the admin client (a new mutable map). */
    public Map<String, Object> adminProperties() {
        return new LinkedHashMap<>(adminProperties);
    }

    public String inputTopic() {
        return inputTopic;
    }

    public String modelTopic() {
        return modelTopic;
    }

    public String alertTopic() {
        return alertTopic;
    }

    public String deadLetterTopic() {
        return deadLetterTopic;
    }

    public String snapshotTopic() {
        return snapshotTopic;
    }

    /** The compacted one-partition topic of key claims (see {@link KeyClaims}). */
    public String claimTopic() {
        return claimTopic;
    }

    public String stageId() {
        return stageId;
    }

    /** The consumer group id; {@code stage.id} unless set. */
    public String groupId() {
        return groupId;
    }

    public String instanceId() {
        return instanceId;
    }

    /** {@code stage.id + "-" + stage.instance}: stable across restarts of one instance. */
    public String transactionalId() {
        return stageId + "-" + instanceId;
    }

    public long cycleIntervalMs() {
        return cycleIntervalMs;
    }

    public long refitEveryRecords() {
        return refitEveryRecords;
    }

    public long refitEveryEventMs() {
        return refitEveryEventMs;
    }

    public int alertPersistence() {
        return alertPersistence;
    }

    public int snapshotChunkBytes() {
        return snapshotChunkBytes;
    }

    public int snapshotMaxMessageBytes() {
        return snapshotMaxMessageBytes;
    }

    /** Replication factor for created topics; -1 means the broker's default. */
    public short replicationFactor() {
        return replicationFactor;
    }

    public long modelRetentionMs() {
        return modelRetentionMs;
    }

    /** Metrics port; -1 is off, 0 picks a free port. */
    public int metricsPort() {
        return metricsPort;
    }

    public long closeTimeoutMs() {
        return closeTimeoutMs;
    }

    public long restoreTimeoutMs() {
        return restoreTimeoutMs;
    }

    /** Records per moments block. */
    public int blockSize() {
        return blockSize;
    }

    /** Forgetting half-life in event-time ms; {@code Double.POSITIVE_INFINITY} for none. */
    public double halfLifeMs() {
        return halfLifeMs;
    }

    /** Cross-validation folds kept per key; 0 keeps none. */
    public int cvFolds() {
        return cvFolds;
    }

    /** Event-time length of one sliding-window pane; 0 when the key keeps no window. */
    public long windowPaneMs() {
        return windowPaneMs;
    }

    /** Panes in the sliding window. */
    public int windowPanes() {
        return windowPanes;
    }

    /**
     * An empty accumulator of width {@code width} as these settings ask for each key and fold: a sliding
     * window of panes when {@link #windowPaneMs()} &gt; 0, otherwise a stream with the block size and
     * half-life.
     */
    public Accumulator emptyMoments(int width) {
        return windowPaneMs > 0 ? Accumulator.window(width, windowPaneMs, windowPanes)
                : Accumulator.stream(width, blockSize, halfLifeMs);
    }

    /** Mutable builder; defaults are those of the configuration reference. */
    public static final class Builder {
        private final Map<String, Object> producerProperties = new LinkedHashMap<>();
        private final Map<String, Object> consumerProperties = new LinkedHashMap<>();
        private final Map<String, Object> adminProperties = new LinkedHashMap<>();
        private String inputTopic;
        private String modelTopic;
        private String alertTopic;
        private String deadLetterTopic;
        private String snapshotTopic;
        private String claimTopic;
        private String stageId = "lariat";
        private String instanceId = "0";
        private String groupId;
        private long cycleIntervalMs = 1000;
        private long refitEveryRecords = 1000;
        private long refitEveryEventMs = 0;
        private long alertPersistence = 1;
        private long snapshotChunkBytes = 512 * 1024;
        private long snapshotMaxMessageBytes = 2 * 1024 * 1024;
        private short replicationFactor = -1;
        private long modelRetentionMs = -1;
        private int metricsPort = -1;
        private long closeTimeoutMs = 10_000;
        private long restoreTimeoutMs = 120_000;
        private long blockSize = 64;
        private double halfLifeMs = Double.POSITIVE_INFINITY;
        private int cvFolds = 0;
        private long windowPaneMs = 0;
        private int windowPanes = 12;

        private Builder() {
        }

        /** Sets a property of every client (e.g. {@code bootstrap.servers}). */
        public Builder clientProperty(String name, Object value) {
            producerProperties.put(name, value);
            consumerProperties.put(name, value);
            adminProperties.put(name, value);
            return this;
        }

        /** Adds producer, consumer and admin pass-through properties. */
        public Builder clientProperties(Map<String, ?> producer, Map<String, ?> consumer, Map<String, ?> admin) {
            producerProperties.putAll(producer);
            consumerProperties.putAll(consumer);
            adminProperties.putAll(admin);
            return this;
        }

        /** Sets input, model, alert, dead-letter and snapshot topics at once. */
        public Builder topics(String input, String model, String alert, String deadLetter, String snapshot) {
            this.inputTopic = input;
            this.modelTopic = model;
            this.alertTopic = alert;
            this.deadLetterTopic = deadLetter;
            this.snapshotTopic = snapshot;
            return this;
        }

        public Builder claimTopic(String v) {
            this.claimTopic = v;
            return this;
        }

        public Builder stageId(String v) {
            this.stageId = v;
            return this;
        }

        public Builder instanceId(String v) {
            this.instanceId = v;
            return this;
        }

        public Builder groupId(String v) {
            this.groupId = v;
            return this;
        }

        public Builder cycleIntervalMs(long v) {
            this.cycleIntervalMs = v;
            return this;
        }

        public Builder refitEveryRecords(long v) {
            this.refitEveryRecords = v;
            return this;
        }

        public Builder refitEveryEventMs(long v) {
            this.refitEveryEventMs = v;
            return this;
        }

        public Builder alertPersistence(long v) {
            this.alertPersistence = v;
            return this;
        }

        public Builder snapshotChunkBytes(long v) {
            this.snapshotChunkBytes = v;
            return this;
        }

        public Builder snapshotMaxMessageBytes(long v) {
            this.snapshotMaxMessageBytes = v;
            return this;
        }

        public Builder replicationFactor(short v) {
            this.replicationFactor = v;
            return this;
        }

        public Builder modelRetentionMs(long v) {
            this.modelRetentionMs = v;
            return this;
        }

        public Builder metricsPort(int v) {
            this.metricsPort = v;
            return this;
        }

        public Builder closeTimeoutMs(long v) {
            this.closeTimeoutMs = v;
            return this;
        }

        public Builder restoreTimeoutMs(long v) {
            this.restoreTimeoutMs = v;
            return this;
        }

        public Builder blockSize(long v) {
            this.blockSize = v;
            return this;
        }

        public Builder halfLifeMs(double v) {
            this.halfLifeMs = v;
            return this;
        }

        public Builder cvFolds(int v) {
            this.cvFolds = v;
            return this;
        }

        /** Sliding window of {@code panes} panes of {@code paneMs} event-time ms; paneMs 0 for none. */
        public Builder window(long paneMs, int panes) {
            this.windowPaneMs = paneMs;
            this.windowPanes = panes;
            return this;
        }

        /**
         * @throws IllegalArgumentException naming the first key whose value is invalid
         */
        public StageSettings build() {
            return new StageSettings(this);
        }
    }
}

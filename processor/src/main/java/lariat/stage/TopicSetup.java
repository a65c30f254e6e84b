package lariat.stage;

import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.Config;
import org.apache.kafka.clients.admin.ConfigEntry;
import org.apache.kafka.clients.admin.NewTopic;
import org.apache.kafka.clients.admin.TopicDescription;
import org.apache.kafka.common.config.ConfigResource;
import org.apache.kafka.common.config.TopicConfig;
import org.apache.kafka.common.errors.TopicExistsException;
import org.apache.kafka.common.errors.UnknownTopicOrPartitionException;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.time.Duration;
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Set;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;

/**
 * Checks the input topic, creates missing output topics and refuses to start when an existing
 * one does not fit. The snapshot topic must have as many partitions as the input (snapshot
 * partition P holds the state of input partition P) and {@code cleanup.policy=compact} alone,
 * since deletion by retention would lose state. The claims topic must have one partition (its order
 * decides which partition owns a key) and be compacted alone, since deletion would forget owners.
 */
public final class TopicSetup {

    private static final Logger LOG = LoggerFactory.getLogger(TopicSetup.class);
    private static final long TIMEOUT_S = 30;

    private final Admin admin;
    private final StageSettings s;

    public TopicSetup(Admin admin, StageSettings settings) {
        this.admin = admin;
        this.s = settings;
    }

    /**
     * Waits up to {@code timeout} until the broker describes {@code topic} with {@code partitions}
     * partitions, each with a leader. A topic whose creation the controller has acknowledged may
     * still be unknown to the broker's metadata for a moment: a describe then says it does not exist,
     * and a producer sending to it gets NOT_LEADER_OR_FOLLOWER.
     *
     * @throws TimeoutException when {@code timeout} passes first
     */
    public static void awaitLeaders(Admin admin, String topic, int partitions, Duration timeout)
            throws InterruptedException, ExecutionException, TimeoutException {
        long deadline = System.nanoTime() + timeout.toNanos();
        while (true) {
            try {
                TopicDescription d = admin.describeTopics(List.of(topic)).allTopicNames()
                        .get(timeout.toMillis(), TimeUnit.MILLISECONDS).get(topic);
                if (d.partitions().size() == partitions
                        && d.partitions().stream().allMatch(p -> p.leader() != null && !p.leader().isEmpty())) {
                    return;
                }
            } catch (ExecutionException e) {
                if (!(e.getCause() instanceof UnknownTopicOrPartitionException)) {
                    throw e;
                }
            }
            if (System.nanoTime() - deadline > 0) {
                throw new TimeoutException("topic " + topic + " not described with " + partitions
                        + " led partitions within " + timeout);
            }
            Thread.sleep(50);
        }
    }

    /**
     * Ensures every topic exists and fits; returns the input topic's partition count.
     *
     * @throws TopicMismatchException naming the topic and the mismatch
     */
    public int ensure() throws InterruptedException {
        int partitions = describe(s.inputTopic())
                .orElseThrow(() -> new TopicMismatchException("input topic '" + s.inputTopic()
                        + "' does not exist; create it, partitioned by model key"))
                .partitions().size();
        Map<String, String> snapshotConfig = Map.of(
                TopicConfig.CLEANUP_POLICY_CONFIG, TopicConfig.CLEANUP_POLICY_COMPACT,
                TopicConfig.MAX_MESSAGE_BYTES_CONFIG, Integer.toString(s.snapshotMaxMessageBytes()),
                TopicConfig.MIN_COMPACTION_LAG_MS_CONFIG, "0");
        Map<String, String> modelConfig = Map.of(TopicConfig.RETENTION_MS_CONFIG,
                Long.toString(s.modelRetentionMs()));
        create(s.snapshotTopic(), Optional.of(partitions), snapshotConfig);
        create(s.modelTopic(), Optional.empty(), modelConfig);
        create(s.alertTopic(), Optional.empty(), Map.of());
        create(s.deadLetterTopic(), Optional.empty(), Map.of());
        create(s.claimTopic(), Optional.of(1), Map.of(TopicConfig.CLEANUP_POLICY_CONFIG,
                TopicConfig.CLEANUP_POLICY_COMPACT));
        checkSnapshot(partitions);
        checkClaims();
        checkModel();
        return partitions;
    }

    private void checkSnapshot(int inputPartitions) throws InterruptedException {
        int sp = awaitDescribed(s.snapshotTopic()).partitions().size();
        List<String> problems = new ArrayList<>();
        if (sp != inputPartitions) {
            problems.add("has " + sp + " partitions but input topic '" + s.inputTopic() + "' has "
                    + inputPartitions + " (snapshot partition P must hold input partition P)");
        }
        requireCompactOnly(s.snapshotTopic(), problems);
        if (!problems.isEmpty()) {
            throw new TopicMismatchException("snapshot topic '" + s.snapshotTopic() + "' " + String.join("; ", problems));
        }
    }

    private void checkClaims() throws InterruptedException {
        int cp = awaitDescribed(s.claimTopic()).partitions().size();
        List<String> problems = new ArrayList<>();
        if (cp != 1) {
            problems.add("has " + cp + " partitions but must have 1 (one partition puts every claim in one order)");
        }
        requireCompactOnly(s.claimTopic(), problems);
        if (!problems.isEmpty()) {
            throw new TopicMismatchException("claim topic '" + s.claimTopic() + "' " + String.join("; ", problems));
        }
    }

    /** Adds to {@code problems} when {@code topic} has another cleanup policy than compact alone. */
    private void requireCompactOnly(String topic, List<String> problems) throws InterruptedException {
        String policy = config(topic).get(TopicConfig.CLEANUP_POLICY_CONFIG).value();
        if (!TopicConfig.CLEANUP_POLICY_COMPACT.equals(policy.replace(" ", ""))) {
            problems.add("has cleanup.policy=" + policy + " but must be compact only");
        }
    }

    private void checkModel() throws InterruptedException {
        String policy = config(s.modelTopic()).get(TopicConfig.CLEANUP_POLICY_CONFIG).value();
        if (policy.contains(TopicConfig.CLEANUP_POLICY_COMPACT)) {
            throw new TopicMismatchException("model topic '" + s.modelTopic() + "' has cleanup.policy=" + policy
                    + "; compaction would delete all but the last version of each key");
        }
        String retention = config(s.modelTopic()).get(TopicConfig.RETENTION_MS_CONFIG).value();
        if (!"-1".equals(retention)) {
            LOG.warn("model topic '{}' has retention.ms={}: old versions will expire", s.modelTopic(), retention);
        }
    }

    private void create(String topic, Optional<Integer> partitions, Map<String, String> config)
            throws InterruptedException {
        if (describe(topic).isPresent()) {
            return;
        }
        Optional<Short> rf = s.replicationFactor() > 0 ? Optional.of(s.replicationFactor()) : Optional.empty();
        NewTopic t = new NewTopic(topic, partitions, rf).configs(config);
        try {
            admin.createTopics(List.of(t)).all().get(TIMEOUT_S, TimeUnit.SECONDS);
            LOG.info("created topic '{}' with {}", topic, config);
        } catch (ExecutionException e) {
            if (!(e.getCause() instanceof TopicExistsException)) {
                throw new TopicMismatchException("cannot create topic '" + topic + "': " + e.getCause(), e.getCause());
            }
        } catch (TimeoutException e) {
            throw new TopicMismatchException("timed out creating topic '" + topic + "'", e);
        }
    }

    private TopicDescription awaitDescribed(String topic) throws InterruptedException {
        long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(TIMEOUT_S);
        Optional<TopicDescription> d = describe(topic);
        while (d.isEmpty()) {
            if (System.nanoTime() > deadline) {
                throw new TopicMismatchException("topic '" + topic + "' was created but does not appear");
            }
            Thread.sleep(100);
            d = describe(topic);
        }
        return d.get();
    }

    private Optional<TopicDescription> describe(String topic) throws InterruptedException {
        try {
            Set<String> names = admin.listTopics().names().get(TIMEOUT_S, TimeUnit.SECONDS);
            if (!names.contains(topic)) {
                return Optional.empty();
            }
            Collection<TopicDescription> d = admin.describeTopics(List.of(topic)).allTopicNames()
                    .get(TIMEOUT_S, TimeUnit.SECONDS).values();
            return d.stream().findFirst();
        } catch (ExecutionException | TimeoutException e) {
            throw new TopicMismatchException("cannot describe topic '" + topic + "': " + e, e);
        }
    }

    private Map<String, ConfigEntry> config(String topic) throws InterruptedException {
        ConfigResource r = new ConfigResource(ConfigResource.Type.TOPIC, topic);
        try {
            Config c = null;
            long deadline = System.nanoTime() + TimeUnit.SECONDS.toNanos(TIMEOUT_S);
            while (c == null) {
                try {
                    c = admin.describeConfigs(List.of(r)).all().get(TIMEOUT_S, TimeUnit.SECONDS).get(r);
                } catch (ExecutionException e) {
                    if (!(e.getCause() instanceof UnknownTopicOrPartitionException) || System.nanoTime() > deadline) {
                        throw e;
                    }
                    Thread.sleep(100);
                }
            }
            Map<String, ConfigEntry> out = new java.util.HashMap<>();
            for (ConfigEntry e : c.entries()) {
                out.put(e.name(), e);
            }
            return out;
        } catch (ExecutionException | TimeoutException e) {
            throw new TopicMismatchException("cannot read the configuration of topic '" + topic + "': " + e, e);
        }
    }

    /** An existing topic does not fit the stage, or a topic cannot be created. */
    public static final class TopicMismatchException extends RuntimeException {
        TopicMismatchException(String message) {
            super(message);
        }

        TopicMismatchException(String message, Throwable cause) {
            super(message, cause);
        }
    }
}

package lariat.it.support;

import java.time.Duration;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.Optional;
import java.util.Properties;
import java.util.UUID;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeoutException;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.regex.Pattern;

import lariat.broker.EmbeddedBroker;
import lariat.stage.TopicSetup;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.NewTopic;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;
import org.testcontainers.kafka.KafkaContainer;

/**
 * The Kafka cluster shared by every integration test in one test JVM, started on first use and
 * stopped by a JVM shutdown hook.
 *
 * <p>Which cluster, in this order: the external cluster whose bootstrap servers the environment
 * variable {@value #BOOTSTRAP_ENV} names; a Testcontainers Kafka container when a Docker engine
 * answers; otherwise Apache Kafka's own broker in this JVM ({@link EmbeddedBroker}). Setting
 * {@value #KIND_ENV} to {@code embedded} or {@code container} skips the Docker probe and forces that
 * kind.
 *
 * <p>Tests share the cluster, so each uses its own topics ({@link #uniqueTopic(String)}), consumer
 * groups and transactional ids.
 */
public final class TestKafka {

    /** Environment variable naming the bootstrap servers of an external cluster. */
    public static final String BOOTSTRAP_ENV = "LARIAT_TEST_BOOTSTRAP";
    /** Environment variable forcing the kind: {@code embedded} or {@code container}. */
    public static final String KIND_ENV = "LARIAT_TEST_BROKER";

    private static final long LEADER_WAIT_MS = 30_000;
    private static final Logger LOG = LoggerFactory.getLogger(TestKafka.class);
    private static final Pattern TOPIC_PREFIX = Pattern.compile("[a-zA-Z0-9._-]{1,100}");
    private static final String RUN_ID = UUID.randomUUID().toString().substring(0, 8);
    private static final AtomicInteger SEQUENCE = new AtomicInteger();

    /** Where the shared cluster comes from. */
    public enum Kind { EXTERNAL, CONTAINER, EMBEDDED }

    private static Cluster cluster;

    private TestKafka() {
    }

    /** The kind of the shared cluster, starting it if needed. */
    public static Kind kind() {
        return cluster().kind;
    }

    /** The {@code bootstrap.servers} value of the shared cluster, starting it if needed. */
    public static String bootstrapServers() {
        return cluster().bootstrapServers();
    }

    /**
     * The embedded broker when the shared cluster is one, so that a test can {@code stop} and
     * {@code restart} it; empty for an external cluster or a container. A test must not close it.
     */
    public static Optional<EmbeddedBroker> embeddedBroker() {
        return Optional.ofNullable(cluster().embedded);
    }

    /**
     * Returns a topic name unique in this test JVM and, through a random run id, across runs on the
     * same external cluster: {@code prefix-runid-n}.
     *
     * @throws IllegalArgumentException if {@code prefix} is not 1 to 100 of {@code [a-zA-Z0-9._-]}
     */
    public static String uniqueTopic(String prefix) {
        if (prefix == null || !TOPIC_PREFIX.matcher(prefix).matches()) {
            throw new IllegalArgumentException("prefix must be 1 to 100 of [a-zA-Z0-9._-], got " + prefix);
        }
        return prefix + "-" + RUN_ID + "-" + SEQUENCE.incrementAndGet();
    }

    /**
     * Creates a topic with the cluster's default replication factor and waits until the controller
     * has created it and every partition has a leader.
     *
     * @param configs topic configurations such as {@code cleanup.policy}; may be empty
     * @throws IllegalArgumentException if {@code partitions} is below 1
     */
    public static void createTopic(String name, int partitions, Map<String, String> configs)
            throws InterruptedException, ExecutionException {
        if (partitions < 1) {
            throw new IllegalArgumentException("partitions must be at least 1, got " + partitions);
        }
        NewTopic topic = new NewTopic(name, Optional.of(partitions), Optional.empty()).configs(configs);
        try (Admin admin = Admin.create(adminProperties())) {
            admin.createTopics(List.of(topic)).all().get();
            TopicSetup.awaitLeaders(admin, name, partitions, Duration.ofMillis(LEADER_WAIT_MS));
        } catch (TimeoutException e) {
            throw new IllegalStateException("topic " + name + ": " + e.getMessage(), e);
        }
    }

    /** Admin client properties for the shared cluster. */
    public static Properties adminProperties() {
        return ClientProperties.admin(bootstrapServers());
    }

    /** {@link ClientProperties#consumer(String, String)} for the shared cluster. */
    public static Properties consumerProperties(String groupId) {
        return ClientProperties.consumer(bootstrapServers(), groupId);
    }

    /** {@link ClientProperties#producer(String)} for the shared cluster. */
    public static Properties producerProperties() {
        return ClientProperties.producer(bootstrapServers());
    }

    /** {@link ClientProperties#transactionalProducer(String, String)} for the shared cluster. */
    public static Properties transactionalProducerProperties(String transactionalId) {
        return ClientProperties.transactionalProducer(bootstrapServers(), transactionalId);
    }

    private static synchronized Cluster cluster() {
        if (cluster == null) {
            cluster = Cluster.start();
            LOG.info("Integration tests use the {} Kafka cluster at {}", cluster.kind.name().toLowerCase(Locale.ROOT),
                    cluster.bootstrapServers());
            Runtime.getRuntime().addShutdownHook(new Thread(cluster::close, "test-kafka-shutdown"));
        }
        return cluster;
    }

    /** The shared cluster and what closes it. */
    private static final class Cluster implements AutoCloseable {
        final Kind kind;
        final String external;
        final KafkaContainer container;
        final EmbeddedBroker embedded;

        private Cluster(Kind kind, String external, KafkaContainer container, EmbeddedBroker embedded) {
            this.kind = kind;
            this.external = external;
            this.container = container;
            this.embedded = embedded;
        }

        static Cluster start() {
            String external = System.getenv(BOOTSTRAP_ENV);
            if (external != null && !external.isBlank()) {
                return new Cluster(Kind.EXTERNAL, external.trim(), null, null);
            }
            String forced = System.getenv(KIND_ENV);
            boolean container = forced == null || forced.isBlank()
                    ? ContainerKafka.dockerAvailable()
                    : parseKind(forced) == Kind.CONTAINER;
            if (container) {
                return new Cluster(Kind.CONTAINER, null, ContainerKafka.start(), null);
            }
            if (forced == null || forced.isBlank()) {
                LOG.info("No Docker engine answered; {}=container shows why", KIND_ENV);
            }
            return new Cluster(Kind.EMBEDDED, null, null, EmbeddedBroker.start());
        }

        private static Kind parseKind(String value) {
            return switch (value.trim().toLowerCase(Locale.ROOT)) {
                case "embedded" -> Kind.EMBEDDED;
                case "container" -> Kind.CONTAINER;
                default -> throw new IllegalArgumentException(
                        KIND_ENV + " must be embedded or container, got " + value);
            };
        }

        String bootstrapServers() {
            return switch (kind) {
                case EXTERNAL -> external;
                case CONTAINER -> container.getBootstrapServers();
                case EMBEDDED -> embedded.bootstrapServers();
            };
        }

        @Override
        public void close() {
            if (container != null) {
                container.close();
            }
            if (embedded != null) {
                embedded.close();
            }
        }
    }
}

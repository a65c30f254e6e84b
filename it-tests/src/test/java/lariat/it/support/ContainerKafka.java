package lariat.it.support;

import org.testcontainers.DockerClientFactory;
import org.testcontainers.kafka.KafkaContainer;

/**
 * A one-node Kafka in a container started through Testcontainers, configured like the embedded
 * broker: replication factor 1 for the internal topics and no topic creation on first use.
 */
final class ContainerKafka {

    /** Environment variable naming the image to run instead of the default. */
    static final String IMAGE_ENV = "LARIAT_TEST_KAFKA_IMAGE";
    /**
     * System property with the default image; the it-tests POM sets it to {@code apache/kafka} at
     * the Kafka version the build pins.
     */
    static final String IMAGE_PROPERTY = "lariat.test.kafka.image";

    private ContainerKafka() {
    }

    /** Whether a Docker engine answers; false, without an exception, when there is none. */
    static boolean dockerAvailable() {
        return DockerClientFactory.instance().isDockerAvailable();
    }

    /** Starts a container and returns it running. */
    static KafkaContainer start() {
        String image = System.getenv(IMAGE_ENV);
        if (image == null || image.isBlank()) {
            image = System.getProperty(IMAGE_PROPERTY, "apache/kafka");
        }
        @SuppressWarnings("resource") // closed by TestKafka's shutdown hook
        KafkaContainer container = new KafkaContainer(image)
                .withEnv("KAFKA_AUTO_CREATE_TOPICS_ENABLE", "false")
                .withEnv("KAFKA_SHARE_COORDINATOR_STATE_TOPIC_REPLICATION_FACTOR", "1")
                .withEnv("KAFKA_SHARE_COORDINATOR_STATE_TOPIC_MIN_ISR", "1");
        container.start();
        return container;
    }
}

package lariat.broker;

import java.nio.file.Path;
import java.util.Properties;

/**
 * The server properties of a single Kafka node in KRaft mode that is its own broker and its own
 * controller, for development and tests.
 *
 * <p>Every internal topic (consumer offsets, transaction state, share-group state) is created with
 * replication factor 1 and minimum in-sync replicas 1, since there is only one replica to have.
 * The controller quorum is static ({@code controller.quorum.voters}) so that the node can be
 * stopped and started again on the same data folder without a recorded voter endpoint to match.
 * Topics are never created on first use: a test or a user creates what it needs.
 */
final class KraftNodeProperties {

    static final int NODE_ID = 1;
    static final String HOST = "127.0.0.1";
    static final String CONTROLLER_LISTENER = "CONTROLLER";
    static final String CLIENT_LISTENER = "PLAINTEXT";

    /** Partitions of each internal topic; the broker default (50) only slows a one-node cluster. */
    private static final String INTERNAL_TOPIC_PARTITIONS = "5";

    /**
     * Log cleaner deduplication buffer in bytes. The default (128 MiB) is allocated at startup and
     * can exhaust a small heap, and a broker fault halts the whole JVM.
     */
    private static final String CLEANER_BUFFER_BYTES = "4194304";

    private KraftNodeProperties() {
    }

    /**
     * Returns the server properties for one node.
     *
     * @param clientPort     port of the {@code PLAINTEXT} listener that clients connect to
     * @param controllerPort port of the controller listener
     * @param logDir         folder that holds the metadata log and every partition log
     */
    static Properties of(int clientPort, int controllerPort, Path logDir) {
        Properties p = new Properties();
        p.setProperty("process.roles", "broker,controller");
        p.setProperty("node.id", Integer.toString(NODE_ID));
        p.setProperty("listeners", CLIENT_LISTENER + "://" + HOST + ":" + clientPort
                + "," + CONTROLLER_LISTENER + "://" + HOST + ":" + controllerPort);
        p.setProperty("advertised.listeners", CLIENT_LISTENER + "://" + HOST + ":" + clientPort);
        p.setProperty("listener.security.protocol.map",
                CLIENT_LISTENER + ":PLAINTEXT," + CONTROLLER_LISTENER + ":PLAINTEXT");
        p.setProperty("controller.listener.names", CONTROLLER_LISTENER);
        p.setProperty("inter.broker.listener.name", CLIENT_LISTENER);
        p.setProperty("controller.quorum.voters", NODE_ID + "@" + HOST + ":" + controllerPort);
        p.setProperty("log.dirs", logDir.toAbsolutePath().toString());

        p.setProperty("offsets.topic.replication.factor", "1");
        p.setProperty("offsets.topic.num.partitions", INTERNAL_TOPIC_PARTITIONS);
        p.setProperty("transaction.state.log.replication.factor", "1");
        p.setProperty("transaction.state.log.min.isr", "1");
        p.setProperty("transaction.state.log.num.partitions", INTERNAL_TOPIC_PARTITIONS);
        p.setProperty("share.coordinator.state.topic.replication.factor", "1");
        p.setProperty("share.coordinator.state.topic.min.isr", "1");
        p.setProperty("share.coordinator.state.topic.num.partitions", INTERNAL_TOPIC_PARTITIONS);
        p.setProperty("default.replication.factor", "1");
        p.setProperty("min.insync.replicas", "1");
        p.setProperty("num.partitions", "1");

        p.setProperty("group.initial.rebalance.delay.ms", "0");
        p.setProperty("log.cleaner.dedupe.buffer.size", CLEANER_BUFFER_BYTES);
        p.setProperty("auto.create.topics.enable", "false");
        return p;
    }
}

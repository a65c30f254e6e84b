package lariat.broker;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.io.PrintStream;
import java.io.UncheckedIOException;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.net.ServerSocket;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.Comparator;
import java.util.Properties;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;
import java.util.stream.Stream;

import kafka.server.KafkaConfig;
import kafka.server.KafkaRaftServer;
import kafka.tools.StorageTool;
import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.AdminClientConfig;
import org.apache.kafka.common.Uuid;
import org.apache.kafka.common.utils.Time;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Apache Kafka's own broker, run inside this JVM as one KRaft node that is both broker and
 * controller, listening on the loopback address only.
 *
 * <p>Life cycle: {@link Builder#start()} formats the data folder if it is new, starts the node and
 * returns once an Admin client gets an answer to {@code describeCluster}. {@link #stop()} shuts the
 * node down and keeps its data; {@link #restart()} starts it again on the same data folder and the
 * same ports, so committed records, offsets and transaction state survive. {@link #close()} stops
 * the node and deletes the data folder if this object created it; a folder given to
 * {@link Builder#dataDir(Path)} is kept. {@code close} is idempotent; after it, {@code restart}
 * throws {@link IllegalStateException}.
 *
 * <p>The methods are synchronized; one instance may be shared by threads.
 */
public final class EmbeddedBroker implements AutoCloseable {

    private static final Logger LOG = LoggerFactory.getLogger(EmbeddedBroker.class);
    private static final String PROPERTIES_FILE = "server.properties";
    private static final String LOG_DIR = "kraft";
    private static final String META_PROPERTIES = "meta.properties";
    private static final Duration PROBE_TIMEOUT = Duration.ofSeconds(2);

    private final int clientPort;
    private final int controllerPort;
    private final Path dataDir;
    private final boolean ownsDataDir;
    private final Duration startTimeout;
    private KafkaRaftServer server;
    private boolean closed;

    private EmbeddedBroker(int clientPort, int controllerPort, Path dataDir, boolean ownsDataDir,
            Duration startTimeout) {
        this.clientPort = clientPort;
        this.controllerPort = controllerPort;
        this.dataDir = dataDir;
        this.ownsDataDir = ownsDataDir;
        this.startTimeout = startTimeout;
    }

    /** Starts a broker on free ports with a new temporary data folder. */
    public static EmbeddedBroker start() {
        return builder().start();
    }

    /** Returns a builder with free ports, a temporary data folder and a 120 s start timeout. */
    public static Builder builder() {
        return new Builder();
    }

    /** The {@code bootstrap.servers} value for clients, {@code 127.0.0.1:port}. */
    public String bootstrapServers() {
        return KraftNodeProperties.HOST + ":" + clientPort;
    }

    /** The port of the client listener; the same across {@link #restart()}. */
    public int port() {
        return clientPort;
    }

    /** The data folder, holding the server properties and the logs. */
    public Path dataDir() {
        return dataDir;
    }

    /** Whether the node is started and not yet stopped. */
    public synchronized boolean isRunning() {
        return server != null;
    }

    /** Shuts the node down and waits for it; keeps the data folder. Does nothing if stopped. */
    public synchronized void stop() {
        if (server == null) {
            return;
        }
        KafkaRaftServer s = server;
        server = null;
        s.shutdown();
        s.awaitShutdown();
        LOG.info("Kafka broker at {} stopped", bootstrapServers());
    }

    /**
     * Starts the node again on the same data folder and ports, stopping it first if it runs, and
     * returns once it answers clients.
     *
     * @throws IllegalStateException if the broker is closed, a port is taken, or the broker does
     *                               not answer within the start timeout
     */
    public synchronized void restart() {
        if (closed) {
            throw new IllegalStateException("broker at " + bootstrapServers() + " is closed");
        }
        stop();
        launch();
    }

    /** Stops the node and deletes the data folder if this object created it. Idempotent. */
    @Override
    public synchronized void close() {
        if (closed) {
            return;
        }
        closed = true;
        try {
            stop();
        } finally {
            if (ownsDataDir) {
                deleteTree(dataDir);
            }
        }
    }

    private void launch() {
        requireFree(clientPort, "client");
        requireFree(controllerPort, "controller");
        long t0 = System.nanoTime();
        Path logDir = dataDir.resolve(LOG_DIR);
        Properties props = KraftNodeProperties.of(clientPort, controllerPort, logDir);
        Path propsFile = writeProperties(props);
        if (!Files.exists(logDir.resolve(META_PROPERTIES))) {
            format(propsFile);
        }
        KafkaRaftServer s = new KafkaRaftServer(KafkaConfig.fromProps(props, false), Time.SYSTEM);
        boolean ready = false;
        try {
            s.startup();
            awaitAnswer(t0);
            ready = true;
        } finally {
            if (!ready) {
                s.shutdown();
                s.awaitShutdown();
            }
        }
        server = s;
        LOG.info("Kafka broker ready at {} in {} ms (data in {})", bootstrapServers(),
                TimeUnit.NANOSECONDS.toMillis(System.nanoTime() - t0), dataDir);
    }

    private Path writeProperties(Properties props) {
        Path file = dataDir.resolve(PROPERTIES_FILE);
        try (OutputStream out = Files.newOutputStream(file)) {
            props.store(out, "Written by lariat.broker.EmbeddedBroker on every start");
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + file, e);
        }
        return file;
    }

    /** Formats a new log folder with a new cluster id. */
    private static void format(Path propsFile) {
        ByteArrayOutputStream buffer = new ByteArrayOutputStream();
        String[] args = {"format", "--cluster-id", Uuid.randomUuid().toString(),
                "--config", propsFile.toString()};
        int rc;
        try (PrintStream out = new PrintStream(buffer, true, StandardCharsets.UTF_8)) {
            rc = StorageTool.execute(args, out);
        }
        if (rc != 0) {
            throw new IllegalStateException("formatting the Kafka storage failed with exit code "
                    + rc + ": " + buffer.toString(StandardCharsets.UTF_8));
        }
    }

    private void awaitAnswer(long t0) {
        long deadline = t0 + startTimeout.toNanos();
        Properties p = new Properties();
        p.setProperty(AdminClientConfig.BOOTSTRAP_SERVERS_CONFIG, bootstrapServers());
        p.setProperty(AdminClientConfig.REQUEST_TIMEOUT_MS_CONFIG, Long.toString(PROBE_TIMEOUT.toMillis()));
        p.setProperty(AdminClientConfig.DEFAULT_API_TIMEOUT_MS_CONFIG, Long.toString(PROBE_TIMEOUT.toMillis()));
        try (Admin admin = Admin.create(p)) {
            while (true) {
                try {
                    if (!admin.describeCluster().nodes().get(PROBE_TIMEOUT.toMillis(), TimeUnit.MILLISECONDS)
                            .isEmpty()) {
                        return;
                    }
                } catch (ExecutionException | TimeoutException e) {
                    if (System.nanoTime() > deadline) {
                        throw new IllegalStateException("Kafka broker at " + bootstrapServers()
                                + " did not answer within " + startTimeout, e);
                    }
                }
                if (System.nanoTime() > deadline) {
                    throw new IllegalStateException("Kafka broker at " + bootstrapServers()
                            + " reported no nodes within " + startTimeout);
                }
                Thread.sleep(100);
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("interrupted while waiting for the Kafka broker", e);
        }
    }

    /**
     * A port nothing listens on now; two calls may return the same port (the first socket is closed
     * before the second binds), so a caller that needs two distinct ports compares them.
     */
    private static int freePort() {
        try (ServerSocket socket = new ServerSocket(0, 0, InetAddress.getByName(KraftNodeProperties.HOST))) {
            socket.setReuseAddress(true);
            return socket.getLocalPort();
        } catch (IOException e) {
            throw new UncheckedIOException("cannot find a free port", e);
        }
    }

    /** Fails fast, before Kafka starts any thread, when another process holds the port. */
    private static void requireFree(int port, String listener) {
        try (ServerSocket socket = new ServerSocket()) {
            socket.setReuseAddress(true);
            socket.bind(new InetSocketAddress(InetAddress.getByName(KraftNodeProperties.HOST), port));
        } catch (IOException e) {
            throw new IllegalStateException("the " + listener + " port " + KraftNodeProperties.HOST + ":"
                    + port + " is in use: " + e.getMessage(), e);
        }
    }

    private static void deleteTree(Path root) {
        if (!Files.exists(root)) {
            return;
        }
        try (Stream<Path> paths = Files.walk(root)) {
            for (Path p : (Iterable<Path>) paths.sorted(Comparator.reverseOrder())::iterator) {
                Files.deleteIfExists(p);
            }
        } catch (IOException e) {
            LOG.warn("could not delete the broker data folder {}: {}", root, e.toString());
        }
    }

    /** Options of an {@link EmbeddedBroker}; every option has a default. */
    public static final class Builder {
        private int port;
        private Path dataDir;
        private Duration startTimeout = Duration.ofSeconds(120);

        private Builder() {
        }

        /**
         * The client listener port, 1 to 65535, or 0 (the default) for a free port.
         *
         * @throws IllegalArgumentException if {@code port} is outside 0 to 65535
         */
        public Builder port(int port) {
            if (port < 0 || port > 65535) {
                throw new IllegalArgumentException("port must be in 0..65535, got " + port);
            }
            this.port = port;
            return this;
        }

        /**
         * A data folder to use and keep; created if missing, formatted if new. The default is a new
         * temporary folder that {@link EmbeddedBroker#close()} deletes.
         *
         * @throws IllegalArgumentException if {@code dataDir} is null or names an existing file
         */
        public Builder dataDir(Path dataDir) {
            if (dataDir == null || Files.isRegularFile(dataDir)) {
                throw new IllegalArgumentException("dataDir must be a folder, got " + dataDir);
            }
            this.dataDir = dataDir;
            return this;
        }

        /**
         * How long {@link #start()} and {@link EmbeddedBroker#restart()} wait for the broker to answer.
         *
         * @throws IllegalArgumentException if {@code timeout} is null, zero or negative
         */
        public Builder startTimeout(Duration timeout) {
            if (timeout == null || timeout.isZero() || timeout.isNegative()) {
                throw new IllegalArgumentException("startTimeout must be positive, got " + timeout);
            }
            this.startTimeout = timeout;
            return this;
        }

        /**
         * Starts the broker and returns once it answers clients.
         *
         * @throws IllegalStateException if a port is taken, or the broker does not answer within
         *                               the start timeout
         * @throws UncheckedIOException  if the data folder cannot be created or written
         */
        public EmbeddedBroker start() {
            boolean owns = dataDir == null;
            Path dir;
            try {
                dir = owns ? Files.createTempDirectory("lariat-broker-") : Files.createDirectories(dataDir);
            } catch (IOException e) {
                throw new UncheckedIOException("cannot create the broker data folder " + dataDir, e);
            }
            int clientPort = port == 0 ? freePort() : port;
            int controllerPort = freePort();
            while (controllerPort == clientPort) {
                controllerPort = freePort();
            }
            EmbeddedBroker broker = new EmbeddedBroker(clientPort, controllerPort, dir, owns, startTimeout);
            boolean started = false;
            try {
                broker.launch();
                started = true;
            } finally {
                if (!started) {
                    broker.close();
                }
            }
            return broker;
        }
    }
}

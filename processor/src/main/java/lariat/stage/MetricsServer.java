package lariat.stage;

import com.sun.net.httpserver.HttpExchange;
import com.sun.net.httpserver.HttpServer;

import java.io.IOException;
import java.io.OutputStream;
import java.net.InetSocketAddress;
import java.nio.charset.StandardCharsets;
import java.util.concurrent.Executors;
import java.util.function.BooleanSupplier;

/**
 * HTTP endpoint on the JDK's built-in server: {@code /metrics} (Prometheus text),
 * {@code /healthz} (200 while the loop is alive) and {@code /readyz} (200 once the assigned
 * partitions are restored, 503 before).
 */
public final class MetricsServer implements AutoCloseable {

    private final HttpServer server;

    private MetricsServer(HttpServer server) {
        this.server = server;
    }

    /**
     * Starts the server on {@code port} (0 picks a free port).
     *
     * @throws IllegalArgumentException when {@code port} is outside 0..65535
     */
    public static MetricsServer start(int port, StageMetrics metrics, BooleanSupplier live, BooleanSupplier ready)
            throws IOException {
        if (port < 0 || port > 65535) {
            throw new IllegalArgumentException("port must be in 0..65535, was " + port);
        }
        HttpServer s = HttpServer.create(new InetSocketAddress(port), 0);
        s.createContext("/metrics", ex -> reply(ex, 200, "text/plain; version=0.0.4; charset=utf-8", metrics.render()));
        s.createContext("/healthz", ex -> status(ex, live.getAsBoolean()));
        s.createContext("/readyz", ex -> status(ex, ready.getAsBoolean()));
        s.setExecutor(Executors.newSingleThreadExecutor(r -> {
            Thread t = new Thread(r, "lariat-metrics");
            t.setDaemon(true);
            return t;
        }));
        s.start();
        return new MetricsServer(s);
    }

    /** The bound port. */
    public int port() {
        return server.getAddress().getPort();
    }

    private static void status(HttpExchange ex, boolean ok) throws IOException {
        reply(ex, ok ? 200 : 503, "text/plain; charset=utf-8", ok ? "ok\n" : "not ready\n");
    }

    private static void reply(HttpExchange ex, int code, String type, String body) throws IOException {
        byte[] bytes = body.getBytes(StandardCharsets.UTF_8);
        ex.getResponseHeaders().set("Content-Type", type);
        ex.sendResponseHeaders(code, bytes.length);
        try (OutputStream os = ex.getResponseBody()) {
            os.write(bytes);
        }
    }

    @Override
    public void close() {
        server.stop(0);
    }
}

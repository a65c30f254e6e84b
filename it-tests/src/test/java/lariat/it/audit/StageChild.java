package lariat.it.audit;

import java.io.File;
import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;

/**
 * The stage's {@code run} command in a child JVM with this test JVM's class path, so that a test can
 * kill it with SIGKILL ({@link Process#destroyForcibly()} on Linux) at any moment. Output goes to a log file.
 */
final class StageChild implements AutoCloseable {

    private final Process process;

    private StageChild(Process process) {
        this.process = process;
    }

    static StageChild start(Path config, Path log) throws IOException {
        String java = Path.of(System.getProperty("java.home"), "bin", "java").toString();
        ProcessBuilder pb = new ProcessBuilder(List.of(java, "-Xmx256m", "-cp", System.getProperty("java.class.path"),
                "lariat.cli.Main", "run", "--config", config.toString()));
        pb.redirectErrorStream(true);
        pb.redirectOutput(ProcessBuilder.Redirect.appendTo(new File(log.toString())));
        return new StageChild(pb.start());
    }

    boolean alive() {
        return process.isAlive();
    }

    /** SIGKILL: no shutdown hook runs, the open transaction is left to time out or be fenced. */
    void kill() throws InterruptedException {
        process.destroyForcibly();
        process.waitFor(30, TimeUnit.SECONDS);
    }

    /** SIGTERM: the stage finishes its cycle and closes. */
    void stop() throws InterruptedException {
        process.destroy();
        if (!process.waitFor(40, TimeUnit.SECONDS)) {
            process.destroyForcibly();
            process.waitFor(10, TimeUnit.SECONDS);
        }
    }

    /** Kills the child if it still runs; does not wait for it. */
    @Override
    public void close() {
        if (process.isAlive()) {
            process.destroyForcibly();
        }
    }
}

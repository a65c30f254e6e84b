package lariat.it.support;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.TimeUnit;

/**
 * One stage instance as a child JVM: {@code java -cp <this JVM's class path> lariat.cli.Main run
 * --config FILE}, its standard output and error appended to a log file. The faults it can suffer
 * are the operating system's own: SIGKILL ({@link #kill()}), SIGSTOP and SIGCONT ({@link #pause()},
 * {@link #resume()}) and SIGTERM ({@link #close()}).
 */
public final class StageProcess implements AutoCloseable {

    private static final long WAIT_S = 30;

    private final Process process;
    private final Path log;

    private StageProcess(Process process, Path log) {
        this.process = process;
        this.log = log;
    }

    /** Starts the stage on {@code config}; output is appended to {@code log}. */
    public static StageProcess start(Path config, Path log) throws IOException {
        Files.createDirectories(log.toAbsolutePath().getParent());
        List<String> cmd = new ArrayList<>();
        cmd.add(Path.of(System.getProperty("java.home"), "bin", "java").toString());
        cmd.add("-Xmx256m");
        cmd.add("-XX:+UseSerialGC");
        cmd.add("-XX:TieredStopAtLevel=1");
        cmd.add("-cp");
        cmd.add(System.getProperty("java.class.path"));
        cmd.add("lariat.cli.Main");
        cmd.add("run");
        cmd.add("--config");
        cmd.add(config.toAbsolutePath().toString());
        Process p = new ProcessBuilder(cmd)
                .redirectErrorStream(true)
                .redirectOutput(ProcessBuilder.Redirect.appendTo(log.toFile()))
                .start();
        return new StageProcess(p, log);
    }

    public long pid() {
        return process.pid();
    }

    public boolean alive() {
        return process.isAlive();
    }

    /** SIGKILL (what {@link Process#destroyForcibly()} sends on Linux); waits for the exit. */
    public void kill() throws InterruptedException {
        process.destroyForcibly();
        if (!process.waitFor(WAIT_S, TimeUnit.SECONDS)) {
            throw new IllegalStateException("stage pid " + pid() + " survived SIGKILL for " + WAIT_S + " s");
        }
    }

    /** SIGSTOP: the JVM freezes, every thread included (heartbeats, producer sender). */
    public void pause() throws IOException, InterruptedException {
        signal("-STOP");
    }

    /** SIGCONT after {@link #pause()}. */
    public void resume() throws IOException, InterruptedException {
        signal("-CONT");
    }

    private void signal(String sig) throws IOException, InterruptedException {
        Process k = new ProcessBuilder("kill", sig, Long.toString(pid())).inheritIO().start();
        if (!k.waitFor(WAIT_S, TimeUnit.SECONDS) || k.exitValue() != 0) {
            throw new IllegalStateException("kill " + sig + " " + pid() + " failed");
        }
    }

    /** The log so far, for failure messages. */
    public String logText() throws IOException {
        return Files.exists(log) ? Files.readString(log, StandardCharsets.UTF_8) : "";
    }

    public Path log() {
        return log;
    }

    /**
     * SIGTERM (a graceful shutdown), then SIGKILL if the stage has not exited in time or this
     * thread is interrupted while waiting (the interrupt flag is kept).
     */
    @Override
    public void close() {
        if (!process.isAlive()) {
            return;
        }
        process.destroy();
        try {
            if (process.waitFor(WAIT_S, TimeUnit.SECONDS)) {
                return;
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        process.destroyForcibly();
    }
}

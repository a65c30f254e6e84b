package lariat.scenario;

import java.io.IOException;
import java.util.Iterator;
import java.util.Objects;
import java.util.concurrent.atomic.AtomicLong;
import java.util.concurrent.atomic.AtomicReference;
import java.util.concurrent.locks.LockSupport;
import java.util.function.BooleanSupplier;

import org.apache.kafka.clients.producer.Producer;
import org.apache.kafka.clients.producer.ProducerRecord;

/**
 * Sends a scenario's rows, in order, to one topic through a caller-supplied producer, keyed by
 * station, optionally paced to a rate and copied to CSV. It stops early at the first failed send
 * or when {@code stop} answers true, and always flushes before returning. The Kafka record
 * timestamp is left to the producer (wall-clock time), so topic retention is not driven by the
 * scenario's simulated event time, which travels in the value.
 */
public final class ScenarioProducer {

    /** Receives progress at most every {@code PROGRESS_INTERVAL_NS} and once at the end. */
    public interface Progress {
        void update(long sent, long total, long eventTimeMs, double elapsedSeconds);
    }

    /** What a run did. */
    public static final class Result {
        private final long sent;
        private final long acknowledged;
        private final long lastEventTimeMs;
        private final double elapsedSeconds;
        private final Exception failure;

        private Result(long sent, long acknowledged, long lastEventTimeMs, double elapsedSeconds, Exception failure) {
            this.sent = sent;
            this.acknowledged = acknowledged;
            this.lastEventTimeMs = lastEventTimeMs;
            this.elapsedSeconds = elapsedSeconds;
            this.failure = failure;
        }

        /** Records handed to the producer (and to the CSV copy). */
        public long sent() {
            return sent;
        }

        /** Records the broker acknowledged. */
        public long acknowledged() {
            return acknowledged;
        }

        public long lastEventTimeMs() {
            return lastEventTimeMs;
        }

        public double elapsedSeconds() {
            return elapsedSeconds;
        }

        /** The first send failure, or null. */
        public Exception failure() {
            return failure;
        }
    }

    private static final long PROGRESS_INTERVAL_NS = 1_000_000_000L;

    private final Scenario scenario;
    private final ReadingEncoder encoder;
    private final String topic;
    private final double ratePerSecond;

    private ScenarioProducer(Scenario scenario, ReadingEncoder encoder, String topic, double ratePerSecond) {
        this.scenario = Objects.requireNonNull(scenario, "scenario");
        this.encoder = Objects.requireNonNull(encoder, "encoder");
        if (topic == null || topic.isBlank()) {
            throw new IllegalArgumentException("topic must be a non-empty name, got " + topic);
        }
        if (!(ratePerSecond >= 0 && Double.isFinite(ratePerSecond))) {
            throw new IllegalArgumentException("ratePerSecond must be finite and >= 0, got " + ratePerSecond);
        }
        this.topic = topic;
        this.ratePerSecond = ratePerSecond;
    }

    /**
     * @param ratePerSecond records per second over all stations; 0 sends as fast as the producer takes them
     */
    public static ScenarioProducer of(Scenario scenario, ReadingEncoder encoder, String topic, double ratePerSecond) {
        return new ScenarioProducer(scenario, encoder, topic, ratePerSecond);
    }

    /** The record for one row. */
    public ProducerRecord<byte[], byte[]> record(StationRow row) {
        return new ProducerRecord<>(topic, encoder.key(row), encoder.value(row));
    }

    /**
     * Sends every row (or until {@code stop}), writing each to {@code csv} (may be null) as it is
     * handed to the producer, then flushes the producer. Does not close the producer or the CSV copy.
     *
     * @throws IOException if the CSV copy cannot be written
     */
    public Result run(Producer<byte[], byte[]> producer, CsvCopy csv, Progress progress, BooleanSupplier stop)
            throws IOException {
        AtomicLong acked = new AtomicLong();
        AtomicReference<Exception> failure = new AtomicReference<>();
        long total = scenario.totalRecords();
        long t0 = System.nanoTime();
        long nextReport = t0 + PROGRESS_INTERVAL_NS;
        long sent = 0;
        long lastTime = scenario.timeOfStep(0);
        Iterator<StationRow> rows = scenario.rows();
        while (rows.hasNext() && failure.get() == null && !stop.getAsBoolean()) {
            StationRow row = rows.next();
            pace(t0, sent);
            producer.send(record(row), (meta, e) -> {
                if (e == null) {
                    acked.incrementAndGet();
                } else {
                    failure.compareAndSet(null, e);
                }
            });
            if (csv != null) {
                csv.write(row);
            }
            sent++;
            lastTime = row.timeMs();
            long now = System.nanoTime();
            if (now >= nextReport) {
                progress.update(sent, total, lastTime, (now - t0) / 1e9);
                nextReport = now + PROGRESS_INTERVAL_NS;
            }
        }
        producer.flush();
        double elapsed = (System.nanoTime() - t0) / 1e9;
        progress.update(sent, total, lastTime, elapsed);
        return new Result(sent, acked.get(), lastTime, elapsed, failure.get());
    }

    private void pace(long t0, long sent) {
        if (ratePerSecond == 0) {
            return;
        }
        long due = t0 + (long) (sent * 1e9 / ratePerSecond);
        long wait;
        while ((wait = due - System.nanoTime()) > 0) {
            LockSupport.parkNanos(wait);
        }
    }
}

package lariat.audit;

import lariat.schema.ModelVersion;
import lariat.stage.PartitionReplay;
import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.TopicPartition;

import java.time.Duration;
import java.util.ArrayDeque;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.PriorityQueue;

/**
 * Replays one input partition from its beginning through a {@link PartitionReplay} (the stage's
 * own per-record and refit code), refitting at given points. The refit of a point with end offset
 * E happens after every record below E has been routed and before any record at or above E; the
 * points of one key are refitted in version order. The consumer is read_committed, as the stage's
 * is, so aborted records are never seen.
 */
public final class InputReplay {

    /** The outcome of one refit point: the recomputed records, or why there are none. */
    public static final class Refitted {
        private final RefitPoint point;
        private final List<ProducerRecord<byte[], byte[]>> records;
        private final ModelVersion model;
        private final String failure;

        private Refitted(RefitPoint point, List<ProducerRecord<byte[], byte[]>> records, ModelVersion model,
                         String failure) {
            this.point = point;
            this.records = records;
            this.model = model;
            this.failure = failure;
        }

        public RefitPoint point() {
            return point;
        }

        /** The records the stage would have sent (model version first), empty on failure. */
        public List<ProducerRecord<byte[], byte[]>> records() {
            return records;
        }

        /** The recomputed model version, or null on failure. */
        public ModelVersion model() {
            return model;
        }

        /** Why the refit produced nothing, or null. */
        public String failure() {
            return failure;
        }
    }

    /** What one replay read and computed. */
    public static final class Result {
        private final List<Refitted> refits;
        private final long records;
        private final long accepted;
        private final double seconds;

        private Result(List<Refitted> refits, long records, long accepted, double seconds) {
            this.refits = refits;
            this.records = records;
            this.accepted = accepted;
            this.seconds = seconds;
        }

        /** Refits in the order performed. */
        public List<Refitted> refits() {
            return refits;
        }

        /** Input records read (below the largest end offset). */
        public long records() {
            return records;
        }

        /** Records accepted into some key's moments. */
        public long accepted() {
            return accepted;
        }

        public double seconds() {
            return seconds;
        }
    }

    private final Consumer<byte[], byte[]> consumer;
    private final Duration timeout;
    private final Progress progress;

    /**
     * @param consumer read_committed consumer without a group; this replay assigns it
     * @param timeout  longest time without progress before the replay gives up
     */
    public InputReplay(Consumer<byte[], byte[]> consumer, Duration timeout, Progress progress) {
        this.consumer = consumer;
        this.timeout = timeout;
        this.progress = progress;
    }

    /**
     * Replays {@code tp} from offset 0 through {@code replay}, refitting at {@code points}.
     *
     * @throws IllegalStateException when the partition makes no progress for the timeout before the
     *                               largest end offset is reached
     */
    public Result replay(PartitionReplay replay, TopicPartition tp, List<RefitPoint> points) {
        Map<String, ArrayDeque<RefitPoint>> byKey = new LinkedHashMap<>();
        List<RefitPoint> sorted = new ArrayList<>(points);
        sorted.sort(Comparator.comparing(RefitPoint::key).thenComparingLong(RefitPoint::version));
        long target = 0;
        for (RefitPoint p : sorted) {
            byKey.computeIfAbsent(p.key(), k -> new ArrayDeque<>()).add(p);
            target = Math.max(target, p.endOffset());
        }
        PriorityQueue<ArrayDeque<RefitPoint>> due = new PriorityQueue<>(
                Comparator.comparingLong((ArrayDeque<RefitPoint> q) -> q.peek().endOffset())
                        .thenComparing(q -> q.peek().key()));
        due.addAll(byKey.values());
        List<Refitted> out = new ArrayList<>(points.size());
        long t0 = System.nanoTime();
        long records = 0;
        long accepted = 0;
        String what = tp.topic() + "/" + tp.partition();
        consumer.assign(List.of(tp));
        consumer.seek(tp, 0);
        long position = 0;
        long lastProgress = System.nanoTime();
        while (position < target) {
            var batch = consumer.poll(Duration.ofMillis(200));
            for (ConsumerRecord<byte[], byte[]> r : batch.records(tp)) {
                if (r.offset() >= target) {
                    break;
                }
                fire(due, r.offset(), replay, out);
                records++;
                if (replay.offer(r.offset(), r.key(), r.value(), r.timestamp()) == PartitionReplay.Routed.ACCEPTED) {
                    accepted++;
                }
            }
            long now = System.nanoTime();
            long next = consumer.position(tp, timeout);
            if (next > position) {
                position = next;
                lastProgress = now;
            } else if (now - lastProgress > timeout.toNanos()) {
                throw new IllegalStateException("replay of " + what + " made no progress for " + timeout.toMillis()
                        + " ms at offset " + position + " (target " + target + ")");
            }
            progress.report(what, Math.min(position, target), target, records, (now - t0) / 1e9, false);
        }
        fire(due, Long.MAX_VALUE, replay, out);
        double seconds = (System.nanoTime() - t0) / 1e9;
        progress.report(what, target, target, records, seconds, true);
        return new Result(List.copyOf(out), records, accepted, seconds);
    }

    private static void fire(PriorityQueue<ArrayDeque<RefitPoint>> due, long offset, PartitionReplay replay,
                             List<Refitted> out) {
        while (!due.isEmpty() && due.peek().peek().endOffset() <= offset) {
            ArrayDeque<RefitPoint> q = due.poll();
            out.add(refit(replay, q.poll()));
            if (!q.isEmpty()) {
                due.add(q);
            }
        }
    }

    private static Refitted refit(PartitionReplay replay, RefitPoint p) {
        if (!replay.hasKey(p.key())) {
            return new Refitted(p, List.of(), null, "no accepted record of key '" + p.key() + "' below offset "
                    + p.endOffset());
        }
        try {
            List<ProducerRecord<byte[], byte[]>> rs = replay.refit(p.key(), p.publishedAtMs());
            ModelVersion mv = ModelTopicReader.decode(rs.get(0).value());
            return new Refitted(p, List.copyOf(rs), mv, mv == null ? "the recomputed record does not decode" : null);
        } catch (IllegalArgumentException e) {
            return new Refitted(p, List.of(), null, "refit failed: " + e.getMessage());
        }
    }
}

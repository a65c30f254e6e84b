package lariat.stage;

import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.consumer.ConsumerRecords;
import org.apache.kafka.common.TopicPartition;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.time.Duration;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Reads one snapshot partition from its beginning to its end (the last stable offset, since
 * the reading consumer is read_committed) and returns the complete key states it holds.
 * The consumer is assigned manually and reused for every partition.
 */
final class SnapshotReader {

    private static final Logger LOG = LoggerFactory.getLogger(SnapshotReader.class);

    /** The complete states of one partition and its position marker (-1 when absent). */
    static final class Partition {
        final Map<String, Restored> states;
        final long nextOffset;

        Partition(Map<String, Restored> states, long nextOffset) {
            this.states = states;
            this.nextOffset = nextOffset;
        }
    }

    /** A restored state and the number of chunks it occupied. */
    static final class Restored {
        final byte[] state;
        final int chunkCount;

        Restored(byte[] state, int chunkCount) {
            this.state = state;
            this.chunkCount = chunkCount;
        }
    }

    private final Consumer<byte[], byte[]> consumer;
    private final StageMetrics metrics;
    private final Duration timeout;

    SnapshotReader(Consumer<byte[], byte[]> consumer, StageMetrics metrics, Duration timeout) {
        this.consumer = consumer;
        this.metrics = metrics;
        this.timeout = timeout;
    }

    /**
     * The complete states of snapshot partition {@code tp}, keyed by model key.
     *
     * @throws org.apache.kafka.common.errors.TimeoutException when the end is not reached in time
     */
    Partition read(TopicPartition tp) {
        consumer.assign(List.of(tp));
        consumer.seekToBeginning(List.of(tp));
        long end = consumer.endOffsets(List.of(tp), timeout).get(tp);
        Map<String, SnapshotFormat.Manifest> manifests = new LinkedHashMap<>();
        Map<String, Map<Integer, SnapshotFormat.Chunk>> chunks = new HashMap<>();
        long[] marker = {-1};
        long deadline = System.nanoTime() + timeout.toNanos();
        while (consumer.position(tp, timeout) < end) {
            if (System.nanoTime() > deadline) {
                throw new org.apache.kafka.common.errors.TimeoutException(
                        "restore of " + tp + " did not reach offset " + end + " within " + timeout);
            }
            ConsumerRecords<byte[], byte[]> batch = consumer.poll(Duration.ofMillis(200));
            for (ConsumerRecord<byte[], byte[]> r : batch) {
                collect(r, manifests, chunks, marker);
            }
        }
        consumer.assign(List.of());
        Map<String, Restored> out = new LinkedHashMap<>();
        for (Map.Entry<String, SnapshotFormat.Manifest> e : manifests.entrySet()) {
            SnapshotFormat.Manifest m = e.getValue();
            Map<Integer, SnapshotFormat.Chunk> mine = chunks.getOrDefault(e.getKey(), Map.of());
            SnapshotFormat.Chunk[] ordered = new SnapshotFormat.Chunk[m.chunkCount];
            for (int i = 0; i < m.chunkCount; i++) {
                ordered[i] = mine.get(i);
            }
            byte[] state = SnapshotFormat.assemble(m, ordered);
            if (state == null) {
                metrics.snapshotIncomplete();
                LOG.error("snapshot of key '{}' in {} is incomplete or fails its SHA-256 check; not applied",
                        e.getKey(), tp);
            } else {
                out.put(e.getKey(), new Restored(state, m.chunkCount));
            }
        }
        return new Partition(out, marker[0]);
    }

    private static void collect(ConsumerRecord<byte[], byte[]> r, Map<String, SnapshotFormat.Manifest> manifests,
                                Map<String, Map<Integer, SnapshotFormat.Chunk>> chunks, long[] marker) {
        switch (SnapshotFormat.kindOf(r.key())) {
            case MANIFEST: {
                String key = SnapshotFormat.manifestModelKey(r.key());
                SnapshotFormat.Manifest m = SnapshotFormat.parseManifest(r.value());
                if (m == null) {
                    manifests.remove(key);
                } else {
                    manifests.put(key, m);
                }
                break;
            }
            case CHUNK: {
                String key = SnapshotFormat.chunkModelKey(r.key());
                SnapshotFormat.Chunk c = SnapshotFormat.parseChunk(r.value());
                if (key != null && c != null) {
                    chunks.computeIfAbsent(key, k -> new HashMap<>()).put(c.index, c);
                }
                break;
            }
            case OFFSET:
                marker[0] = SnapshotFormat.parseOffsetMarker(r.value());
                break;
            default:
                break;
        }
    }
}

package lariat.audit;

import lariat.schema.KeyClaim;
import lariat.stage.ClaimLog;
import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.common.PartitionInfo;
import org.apache.kafka.common.TopicPartition;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * The key claims on a stage's claims topic as a reader sees them at one moment: partition 0 read
 * (read_committed) from its beginning to the end it had when the read started, a tombstone removing
 * the claim with its Kafka key, and a repeated claim of a pair keeping its first place, as the stage
 * itself applies them. The owner of a model key of an input topic is the partition of its earliest
 * live claim. Immutable.
 */
public final class ClaimListing {

    /** One live claim: its Kafka key, its value and its offset on the claims topic. */
    public static final class Entry {
        private final String recordKey;
        private final KeyClaim claim;
        private final long offset;
        private final boolean owner;

        private Entry(String recordKey, KeyClaim claim, long offset, boolean owner) {
            this.recordKey = recordKey;
            this.claim = claim;
            this.offset = offset;
            this.owner = owner;
        }

        public String recordKey() {
            return recordKey;
        }

        public KeyClaim claim() {
            return claim;
        }

        public long offset() {
            return offset;
        }

        /** Whether this is the earliest live claim of its model key and input topic. */
        public boolean owner() {
            return owner;
        }
    }

    private final List<Entry> entries;
    private final int passedOver;

    private ClaimListing(List<Entry> entries, int passedOver) {
        this.entries = Collections.unmodifiableList(entries);
        this.passedOver = passedOver;
    }

    /**
     * Reads the claims topic {@code topic} with {@code consumer} (read_committed, no group; it is
     * assigned partition 0 and left assigned).
     *
     * @throws IllegalArgumentException when the topic does not exist
     * @throws org.apache.kafka.common.errors.TimeoutException when the end is not reached within
     *     {@code timeout} of no progress
     */
    public static ClaimListing read(Consumer<byte[], byte[]> consumer, String topic, Duration timeout) {
        List<PartitionInfo> parts = consumer.partitionsFor(topic, timeout);
        if (parts == null || parts.isEmpty()) {
            throw new IllegalArgumentException("claims topic '" + topic + "' does not exist");
        }
        TopicPartition tp = new TopicPartition(topic, 0);
        consumer.assign(List.of(tp));
        consumer.seekToBeginning(List.of(tp));
        long end = consumer.endOffsets(List.of(tp), timeout).get(tp);
        Map<String, Long> offsets = new LinkedHashMap<>();
        Map<String, KeyClaim> claims = new LinkedHashMap<>();
        int passedOver = 0;
        long lastProgress = System.nanoTime();
        while (consumer.position(tp, timeout) < end) {
            boolean progressed = false;
            for (ConsumerRecord<byte[], byte[]> r : consumer.poll(Duration.ofMillis(200))) {
                progressed = true;
                if (r.offset() >= end) {
                    continue;
                }
                String key = r.key() == null ? "" : new String(r.key(), StandardCharsets.UTF_8);
                if (r.value() == null) {
                    offsets.remove(key);
                    claims.remove(key);
                    continue;
                }
                KeyClaim c = decode(r.value());
                if (c == null || !ClaimLog.named(key, c)) {
                    passedOver++;
                    continue;
                }
                if (!claims.containsKey(key)) {
                    claims.put(key, c);
                    offsets.put(key, r.offset());
                }
            }
            if (progressed) {
                lastProgress = System.nanoTime();
            } else if (System.nanoTime() - lastProgress > timeout.toNanos()) {
                throw new org.apache.kafka.common.errors.TimeoutException("claims topic " + tp
                        + " not read to offset " + end + " within " + timeout + " without progress");
            }
        }
        return of(claims, offsets, passedOver);
    }

    /** A listing of the given live claims (Kafka key to value and to offset, in topic order). */
    static ClaimListing of(Map<String, KeyClaim> claims, Map<String, Long> offsets, int passedOver) {
        Map<String, Long> earliest = new LinkedHashMap<>();
        for (Map.Entry<String, KeyClaim> e : claims.entrySet()) {
            earliest.merge(ownerKey(e.getValue()), offsets.get(e.getKey()), Math::min);
        }
        List<Entry> out = new ArrayList<>();
        for (Map.Entry<String, KeyClaim> e : claims.entrySet()) {
            long offset = offsets.get(e.getKey());
            out.add(new Entry(e.getKey(), e.getValue(), offset, earliest.get(ownerKey(e.getValue())) == offset));
        }
        out.sort((a, b) -> Long.compare(a.offset, b.offset));
        return new ClaimListing(out, passedOver);
    }

    private static String ownerKey(KeyClaim c) {
        return c.getInputTopic() + "|" + c.getKey();
    }

    private static KeyClaim decode(byte[] value) {
        try {
            return ClaimLog.decode(value);
        } catch (IOException e) {
            return null;
        }
    }

    /** The live claims in topic order. */
    public List<Entry> entries() {
        return entries;
    }

    /** Records that were not a key claim whose value matches its Kafka key (passed over, as the stage does). */
    public int passedOver() {
        return passedOver;
    }

    /** Per input topic and model key claimed on two or more partitions: the partitions, owner first. */
    public Map<String, List<Integer>> conflicts() {
        Map<String, List<Integer>> byKey = new TreeMap<>();
        for (Entry e : entries) {
            byKey.computeIfAbsent(e.claim.getInputTopic() + " " + e.claim.getKey(), k -> new ArrayList<>())
                    .add(e.claim.getInputPartition());
        }
        byKey.values().removeIf(l -> l.size() < 2);
        return byKey;
    }

    /** The live claim of ({@code inputTopic}, {@code partition}, {@code modelKey}), or null. */
    public Entry find(String inputTopic, int partition, String modelKey) {
        String key = new String(ClaimLog.recordKey(inputTopic, partition, modelKey), StandardCharsets.UTF_8);
        for (Entry e : entries) {
            if (e.recordKey.equals(key)) {
                return e;
            }
        }
        return null;
    }
}

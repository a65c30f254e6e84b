package lariat.stage;

import lariat.codec.SchemaTrust;
import lariat.schema.KeyClaim;
import org.apache.avro.AvroRuntimeException;
import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.TopicPartition;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.time.Duration;
import java.time.Instant;
import java.util.List;

/**
 * The stage's side of the claims topic (partition 0 of {@code claim.topic}): a read_committed
 * consumer without a group, assigned that partition from its beginning, feeding {@link KeyClaims};
 * and the claim records the loop sends in its transactions.
 *
 * <p>A claim's Kafka key is the UTF-8 text {@code inputTopic|partition|modelKey} (a topic name has no
 * {@code |} and the partition is decimal digits), so compaction keeps one claim per pair; its value is
 * a {@link KeyClaim} in Avro's single-object encoding. Claims of another input topic (a claims topic
 * shared by stages) are passed over. A record that does not decode, or whose value names another pair
 * than its key, is logged and passed over; it never stops the stage.
 */
public final class ClaimLog {

    private static final Logger LOG = LoggerFactory.getLogger(ClaimLog.class);

    private final Consumer<byte[], byte[]> consumer;
    private final TopicPartition tp;
    private final String inputTopic;
    private final String claimedBy;
    private final KeyClaims claims;

    /** Assigns {@code consumer} the claims partition at its beginning; {@code claims} receives what is read. */
    ClaimLog(Consumer<byte[], byte[]> consumer, StageSettings s, KeyClaims claims) {
        SchemaTrust.ensure();
        this.consumer = consumer;
        this.tp = new TopicPartition(s.claimTopic(), 0);
        this.inputTopic = s.inputTopic();
        this.claimedBy = s.transactionalId();
        this.claims = claims;
        consumer.assign(List.of(tp));
        consumer.seekToBeginning(List.of(tp));
    }

    /** The Kafka key of the claim of ({@code modelKey}, {@code partition}) of {@code inputTopic}. */
    public static byte[] recordKey(String inputTopic, int partition, String modelKey) {
        return (inputTopic + "|" + partition + "|" + modelKey).getBytes(StandardCharsets.UTF_8);
    }

    /**
     * The claim in the value of a claims-topic record (Avro single-object encoding).
     *
     * @throws IOException when the value is not a key claim
     */
    public static KeyClaim decode(byte[] value) throws IOException {
        try {
            return KeyClaim.fromByteBuffer(ByteBuffer.wrap(value));
        } catch (AvroRuntimeException e) {
            throw new IOException(e.getMessage(), e);
        }
    }

    /** Whether {@code recordKey} (UTF-8 text) is the Kafka key of claim {@code c}, which names a partition >= 0. */
    public static boolean named(String recordKey, KeyClaim c) {
        return c.getInputPartition() >= 0 && recordKey.equals(new String(recordKey(c.getInputTopic(),
                c.getInputPartition(), c.getKey()), StandardCharsets.UTF_8));
    }

    /** Applies the claims fetched so far without waiting for more. */
    void poll() {
        apply(consumer.poll(Duration.ZERO));
    }

    /**
     * Reads until the position reaches the end (the last stable offset) the partition had when called.
     *
     * @throws org.apache.kafka.common.errors.TimeoutException when that takes longer than {@code timeout}
     */
    void catchUp(Duration timeout) {
        long end = consumer.endOffsets(List.of(tp), timeout).get(tp);
        long deadline = System.nanoTime() + timeout.toNanos();
        while (consumer.position(tp, timeout) < end) {
            if (System.nanoTime() - deadline > 0) {
                throw new org.apache.kafka.common.errors.TimeoutException(
                        "claims topic " + tp + " not read to offset " + end + " within " + timeout);
            }
            apply(consumer.poll(Duration.ofMillis(100)));
        }
    }

    /** The claim of {@code k}'s key on its partition by this instance, addressed to the claims partition. */
    ProducerRecord<byte[], byte[]> claim(KeyState k, long nowMs) {
        KeyClaim c = KeyClaim.newBuilder()
                .setKey(k.modelKey())
                .setInputTopic(inputTopic)
                .setInputPartition(k.partition())
                .setClaimedBy(claimedBy)
                .setFirstOffset(k.firstOffset() >= 0 ? k.firstOffset() : null)
                .setClaimedAtMs(Instant.ofEpochMilli(nowMs))
                .build();
        try {
            ByteBuffer b = c.toByteBuffer();
            byte[] value = new byte[b.remaining()];
            b.get(value);
            return new ProducerRecord<>(tp.topic(), tp.partition(), recordKey(inputTopic, k.partition(),
                    k.modelKey()), value);
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    private void apply(Iterable<ConsumerRecord<byte[], byte[]>> records) {
        for (ConsumerRecord<byte[], byte[]> r : records) {
            if (r.offset() <= claims.position()) {
                LOG.warn("claims topic {} went back to offset {} after {}; passed over until it passes that again",
                        tp, r.offset(), claims.position());
                continue;
            }
            String key = r.key() == null ? "" : new String(r.key(), StandardCharsets.UTF_8);
            if (!key.startsWith(inputTopic + "|")) {
                continue;
            }
            if (r.value() == null) {
                applyTombstone(key, r.offset());
                continue;
            }
            KeyClaim c;
            try {
                c = decode(r.value());
            } catch (IOException e) {
                LOG.warn("record at offset {} of claims topic {} (key '{}') is not a key claim; passed over: {}",
                        r.offset(), tp, key, e.toString());
                continue;
            }
            if (!named(key, c)) {
                LOG.warn("claim at offset {} of claims topic {} has key '{}' but names key '{}' on partition {} of "
                        + "'{}'; passed over", r.offset(), tp, key, c.getKey(), c.getInputPartition(),
                        c.getInputTopic());
                continue;
            }
            claims.add(c.getKey(), c.getInputPartition(), c.getClaimedBy(), r.offset());
        }
    }

    private void applyTombstone(String key, long offset) {
        int bar = key.indexOf('|', inputTopic.length() + 1);
        String digits = bar < 0 ? "" : key.substring(inputTopic.length() + 1, bar);
        if (!digits.matches("[0-9]{1,9}")) {
            LOG.warn("tombstone at offset {} of claims topic {} has key '{}', which names no partition; passed over",
                    offset, tp, key);
            return;
        }
        claims.remove(key.substring(bar + 1), Integer.parseInt(digits), offset);
    }
}

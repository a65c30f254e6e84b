package lariat.audit;

import lariat.codec.SchemaTrust;
import lariat.schema.ModelVersion;
import org.apache.avro.AvroRuntimeException;
import org.apache.avro.Schema;
import org.apache.avro.message.BinaryMessageDecoder;
import org.apache.avro.message.SchemaStore;
import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.common.PartitionInfo;
import org.apache.kafka.common.TopicPartition;

import java.io.IOException;
import java.io.InputStream;
import java.io.UncheckedIOException;
import java.nio.BufferUnderflowException;
import java.nio.ByteBuffer;
import java.time.Duration;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.function.Predicate;

/**
 * Reads every committed model version from a model topic: assigns all its partitions to a
 * read_committed consumer, reads each from its beginning to the end offset it had when reading
 * started, and decodes the values as {@link ModelVersion} (Avro single-object encoding). Values
 * written with an earlier ModelVersion schema (kept as resources under {@value #HISTORY}) are
 * resolved to the current one, fields added since taking their defaults. Values that do not
 * decode are counted, not returned.
 */
public final class ModelTopicReader {

    /** Resource folder of the earlier ModelVersion writer schemas. */
    static final String HISTORY = "/lariat/schema/history/";

    /** Earlier ModelVersion schemas, oldest first. */
    private static final List<String> EARLIER = List.of("ModelVersion-1.avsc");

    private static final BinaryMessageDecoder<ModelVersion> DECODER = decoder();

    /** What was read: the versions (model-topic order within a partition) and the undecodable count. */
    public static final class Result {
        private final List<PublishedVersion> versions;
        private final long undecodable;

        private Result(List<PublishedVersion> versions, long undecodable) {
            this.versions = versions;
            this.undecodable = undecodable;
        }

        public List<PublishedVersion> versions() {
            return versions;
        }

        /** Records whose value is not a model version. */
        public long undecodable() {
            return undecodable;
        }
    }

    private final Consumer<byte[], byte[]> consumer;
    private final Duration timeout;

    /** A reader using {@code consumer} (read_committed, no group); gives up after {@code timeout} without progress. */
    public ModelTopicReader(Consumer<byte[], byte[]> consumer, Duration timeout) {
        this.consumer = consumer;
        this.timeout = timeout;
    }

    /**
     * The versions in {@code topic} whose key {@code keys} accepts.
     *
     * @throws IllegalArgumentException when the topic does not exist
     * @throws IllegalStateException    when reading makes no progress for the timeout
     */
    public Result read(String topic, Predicate<String> keys) {
        List<PartitionInfo> infos = consumer.partitionsFor(topic, timeout);
        if (infos == null || infos.isEmpty()) {
            throw new IllegalArgumentException("model topic '" + topic + "' does not exist");
        }
        List<TopicPartition> tps = new ArrayList<>();
        for (PartitionInfo i : infos) {
            tps.add(new TopicPartition(topic, i.partition()));
        }
        consumer.assign(tps);
        consumer.seekToBeginning(tps);
        Map<TopicPartition, Long> end = new HashMap<>(consumer.endOffsets(tps, timeout));
        List<PublishedVersion> out = new ArrayList<>();
        long bad = 0;
        long lastProgress = System.nanoTime();
        while (!done(end)) {
            var batch = consumer.poll(Duration.ofMillis(200));
            for (ConsumerRecord<byte[], byte[]> r : batch) {
                TopicPartition tp = new TopicPartition(r.topic(), r.partition());
                if (r.offset() >= end.get(tp)) {
                    continue;
                }
                ModelVersion mv = decode(r.value());
                if (mv == null) {
                    bad++;
                } else if (keys.test(mv.getKey())) {
                    out.add(PublishedVersion.of(mv, r.partition(), r.offset()));
                }
            }
            if (!batch.isEmpty()) {
                lastProgress = System.nanoTime();
            } else if (System.nanoTime() - lastProgress > timeout.toNanos()) {
                throw new IllegalStateException("reading model topic '" + topic + "' made no progress for "
                        + timeout.toMillis() + " ms");
            }
        }
        return new Result(List.copyOf(out), bad);
    }

    private boolean done(Map<TopicPartition, Long> end) {
        for (Map.Entry<TopicPartition, Long> e : end.entrySet()) {
            if (consumer.position(e.getKey(), timeout) < e.getValue()) {
                return false;
            }
        }
        return true;
    }

    /** The model version single-object encoded in {@code value}, or null when it is not one. */
    static ModelVersion decode(byte[] value) {
        if (value == null) {
            return null;
        }
        SchemaTrust.ensure();
        try {
            return DECODER.decode(ByteBuffer.wrap(value));
        } catch (IOException | AvroRuntimeException | IndexOutOfBoundsException | NegativeArraySizeException
                 | BufferUnderflowException e) {
            return null;
        }
    }

    private static BinaryMessageDecoder<ModelVersion> decoder() {
        SchemaStore.Cache earlier = new SchemaStore.Cache();
        for (String name : EARLIER) {
            try (InputStream in = ModelTopicReader.class.getResourceAsStream(HISTORY + name)) {
                if (in == null) {
                    throw new IllegalStateException("missing resource " + HISTORY + name);
                }
                earlier.addSchema(new Schema.Parser().parse(in));
            } catch (IOException e) {
                throw new UncheckedIOException(e);
            }
        }
        return ModelVersion.createDecoder(earlier);
    }
}

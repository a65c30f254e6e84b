package lariat.stage;

import org.apache.kafka.clients.consumer.ConsumerRecord;
import org.apache.kafka.clients.producer.ProducerRecord;
import org.apache.kafka.common.header.internals.RecordHeaders;

import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;

/**
 * Builds dead-letter records: the original key and value bytes, untouched, with headers naming
 * what went wrong and where the record came from. Header values are UTF-8 strings, except that
 * partition and offset are also readable as text (decimal).
 */
public final class DeadLetters {

    public static final String REASON = "lariat.reason";
    public static final String DETAIL = "lariat.detail";
    public static final String EXCEPTION_CLASS = "lariat.exception.class";
    public static final String SOURCE_TOPIC = "lariat.source.topic";
    public static final String SOURCE_PARTITION = "lariat.source.partition";
    public static final String SOURCE_OFFSET = "lariat.source.offset";
    public static final String SOURCE_TIMESTAMP = "lariat.source.timestamp";

    /**
     * Reason for a record whose model key already lives on another input partition of this instance, or
     * that the claims topic gives to another partition (whichever instance owns it).
     */
    public static final String KEY_ON_TWO_PARTITIONS = "KEY_ON_TWO_PARTITIONS";
    /** Reason for a record whose width differs from its key's. */
    public static final String WRONG_WIDTH = "WRONG_WIDTH";
    /** Reason for a record the moments refused (non-finite value or weight). */
    public static final String NON_FINITE = "NON_FINITE";
    /** Reason for a record older than its key's sliding window (the window's state is left alone). */
    public static final String TOO_LATE_FOR_WINDOW = "TOO_LATE_FOR_WINDOW";

    private DeadLetters() {
    }

    /** The dead letter of {@code source} on {@code topic}. */
    public static ProducerRecord<byte[], byte[]> of(String topic, ConsumerRecord<byte[], byte[]> source,
                                                    String reason, String detail, String exceptionClass) {
        RecordHeaders h = new RecordHeaders();
        h.add(REASON, utf8(reason));
        h.add(DETAIL, utf8(detail == null ? "" : truncate(detail)));
        h.add(EXCEPTION_CLASS, utf8(exceptionClass == null ? "" : exceptionClass));
        h.add(SOURCE_TOPIC, utf8(source.topic()));
        h.add(SOURCE_PARTITION, utf8(Integer.toString(source.partition())));
        h.add(SOURCE_OFFSET, utf8(Long.toString(source.offset())));
        h.add(SOURCE_TIMESTAMP, utf8(Long.toString(source.timestamp())));
        return new ProducerRecord<>(topic, null, null, source.key(), source.value(), h);
    }

    private static String truncate(String s) {
        return s.length() <= 1000 ? s : s.substring(0, 1000) + "...";
    }

    private static byte[] utf8(String s) {
        ByteBuffer b = StandardCharsets.UTF_8.encode(s);
        byte[] out = new byte[b.remaining()];
        b.get(out);
        return out;
    }
}

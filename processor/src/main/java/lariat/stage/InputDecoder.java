package lariat.stage;

/**
 * Turns one raw input record into a {@link Decoded}. Implementations never throw: every
 * failure is a {@link Decoded#rejected rejection} naming its reason.
 */
public interface InputDecoder {

    /**
     * @param key       the record key bytes, possibly null
     * @param value     the record value bytes, possibly null
     * @param timestampMs the Kafka record timestamp, used when no event-time field is configured
     */
    Decoded decode(byte[] key, byte[] value, long timestampMs);
}

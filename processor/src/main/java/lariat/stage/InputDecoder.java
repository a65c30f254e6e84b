package lariat.stage;

import lariat.codec.Decoded;
import lariat.codec.KeyLayouts;

/**
 * Turns one raw input record into a reading, a rejection or a skip; never throws for bad input.
 * {@link lariat.codec.RecordDecoder#decode} is the production implementation.
 */
@FunctionalInterface
public interface InputDecoder {

    /**
     * @param key         the record key bytes, possibly null
     * @param value       the record value bytes, possibly null
     * @param timestampMs the Kafka record timestamp
     * @param layouts     the partition's per-key channel layouts; a new key's layout is added
     *                    when its first record is accepted
     */
    Decoded decode(byte[] key, byte[] value, long timestampMs, KeyLayouts layouts);
}

package lariat.stage;

import lariat.codec.Decoded;
import lariat.codec.KeyLayouts;
import lariat.codec.RowBuffer;

/**
 * Turns one raw input record into an accepted row, a rejection or a skip; never throws for bad input.
 * {@link lariat.codec.RecordDecoder#decodeInto} is the production implementation.
 */
@FunctionalInterface
public interface InputDecoder {

    /**
     * @param key         the record key bytes, possibly null
     * @param value       the record value bytes, possibly null
     * @param timestampMs the Kafka record timestamp
     * @param layouts     the partition's per-key channel layouts; a new key's layout is added
     *                    when its first record is accepted
     * @param out         modified: holds the record when it is accepted
     * @return {@code null} when the record is accepted into {@code out}, otherwise its rejection or skip
     */
    Decoded decode(byte[] key, byte[] value, long timestampMs, KeyLayouts layouts, RowBuffer out);
}

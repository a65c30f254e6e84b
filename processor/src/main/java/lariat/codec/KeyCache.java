package lariat.codec;

import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;

/**
 * Model keys by their UTF-8 bytes, so that a key seen before costs a hash and a byte comparison instead of
 * a new {@code String}. Open addressing with linear probing over at most {@value #MAX_ENTRIES} keys; when
 * full it starts over empty. A strict cache decodes new bytes as {@code CharsetDecoder} with
 * {@code REPORT} does (malformed bytes give {@code null}); a lenient one as {@code new String(bytes, UTF_8)}
 * does (malformed bytes become U+FFFD), which is how Avro's {@code Utf8.toString} turns a string field into
 * text. Not thread-safe.
 */
final class KeyCache {

    static final int MAX_ENTRIES = 4096;
    private static final int MAX_KEY_BYTES = 4 * FieldMapper.MAX_KEY_CHARS;

    private final boolean strict;
    private final CharsetDecoder utf8 = StandardCharsets.UTF_8.newDecoder()
            .onMalformedInput(CodingErrorAction.REPORT).onUnmappableCharacter(CodingErrorAction.REPORT);
    private byte[][] keys = new byte[64][];
    private String[] texts = new String[64];
    private int[] hashes = new int[64];
    private int size;

    KeyCache(boolean strict) {
        this.strict = strict;
    }

    /**
     * The text of {@code bytes[off, off + len)}, or {@code null} when a strict cache finds it not UTF-8.
     * Keys longer than {@code 4 * FieldMapper.MAX_KEY_CHARS} bytes are decoded but not kept.
     */
    String text(byte[] bytes, int off, int len) {
        int h = hash(bytes, off, len);
        int mask = keys.length - 1;
        int i = h & mask;
        for (byte[] k = keys[i]; k != null; k = keys[i]) {
            if (hashes[i] == h && ChannelTable.same(k, bytes, off, len)) {
                return texts[i];
            }
            i = (i + 1) & mask;
        }
        String s = decode(bytes, off, len);
        if (s != null && len <= MAX_KEY_BYTES) {
            insert(Arrays.copyOfRange(bytes, off, off + len), h, s);
        }
        return s;
    }

    private String decode(byte[] bytes, int off, int len) {
        if (!strict) {
            return new String(bytes, off, len, StandardCharsets.UTF_8);
        }
        try {
            return utf8.decode(ByteBuffer.wrap(bytes, off, len)).toString();
        } catch (CharacterCodingException e) {
            return null;
        }
    }

    private void insert(byte[] key, int h, String text) {
        if (4 * (size + 1) > 3 * keys.length) {
            if (keys.length * 2 <= 2 * MAX_ENTRIES) {
                rehash(keys.length * 2);
            } else {
                keys = new byte[keys.length][];
                texts = new String[keys.length];
                hashes = new int[keys.length];
                size = 0;
            }
        }
        int mask = keys.length - 1;
        int i = h & mask;
        while (keys[i] != null) {
            i = (i + 1) & mask;
        }
        keys[i] = key;
        texts[i] = text;
        hashes[i] = h;
        size++;
    }

    private void rehash(int capacity) {
        byte[][] oldKeys = keys;
        String[] oldTexts = texts;
        int[] oldHashes = hashes;
        keys = new byte[capacity][];
        texts = new String[capacity];
        hashes = new int[capacity];
        size = 0;
        for (int j = 0; j < oldKeys.length; j++) {
            if (oldKeys[j] != null) {
                insert(oldKeys[j], oldHashes[j], oldTexts[j]);
            }
        }
    }

    /** A 32-bit polynomial hash of the bytes with the high half folded in. */
    static int hash(byte[] b, int off, int len) {
        int h = 1;
        for (int i = off; i < off + len; i++) {
            h = 31 * h + b[i];
        }
        return h ^ (h >>> 16);
    }
}

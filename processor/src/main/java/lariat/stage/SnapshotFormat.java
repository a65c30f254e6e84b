package lariat.stage;

import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Record layout of the snapshot topic, framing version {@value #FRAMING_VERSION}. The topic is internal to
 * the stage (only the stage writes and reads it), so it uses this fixed binary framing rather than Avro;
 * the state it carries is versioned on its own (the key-state payload begins with its format number, see
 * {@code KeyState}), and the moments inside it are the canonical bytes whose SHA-256 the model records
 * carry as fingerprints.
 *
 * <p>One key's state is split into chunks of at most {@code chunkBytes} bytes plus one manifest, all
 * written in the same transaction. Keys are UTF-8; values are big-endian:
 * <pre>
 *   manifest  key "m|" + modelKey            value MAGIC, 'M', generation (long), chunkCount (int),
 *                                                  totalBytes (int), SHA-256 of the state (32 bytes)
 *   chunk i   key "c|" + i + "|" + modelKey  value MAGIC, 'C', generation (long), i (int), chunk bytes
 *   marker    key "o|"                        value MAGIC, 'O', next input offset (long)
 *   tombstone key of a stale chunk            value null
 * </pre>
 * MAGIC ({@code 0x4C}) is the first byte of every value and names framing version 1; a later framing gets
 * another first byte, and a reader never applies a value whose first byte it does not know (such a
 * manifest or chunk makes the key's snapshot incomplete).
 *
 * <p>The generation is the key's accepted record count, so a chunk from another snapshot of the
 * same key is recognised. A restore applies a state only when every chunk of the latest
 * manifest is present with the manifest's generation and the concatenation has the manifest's
 * length and SHA-256 (FIPS 180-4). Chunk indexes beyond a new, shorter snapshot are tombstoned in
 * the transaction that writes it, so compaction removes them.
 */
public final class SnapshotFormat {

    /** Version of the framing described in the class comment; named on the wire by {@link #MAGIC}. */
    public static final int FRAMING_VERSION = 1;
    /** First byte of every value of framing version 1. */
    static final byte MAGIC = 0x4C;
    private static final byte MANIFEST = 'M';
    private static final byte CHUNK = 'C';

    private SnapshotFormat() {
    }

    /** One record to write on the snapshot topic; a null value is a tombstone. */
    public static final class Entry {
        private final byte[] key;
        private final byte[] value;

        Entry(byte[] key, byte[] value) {
            this.key = key;
            this.value = value;
        }

        public byte[] key() {
            return key;
        }

        public byte[] value() {
            return value;
        }
    }

    /** What a snapshot-topic record is, once parsed. */
    public enum Kind { MANIFEST, CHUNK, OFFSET, FOREIGN }

    private static final byte OFFSET = 'O';
    private static final byte[] OFFSET_KEY = "o|".getBytes(StandardCharsets.UTF_8);

    /**
     * The partition's position marker: key {@code "o|"}, value MAGIC, 'O', next input offset.
     * Written in every transaction beside the consumed offsets, so a partition whose group
     * offsets expired still resumes where its snapshot was taken.
     */
    public static Entry offsetMarker(long nextOffset) {
        ByteBuffer v = ByteBuffer.allocate(10);
        v.put(MAGIC).put(OFFSET).putLong(nextOffset);
        return new Entry(OFFSET_KEY.clone(), v.array());
    }

    /** Next input offset of a marker value, or -1 when it is malformed. */
    static long parseOffsetMarker(byte[] value) {
        if (value == null || value.length != 10 || value[0] != MAGIC || value[1] != OFFSET) {
            return -1;
        }
        return ByteBuffer.wrap(value, 2, 8).getLong();
    }

    /**
     * Splits {@code state} into chunk entries followed by the manifest, plus tombstones for
     * chunk indexes {@code [chunks, previousChunkCount)}.
     *
     * @throws IllegalArgumentException when {@code chunkBytes < 1}
     */
    public static List<Entry> encode(String modelKey, long generation, byte[] state, int chunkBytes,
                                     int previousChunkCount) {
        if (chunkBytes < 1) {
            throw new IllegalArgumentException("chunkBytes must be positive, was " + chunkBytes);
        }
        int chunks = Math.max(1, (state.length + chunkBytes - 1) / chunkBytes);
        List<Entry> out = new ArrayList<>(chunks + 1 + Math.max(0, previousChunkCount - chunks));
        for (int i = 0; i < chunks; i++) {
            int from = i * chunkBytes;
            int to = Math.min(state.length, from + chunkBytes);
            ByteBuffer v = ByteBuffer.allocate(2 + 8 + 4 + (to - from));
            v.put(MAGIC).put(CHUNK).putLong(generation).putInt(i).put(state, from, to - from);
            out.add(new Entry(chunkKey(modelKey, i), v.array()));
        }
        for (int i = chunks; i < previousChunkCount; i++) {
            out.add(new Entry(chunkKey(modelKey, i), null));
        }
        ByteBuffer m = ByteBuffer.allocate(2 + 8 + 4 + 4 + 32);
        m.put(MAGIC).put(MANIFEST).putLong(generation).putInt(chunks).putInt(state.length).put(sha256(state));
        out.add(new Entry(manifestKey(modelKey), m.array()));
        return out;
    }

    /**
     * Tombstones of {@code modelKey}'s whole snapshot: chunk indexes {@code [0, chunkCount)}, then the
     * manifest, so compaction removes the key from the partition and a restore no longer finds it.
     *
     * @throws IllegalArgumentException when {@code chunkCount < 0}
     */
    public static List<Entry> tombstones(String modelKey, int chunkCount) {
        if (chunkCount < 0) {
            throw new IllegalArgumentException("chunkCount must be >= 0, was " + chunkCount);
        }
        List<Entry> out = new ArrayList<>(chunkCount + 1);
        for (int i = 0; i < chunkCount; i++) {
            out.add(new Entry(chunkKey(modelKey, i), null));
        }
        out.add(new Entry(manifestKey(modelKey), null));
        return out;
    }

    static byte[] manifestKey(String modelKey) {
        return ("m|" + modelKey).getBytes(StandardCharsets.UTF_8);
    }

    static byte[] chunkKey(String modelKey, int index) {
        return ("c|" + index + "|" + modelKey).getBytes(StandardCharsets.UTF_8);
    }

    /** Kind of a snapshot-topic record key. */
    public static Kind kindOf(byte[] key) {
        if (key == null || key.length < 2 || key[1] != '|') {
            return Kind.FOREIGN;
        }
        switch (key[0]) {
            case 'm':
                return Kind.MANIFEST;
            case 'c':
                return Kind.CHUNK;
            case 'o':
                return key.length == 2 ? Kind.OFFSET : Kind.FOREIGN;
            default:
                return Kind.FOREIGN;
        }
    }

    /** Model key of a manifest record key. */
    static String manifestModelKey(byte[] key) {
        return new String(key, 2, key.length - 2, StandardCharsets.UTF_8);
    }

    /** Model key of a chunk record key; the chunk index is in the value. */
    static String chunkModelKey(byte[] key) {
        String s = new String(key, StandardCharsets.UTF_8);
        int bar = s.indexOf('|', 2);
        return bar < 0 ? null : s.substring(bar + 1);
    }

    /** A parsed manifest. */
    static final class Manifest {
        final long generation;
        final int chunkCount;
        final int totalBytes;
        final byte[] sha256;

        private Manifest(long generation, int chunkCount, int totalBytes, byte[] sha256) {
            this.generation = generation;
            this.chunkCount = chunkCount;
            this.totalBytes = totalBytes;
            this.sha256 = sha256;
        }
    }

    /** A parsed chunk. */
    static final class Chunk {
        final long generation;
        final int index;
        final byte[] bytes;

        private Chunk(long generation, int index, byte[] bytes) {
            this.generation = generation;
            this.index = index;
            this.bytes = bytes;
        }
    }

    /** Parses a manifest value, or returns null when it is malformed. */
    static Manifest parseManifest(byte[] value) {
        if (value == null || value.length != 2 + 8 + 4 + 4 + 32 || value[0] != MAGIC || value[1] != MANIFEST) {
            return null;
        }
        ByteBuffer b = ByteBuffer.wrap(value, 2, value.length - 2);
        long gen = b.getLong();
        int count = b.getInt();
        int total = b.getInt();
        byte[] sha = new byte[32];
        b.get(sha);
        return count < 1 || total < 0 ? null : new Manifest(gen, count, total, sha);
    }

    /** Parses a chunk value, or returns null when it is malformed. */
    static Chunk parseChunk(byte[] value) {
        if (value == null || value.length < 14 || value[0] != MAGIC || value[1] != CHUNK) {
            return null;
        }
        ByteBuffer b = ByteBuffer.wrap(value, 2, value.length - 2);
        long gen = b.getLong();
        int index = b.getInt();
        return new Chunk(gen, index, Arrays.copyOfRange(value, 14, value.length));
    }

    /**
     * Joins the chunks of {@code m}; returns null unless every chunk is present with the
     * manifest's generation, the length matches and the SHA-256 matches.
     */
    static byte[] assemble(Manifest m, Chunk[] chunks) {
        if (chunks.length < m.chunkCount) {
            return null;
        }
        ByteBuffer all = ByteBuffer.allocate(m.totalBytes);
        for (int i = 0; i < m.chunkCount; i++) {
            Chunk c = chunks[i];
            if (c == null || c.generation != m.generation || c.index != i || c.bytes.length > all.remaining()) {
                return null;
            }
            all.put(c.bytes);
        }
        if (all.hasRemaining()) {
            return null;
        }
        byte[] state = all.array();
        return MessageDigest.isEqual(sha256(state), m.sha256) ? state : null;
    }

    static byte[] sha256(byte[] bytes) {
        try {
            return MessageDigest.getInstance("SHA-256").digest(bytes);
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is required of every JDK", e);
        }
    }
}

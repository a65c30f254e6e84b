package lariat.stage;

import org.junit.jupiter.api.Test;

import java.util.List;
import java.util.Random;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

class SnapshotFormatTest {

    private static final int CHUNK = 1000;

    private static byte[] state(int n) {
        byte[] b = new byte[n];
        new Random(7).nextBytes(b);
        return b;
    }

    /** Parses entries the way a restore does: chunks by index, then the manifest. */
    private static byte[] assemble(List<SnapshotFormat.Entry> entries, int dropChunk, long otherGeneration) {
        SnapshotFormat.Manifest m = null;
        SnapshotFormat.Chunk[] chunks = new SnapshotFormat.Chunk[16];
        for (SnapshotFormat.Entry e : entries) {
            if (SnapshotFormat.kindOf(e.key()) == SnapshotFormat.Kind.MANIFEST) {
                m = SnapshotFormat.parseManifest(e.value());
            } else if (e.value() != null) {
                SnapshotFormat.Chunk c = SnapshotFormat.parseChunk(e.value());
                if (c.index != dropChunk) {
                    chunks[c.index] = c;
                }
            }
        }
        if (otherGeneration >= 0) {
            List<SnapshotFormat.Entry> other = SnapshotFormat.encode("k", otherGeneration, state(2500), CHUNK, 0);
            chunks[1] = SnapshotFormat.parseChunk(other.get(1).value());
        }
        return SnapshotFormat.assemble(m, chunks);
    }

    @Test
    void encode_stateOverThreeChunks_assemblesToSameBytes() {
        byte[] s = state(2500);
        List<SnapshotFormat.Entry> entries = SnapshotFormat.encode("north-01", 42, s, CHUNK, 0);
        assertEquals(4, entries.size(), "three chunks and a manifest");
        assertEquals(SnapshotFormat.Kind.MANIFEST, SnapshotFormat.kindOf(entries.get(3).key()), "manifest last");
        assertArrayEquals(s, assemble(entries, -1, -1));
    }

    @Test
    void assemble_missingChunk_isNotApplied() {
        assertNull(assemble(SnapshotFormat.encode("k", 1, state(2500), CHUNK, 0), 1, -1));
    }

    @Test
    void assemble_chunkOfOtherGeneration_isNotApplied() {
        assertNull(assemble(SnapshotFormat.encode("k", 5, state(2500), CHUNK, 0), -1, 4));
    }

    @Test
    void assemble_flippedByte_failsSha256() {
        List<SnapshotFormat.Entry> entries = SnapshotFormat.encode("k", 1, state(2500), CHUNK, 0);
        entries.get(0).value()[20] ^= 1;
        assertNull(assemble(entries, -1, -1));
    }

    @Test
    void encode_shorterThanPrevious_tombstonesStaleChunks() {
        List<SnapshotFormat.Entry> entries = SnapshotFormat.encode("k", 9, state(1500), CHUNK, 5);
        long tombstones = entries.stream().filter(e -> e.value() == null).count();
        assertEquals(3, tombstones, "chunks 2, 3 and 4 of the previous snapshot");
        assertArrayEquals(state(1500), assemble(entries, -1, -1));
    }

    @Test
    void encode_emptyState_oneEmptyChunk() {
        assertArrayEquals(new byte[0], assemble(SnapshotFormat.encode("k", 0, new byte[0], CHUNK, 0), -1, -1));
    }

    @Test
    void modelKeys_withSeparatorInKey_roundTrip() {
        String key = "site|7|pump";
        List<SnapshotFormat.Entry> entries = SnapshotFormat.encode(key, 1, state(10), CHUNK, 0);
        assertEquals(key, SnapshotFormat.chunkModelKey(entries.get(0).key()));
        assertEquals(key, SnapshotFormat.manifestModelKey(entries.get(1).key()));
    }

    @Test
    void offsetMarker_roundTrips() {
        SnapshotFormat.Entry e = SnapshotFormat.offsetMarker(123_456_789L);
        assertEquals(SnapshotFormat.Kind.OFFSET, SnapshotFormat.kindOf(e.key()));
        assertEquals(123_456_789L, SnapshotFormat.parseOffsetMarker(e.value()));
    }

    @Test
    void encode_zeroChunkBytes_rejectedNamingArgument() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> SnapshotFormat.encode("k", 1, state(10), 0, 0));
        assertEquals("chunkBytes must be positive, was 0", e.getMessage());
    }

    @Test
    void parse_valueOfUnknownFramingVersion_isNotApplied() {
        List<SnapshotFormat.Entry> entries = SnapshotFormat.encode("k", 1, state(10), CHUNK, 0);
        byte[] chunk = entries.get(0).value().clone();
        byte[] manifest = entries.get(1).value().clone();
        assertEquals(SnapshotFormat.MAGIC, manifest[0], "framing version 1 starts every value with MAGIC");
        assertEquals(2 + 8 + 4 + 4 + 32, manifest.length, "manifest layout of the class comment");
        chunk[0] = 0x4D;
        manifest[0] = 0x4D;
        assertNull(SnapshotFormat.parseChunk(chunk));
        assertNull(SnapshotFormat.parseManifest(manifest));
    }

    @Test
    void encode_windowedKeyStateOverChunks_restoresBitExactly() throws java.io.IOException {
        KeyState k = KeyState.create("west-02", 0, new String[] {"flow", "head", "current"},
                lariat.moments.Accumulator.window(3, 1000L, 8), 4);
        java.util.Random rnd = new java.util.Random(4);
        for (int i = 0; i < 200; i++) {
            k.add(new double[] {rnd.nextGaussian(), rnd.nextGaussian(), rnd.nextGaussian()}, 1.0, 97L * i, i);
        }
        byte[] state = k.toBytes();
        List<SnapshotFormat.Entry> entries = SnapshotFormat.encode("west-02", k.count(), state, CHUNK, 0);
        assertTrue(entries.size() > 3, "the state spans several chunks");
        KeyState restored = KeyState.fromBytes(assemble(entries, -1, -1), entries.size() - 1);
        assertArrayEquals(state, restored.toBytes());
        assertEquals(k.moments().moments().fingerprint(), restored.moments().moments().fingerprint());
    }

    @Test
    void tombstones_keyOfThreeChunks_nullValueForEveryChunkAndTheManifest() {
        List<SnapshotFormat.Entry> written = SnapshotFormat.encode("north-03", 5, state(2500), CHUNK, 0);
        List<SnapshotFormat.Entry> gone = SnapshotFormat.tombstones("north-03", 3);
        assertEquals(written.size(), gone.size(), "one tombstone per record the snapshot wrote");
        for (int i = 0; i < written.size(); i++) {
            assertArrayEquals(written.get(i).key(), gone.get(i).key());
            assertNull(gone.get(i).value());
        }
        assertEquals(SnapshotFormat.Kind.MANIFEST, SnapshotFormat.kindOf(gone.get(3).key()));
        assertEquals(1, SnapshotFormat.tombstones("north-03", 0).size(), "a state never committed: its manifest only");
        assertThrows(IllegalArgumentException.class, () -> SnapshotFormat.tombstones("north-03", -1));
    }
}

package lariat.codec;

import java.lang.invoke.MethodHandles;
import java.lang.invoke.VarHandle;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;

/**
 * The columns of a layout's channels and the target by their UTF-8 names: column i for channel i of the
 * layout and column {@code size} for the target, looked up from the bytes of an Avro map key without
 * making a {@code String}. Open addressing with linear probing in a table at least twice the column count.
 *
 * <p>Writers usually send a key's channels in the same order every time, so the table also remembers
 * which column the i-th map entry named last time ({@link #expected}); checking that guess costs one
 * byte comparison, and only a wrong guess pays for the hash lookup. The guesses only steer the lookup,
 * never its answer. Not thread-safe (the guesses change).
 */
final class ChannelTable {

    private final byte[][] names;
    private final int[] hashes;
    private final int[] columnAt;
    private final int columns;
    private static final VarHandle LONG_LE = MethodHandles.byteArrayViewVarHandle(long[].class, ByteOrder.LITTLE_ENDIAN);

    private final byte[][] byColumn;
    private final long[] packed;
    private final long[] packMask;
    private int[] expected = new int[0];

    private ChannelTable(byte[][] names, int columns) {
        this.byColumn = names;
        this.packed = new long[names.length];
        this.packMask = new long[names.length];
        for (int c = 0; c < names.length; c++) {
            int len = names[c].length;
            packMask[c] = len >= 8 ? -1L : (1L << (8 * len)) - 1;
            byte[] padded = Arrays.copyOf(names[c], 8);
            packed[c] = (long) LONG_LE.get(padded, 0) & packMask[c];
        }
        int capacity = Integer.highestOneBit(Math.max(4, 2 * names.length) - 1) << 1;
        this.names = new byte[capacity][];
        this.hashes = new int[capacity];
        this.columnAt = new int[capacity];
        this.columns = columns;
        for (int c = 0; c < names.length; c++) {
            int h = KeyCache.hash(names[c], 0, names[c].length);
            int i = h & (capacity - 1);
            while (this.names[i] != null) {
                i = (i + 1) & (capacity - 1);
            }
            this.names[i] = names[c];
            this.hashes[i] = h;
            this.columnAt[i] = c;
        }
    }

    /**
     * The table of {@code layout}'s channels then {@code target}, or {@code null} when a byte match could
     * differ from the general path's text match: a name that is the target too, or a name whose UTF-8 form
     * does not decode back to it or that holds U+FFFD (the text of malformed bytes).
     */
    static ChannelTable of(ChannelLayout layout, String target) {
        int n = layout.size();
        byte[][] names = new byte[n + 1][];
        for (int c = 0; c <= n; c++) {
            String name = c < n ? layout.name(c) : target;
            if ((c < n && name.equals(target)) || name.indexOf('\uFFFD') >= 0) {
                return null;
            }
            names[c] = name.getBytes(StandardCharsets.UTF_8);
            if (!new String(names[c], StandardCharsets.UTF_8).equals(name)) {
                return null;
            }
        }
        return new ChannelTable(names, n + 1);
    }

    /** The number of columns: the layout's channels plus the target. */
    int columns() {
        return columns;
    }

    /**
     * The column named by {@code bytes[off, off + len)}, the {@code entry}-th key of a map, or -1; tries
     * the column that entry named last time first.
     */
    int column(int entry, byte[] bytes, int off, int len) {
        if (entry < expected.length) {
            int guess = expected[entry];
            if (guess >= 0 && named(guess, bytes, off, len)) {
                return guess;
            }
        } else {
            int old = expected.length;
            expected = Arrays.copyOf(expected, Math.max(2 * old, entry + 1));
            Arrays.fill(expected, old, expected.length, -1);
        }
        int c = column(bytes, off, len);
        expected[entry] = c;
        return c;
    }

    /** Whether column {@code column} is named by the bytes; a name of at most 8 bytes is compared as one word. */
    private boolean named(int column, byte[] bytes, int off, int len) {
        byte[] name = byColumn[column];
        if (name.length != len) {
            return false;
        }
        if (len <= 8 && off + 8 <= bytes.length) {
            return ((long) LONG_LE.get(bytes, off) & packMask[column]) == packed[column];
        }
        return same(name, bytes, off, len);
    }

    /** Whether {@code name} equals {@code bytes[off, off + len)}; a plain loop, quicker than a library call for names this short. */
    static boolean same(byte[] name, byte[] bytes, int off, int len) {
        if (name.length != len) {
            return false;
        }
        for (int i = 0; i < len; i++) {
            if (name[i] != bytes[off + i]) {
                return false;
            }
        }
        return true;
    }

    /** The column named by {@code bytes[off, off + len)}, or -1. */
    int column(byte[] bytes, int off, int len) {
        int h = KeyCache.hash(bytes, off, len);
        int mask = names.length - 1;
        int i = h & mask;
        for (byte[] k = names[i]; k != null; k = names[i]) {
            if (hashes[i] == h && same(k, bytes, off, len)) {
                return columnAt[i];
            }
            i = (i + 1) & mask;
        }
        return -1;
    }
}

package lariat.codec;

import java.nio.charset.StandardCharsets;
import java.util.Arrays;

/**
 * The columns of a layout's channels and the target by their UTF-8 names: column i for channel i of the
 * layout and column {@code size} for the target, looked up from the bytes of an Avro map key without
 * making a {@code String}. Open addressing with linear probing in a table at least twice the column count.
 * Immutable.
 */
final class ChannelTable {

    private final byte[][] names;
    private final int[] hashes;
    private final int[] columnAt;
    private final int columns;

    private ChannelTable(byte[][] names, int columns) {
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

    /** The column named by {@code bytes[off, off + len)}, or -1. */
    int column(byte[] bytes, int off, int len) {
        int h = KeyCache.hash(bytes, off, len);
        int mask = names.length - 1;
        int i = h & mask;
        for (byte[] k = names[i]; k != null; k = names[i]) {
            if (hashes[i] == h && Arrays.equals(k, 0, k.length, bytes, off, off + len)) {
                return columnAt[i];
            }
            i = (i + 1) & mask;
        }
        return -1;
    }
}

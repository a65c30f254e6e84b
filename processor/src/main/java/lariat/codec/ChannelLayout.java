package lariat.codec;

import java.util.Arrays;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import org.apache.avro.util.Utf8;

/**
 * The ordered feature channel names of a key. The position of a name is its column in every
 * {@link Reading#z()} of the key; the target follows as the last column.
 */
public final class ChannelLayout {

    private final List<String> names;
    private final Utf8[] utf8;

    private ChannelLayout(String[] names) {
        Set<String> seen = new HashSet<>();
        for (String n : names) {
            if (n == null || n.isEmpty()) {
                throw new IllegalArgumentException("names: a channel name is null or empty, got " + Arrays.toString(names));
            }
            if (!seen.add(n)) {
                throw new IllegalArgumentException("names: channel '" + n + "' appears twice");
            }
        }
        this.names = List.of(names);
        this.utf8 = new Utf8[names.length];
        for (int i = 0; i < names.length; i++) {
            utf8[i] = new Utf8(names[i]);
        }
    }

    /**
     * @throws IllegalArgumentException if a name is empty or repeated
     */
    public static ChannelLayout of(List<String> names) {
        return new ChannelLayout(names.toArray(new String[0]));
    }

    /** The channel names, unmodifiable. */
    public List<String> names() {
        return names;
    }

    public int size() {
        return names.size();
    }

    String name(int i) {
        return names.get(i);
    }

    Utf8 utf8(int i) {
        return utf8[i];
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof ChannelLayout && ((ChannelLayout) o).names.equals(names);
    }

    @Override
    public int hashCode() {
        return names.hashCode();
    }

    @Override
    public String toString() {
        return names.toString();
    }
}

package lariat.codec;

import java.util.HashMap;
import java.util.Map;
import java.util.Optional;

/**
 * The channel layout of each model key whose channels are not fixed by configuration (a map field,
 * or a name pattern over JSON fields): the first accepted record of a key fixes its layout, and
 * later records are read in that order. This is per-partition stage state: the stage keeps one per
 * input partition, restores it with the key's moments (whose snapshot lists the channels) and drops
 * it with them. Not thread-safe.
 */
public final class KeyLayouts {

    private final Map<String, ChannelLayout> byKey;

    private KeyLayouts(Map<String, ChannelLayout> byKey) {
        this.byKey = byKey;
    }

    /** An empty registry. */
    public static KeyLayouts create() {
        return new KeyLayouts(new HashMap<>());
    }

    /** The layout of a key, if fixed. */
    public Optional<ChannelLayout> of(String key) {
        return Optional.ofNullable(byKey.get(key));
    }

    ChannelLayout get(String key) {
        return byKey.get(key);
    }

    /**
     * Fixes (or restores) the layout of a key.
     *
     * @throws IllegalArgumentException if the key already has a different layout
     */
    public void put(String key, ChannelLayout layout) {
        ChannelLayout old = byKey.putIfAbsent(key, layout);
        if (old != null && !old.equals(layout)) {
            throw new IllegalArgumentException("layout: key '" + key + "' already has channels " + old
                    + ", got " + layout);
        }
    }

    /** Forgets a key (when its partition is revoked or its state is discarded). */
    public void remove(String key) {
        byKey.remove(key);
    }

    /** Forgets every key. */
    public void clear() {
        byKey.clear();
    }

    /** Number of keys with a fixed layout. */
    public int count() {
        return byKey.size();
    }

    /** An independent copy. */
    public KeyLayouts copy() {
        return new KeyLayouts(new HashMap<>(byKey));
    }
}

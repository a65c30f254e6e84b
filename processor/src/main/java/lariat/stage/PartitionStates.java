package lariat.stage;

import java.util.Collection;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.Map;

/**
 * The in-memory key states of the assigned input partitions, and which partition owns each
 * key. A key owned by one partition and seen on another is a routing fault the loop reports.
 */
final class PartitionStates {

    private final Map<Integer, Map<String, KeyState>> byPartition = new HashMap<>();
    private final Map<String, Integer> owner = new HashMap<>();

    /** The state of {@code key}, or null when no assigned partition holds it. */
    KeyState get(String key) {
        Integer p = owner.get(key);
        return p == null ? null : byPartition.get(p).get(key);
    }

    /** The partition holding {@code key}, or -1. */
    int ownerOf(String key) {
        Integer p = owner.get(key);
        return p == null ? -1 : p;
    }

    void put(KeyState s) {
        byPartition.computeIfAbsent(s.partition(), p -> new LinkedHashMap<>()).put(s.modelKey(), s);
        owner.put(s.modelKey(), s.partition());
    }

    /** Drops the state {@code s}, when it is the one held for its key. */
    void remove(KeyState s) {
        Map<String, KeyState> m = byPartition.get(s.partition());
        if (m != null && m.get(s.modelKey()) == s) {
            m.remove(s.modelKey());
            owner.remove(s.modelKey());
        }
    }

    /** Drops every key of {@code partition}. */
    void drop(int partition) {
        Map<String, KeyState> gone = byPartition.remove(partition);
        if (gone != null) {
            gone.keySet().forEach(owner::remove);
        }
    }

    void clear() {
        byPartition.clear();
        owner.clear();
    }

    /** States of {@code partition} (live view; empty when none). */
    Collection<KeyState> of(int partition) {
        return byPartition.getOrDefault(partition, Map.of()).values();
    }

    /** Every state (live view). */
    Iterable<KeyState> all() {
        return () -> byPartition.values().stream().flatMap(m -> m.values().stream()).iterator();
    }

    int size() {
        return owner.size();
    }
}

package lariat.audit;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashSet;
import java.util.List;
import java.util.Optional;
import java.util.Set;

/**
 * The published versions of one model key in version order, with the as-of lookups.
 *
 * <p>As of an event time t, the version in force is the highest version whose moments hold no
 * record later than t ({@code lastEventTimeMs <= t}): the newest model computed only from data up
 * to t. As of a publish time t, it is the highest version published at or before t
 * ({@code publishedAtMs <= t}): the model a downstream reader could have had at t. Both are
 * empty before the first version. A version number seen twice (which the stage never writes)
 * keeps its first copy in model-topic order and is reported by {@link #duplicates()}. Immutable.
 */
public final class KeyHistory {

    private final String key;
    private final List<PublishedVersion> versions;
    private final List<Long> duplicates;

    private KeyHistory(String key, List<PublishedVersion> versions, List<Long> duplicates) {
        this.key = key;
        this.versions = versions;
        this.duplicates = duplicates;
    }

    /**
     * The history of {@code key} from {@code published}, in model-topic order; versions of other
     * keys are ignored.
     *
     * @throws IllegalArgumentException when {@code key} is null or empty
     */
    public static KeyHistory of(String key, List<PublishedVersion> published) {
        if (key == null || key.isEmpty()) {
            throw new IllegalArgumentException("key must be non-empty, was " + key);
        }
        List<PublishedVersion> mine = new ArrayList<>();
        List<Long> dup = new ArrayList<>();
        Set<Long> seen = new HashSet<>();
        for (PublishedVersion v : published) {
            if (!v.key().equals(key)) {
                continue;
            }
            if (!seen.add(v.version())) {
                dup.add(v.version());
            } else {
                mine.add(v);
            }
        }
        mine.sort(Comparator.comparingLong(PublishedVersion::version));
        return new KeyHistory(key, List.copyOf(mine), List.copyOf(dup));
    }

    public String key() {
        return key;
    }

    /** Versions in increasing version order. */
    public List<PublishedVersion> versions() {
        return versions;
    }

    public boolean isEmpty() {
        return versions.isEmpty();
    }

    /** The version numbered {@code version}, if published. */
    public Optional<PublishedVersion> get(long version) {
        return versions.stream().filter(v -> v.version() == version).findFirst();
    }

    /** The highest version with {@code lastEventTimeMs <= eventTimeMs}. */
    public Optional<PublishedVersion> asOfEventTime(long eventTimeMs) {
        return versions.stream().filter(v -> v.lastEventTimeMs() <= eventTimeMs)
                .max(Comparator.comparingLong(PublishedVersion::version));
    }

    /** The highest version with {@code publishedAtMs <= publishTimeMs}. */
    public Optional<PublishedVersion> asOfPublishTime(long publishTimeMs) {
        return versions.stream().filter(v -> v.publishedAtMs() <= publishTimeMs)
                .max(Comparator.comparingLong(PublishedVersion::version));
    }

    /**
     * Version numbers between 1 and the highest published one that are absent (versions are
     * contiguous from 1 by the stage's contract, so any entry here is a fault).
     */
    public List<Long> gaps() {
        List<Long> out = new ArrayList<>();
        long expected = 1;
        for (PublishedVersion v : versions) {
            for (long g = expected; g < v.version(); g++) {
                out.add(g);
            }
            expected = v.version() + 1;
        }
        return out;
    }

    /** Version numbers published more than once (each repeat listed). */
    public List<Long> duplicates() {
        return duplicates;
    }
}

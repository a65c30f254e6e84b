package lariat.audit;

/**
 * A refit a replay performs: version {@code version} of {@code key}, fitted from the key's
 * records below input offset {@code endOffset}, recording {@code publishedAtMs} as its wall-clock
 * time. Immutable.
 */
public final class RefitPoint {

    private final String key;
    private final long version;
    private final long endOffset;
    private final long publishedAtMs;

    private RefitPoint(String key, long version, long endOffset, long publishedAtMs) {
        this.key = key;
        this.version = version;
        this.endOffset = endOffset;
        this.publishedAtMs = publishedAtMs;
    }

    /**
     * @throws IllegalArgumentException when {@code key} is empty, {@code version < 1} or {@code endOffset < 0}
     */
    public static RefitPoint of(String key, long version, long endOffset, long publishedAtMs) {
        if (key == null || key.isEmpty()) {
            throw new IllegalArgumentException("key must be non-empty, was " + key);
        }
        if (version < 1) {
            throw new IllegalArgumentException("version must be >= 1, was " + version);
        }
        if (endOffset < 0) {
            throw new IllegalArgumentException("endOffset must be >= 0, was " + endOffset);
        }
        return new RefitPoint(key, version, endOffset, publishedAtMs);
    }

    /** The refit point a published version records. */
    public static RefitPoint of(PublishedVersion v) {
        return of(v.key(), v.version(), v.inputEndOffset(), v.publishedAtMs());
    }

    public String key() {
        return key;
    }

    public long version() {
        return version;
    }

    public long endOffset() {
        return endOffset;
    }

    public long publishedAtMs() {
        return publishedAtMs;
    }

    @Override
    public String toString() {
        return key + " v" + version + " @" + endOffset;
    }
}

package lariat.audit;

/**
 * Which published versions an audit covers: one key or all ({@code key} null), one version of it
 * or all ({@code version} 0), and only those published in {@code [fromMs, toMs]}. Immutable.
 */
public final class AuditScope {

    private final String key;
    private final long version;
    private final long fromMs;
    private final long toMs;

    private AuditScope(String key, long version, long fromMs, long toMs) {
        this.key = key;
        this.version = version;
        this.fromMs = fromMs;
        this.toMs = toMs;
    }

    /**
     * @param key     the model key, or null for every key
     * @param version the version, or 0 for every version
     * @param fromMs  earliest publish time, epoch ms ({@link Long#MIN_VALUE} for no bound)
     * @param toMs    latest publish time, epoch ms ({@link Long#MAX_VALUE} for no bound)
     * @throws IllegalArgumentException when {@code version < 0}, a version is given without a key,
     *                                  or {@code fromMs > toMs}
     */
    public static AuditScope of(String key, long version, long fromMs, long toMs) {
        if (version < 0) {
            throw new IllegalArgumentException("version must be >= 1 (or 0 for all), was " + version);
        }
        if (version > 0 && key == null) {
            throw new IllegalArgumentException("version " + version + " needs a key");
        }
        if (fromMs > toMs) {
            throw new IllegalArgumentException("time range is empty: from " + fromMs + " > to " + toMs);
        }
        return new AuditScope(key, version, fromMs, toMs);
    }

    /** Every version of every key. */
    public static AuditScope all() {
        return of(null, 0, Long.MIN_VALUE, Long.MAX_VALUE);
    }

    /** Whether the scope names keys of {@code key}. */
    public boolean coversKey(String k) {
        return key == null || key.equals(k);
    }

    /** Whether {@code v} is audited. */
    public boolean covers(PublishedVersion v) {
        return coversKey(v.key()) && (version == 0 || v.version() == version)
                && v.publishedAtMs() >= fromMs && v.publishedAtMs() <= toMs;
    }
}

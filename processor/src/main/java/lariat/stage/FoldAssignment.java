package lariat.stage;

/**
 * Stable fold assignment for cross-validation: record {@code n} (0-based index among a key's
 * accepted records) goes to fold {@code mix(n) mod k}, where {@code mix} is the 64-bit
 * finalizer of SplitMix64 (Steele, Lea and Flood, "Fast splittable pseudorandom number
 * generators", OOPSLA 2014). The same records in the same order always land in the same folds.
 */
public final class FoldAssignment {

    private FoldAssignment() {
    }

    /**
     * Fold of record {@code n} among {@code k} folds.
     *
     * @throws IllegalArgumentException when {@code k < 1} or {@code n < 0}
     */
    public static int foldOf(long n, int k) {
        if (k < 1) {
            throw new IllegalArgumentException("k must be >= 1, was " + k);
        }
        if (n < 0) {
            throw new IllegalArgumentException("n must be >= 0, was " + n);
        }
        long z = n + 0x9E3779B97F4A7C15L;
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        z = z ^ (z >>> 31);
        return (int) Long.remainderUnsigned(z, k);
    }
}

package lariat.select;

/**
 * Stable assignment of records to K cross-validation folds from the record's ordinal (its position in
 * the key's record count): fold = mix(ordinal) mod K, where mix is the 64-bit finalizer of SplitMix64
 * (Steele, Lea &amp; Flood, "Fast splittable pseudorandom number generators", OOPSLA 2014). No random
 * generator and no seed: the same ordinal always lands in the same fold, on every machine and replay.
 */
public final class FoldAssignment {

    private FoldAssignment() {
    }

    /**
     * @param ordinal the record's 0-based ordinal
     * @param folds   K &gt;= 2
     * @return the fold in [0, K)
     */
    public static int fold(long ordinal, int folds) {
        if (folds < 2) {
            throw new IllegalArgumentException("folds must be >= 2, was " + folds);
        }
        return (int) Long.remainderUnsigned(mix(ordinal), folds);
    }

    /** The SplitMix64 output for state {@code x}: golden-gamma increment then two xor-shift-multiply rounds. */
    static long mix(long x) {
        long z = x + 0x9E3779B97F4A7C15L;
        z = (z ^ (z >>> 30)) * 0xBF58476D1CE4E5B9L;
        z = (z ^ (z >>> 27)) * 0x94D049BB133111EBL;
        return z ^ (z >>> 31);
    }
}

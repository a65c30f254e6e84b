package lariat.select;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class FoldAssignmentTest {

    @Test
    void mix_zero_matchesSplitMix64FirstOutput() {
        // The first output of SplitMix64 seeded with 0 (Steele, Lea & Flood 2014; value as recalled from
        // the public reference implementation's output for seed 0).
        assertEquals(0xE220A8397B1DCDAFL, FoldAssignment.mix(0));
    }

    @Test
    void fold_sameOrdinal_sameFoldEveryTime() {
        int[] first = new int[1000];
        for (int i = 0; i < first.length; i++) {
            first[i] = FoldAssignment.fold(i, 7);
        }
        for (int i = first.length - 1; i >= 0; i--) {
            assertEquals(first[i], FoldAssignment.fold(i, 7));
        }
    }

    @Test
    void fold_manyOrdinals_balancedWithinFivePercent() {
        int k = 10;
        int n = 100_000;
        int[] counts = new int[k];
        for (long i = 0; i < n; i++) {
            counts[FoldAssignment.fold(i, k)]++;
        }
        for (int c : counts) {
            assertTrue(Math.abs(c - n / k) < 0.05 * n / k, "count " + c);
        }
    }

    @Test
    void fold_oneFold_isRefused() {
        assertThrows(IllegalArgumentException.class, () -> FoldAssignment.fold(3, 1));
    }
}

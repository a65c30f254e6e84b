package lariat.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/** The JSON shape of the benchmark results on tiny problems (the contract of issue 2, section 7); no timing. */
class BenchJsonTest {

    @Test
    void pathJson_tinyProblem_hasContractKeysInOrderWithConsistentValues() {
        Map<String, Object> json = PathBench.run(8, 20, 3, 3, 7L, 0.0).toJson();
        List<String> keys = List.copyOf(json.keySet());
        assertEquals(List.of("features", "rows", "steps", "median_s", "min_s", "max_s"), keys.subList(0, 6));
        assertEquals(8, json.get("features"));
        assertEquals(20, json.get("rows"));
        assertEquals(3, json.get("steps"));
        double min = (Double) json.get("min_s");
        double median = (Double) json.get("median_s");
        double max = (Double) json.get("max_s");
        assertTrue(0 < min && min <= median && median <= max, min + " <= " + median + " <= " + max);
    }

    @Test
    void pathJson_zeroSteps_reportsTheStepsOfTheWholePath() {
        Map<String, Object> json = PathBench.run(6, 40, 0, 1, 3L, 0.0).toJson();
        int steps = (Integer) json.get("steps");
        assertTrue(steps >= 6, "the whole lasso path of 6 columns with n > p takes at least 6 steps, took " + steps);
        assertEquals("COMPLETE", json.get("stop_reason"));
        assertEquals(6, json.get("final_active"));
    }

    @Test
    void momentsJson_tinyProblem_hasRecordsPerSecondFromTheMedianPass() {
        Map<String, Object> json = MomentsBench.run(5, 300, 16, 3, 11L).toJson();
        assertEquals("records_per_s", json.keySet().iterator().next());
        double rate = (Double) json.get("records_per_s");
        double median = (Double) json.get("median_s");
        assertEquals(300 / median, rate, 1e-9 * rate);
        assertEquals(6, json.get("width"));
        assertEquals(16, json.get("block_size"));
        assertTrue((Double) json.get("warmup_s") > 0, "one short warm-up pass at least");
    }

    @Test
    void momentsWarmup_givenSeconds_passesAtLeastThatLongBeforeTiming() {
        Map<String, Object> json = MomentsBench.run(5, 300, 16, 2, 11L, 1, 0.2).toJson();
        assertTrue((Double) json.get("warmup_s") >= 0.2, "warm-up of " + json.get("warmup_s") + " s");
        assertThrows(IllegalArgumentException.class, () -> MomentsBench.run(5, 300, 16, 2, 11L, 1, -1));
        assertThrows(IllegalArgumentException.class, () -> MomentsBench.run(5, 300, 16, 2, 11L, 1,
                Double.POSITIVE_INFINITY));
    }

    @Test
    void syntheticRows_sameSeed_sameRowsAndTenPercentNonzeros() {
        SyntheticRows a = SyntheticRows.of(30, 10, 5L);
        SyntheticRows b = SyntheticRows.of(30, 10, 5L);
        assertTrue(java.util.Arrays.equals(a.data(), b.data()));
        long nonzeros = java.util.Arrays.stream(a.truth()).filter(v -> v != 0).count();
        assertEquals(3, nonzeros);
    }
}

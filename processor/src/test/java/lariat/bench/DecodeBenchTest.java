package lariat.bench;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Map;
import org.junit.jupiter.api.Test;

/** {@code bench decode} reads every record by both paths, and reports per-record times and their ratio. */
class DecodeBenchTest {

    @Test
    void run_smallInput_bothPathsTimedAndRatioOfMedians() {
        DecodeBench.Result r = DecodeBench.run(5, 3, 300, 3, 7L, 0.0);
        Map<String, Object> json = r.toJson();
        double stage = (double) json.get("stage_ns_per_record");
        double general = (double) json.get("general_ns_per_record");
        assertTrue(stage > 0 && general > 0, json.toString());
        assertTrue((double) json.get("stage_min_ns_per_record") <= stage, json.toString());
        assertTrue((double) json.get("general_max_ns_per_record") >= general, json.toString());
        assertEquals(general / stage, (double) json.get("speedup"), 1e-12);
        assertEquals(3, json.get("passes"));
        assertTrue(r.table().contains("speed-up (general / stage, medians)"), r.table());
    }

    @Test
    void run_zeroRepeats_refusedNamingTheOption() {
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> DecodeBench.run(5, 3, 10, 0, 7L, 0.0));
        assertTrue(e.getMessage().startsWith("repeat"), e.getMessage());
    }
}

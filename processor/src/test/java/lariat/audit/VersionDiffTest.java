package lariat.audit;

import lariat.schema.ModelVersion;
import org.junit.jupiter.api.Test;

import java.util.List;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/** Diffs of hand-made versions; the expected sets are worked by hand from the coefficients. */
class VersionDiffTest {

    @Test
    void of_enterLeaveFlipAndChange_reportsEach() {
        ModelVersion a = Versions.of("k", 1, 100, 1000, new String[] {"flow", "temp", "speed"},
                new double[] {2.0, 0.5, -1.0});
        ModelVersion b = Versions.of("k", 2, 200, 2000, new String[] {"flow", "speed", "vibration"},
                new double[] {2.0, 0.25, 3.0});
        VersionDiff d = VersionDiff.of(a, b);
        assertEquals(List.of("vibration"), d.entered());
        assertEquals(List.of("temp"), d.left());
        assertEquals(List.of("speed"), d.signFlipped());
        assertEquals(List.of("speed", "vibration", "temp"),
                d.coefficientChanges().stream().map(VersionDiff.CoefficientChange::name).toList());
        VersionDiff.CoefficientChange temp = d.coefficientChanges().get(2);
        assertEquals(0.5, temp.before());
        assertEquals(0.0, temp.after());
        assertFalse(d.sameActiveSet());
        assertEquals(List.of("penalty", "recordCount"), d.selectionChanges().stream().map(FieldDifference::field)
                .toList());
    }

    @Test
    void of_sameVersion_hasNoChanges() {
        ModelVersion a = Versions.of("k", 1, 100, 1000, new String[] {"flow"}, new double[] {2.0});
        VersionDiff d = VersionDiff.of(a, a);
        assertTrue(d.sameActiveSet());
        assertEquals(List.of(), d.coefficientChanges());
        assertEquals(List.of(), d.selectionChanges());
    }

    @Test
    void of_coefficientOneUlpApart_isAChange() {
        ModelVersion a = Versions.of("k", 1, 100, 1000, new String[] {"flow"}, new double[] {2.0});
        ModelVersion b = Versions.of("k", 1, 100, 1000, new String[] {"flow"}, new double[] {Math.nextUp(2.0)});
        assertEquals(1, VersionDiff.of(a, b).coefficientChanges().size());
    }

    @Test
    void of_differentKeys_throwsNamingBoth() {
        ModelVersion a = Versions.of("k1", 1, 100, 1000, new String[0], new double[0]);
        ModelVersion b = Versions.of("k2", 1, 100, 1000, new String[0], new double[0]);
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> VersionDiff.of(a, b));
        assertTrue(e.getMessage().contains("'k1'") && e.getMessage().contains("'k2'"));
    }
}

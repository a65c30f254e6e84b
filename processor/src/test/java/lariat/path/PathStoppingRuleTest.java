package lariat.path;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;

/** Each stopping rule ends the path at the first knot it names, and the knots before are the full path's. */
class PathStoppingRuleTest {

    private final RawProblem problem = RawProblem.random(201, 150, 12, true);
    private final PathEngine engine = new PathEngine(12);
    private final LassoPath full = engine.fit(problem.gram(), PathOptions.defaults());

    private void assertPrefixOfFull(LassoPath path) {
        List<Knot> knots = path.knots();
        for (int k = 0; k < knots.size(); k++) {
            assertArrayEquals(full.knots().get(k).standardized(), knots.get(k).standardized(), 0, "knot " + k);
        }
    }

    @Test
    void fit_maxActive_stopsBeforeTheNextEntry() {
        LassoPath path = engine.fit(problem.gram(), PathOptions.builder().maxActive(4).build());

        assertEquals(StopReason.MAX_ACTIVE, path.stopReason());
        assertTrue(path.knots().stream().allMatch(k -> k.active().length <= 4));
        assertEquals(4, path.last().active().length);
        assertEquals(-1, path.last().entered());
        assertPrefixOfFull(path);
    }

    @Test
    void fit_targetR2_stopsAtFirstKnotReachingIt() {
        double target = 0.5 * full.last().r2();
        LassoPath path = engine.fit(problem.gram(), PathOptions.builder().targetR2(target).build());

        assertEquals(StopReason.TARGET_R2, path.stopReason());
        assertTrue(path.last().r2() >= target);
        assertTrue(path.knots().get(path.knots().size() - 2).r2() < target);
        assertPrefixOfFull(path);
    }

    @Test
    void fit_minRelativePenalty_stopsAtFirstKnotAtOrBelowIt() {
        LassoPath path = engine.fit(problem.gram(), PathOptions.builder().minRelativePenalty(0.2).build());

        assertEquals(StopReason.MIN_PENALTY, path.stopReason());
        assertTrue(path.last().relativePenalty() <= 0.2);
        assertTrue(path.knots().get(path.knots().size() - 2).relativePenalty() > 0.2);
        assertPrefixOfFull(path);
    }

    @Test
    void fit_maxSteps_takesExactlyThatMany() {
        LassoPath path = engine.fit(problem.gram(), PathOptions.builder().maxSteps(3).build());

        assertEquals(StopReason.MAX_STEPS, path.stopReason());
        assertEquals(4, path.knots().size());
        assertPrefixOfFull(path);
    }

    @Test
    void fit_defaults_runToTheLeastSquaresFit() {
        assertEquals(StopReason.COMPLETE, full.stopReason());
        assertEquals(0, full.last().penalty(), 0);
        assertEquals(1, full.knots().get(0).relativePenalty(), 0);
    }
}

package lariat.bench;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import lariat.path.GramInput;
import lariat.path.Knot;
import lariat.path.LassoPath;
import lariat.path.PathEngine;
import lariat.path.PathOptions;
import org.junit.jupiter.api.Test;

/**
 * The prototype kernel computes the same lasso path as {@link PathEngine} (itself certified by the
 * optimality conditions in lariat.path's tests) on benchmark-shaped problems, drops included.
 */
class ContiguousLassoKernelTest {

    /** Shared tolerance on standardized penalties and coefficients, relative to λ_max. */
    private static final double TOLERANCE = 1e-9;

    @Test
    void fit_wholePathWithDrops_matchesEngineKnotByKnot() {
        for (int p : new int[] {12, 40, 90}) {
            GramInput in = GramFromRows.of(SyntheticRows.of(p, 2 * p, 100 + p));
            LassoPath path = new PathEngine(p).fit(in, PathOptions.defaults());
            ContiguousLassoKernel kernel = new ContiguousLassoKernel(p);
            int steps = kernel.fit(in, 0);
            assertSamePath(path, kernel, steps);
        }
    }

    @Test
    void fit_maxSteps_stopsAtTheSameKnotAsEngine() {
        int p = 60;
        GramInput in = GramFromRows.of(SyntheticRows.of(p, 120, 9L));
        LassoPath path = new PathEngine(p).fit(in, PathOptions.builder().maxSteps(25).build());
        ContiguousLassoKernel kernel = new ContiguousLassoKernel(p);
        int steps = kernel.fit(in, 25);
        assertEquals(25, steps);
        assertSamePath(path, kernel, steps);
    }

    @Test
    void fit_benchmarkSeeds_includeAtLeastOneDrop() {
        int drops = 0;
        for (int p : new int[] {12, 40, 90}) {
            GramInput in = GramFromRows.of(SyntheticRows.of(p, 2 * p, 100 + p));
            for (Knot k : new PathEngine(p).fit(in, PathOptions.defaults()).knots()) {
                drops += k.left() >= 0 ? 1 : 0;
            }
        }
        assertTrue(drops > 0, "the equality checks above must exercise the drop branch");
    }

    private static void assertSamePath(LassoPath path, ContiguousLassoKernel kernel, int steps) {
        assertFalse(kernel.stoppedOnPivot());
        List<Knot> knots = path.knots();
        assertEquals(knots.size() - 1, steps);
        double scale = path.lambdaMax() * TOLERANCE;
        double[] penalties = kernel.penalties();
        for (int k = 0; k < knots.size(); k++) {
            assertEquals(knots.get(k).penalty(), penalties[k], scale, "penalty of knot " + k);
        }
        assertArrayEquals(path.last().standardized(), kernel.standardizedCoefficients(), scale);
    }
}

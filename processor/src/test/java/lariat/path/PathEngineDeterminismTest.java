package lariat.path;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * Bit-for-bit identities of the engine. The symmetrization rule (class comment of {@link PathEngine}),
 * G_jk = ½(C_jk + C_kj)/(d_j d_k): an input whose C_xx is asymmetric by rounding-sized amounts must give the
 * path of the exactly symmetric input ½(C_jk + C_kj) (formed here with the same expression), which the
 * engine reads by rows only. And reuse: workspaces left by earlier fits never change a result.
 */
class PathEngineDeterminismTest {

    @Test
    void fit_asymmetricCxx_samePathAsItsSymmetrizedInput() {
        RawProblem problem = RawProblem.random(211, 70, 12, true);
        GramInput exact = problem.gram();
        int p = exact.p();
        double[] c = exact.cxx();
        Random rnd = new Random(212);
        double[] skewed = c.clone();
        for (int i = 0; i < p; i++) {
            for (int j = i + 1; j < p; j++) {
                double scale = Math.sqrt(c[i * p + i] * c[j * p + j]);
                skewed[i * p + j] += 1e-12 * scale * rnd.nextGaussian();
                skewed[j * p + i] -= 1e-12 * scale * rnd.nextGaussian();
            }
        }
        double[] symmetrized = new double[p * p];
        for (int i = 0; i < p; i++) {
            for (int j = 0; j < p; j++) {
                symmetrized[i * p + j] = 0.5 * (skewed[i * p + j] + skewed[j * p + i]);
            }
        }
        GramInput asymmetric = GramInput.of(skewed, exact.cxy(), exact.cyy(), exact.meanX(), exact.meanY(),
                exact.totalWeight(), exact.sumSquaredWeights(), exact.count());
        GramInput symmetric = GramInput.of(symmetrized, exact.cxy(), exact.cyy(), exact.meanX(), exact.meanY(),
                exact.totalWeight(), exact.sumSquaredWeights(), exact.count());
        assertFalse(asymmetric.exactlySymmetric(), "premise: the skewed input takes the two-sided branch");
        assertTrue(symmetric.exactlySymmetric(), "premise: the symmetrized input takes the row-only branch");

        for (PathOptions opt : List.of(PathOptions.defaults(), PathOptions.builder().method(PathMethod.LAR).build(),
                PathOptions.builder().positive(true).ridge(0.3).build())) {
            assertSameBits(new PathEngine(p).fit(symmetric, opt), new PathEngine(p).fit(asymmetric, opt));
        }
    }

    /**
     * A path is a pure function of its input: an engine that has already fitted other problems (its row
     * workspaces hold their values) gives the same bits as a fresh engine, for every variant. Oracle: that
     * identity.
     */
    @Test
    void fit_reusedEngine_sameBitsAsFreshEngine() {
        int p = 15;
        PathEngine reused = new PathEngine(p);
        List<PathOptions> variants = List.of(PathOptions.defaults(), PathOptions.builder().method(PathMethod.LAR)
                .build(), PathOptions.builder().positive(true).build(), PathOptions.builder().ridge(0.5).build());
        for (long seed = 300; seed < 306; seed++) {
            GramInput in = RawProblem.random(seed, seed % 2 == 0 ? 40 : 10, p, seed % 3 == 0).gram();
            for (PathOptions opt : variants) {
                assertSameBits(new PathEngine(p).fit(in, opt), reused.fit(in, opt));
            }
        }
    }

    private static void assertSameBits(LassoPath expected, LassoPath actual) {
        assertEquals(expected.knots().size(), actual.knots().size());
        assertEquals(expected.excluded().size(), actual.excluded().size());
        for (int k = 0; k < expected.knots().size(); k++) {
            Knot x = expected.knots().get(k);
            Knot y = actual.knots().get(k);
            assertEquals(x.penalty(), y.penalty(), 0, "penalty of knot " + k);
            assertArrayEquals(x.active(), y.active(), "active set of knot " + k);
            assertArrayEquals(x.standardized(), y.standardized(), 0, "standardized coefficients of knot " + k);
            assertArrayEquals(x.raw(), y.raw(), 0, "raw coefficients of knot " + k);
            assertEquals(x.intercept(), y.intercept(), 0, "intercept of knot " + k);
            assertEquals(x.rss(), y.rss(), 0, "rss of knot " + k);
        }
    }
}

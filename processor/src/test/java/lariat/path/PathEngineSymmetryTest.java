package lariat.path;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * The engine's symmetrization rule (class comment of {@link PathEngine}): G_jk = ½(C_jk + C_kj)/(d_j d_k).
 * An input whose C_xx is asymmetric by rounding-sized amounts must give, bit for bit, the path of the
 * exactly symmetric input ½(C_jk + C_kj) (formed here with the same expression), which the engine reads by
 * rows only. The oracle is that identity between two inputs.
 */
class PathEngineSymmetryTest {

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
            LassoPath a = new PathEngine(p).fit(asymmetric, opt);
            LassoPath b = new PathEngine(p).fit(symmetric, opt);
            assertEquals(b.knots().size(), a.knots().size(), opt.toString());
            for (int k = 0; k < a.knots().size(); k++) {
                Knot x = a.knots().get(k);
                Knot y = b.knots().get(k);
                assertEquals(y.penalty(), x.penalty(), 0, "penalty of knot " + k);
                assertArrayEquals(y.active(), x.active(), "active set of knot " + k);
                assertArrayEquals(y.standardized(), x.standardized(), 0, "coefficients of knot " + k);
                assertEquals(y.rss(), x.rss(), 0, "rss of knot " + k);
            }
        }
    }
}

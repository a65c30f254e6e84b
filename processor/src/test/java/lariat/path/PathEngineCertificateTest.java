package lariat.path;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Optimality certificates on random problems (fixed seeds, n > p and p > n, with and without weights),
 * for lasso, LAR, positive lasso and the elastic net: every knot and segment midpoint satisfies the
 * conditions of {@link PathCertificates} computed from the raw rows, and the last knot equals a direct
 * (ridge) least-squares solve by EJML QR when the design has full column rank.
 */
class PathEngineCertificateTest {

    private static final int[][] SIZES = {
        {40, 3}, {60, 8}, {120, 15}, {300, 30}, {25, 12}, {12, 30}, {20, 60}, {8, 8}, {200, 5},
    };

    static Stream<Arguments> problems() {
        List<Arguments> out = new ArrayList<>();
        String[] variants = {"lasso", "lar", "positive", "ridge", "ridge-lar"};
        long seed = 20240501L;
        for (int[] size : SIZES) {
            for (boolean weighted : new boolean[] {false, true}) {
                for (String v : variants) {
                    out.add(Arguments.of(seed++, size[0], size[1], weighted, v));
                }
            }
        }
        return out.stream();
    }

    static PathOptions options(String variant) {
        PathOptions.Builder b = PathOptions.builder();
        switch (variant) {
            case "lar" -> b.method(PathMethod.LAR);
            case "positive" -> b.positive(true);
            case "ridge" -> b.ridge(0.3);
            case "ridge-lar" -> b.method(PathMethod.LAR).ridge(2.0);
            default -> { }
        }
        return b.build();
    }

    @ParameterizedTest(name = "seed {0}: n={1} p={2} weighted={3} {4}")
    @MethodSource("problems")
    void fit_randomProblem_satisfiesOptimalityAtEveryKnotAndMidpoint(long seed, int n, int p, boolean weighted,
                                                                    String variant) {
        RawProblem problem = RawProblem.random(seed, n, p, weighted);
        PathOptions opt = options(variant);
        LassoPath path = new PathEngine(p).fit(problem.gram(), opt);

        PathCertificates.assertPath(path, problem, opt);
        assertEquals(path.lambdaMax() > 0, path.knots().size() >= 2, "a path with steps iff lambda max > 0");
    }

    @ParameterizedTest(name = "seed {0}: n={1} p={2} weighted={3} {4}")
    @MethodSource("problems")
    void fit_fullRankOrRidge_lastKnotEqualsLeastSquares(long seed, int n, int p, boolean weighted, String variant) {
        RawProblem problem = RawProblem.random(seed, n, p, weighted);
        PathOptions opt = options(variant);
        LassoPath path = new PathEngine(p).fit(problem.gram(), opt);
        Knot last = path.last();

        if (opt.positive()) {
            assertTrue(n <= p || path.stopReason() == StopReason.COMPLETE, "positive path complete when n > p");
            double[] refit = problem.leastSquares(last.active(), 0);
            PathCertificates.assertCoefficients(refit, last.standardized(), "least squares on the final active set");
        } else if (n > p || opt.ridge() > 0) {
            assertEquals(StopReason.COMPLETE, path.stopReason());
            int[] all = java.util.stream.IntStream.range(0, p).toArray();
            PathCertificates.assertCoefficients(problem.leastSquares(all, opt.ridge()), last.standardized(),
                    "least squares");
            assertEquals(0, last.penalty(), 0);
        } else {
            assertEquals(StopReason.RANK, path.stopReason());
            assertEquals(n - 1, last.active().length, "active set at the rank");
            assertEquals(1, last.r2(), PathCertificates.RSS_TOLERANCE, "exact fit at the rank");
        }
    }
}

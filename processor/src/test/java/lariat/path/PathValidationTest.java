package lariat.path;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/** Caller errors are IllegalArgumentExceptions naming the argument; value types copy their arrays. */
class PathValidationTest {

    private static final double[] CXX = {2, 0.5, 0.5, 1};
    private static final double[] CXY = {1, 0.3};
    private static final double[] MEAN = {0, 0};

    private static String messageOf(Runnable r) {
        return assertThrows(IllegalArgumentException.class, r::run).getMessage();
    }

    @Test
    void of_invalidInput_namesTheArgument() {
        assertTrue(messageOf(() -> GramInput.of(new double[] {2, 0.5, 0.7, 1}, CXY, 1, MEAN, 0, 1, 1, 1))
                .contains("cxx[0,1]"));
        assertTrue(messageOf(() -> GramInput.of(new double[] {2, 0.5, 0.5}, CXY, 1, MEAN, 0, 1, 1, 1))
                .contains("cxx"));
        assertTrue(messageOf(() -> GramInput.of(CXX, new double[] {1, Double.NaN}, 1, MEAN, 0, 1, 1, 1))
                .contains("cxy[1]"));
        assertTrue(messageOf(() -> GramInput.of(new double[] {-2, 0, 0, 1}, CXY, 1, MEAN, 0, 1, 1, 1))
                .contains("cxx[0,0]"));
        assertTrue(messageOf(() -> GramInput.of(CXX, CXY, -1, MEAN, 0, 1, 1, 1)).contains("cyy"));
        assertTrue(messageOf(() -> GramInput.of(CXX, CXY, 1, new double[1], 0, 1, 1, 1)).contains("meanX"));
        assertTrue(messageOf(() -> GramInput.of(CXX, CXY, 1, MEAN, 0, 0, 1, 1)).contains("totalWeight"));
        assertTrue(messageOf(() -> GramInput.of(CXX, CXY, 1, MEAN, 0, 1, 0, 1)).contains("sumSquaredWeights"));
        assertTrue(messageOf(() -> GramInput.of(CXX, CXY, 1, MEAN, 0, 1, 1, 0)).contains("count"));
        assertTrue(messageOf(() -> GramInput.of(CXX, new double[0], 1, new double[0], 0, 1, 1, 1)).contains("cxy"));
    }

    @Test
    void of_arrays_copiedInAndOut() {
        double[] cxx = CXX.clone();
        GramInput in = GramInput.of(cxx, CXY, 1, MEAN, 0, 4, 4, 4);
        cxx[0] = 99;
        in.cxx()[1] = 99;

        assertArrayEquals(CXX, in.cxx());
        assertEquals(4, in.effectiveSampleSize(), 0);
    }

    @Test
    void builder_invalidValues_nameTheOption() {
        assertTrue(messageOf(() -> PathOptions.builder().ridge(-1)).contains("ridge"));
        assertTrue(messageOf(() -> PathOptions.builder().ridge(Double.NaN)).contains("ridge"));
        assertTrue(messageOf(() -> PathOptions.builder().maxActive(0)).contains("maxActive"));
        assertTrue(messageOf(() -> PathOptions.builder().targetR2(1.5)).contains("targetR2"));
        assertTrue(messageOf(() -> PathOptions.builder().minRelativePenalty(1)).contains("minRelativePenalty"));
        assertTrue(messageOf(() -> PathOptions.builder().maxSteps(0)).contains("maxSteps"));
        assertTrue(messageOf(() -> PathOptions.builder().method(null)).contains("method"));
    }

    @Test
    void fit_wrongWidthOrNull_rejected() {
        GramInput in = GramInput.of(CXX, CXY, 1, MEAN, 0, 1, 1, 1);

        assertTrue(messageOf(() -> new PathEngine(3).fit(in, PathOptions.defaults())).contains("input.p()"));
        assertTrue(messageOf(() -> new PathEngine(2).fit(null, PathOptions.defaults())).contains("null"));
        assertTrue(messageOf(() -> new PathEngine(0)).contains("p must be"));
    }

    @Test
    void coefficientsAt_negativeOrBelowAnEarlyStop_rejected() {
        RawProblem problem = RawProblem.random(301, 40, 6, false);
        LassoPath early = new PathEngine(6).fit(problem.gram(), PathOptions.builder().maxActive(2).build());
        double below = early.last().penalty() / 2;

        assertTrue(messageOf(() -> early.standardizedCoefficientsAt(-1)).contains("lambda"));
        assertTrue(messageOf(() -> early.rawCoefficientsAt(below)).contains("stopped early"));
    }
}

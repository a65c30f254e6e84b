package lariat.stage;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.HashMap;
import java.util.Map;
import java.util.Random;
import lariat.config.StageConfig;
import lariat.moments.Moments;
import lariat.schema.ActiveFeature;
import lariat.schema.ModelVersion;
import lariat.select.SelectedModel;
import org.junit.jupiter.api.Test;

/**
 * {@code path.ridge.rescale} from the configuration to the model record: the stage's refit publishes the
 * elastic-net estimate, (1 + λ₂) times the naive one (Zou &amp; Hastie, J. R. Statist. Soc. B 67(2), 2005,
 * section 3.2, from memory), says so in {@code coefficientScale}, and its RSS is the direct sum on the rows.
 */
class RidgeRescaleRecordTest {

    /** Relative tolerance of squared errors from moments against direct sums on the rows. */
    static final double SUM_TOL = 1e-9;
    static final int P = 4;
    static final int N = 300;

    private final double[][] rows = new double[N][P + 1];

    RidgeRescaleRecordTest() {
        Random rnd = new Random(11);
        for (double[] r : rows) {
            for (int j = 0; j < P; j++) {
                r[j] = 50 + 3 * j + rnd.nextGaussian();
            }
            r[P] = 4 + 2 * r[0] - 1.5 * r[1] + 0.4 * r[2] + 0.5 * rnd.nextGaussian();
        }
    }

    private Moments moments() {
        Moments m = new Moments(P + 1);
        for (int i = 0; i < N; i++) {
            m.add(rows[i], 1.0, i);
        }
        return m;
    }

    private static RefitRecipe recipe(String ridge, String rescale) {
        Map<String, String> props = new HashMap<>();
        props.put("input.topic", "in");
        props.put("field.target", "y");
        props.put("field.features", "a,b,c,d");
        props.put("path.ridge", ridge);
        props.put("path.ridge.rescale", rescale);
        props.put("select.rule", "relative-penalty");
        props.put("select.relative.penalty", "0.05");
        return RefitRecipe.of(StageConfig.of(props));
    }

    private static ModelVersion record(KeyFit fit) {
        String[] channels = {"a", "b", "c", "d", "y"};
        ModelRecords.KeyFacts f = new ModelRecords.KeyFacts("k", 1, channels, N, 0, N, ActiveSet.empty());
        return new ModelRecords("in", "hash", "test").model(f, fit, 0L);
    }

    @Test
    void refit_rescaleOnWithRidge_publishesOnePlusRidgeTimesTheNaiveModel() {
        RefitRecipe on = recipe("0.5", "true");
        assertTrue(on.ridgeRescale());
        KeyFit naive = KeyFit.of(moments(), null, recipe("0.5", "false"));
        KeyFit scaled = KeyFit.of(moments(), null, on);
        SelectedModel s0 = naive.selected();
        SelectedModel s1 = scaled.selected();
        assertTrue(s0.active().length >= 2);
        assertArrayEquals(s0.active(), s1.active());
        double[] r0 = s0.rawCoefficients();
        double[] r1 = s1.rawCoefficients();
        for (int j : s0.active()) {
            assertEquals(1.5, r1[j] / r0[j], 1e-14, "column " + j);
        }
        ModelVersion mv = record(scaled);
        assertEquals(1.5, mv.getCoefficientScale(), 0.0);
        assertEquals(1.0, record(naive).getCoefficientScale(), 0.0);
        assertEquals(s1.intercept(), mv.getIntercept(), 0.0);
        assertEquals(s1.rss(), mv.getRss(), 0.0);
        assertEquals(s0.refit().coefficients()[0], s1.refit().coefficients()[0], 0.0);
        double rss = 0;
        for (double[] r : rows) {
            double e = r[P] - mv.getIntercept();
            for (ActiveFeature af : mv.getFeatures()) {
                e -= r[mv.getChannels().indexOf(af.getName())] * af.getCoefficient();
            }
            rss += e * e;
        }
        assertEquals(rss, mv.getRss(), SUM_TOL * rss);
        assertFalse(Math.abs(rss - record(naive).getRss()) <= SUM_TOL * rss, "the naive model has another RSS");
    }

    @Test
    void refit_rescaleOffOrNoRidge_changesNothing() {
        ModelVersion plain = record(KeyFit.of(moments(), null, recipe("0", "false")));
        ModelVersion onNoRidge = record(KeyFit.of(moments(), null, recipe("0", "true")));
        assertEquals(plain, onNoRidge);
        assertEquals(1.0, onNoRidge.getCoefficientScale(), 0.0);
        KeyFit ridgeOff = KeyFit.of(moments(), null, recipe("0.5", "false"));
        assertEquals(1.0, ridgeOff.selected().coefficientScale(), 0.0);
        assertFalse(recipe("0.5", "false").ridgeRescale());
    }
}

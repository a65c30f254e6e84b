package lariat.scenario;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;
import org.ejml.data.DMatrixRMaj;
import org.ejml.dense.row.CommonOps_DDRM;
import org.ejml.dense.row.factory.LinearSolverFactory_DDRM;
import org.ejml.interfaces.linsol.LinearSolverDense;
import org.junit.jupiter.api.Test;

/**
 * The ground truth against the generated rows, with ordinary least squares computed here by
 * EJML's QR solver (org.ejml:ejml-all, the version pinned in the parent POM) as the reference.
 */
class GroundTruthTest {

    /** Fitted coefficients must lie within this many standard errors of the truth. */
    private static final double SE_MULTIPLE = 5;
    /** The residual standard deviation must be within this relative distance of the noise. */
    private static final double SIGMA_REL_TOL = 0.1;
    /** A true driver's coefficient must be at least this many standard errors from zero. */
    private static final double MIN_DRIVER_T = 20;
    /**
     * Largest variance inflation factor allowed among the channels; 5 is a common-practice
     * threshold for collinearity worth worrying about.
     */
    private static final double MAX_VIF = 5;

    private static final ScenarioSpec SPEC = ScenarioSpec.defaults().withRecordsPerStation(4000);
    private static final Scenario SCENARIO = Scenario.of(SPEC);

    @Test
    void leastSquares_everyRegimeOfEveryStation_recoversTrueCoefficientsWithinNoise() {
        for (StationTruth st : SCENARIO.truth().stations()) {
            List<StationRow> rows = rowsOf(st.station());
            for (Regime r : st.regimes()) {
                List<StationRow> part = rows.subList((int) r.fromStep(), (int) r.toStep());
                Fit fit = Fit.of(part, SCENARIO.channels().size());
                String where = st.station() + " " + r;
                assertEquals(SPEC.noiseSd(), fit.sigma, SIGMA_REL_TOL * SPEC.noiseSd(), where);
                for (int j = 0; j < SCENARIO.channels().size(); j++) {
                    String ch = SCENARIO.channels().get(j);
                    double truth = r.model().coefficient(ch);
                    assertEquals(truth, fit.beta[j], SE_MULTIPLE * fit.se[j], where + " " + ch);
                    if (truth != 0) {
                        assertTrue(Math.abs(truth) / fit.se[j] > MIN_DRIVER_T, where + " " + ch);
                    }
                }
                assertEquals(r.model().intercept(), fit.intercept, SE_MULTIPLE * fit.interceptSe, where);
            }
        }
    }

    @Test
    void channels_oneStation_varianceInflationBelowFive() {
        List<StationRow> rows = rowsOf(SCENARIO.stations().get(0));
        int p = SCENARIO.channels().size();
        DMatrixRMaj x = centered(rows, p);
        DMatrixRMaj c = new DMatrixRMaj(p, p);
        CommonOps_DDRM.multTransA(x, x, c);
        DMatrixRMaj r = new DMatrixRMaj(p, p);
        for (int i = 0; i < p; i++) {
            for (int j = 0; j < p; j++) {
                r.set(i, j, c.get(i, j) / Math.sqrt(c.get(i, i) * c.get(j, j)));
            }
        }
        assertTrue(CommonOps_DDRM.invert(r));
        for (int j = 0; j < p; j++) {
            assertTrue(r.get(j, j) < MAX_VIF, SCENARIO.channels().get(j) + " VIF " + r.get(j, j));
        }
    }

    @Test
    void truth_defaultPlan_changesWhereAndWhenPlanned() {
        GroundTruth t = SCENARIO.truth();
        assertEquals(List.of("delta-09", "harbor-05"), t.unchangedStations());
        assertEquals(5, t.changes().size());
        InjectedChange enters = t.station("north-03").changes().get(0);
        assertEquals(ChangeKind.ENTERS, enters.kind());
        assertEquals(1400, enters.step());
        assertEquals(SCENARIO.timeOfStep(1400), enters.timeMs());
        assertEquals(0.0, enters.before());
        assertTrue(enters.after() > 0);
        InjectedChange flip = t.station("basin-07").changes().get(0);
        assertEquals(-flip.before(), flip.after());
        StationTruth cedar = t.station("cedar-14");
        assertEquals(3, cedar.regimes().size());
        assertTrue(cedar.activeAt(SCENARIO.timeOfStep(2000)).contains("vib_2x_mm_s"));
        assertEquals(cedar.activeAt(SCENARIO.timeOfStep(0)), cedar.activeAt(SCENARIO.timeOfStep(3500)));
        for (StationTruth st : t.stations()) {
            int drivers = st.regimes().get(0).model().active().size();
            assertTrue(drivers >= 3 && drivers <= 5, st.station() + " has " + drivers);
            for (InjectedChange ch : st.changes()) {
                assertEquals(ch.before(), st.modelAtStep(ch.step() - 1).coefficient(ch.channel()));
                assertEquals(ch.after(), st.modelAtStep(ch.step()).coefficient(ch.channel()));
            }
        }
    }

    @Test
    void of_leavingChannelNotDriving_throwsNamingChannel() {
        ScenarioSpec bad = SPEC.withChanges(List.of(ChangeSpec.leaves(0, 0.5, "humidity_pct")));
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class, () -> Scenario.of(bad));
        assertTrue(e.getMessage().contains("humidity_pct"), e.getMessage());
    }

    @Test
    void of_enteringChannelAlreadyDriving_throws() {
        ScenarioSpec bad = SPEC.withChanges(List.of(ChangeSpec.enters(0, 0.5, "flow_m3h", 3)));
        assertThrows(IllegalArgumentException.class, () -> Scenario.of(bad));
    }

    @Test
    void of_changeAtMissingStationOrFirstReading_throws() {
        assertThrows(IllegalArgumentException.class,
                () -> Scenario.of(SPEC.withChanges(List.of(ChangeSpec.signFlip(6, 0.5, "flow_m3h")))));
        assertThrows(IllegalArgumentException.class, () -> Scenario.of(SPEC.withRecordsPerStation(3)
                .withChanges(List.of(ChangeSpec.signFlip(0, 0.1, "flow_m3h")))));
        assertThrows(IllegalArgumentException.class, () -> ChangeSpec.enters(0, 1.0, "flow_m3h", 3));
        assertThrows(IllegalArgumentException.class, () -> ChangeSpec.leaves(0, 0.5, "no_such_channel"));
    }

    @Test
    void defaults_fewerStations_planTrimmed() {
        Scenario two = Scenario.of(SPEC.withStations(2));
        assertEquals(2, two.truth().changes().size());
        assertEquals(List.of(), two.truth().unchangedStations());
    }

    private static List<StationRow> rowsOf(String station) {
        List<StationRow> out = new ArrayList<>();
        Iterator<StationRow> it = SCENARIO.rows();
        while (it.hasNext()) {
            StationRow r = it.next();
            if (r.station().equals(station)) {
                out.add(r);
            }
        }
        return out;
    }

    private static DMatrixRMaj centered(List<StationRow> rows, int p) {
        DMatrixRMaj x = new DMatrixRMaj(rows.size(), p);
        for (int i = 0; i < rows.size(); i++) {
            for (int j = 0; j < p; j++) {
                x.set(i, j, rows.get(i).value(j));
            }
        }
        for (int j = 0; j < p; j++) {
            double mean = 0;
            for (int i = 0; i < rows.size(); i++) {
                mean += x.get(i, j);
            }
            mean /= rows.size();
            for (int i = 0; i < rows.size(); i++) {
                x.set(i, j, x.get(i, j) - mean);
            }
        }
        return x;
    }

    /** Ordinary least squares of the target on all channels with an intercept, and standard errors. */
    private static final class Fit {
        final double[] beta;
        final double[] se;
        final double intercept;
        final double interceptSe;
        final double sigma;

        private Fit(double[] beta, double[] se, double intercept, double interceptSe, double sigma) {
            this.beta = beta;
            this.se = se;
            this.intercept = intercept;
            this.interceptSe = interceptSe;
            this.sigma = sigma;
        }

        static Fit of(List<StationRow> rows, int p) {
            int n = rows.size();
            DMatrixRMaj x = new DMatrixRMaj(n, p + 1);
            DMatrixRMaj y = new DMatrixRMaj(n, 1);
            for (int i = 0; i < n; i++) {
                x.set(i, 0, 1);
                for (int j = 0; j < p; j++) {
                    x.set(i, j + 1, rows.get(i).value(j));
                }
                y.set(i, 0, rows.get(i).value(p));
            }
            LinearSolverDense<DMatrixRMaj> qr = LinearSolverFactory_DDRM.leastSquaresQrPivot(true, false);
            assertTrue(qr.setA(x.copy()));
            DMatrixRMaj b = new DMatrixRMaj(p + 1, 1);
            qr.solve(y.copy(), b);
            DMatrixRMaj resid = new DMatrixRMaj(n, 1);
            CommonOps_DDRM.mult(x, b, resid);
            double rss = 0;
            for (int i = 0; i < n; i++) {
                double e = y.get(i, 0) - resid.get(i, 0);
                rss += e * e;
            }
            double s2 = rss / (n - p - 1);
            DMatrixRMaj xtx = new DMatrixRMaj(p + 1, p + 1);
            CommonOps_DDRM.multTransA(x, x, xtx);
            assertTrue(CommonOps_DDRM.invert(xtx));
            double[] beta = new double[p];
            double[] se = new double[p];
            for (int j = 0; j < p; j++) {
                beta[j] = b.get(j + 1, 0);
                se[j] = Math.sqrt(s2 * xtx.get(j + 1, j + 1));
            }
            return new Fit(beta, se, b.get(0, 0), Math.sqrt(s2 * xtx.get(0, 0)), Math.sqrt(s2));
        }
    }
}

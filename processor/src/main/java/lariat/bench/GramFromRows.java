package lariat.bench;

import lariat.moments.Moments;
import lariat.path.GramInput;

/**
 * Builds the path engine's input from synthetic rows the way the stage does: one {@link Moments} block
 * update over all rows (unit weights), then the co-moment matrix split into C_xx, C_xy and C_yy.
 */
final class GramFromRows {

    private GramFromRows() {
    }

    static GramInput of(SyntheticRows data) {
        int p = data.features();
        int n = data.rows();
        int d = p + 1;
        double[] weights = new double[n];
        long[] times = new long[n];
        java.util.Arrays.fill(weights, 1.0);
        Moments m = new Moments(d);
        m.addBlock(data.data(), weights, times, n);
        double[] c = m.comomentMatrix();
        double[] cxx = new double[p * p];
        double[] cxy = new double[p];
        double[] meanX = new double[p];
        for (int i = 0; i < p; i++) {
            System.arraycopy(c, i * d, cxx, i * p, p);
            cxy[i] = c[i * d + p];
            meanX[i] = m.mean(i);
        }
        return GramInput.of(cxx, cxy, c[p * d + p], meanX, m.mean(p), m.totalWeight(), m.sumSquaredWeights(),
                m.count());
    }
}

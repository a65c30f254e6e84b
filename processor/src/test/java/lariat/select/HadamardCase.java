package lariat.select;

import lariat.moments.Moments;
import lariat.path.LassoPath;
import lariat.path.PathEngine;
import lariat.path.PathOptions;

/**
 * A hand-checkable path. Eight rows; features x1, x2, x3 are columns 1, 2, 3 of the Sylvester Hadamard
 * matrix of order 8 (centered, mutually orthogonal, squared norm 8) and y = 10 + 3x1 − 2x2 + 0.5x3 + 2x4
 * with x4 = column 4 (orthogonal to the features: the residual of the least-squares fit).
 * Standardized columns are x/√8, so c = √8 (3, −2, 0.5) and, the design being orthogonal, the lasso is
 * soft thresholding: at relative penalty r (λ = 3√8 r) the raw coefficients are
 * β1 = 3 − 3r, β2 = −(2 − 3r)₊, β3 = (0.5 − 3r)₊, intercept 10. Knots: r = 1, 2/3, 1/6, 0.
 * C_yy = 8 (9 + 4 + 0.25 + 4) = 138. RSS at the knots: 138, 8·12.25 = 98, 8·4.75 = 38, 8·4 = 32.
 */
final class HadamardCase {

    static final int N = 8;

    private HadamardCase() {
    }

    static double h(int row, int col) {
        return Integer.bitCount(row & col) % 2 == 0 ? 1 : -1;
    }

    static Moments moments() {
        Moments m = new Moments(4);
        for (int i = 0; i < N; i++) {
            double y = 10 + 3 * h(i, 1) - 2 * h(i, 2) + 0.5 * h(i, 3) + 2 * h(i, 4);
            m.add(new double[] {h(i, 1), h(i, 2), h(i, 3), y}, 1.0, i);
        }
        return m;
    }

    static RegressionMoments regression() {
        return RegressionMoments.of(moments(), new int[] {0, 1, 2}, 3);
    }

    static LassoPath path() {
        return new PathEngine(3).fit(regression().gramInput(), PathOptions.defaults());
    }
}

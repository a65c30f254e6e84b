package lariat.path;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import org.junit.jupiter.api.Test;

/**
 * The Cholesky factor kept by joins and Givens downdates solves the same systems as a direct solve of the
 * restricted Gram matrix (Gaussian elimination written here), after any sequence of changes.
 */
class ActiveCholeskyTest {

    private static final double TOLERANCE = 1e-10;

    private static double[] randomCorrelationLike(Random rnd, int p) {
        int n = 3 * p;
        double[][] z = new double[n][p];
        for (double[] row : z) {
            for (int j = 0; j < p; j++) {
                row[j] = rnd.nextGaussian();
            }
        }
        double[] g = new double[p * p];
        for (int i = 0; i < p; i++) {
            for (int j = 0; j < p; j++) {
                for (double[] row : z) {
                    g[i * p + j] += row[i] * row[j] / n;
                }
            }
        }
        return g;
    }

    /** Solves G_AA x = b by Gaussian elimination with partial pivoting. */
    private static double[] directSolve(double[] g, int p, int[] active, int m, double[] b) {
        double[][] a = new double[m][m + 1];
        for (int i = 0; i < m; i++) {
            for (int j = 0; j < m; j++) {
                a[i][j] = g[active[i] * p + active[j]];
            }
            a[i][m] = b[i];
        }
        for (int c = 0; c < m; c++) {
            int piv = c;
            for (int r = c + 1; r < m; r++) {
                piv = Math.abs(a[r][c]) > Math.abs(a[piv][c]) ? r : piv;
            }
            double[] t = a[c];
            a[c] = a[piv];
            a[piv] = t;
            for (int r = c + 1; r < m; r++) {
                double f = a[r][c] / a[c][c];
                for (int k = c; k <= m; k++) {
                    a[r][k] -= f * a[c][k];
                }
            }
        }
        double[] x = new double[m];
        for (int i = m - 1; i >= 0; i--) {
            double v = a[i][m];
            for (int k = i + 1; k < m; k++) {
                v -= a[i][k] * x[k];
            }
            x[i] = v / a[i][i];
        }
        return x;
    }

    @Test
    void remove_anyPositionAfterJoins_solvesLikeTheRestrictedMatrix() {
        Random rnd = new Random(7);
        int p = 9;
        for (int trial = 0; trial < 30; trial++) {
            double[] g = randomCorrelationLike(rnd, p);
            ActiveCholesky chol = new ActiveCholesky(p);
            int[] active = new int[p];
            int m = 0;
            for (int step = 0; step < 25; step++) {
                boolean join = m == 0 || (m < p && rnd.nextDouble() < 0.6);
                if (join) {
                    int col = pickInactive(rnd, active, m, p);
                    assertTrue(probe(chol, g, p, active, col) > 0);
                    chol.commit(col);
                    active[m++] = col;
                } else {
                    int pos = rnd.nextInt(m);
                    chol.remove(pos);
                    System.arraycopy(active, pos + 1, active, pos, m - pos - 1);
                    m--;
                }
                assertSolves(chol, g, p, active, m, rnd);
            }
        }
    }

    @Test
    void probe_columnInSpanOfActive_hasZeroPivot() {
        double[] g = {1, 0, 0.6, 0, 1, 0.8, 0.6, 0.8, 1};
        ActiveCholesky chol = new ActiveCholesky(3);
        int[] active = {0, 1, 0};
        probe(chol, g, 3, active, 0);
        chol.commit(0);
        probe(chol, g, 3, active, 1);
        chol.commit(1);

        assertEquals(0, probe(chol, g, 3, active, 2), 1e-15, "x3 = 0.6 x1 + 0.8 x2 has no residual variance");
    }

    /** Probes column {@code col} with G_{A,col} gathered from the p × p row-major {@code g}. */
    private static double probe(ActiveCholesky chol, double[] g, int p, int[] active, int col) {
        double[] b = new double[p];
        for (int i = 0; i < chol.size(); i++) {
            b[i] = g[active[i] * p + col];
        }
        return chol.probe(b, g[col * p + col], col);
    }

    private static int pickInactive(Random rnd, int[] active, int m, int p) {
        while (true) {
            int col = rnd.nextInt(p);
            boolean used = false;
            for (int k = 0; k < m; k++) {
                used |= active[k] == col;
            }
            if (!used) {
                return col;
            }
        }
    }

    private static void assertSolves(ActiveCholesky chol, double[] g, int p, int[] active, int m, Random rnd) {
        assertEquals(m, chol.size());
        double[] b = new double[p];
        for (int i = 0; i < m; i++) {
            b[i] = rnd.nextGaussian();
        }
        double[] expected = directSolve(g, p, active, m, b);
        double[] x = new double[p];
        chol.solve(b, x);
        for (int i = 0; i < m; i++) {
            assertEquals(expected[i], x[i], TOLERANCE * Math.max(1, Math.abs(expected[i])), "solution " + i);
        }
    }
}

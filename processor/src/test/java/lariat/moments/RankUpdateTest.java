package lariat.moments;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;

import org.junit.jupiter.api.Test;

/**
 * Contract of {@link RankUpdate#addUpper}: each upper entry equals the naive fused multiply-add sum over
 * the rows in order, bit for bit (oracle: the definition, evaluated entry by entry); it equals the
 * column-tiled loop nest it replaced ({@link ColumnTiledRankUpdate}) bit for bit on panels of many shapes,
 * across column tiles and with ragged edges; any split of the rows of C gives the same bits as the whole;
 * entries left of {@link RankUpdate#firstColumn} are untouched.
 */
class RankUpdateTest {

    private static final long SEED = 20261201L;
    private static final int[] WIDTHS = {1, 2, 3, 4, 5, 6, 7, 8, 9, 63, 64, 65, 66, 101, 127, 257, 511, 512, 513, 600};
    private static final int[] ROW_COUNTS = {1, 2, 3, 4, 5, 7, 8, 9, 17, 33};

    @Test
    void addUpper_manyWidthsAndRowCounts_equalsNaiveFusedSumBitForBit() {
        Random rnd = new Random(SEED);
        for (int d = 1; d <= 140; d += (d < 12 ? 1 : 7)) {
            for (int k : new int[] {1, 3, 4, 7, 17}) {
                double[][] panel = panel(rnd, k, d);
                double[][] c = matrix(rnd, d);
                double[][] expected = copy(c);
                for (int i = 0; i < d; i++) {
                    for (int j = i; j < d; j++) {
                        double s = expected[i][j];
                        for (int r = 0; r < k; r++) {
                            s = Math.fma(panel[r][i], panel[r][j], s);
                        }
                        expected[i][j] = s;
                    }
                }
                RankUpdate.addUpper(panel, k, d, c);
                assertUpperBits(expected, c, d, "d=" + d + " k=" + k);
                assertLeftUntouched(expected, c, d, "d=" + d + " k=" + k);
            }
        }
    }

    @Test
    void addUpper_manyShapes_equalsColumnTiledKernelBitForBit() {
        Random rnd = new Random(SEED + 1);
        for (int d : WIDTHS) {
            for (int k : ROW_COUNTS) {
                double[][] panel = panel(rnd, k, d);
                double[][] c = matrix(rnd, d);
                double[] columns = new double[k * d];
                double[] flat = new double[d * d];
                for (int r = 0; r < k; r++) {
                    for (int j = 0; j < d; j++) {
                        columns[j * k + r] = panel[r][j];
                    }
                }
                for (int i = 0; i < d; i++) {
                    System.arraycopy(c[i], 0, flat, i * d, d);
                }
                ColumnTiledRankUpdate.addUpper(columns, k, d, flat);
                RankUpdate.addUpper(panel, k, d, c);
                for (int i = 0; i < d; i++) {
                    for (int j = i; j < d; j++) {
                        assertEquals(Double.doubleToRawLongBits(flat[i * d + j]), Double.doubleToRawLongBits(c[i][j]),
                                "d=" + d + " k=" + k + " entry (" + i + "," + j + ")");
                    }
                }
            }
        }
    }

    @Test
    void addUpper_rowRangesInAnySplit_equalWholeUpdateBitForBit() {
        Random rnd = new Random(SEED + 2);
        for (int d : new int[] {2, 9, 65, 257, 600}) {
            int k = 13;
            double[][] panel = panel(rnd, k, d);
            double[][] start = matrix(rnd, d);
            double[][] whole = copy(start);
            RankUpdate.addUpper(panel, k, d, whole);
            for (int trial = 0; trial < 5; trial++) {
                double[][] split = copy(start);
                int from = 0;
                while (from < d) {
                    int to = Math.min(d, from + 2 * (1 + rnd.nextInt(Math.max(1, d / 4))));
                    RankUpdate.addUpper(panel, k, d, split, from, to);
                    from = to;
                }
                assertUpperBits(whole, split, d, "d=" + d + " trial " + trial);
            }
        }
    }

    @Test
    void splitRows_anyWidthAndParts_evenBoundsCoveringAllRowsWithBalancedWork() {
        for (int d : new int[] {1, 2, 3, 65, 101, 1001}) {
            for (int parts : new int[] {1, 2, 3, 8, 12}) {
                int[] bounds = new int[parts + 1];
                RankUpdate.splitRows(d, parts, bounds);
                assertEquals(0, bounds[0]);
                assertEquals(d, bounds[parts]);
                long total = work(d, 0, d);
                for (int p = 0; p < parts; p++) {
                    assertTrue(bounds[p] <= bounds[p + 1], "d=" + d + " parts=" + parts);
                    assertTrue(bounds[p] % 2 == 0 || bounds[p] == d,
                            "d=" + d + " parts=" + parts + " bound " + bounds[p]);
                    // A part exceeds its share by at most one pair of rows (2 d entries).
                    assertTrue(work(d, bounds[p], bounds[p + 1]) <= total / parts + 2L * d,
                            "d=" + d + " parts=" + parts + " part " + p);
                }
            }
        }
    }

    private static long work(int d, int from, int to) {
        long w = 0;
        for (int i = from; i < to; i++) {
            w += d - RankUpdate.firstColumn(i);
        }
        return w;
    }

    private static double[][] panel(Random rnd, int k, int d) {
        double[][] panel = new double[k][d];
        for (double[] row : panel) {
            for (int j = 0; j < d; j++) {
                row[j] = rnd.nextGaussian() * Math.exp(rnd.nextGaussian());
            }
        }
        return panel;
    }

    private static double[][] matrix(Random rnd, int d) {
        double[][] c = new double[d][d];
        for (double[] row : c) {
            for (int j = 0; j < d; j++) {
                row[j] = rnd.nextGaussian();
            }
        }
        return c;
    }

    private static double[][] copy(double[][] m) {
        double[][] c = new double[m.length][];
        for (int i = 0; i < m.length; i++) {
            c[i] = m[i].clone();
        }
        return c;
    }

    private static void assertUpperBits(double[][] expected, double[][] actual, int d, String what) {
        for (int i = 0; i < d; i++) {
            for (int j = i; j < d; j++) {
                assertEquals(Double.doubleToRawLongBits(expected[i][j]), Double.doubleToRawLongBits(actual[i][j]),
                        what + " entry (" + i + "," + j + ")");
            }
        }
    }

    private static void assertLeftUntouched(double[][] before, double[][] after, int d, String what) {
        for (int i = 0; i < d; i++) {
            for (int j = 0; j < RankUpdate.firstColumn(i); j++) {
                assertEquals(Double.doubleToRawLongBits(before[i][j]), Double.doubleToRawLongBits(after[i][j]),
                        what + " entry (" + i + "," + j + ")");
            }
        }
    }
}

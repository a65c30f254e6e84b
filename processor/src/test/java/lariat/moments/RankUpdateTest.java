package lariat.moments;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Random;

import org.junit.jupiter.api.Test;

/**
 * Contract of {@link RankUpdate#addUpper}: each upper entry equals the naive fused multiply-add sum over
 * the rows in order, bit for bit, for widths across several column panels and tiles with ragged edges;
 * entries below the diagonal are untouched.
 */
class RankUpdateTest {

    private static final long SEED = 20261201L;

    @Test
    void addUpper_manyWidthsAndRowCounts_equalsNaiveFusedSumBitForBit() {
        Random rnd = new Random(SEED);
        int[] rowCounts = {1, 3, 4, 7, 17};
        for (int d = 1; d <= 140; d += (d < 12 ? 1 : 7)) {
            for (int k : rowCounts) {
                double[] panel = new double[d * k];
                for (int i = 0; i < panel.length; i++) {
                    panel[i] = rnd.nextGaussian() * Math.exp(rnd.nextGaussian());
                }
                double[] c = new double[d * d];
                for (int i = 0; i < c.length; i++) {
                    c[i] = rnd.nextGaussian();
                }
                double[] expected = c.clone();
                for (int i = 0; i < d; i++) {
                    for (int j = i; j < d; j++) {
                        double s = expected[i * d + j];
                        for (int r = 0; r < k; r++) {
                            s = Math.fma(panel[i * k + r], panel[j * k + r], s);
                        }
                        expected[i * d + j] = s;
                    }
                }
                RankUpdate.addUpper(panel, k, d, c);
                for (int i = 0; i < d * d; i++) {
                    assertEquals(Double.doubleToLongBits(expected[i]), Double.doubleToLongBits(c[i]),
                            "d=" + d + " k=" + k + " entry (" + i / d + "," + i % d + ")");
                }
            }
        }
    }
}

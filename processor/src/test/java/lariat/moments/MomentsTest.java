package lariat.moments;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;
import org.junit.jupiter.api.Test;

class MomentsTest {

    /** Tolerance for the hand-checked case, whose exact values are small binary fractions. */
    private static final double HAND_TOLERANCE = 1e-14;

    /*
     * Hand-checked case, d = 2, weights (1, 2, 1):
     *   z1 = (1, 2), z2 = (3, 4), z3 = (5, 0)
     *   W = 4, Σw² = 1 + 4 + 1 = 6, effective size 16/6 = 8/3
     *   μ0 = (1 + 6 + 5)/4 = 3, μ1 = (2 + 8 + 0)/4 = 2.5
     *   deviations: (−2, −0.5), (0, 1.5), (2, −2.5)
     *   C00 = 1·4 + 2·0 + 1·4 = 8
     *   C11 = 1·0.25 + 2·2.25 + 1·6.25 = 11
     *   C01 = 1·(−2)(−0.5) + 2·0·1.5 + 1·2·(−2.5) = 1 − 5 = −4
     */
    private static final double[][] HAND_ROWS = {{1, 2}, {3, 4}, {5, 0}};
    private static final double[] HAND_WEIGHTS = {1, 2, 1};
    private static final long[] HAND_TIMES = {100, 300, 200};

    @Test
    void add_handCheckedRows_matchHandComputation() {
        Moments m = new Moments(2);
        for (int r = 0; r < 3; r++) {
            m.add(HAND_ROWS[r], HAND_WEIGHTS[r], HAND_TIMES[r]);
        }
        assertHandValues(m);
    }

    @Test
    void addBlock_handCheckedRows_matchHandComputation() {
        Moments m = new Moments(2);
        m.addBlock(new double[] {1, 2, 3, 4, 5, 0}, HAND_WEIGHTS, HAND_TIMES, 3);
        assertHandValues(m);
    }

    private static void assertHandValues(Moments m) {
        assertEquals(3, m.count());
        assertEquals(4.0, m.totalWeight(), HAND_TOLERANCE);
        assertEquals(6.0, m.sumSquaredWeights(), HAND_TOLERANCE);
        assertEquals(8.0 / 3.0, m.effectiveSize(), HAND_TOLERANCE);
        assertEquals(3.0, m.mean(0), HAND_TOLERANCE);
        assertEquals(2.5, m.mean(1), HAND_TOLERANCE);
        assertEquals(8.0, m.comoment(0, 0), HAND_TOLERANCE);
        assertEquals(11.0, m.comoment(1, 1), HAND_TOLERANCE);
        assertEquals(-4.0, m.comoment(0, 1), HAND_TOLERANCE);
        assertEquals(-4.0, m.comoment(1, 0), HAND_TOLERANCE);
        assertEquals(100L, m.minEventTimeMs());
        assertEquals(300L, m.maxEventTimeMs());
    }

    @Test
    void newMoments_empty_reportsZeroWeightAndEmptyTimeRange() {
        Moments m = new Moments(3);
        assertEquals(0, m.count());
        assertEquals(0.0, m.effectiveSize());
        assertEquals(Long.MAX_VALUE, m.minEventTimeMs());
        assertEquals(Long.MIN_VALUE, m.maxEventTimeMs());
        assertArrayEquals(new double[9], m.comomentMatrix());
    }

    @Test
    void constructor_nonPositiveWidth_rejected() {
        assertThrows(IllegalArgumentException.class, () -> new Moments(0));
        assertThrows(IllegalArgumentException.class, () -> new Moments(-2));
    }

    @Test
    void addAndAddBlock_randomSizesAndWeights_equalTwoPassOnRawRows() {
        Random rnd = new Random(20240501L);
        for (int trial = 0; trial < 60; trial++) {
            int d = 1 + rnd.nextInt(12);
            int n = 1 + rnd.nextInt(300);
            RandomRows data = RandomRows.of(rnd, n, d);
            TwoPass reference = data.twoPass();

            Moments oneByOne = new Moments(d);
            for (int r = 0; r < n; r++) {
                oneByOne.add(data.rows[r], data.weights[r], data.times[r]);
            }
            reference.assertMatches(oneByOne);

            Moments blocks = new Moments(d);
            for (int from = 0; from < n; ) {
                int to = Math.min(n, from + 1 + rnd.nextInt(70));
                blocks.addBlock(data.flat(from, to), data.weights(from, to), data.times(from, to), to - from);
                from = to;
            }
            reference.assertMatches(blocks);
            assertEquals(n, blocks.count());
            assertEquals(oneByOne.minEventTimeMs(), blocks.minEventTimeMs());
            assertEquals(oneByOne.maxEventTimeMs(), blocks.maxEventTimeMs());
        }
    }

    @Test
    void merge_threeParts_isAssociativeAndEqualsPooledTwoPass() {
        Random rnd = new Random(7L);
        for (int trial = 0; trial < 30; trial++) {
            int d = 1 + rnd.nextInt(8);
            int n = 3 + rnd.nextInt(200);
            RandomRows data = RandomRows.of(rnd, n, d);
            int cut1 = 1 + rnd.nextInt(n - 2);
            int cut2 = cut1 + 1 + rnd.nextInt(n - cut1 - 1);
            Moments a = part(data, 0, cut1);
            Moments b = part(data, cut1, cut2);
            Moments c = part(data, cut2, n);

            Moments left = a.copy();
            left.merge(b);
            left.merge(c);
            Moments bc = b.copy();
            bc.merge(c);
            Moments right = a.copy();
            right.merge(bc);

            TwoPass reference = data.twoPass();
            reference.assertMatches(left);
            reference.assertMatches(right);
            assertEquals(n, left.count());
            assertEquals(n, right.count());
        }
    }

    @Test
    void merge_withEmpty_isBitExactIdentity() {
        RandomRows data = RandomRows.of(new Random(11L), 50, 4);
        Moments a = part(data, 0, 50);
        Moments intoEmpty = new Moments(4);
        intoEmpty.merge(a);
        assertArrayEquals(a.toBytes(), intoEmpty.toBytes());
        Moments withEmpty = a.copy();
        withEmpty.merge(new Moments(4));
        assertArrayEquals(a.toBytes(), withEmpty.toBytes());
    }

    @Test
    void copy_thenMutateEither_othersBytesUnchanged() {
        RandomRows data = RandomRows.of(new Random(12L), 40, 3);
        Moments original = part(data, 0, 20);
        Moments copy = original.copy();
        assertEquals(original, copy);
        byte[] before = copy.toBytes();
        for (int r = 20; r < 40; r++) {
            original.add(data.rows[r], data.weights[r], data.times[r]);
        }
        assertArrayEquals(before, copy.toBytes());
        byte[] originalBytes = original.toBytes();
        copy.addBlock(data.flat(20, 40), data.weights(20, 40), data.times(20, 40), 20);
        copy.scale(0.5);
        assertArrayEquals(originalBytes, original.toBytes());
        assertNotEquals(original, copy);
    }

    @Test
    void scale_factor_equalsTwoPassWithScaledWeights() {
        RandomRows data = RandomRows.of(new Random(13L), 120, 5);
        Moments m = part(data, 0, 120);
        m.scale(0.3);
        double[] scaled = data.weights.clone();
        for (int r = 0; r < scaled.length; r++) {
            scaled[r] *= 0.3;
        }
        TwoPass.of(data.rows, scaled, scaled.length).assertMatches(m);
        assertEquals(120, m.count());
    }

    @Test
    void scale_underflowingFactor_leavesCountAndEmptyWeightWithoutNaN() {
        RandomRows data = RandomRows.of(new Random(14L), 10, 2);
        Moments m = part(data, 0, 10);
        m.scale(1e-200);
        m.scale(1e-200);
        assertEquals(0.0, m.totalWeight());
        assertEquals(0.0, m.sumSquaredWeights());
        assertEquals(0.0, m.effectiveSize());
        assertArrayEquals(new double[4], m.comomentMatrix());
        assertEquals(10, m.count());
        m.add(data.rows[0], 2.0, data.times[0]);
        assertArrayEquals(data.rows[0], m.means());
        assertEquals(2.0, m.totalWeight());
    }

    @Test
    void scale_negativeOrNonFinite_rejected() {
        Moments m = new Moments(1);
        assertThrows(IllegalArgumentException.class, () -> m.scale(-1.0));
        assertThrows(IllegalArgumentException.class, () -> m.scale(Double.NaN));
        assertThrows(IllegalArgumentException.class, () -> m.scale(Double.POSITIVE_INFINITY));
    }

    /*
     * Large offsets: columns near 1e6 with a spread of 1e-3, so μ²/σ² = 1e18 and the raw-sum form
     * Σ w z zᵀ − W μ μᵀ subtracts two numbers near 2e15 whose difference is about 2e-3: one unit in the last
     * place of 2e15 is 0.25 or more, so no correct digit can survive (Chan, Golub & LeVeque 1983 bound its
     * relative error by n·ε·μ²/σ²). The centered updates, with the mean kept as a TwoSum pair, see
     * deviations accurate to the spread; correlations must agree with the two-pass reference to 1e-9.
     */
    private static final double CORRELATION_TOLERANCE = 1e-9;

    @Test
    void comoments_largeOffsetSmallSpread_correlationsMatchTwoPassWhereRawSumsFail() {
        Random rnd = new Random(1_000_000L);
        int n = 2000;
        int d = 3;
        double[][] rows = new double[n][d];
        double[] weights = new double[n];
        long[] times = new long[n];
        for (int r = 0; r < n; r++) {
            double g0 = rnd.nextGaussian();
            double g1 = rnd.nextGaussian();
            double g2 = rnd.nextGaussian();
            rows[r][0] = 1e6 + 1e-3 * g0;
            rows[r][1] = 1e6 + 1e-3 * (0.6 * g0 + 0.8 * g1);
            rows[r][2] = -2e6 + 1e-3 * (0.3 * g0 - 0.5 * g1 + 0.8 * g2);
            weights[r] = 0.5 + 1.5 * rnd.nextDouble();
            times[r] = r;
        }
        TwoPass reference = TwoPass.of(rows, weights, n);

        Moments oneByOne = new Moments(d);
        MomentStream stream = new MomentStream(d, 64, Double.POSITIVE_INFINITY);
        for (int r = 0; r < n; r++) {
            oneByOne.add(rows[r], weights[r], times[r]);
            stream.add(rows[r], weights[r], times[r]);
        }
        Moments blocks = stream.snapshot();
        for (int i = 0; i < d; i++) {
            for (int j = 0; j < d; j++) {
                assertEquals(reference.correlation(i, j), correlation(oneByOne, i, j), CORRELATION_TOLERANCE,
                        "one by one " + i + "," + j);
                assertEquals(reference.correlation(i, j), correlation(blocks, i, j), CORRELATION_TOLERANCE,
                        "blocks " + i + "," + j);
            }
        }

        double w = 0.0;
        double sum = 0.0;
        double sumSquares = 0.0;
        for (int r = 0; r < n; r++) {
            w += weights[r];
            sum += weights[r] * rows[r][0];
            sumSquares += weights[r] * rows[r][0] * rows[r][0];
        }
        double mu = sum / w;
        double rawSumC00 = sumSquares - w * mu * mu;
        double exact = reference.comoment[0];
        assertTrue(Math.abs(rawSumC00 - exact) / exact > 0.1,
                "raw-sum form unexpectedly accurate: " + rawSumC00 + " vs " + exact);
        assertEquals(exact, blocks.comoment(0, 0), TwoPass.COMOMENT_TOLERANCE * exact);
    }

    /**
     * Tolerance on the NumAcc4 standard deviation: the decimal inputs 10000000.1 and 10000000.3 are not
     * binary64 numbers; rounding them moves each deviation by up to half a unit in the last place of 1e7
     * (about 9.3e-10), i.e. up to about 1e-8 of the 0.1 spread.
     */
    private static final double NUMACC4_SD_TOLERANCE = 2e-8;

    /**
     * NIST Statistical Reference Datasets, univariate summary statistics, data set NumAcc4 (higher
     * difficulty): 10000000.2 followed by 500 pairs 10000000.1, 10000000.3; certified mean 10000000.2 and
     * sample standard deviation 0.1. The construction and certified values are from memory of the NIST StRD
     * pages and follow by hand: the sum of squared deviations is 1000 · 0.01 = 10 over n − 1 = 1000.
     */
    @Test
    void moments_nistNumAcc4_matchCertifiedMeanAndStandardDeviation() {
        double[][] rows = new double[1001][1];
        rows[0][0] = 10000000.2;
        for (int i = 1; i < 1001; i += 2) {
            rows[i][0] = 10000000.1;
            rows[i + 1][0] = 10000000.3;
        }
        Moments oneByOne = new Moments(1);
        MomentStream stream = new MomentStream(1, 64, Double.POSITIVE_INFINITY);
        for (int i = 0; i < 1001; i++) {
            oneByOne.add(rows[i], 1.0, i);
            stream.add(rows[i], 1.0, i);
        }
        for (Moments m : new Moments[] {oneByOne, stream.snapshot()}) {
            assertEquals(10000000.2, m.mean(0), Math.ulp(10000000.2));
            double sd = Math.sqrt(m.comoment(0, 0) / (m.count() - 1));
            assertEquals(0.1, sd, 0.1 * NUMACC4_SD_TOLERANCE);
        }
    }

    @Test
    void add_nonFiniteValue_rejectedNamingColumnAndStateUnchanged() {
        Moments m = part(RandomRows.of(new Random(15L), 10, 5), 0, 10);
        String before = m.fingerprint();
        IllegalArgumentException nan = assertThrows(IllegalArgumentException.class,
                () -> m.add(new double[] {1, 2, 3, Double.NaN, 5}, 1.0, 0L));
        assertEquals("column 3 has non-finite value NaN", nan.getMessage());
        IllegalArgumentException inf = assertThrows(IllegalArgumentException.class,
                () -> m.add(new double[] {Double.NEGATIVE_INFINITY, 2, 3, 4, 5}, 1.0, 0L));
        assertEquals("column 0 has non-finite value -Infinity", inf.getMessage());
        assertEquals(before, m.fingerprint());
    }

    @Test
    void add_widthMismatchOrBadWeight_rejectedAndStateUnchanged() {
        Moments m = part(RandomRows.of(new Random(16L), 10, 3), 0, 10);
        String before = m.fingerprint();
        IllegalArgumentException width = assertThrows(IllegalArgumentException.class,
                () -> m.add(new double[] {1, 2}, 1.0, 0L));
        assertTrue(width.getMessage().contains("length 2") && width.getMessage().contains("width 3"),
                width.getMessage());
        assertThrows(IllegalArgumentException.class, () -> m.add(null, 1.0, 0L));
        for (double bad : new double[] {0.0, -1.0, Double.NaN, Double.POSITIVE_INFINITY}) {
            IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                    () -> m.add(new double[] {1, 2, 3}, bad, 0L));
            assertTrue(e.getMessage().contains("weight") && e.getMessage().contains(String.valueOf(bad)),
                    e.getMessage());
        }
        assertEquals(before, m.fingerprint());
    }

    @Test
    void addBlock_badRowInTheMiddle_rejectedNamingRowAndColumnAndStateUnchanged() {
        Moments m = part(RandomRows.of(new Random(17L), 10, 2), 0, 10);
        String before = m.fingerprint();
        double[] rows = {1, 2, 3, 4, 5, Double.POSITIVE_INFINITY, 7, 8};
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> m.addBlock(rows, new double[] {1, 1, 1, 1}, new long[4], 4));
        assertEquals("row 2: column 1 has non-finite value Infinity", e.getMessage());
        assertThrows(IllegalArgumentException.class,
                () -> m.addBlock(new double[] {1, 2, 3, 4}, new double[] {1, -1}, new long[2], 2));
        assertThrows(IllegalArgumentException.class,
                () -> m.addBlock(new double[] {1, 2, 3}, new double[] {1, 1}, new long[2], 2));
        assertThrows(IllegalArgumentException.class,
                () -> m.addBlock(new double[] {1, 2}, new double[] {1}, new long[0], 1));
        assertThrows(IllegalArgumentException.class,
                () -> m.addBlock(new double[0], new double[0], new long[0], -1));
        assertEquals(before, m.fingerprint());
    }

    @Test
    void add_overflowingUpdate_rejectedAndStateUnchanged() {
        Moments m = new Moments(2);
        m.add(new double[] {1e300, 0.0}, 1.0, 0L);
        String before = m.fingerprint();
        IllegalArgumentException e = assertThrows(IllegalArgumentException.class,
                () -> m.add(new double[] {-1e300, 0.0}, 1.0, 1L));
        assertTrue(e.getMessage().contains("column 0"), e.getMessage());
        assertEquals(before, m.fingerprint());
    }

    @Test
    void merge_widthMismatch_rejectedAndStateUnchanged() {
        Moments m = part(RandomRows.of(new Random(18L), 10, 3), 0, 10);
        String before = m.fingerprint();
        assertThrows(IllegalArgumentException.class, () -> m.merge(new Moments(2)));
        assertThrows(IllegalArgumentException.class, () -> m.merge(null));
        assertEquals(before, m.fingerprint());
    }

    @Test
    void toBytes_roundTrip_isBitExact() {
        Random rnd = new Random(19L);
        for (int trial = 0; trial < 20; trial++) {
            int d = 1 + rnd.nextInt(10);
            RandomRows data = RandomRows.of(rnd, 1 + rnd.nextInt(100), d);
            Moments m = part(data, 0, data.size());
            byte[] bytes = m.toBytes();
            Moments back = Moments.fromBytes(bytes);
            assertArrayEquals(bytes, back.toBytes());
            assertEquals(m, back);
            assertEquals(m.hashCode(), back.hashCode());
            assertEquals(m.fingerprint(), back.fingerprint());
            assertArrayEquals(m.comomentMatrix(), back.comomentMatrix());
            assertArrayEquals(m.means(), back.means());
            assertEquals(m.count(), back.count());
            assertEquals(m.minEventTimeMs(), back.minEventTimeMs());
        }
        Moments empty = new Moments(4);
        assertEquals(empty, Moments.fromBytes(empty.toBytes()));
    }

    @Test
    void toBytes_layout_isVersionedBigEndianWithUpperTriangle() {
        Moments m = new Moments(3);
        byte[] bytes = m.toBytes();
        assertEquals(Moments.FORMAT_VERSION, bytes[0]);
        assertEquals(45 + 16 * 3 + 8 * 6, bytes.length);
        assertEquals(3, java.nio.ByteBuffer.wrap(bytes, 1, 4).getInt());
    }

    @Test
    void fingerprint_isLowercaseHexSha256OfBytes() throws Exception {
        Moments m = part(RandomRows.of(new Random(20L), 5, 2), 0, 5);
        byte[] digest = java.security.MessageDigest.getInstance("SHA-256").digest(m.toBytes());
        assertEquals(java.util.HexFormat.of().formatHex(digest), m.fingerprint());
        assertTrue(m.fingerprint().matches("[0-9a-f]{64}"));
    }

    @Test
    void fromBytes_malformed_rejected() {
        Moments m = part(RandomRows.of(new Random(21L), 20, 3), 0, 20);
        byte[] good = m.toBytes();
        assertThrows(IllegalArgumentException.class, () -> Moments.fromBytes(null));
        assertThrows(IllegalArgumentException.class, () -> Moments.fromBytes(new byte[0]));
        assertThrows(IllegalArgumentException.class, () -> Moments.fromBytes(java.util.Arrays.copyOf(good, good.length - 1)));
        assertThrows(IllegalArgumentException.class, () -> Moments.fromBytes(java.util.Arrays.copyOf(good, good.length + 1)));
        byte[] version = good.clone();
        version[0] = 2;
        assertThrows(IllegalArgumentException.class, () -> Moments.fromBytes(version));
        assertThrows(IllegalArgumentException.class, () -> Moments.fromBytes(patchInt(good, 1, 0)));
        assertThrows(IllegalArgumentException.class, () -> Moments.fromBytes(patchInt(good, 1, 4)));
        int meanOffset = 45;
        int firstComoment = 45 + 16 * 3;
        assertThrows(IllegalArgumentException.class, () -> Moments.fromBytes(patchDouble(good, meanOffset, Double.NaN)));
        assertThrows(IllegalArgumentException.class,
                () -> Moments.fromBytes(patchDouble(good, firstComoment, Double.POSITIVE_INFINITY)));
        assertThrows(IllegalArgumentException.class, () -> Moments.fromBytes(patchDouble(good, firstComoment, -1.0)));
        assertThrows(IllegalArgumentException.class, () -> Moments.fromBytes(patchDouble(good, 13, -4.0)));
        assertThrows(IllegalArgumentException.class, () -> Moments.fromBytes(patchDouble(good, meanOffset, -0.0)));
        byte[] negativeCount = good.clone();
        java.nio.ByteBuffer.wrap(negativeCount).putLong(5, -1L);
        assertThrows(IllegalArgumentException.class, () -> Moments.fromBytes(negativeCount));
        byte[] emptyWithWeight = new Moments(3).toBytes();
        java.nio.ByteBuffer.wrap(emptyWithWeight).putDouble(13, 1.0).putDouble(21, 1.0);
        assertThrows(IllegalArgumentException.class, () -> Moments.fromBytes(emptyWithWeight));
    }

    private static byte[] patchInt(byte[] bytes, int offset, int value) {
        byte[] out = bytes.clone();
        java.nio.ByteBuffer.wrap(out).putInt(offset, value);
        return out;
    }

    private static byte[] patchDouble(byte[] bytes, int offset, double value) {
        byte[] out = bytes.clone();
        java.nio.ByteBuffer.wrap(out).putDouble(offset, value);
        return out;
    }

    private static Moments part(RandomRows data, int from, int to) {
        Moments m = new Moments(data.width());
        for (int r = from; r < to; r++) {
            m.add(data.rows[r], data.weights[r], data.times[r]);
        }
        return m;
    }

    private static double correlation(Moments m, int i, int j) {
        return m.comoment(i, j) / Math.sqrt(m.comoment(i, i) * m.comoment(j, j));
    }
}

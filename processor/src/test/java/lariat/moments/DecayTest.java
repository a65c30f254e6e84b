package lariat.moments;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Random;
import org.junit.jupiter.api.Test;

class DecayTest {

    /** Units in the last place allowed against the platform's 2^(−x): two roundings plus the table entry. */
    private static final double ULPS = 4.0;

    @Test
    void pow2Negative_randomArguments_matchMathPowWithinFewUlps() {
        Random rnd = new Random(71L);
        for (int i = 0; i < 100_000; i++) {
            double x = i < 50_000 ? 3.0 * rnd.nextDouble() : 1000.0 * rnd.nextDouble();
            double expected = Math.pow(2.0, -x);
            assertEquals(expected, Decay.pow2Negative(x), ULPS * Math.ulp(expected), () -> "x = " + x);
        }
    }

    @Test
    void pow2Negative_integersAndZero_exactPowersOfTwo() {
        assertEquals(1.0, Decay.pow2Negative(0.0));
        for (int n = 1; n <= 1074; n++) {
            assertEquals(Math.scalb(1.0, -n), Decay.pow2Negative(n), "n = " + n);
        }
    }

    @Test
    void pow2Negative_beyondSubnormalRange_isZero() {
        assertEquals(0.0, Decay.pow2Negative(1100.0));
        assertEquals(0.0, Decay.pow2Negative(Double.POSITIVE_INFINITY));
        assertEquals(0.0, Decay.factor(Long.MAX_VALUE, Long.MIN_VALUE, 1.0));
    }

    @Test
    void factor_equalTimes_isExactlyOne() {
        assertEquals(1.0, Decay.factor(1_700_000_000_000L, 1_700_000_000_000L, 3.5));
        assertEquals(0.5, Decay.factor(2_000L, 1_000L, 1_000.0));
    }
}

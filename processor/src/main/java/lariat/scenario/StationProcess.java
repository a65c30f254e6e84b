package lariat.scenario;

/**
 * The evolving state of one station's channels; each call of {@link #next} advances one reading.
 *
 * <p>Per reading, with n a fresh standard normal deviate each time: every autoregressive state
 * moves as {@code a ← φ a + sqrt(1 − φ²) n}, which keeps unit variance (states start from N(0, 1),
 * so the process is stationary from the first reading). The demand and weather factors add a
 * daily cycle of event time: {@code f = 0.6·√2·sin(2π·τ − φ₀) + 0.8·a}, τ the fraction of the UTC
 * day, still of unit variance over a day. Level and grid factors are the states themselves.
 * Channels follow {@link ChannelCatalog}; the target is
 * {@code intercept + Σ_j β_j x_j + σ·n}.
 */
final class StationProcess {

    private static final long DAY_MS = 86_400_000L;
    private static final double[] FACTOR_PHI = {0.97, 0.99, 0.995, 0.9};
    private static final double OWN_PHI = 0.7;
    private static final double CYCLE_SHARE = 0.6;
    private static final double DEMAND_PHASE = 1.9;
    private static final double WEATHER_PHASE = 2.2;

    private final StationProfile profile;
    private final SplitMix64 rng;
    private final double noiseSd;
    private final double[] factorState = new double[ChannelCatalog.FACTORS];
    private final double[] factor = new double[ChannelCatalog.FACTORS];
    private final double[] own;
    private final double[] ownWeight;

    StationProcess(StationProfile profile, long streamSeed, double noiseSd) {
        this.profile = profile;
        this.rng = new SplitMix64(streamSeed);
        this.noiseSd = noiseSd;
        int p = ChannelCatalog.count();
        this.own = new double[p];
        this.ownWeight = new double[p];
        for (int k = 0; k < factorState.length; k++) {
            factorState[k] = rng.nextGaussian();
        }
        for (int j = 0; j < p; j++) {
            own[j] = rng.nextGaussian();
            double shared = 0;
            for (int k = 0; k < ChannelCatalog.FACTORS; k++) {
                shared += ChannelCatalog.loading(j, k) * ChannelCatalog.loading(j, k);
            }
            ownWeight[j] = StrictMath.sqrt(1 - shared);
        }
    }

    /**
     * Advances one reading at event time {@code timeMs} under the model (intercept, beta) and
     * writes the channel values followed by the target into {@code out}, which it modifies.
     *
     * @param beta raw coefficients in channel order, one per channel (0 for non-drivers)
     * @param out  length channels + 1
     */
    void next(long timeMs, double intercept, double[] beta, double[] out) {
        for (int k = 0; k < factorState.length; k++) {
            factorState[k] = ar(factorState[k], FACTOR_PHI[k]);
        }
        double tau = Math.floorMod(timeMs, DAY_MS) / (double) DAY_MS;
        double cycle = CYCLE_SHARE * StrictMath.sqrt(2);
        double rest = StrictMath.sqrt(1 - CYCLE_SHARE * CYCLE_SHARE);
        factor[ChannelCatalog.DEMAND] = cycle * StrictMath.sin(2 * Math.PI * tau - DEMAND_PHASE)
                + rest * factorState[ChannelCatalog.DEMAND];
        factor[ChannelCatalog.WEATHER] = cycle * StrictMath.sin(2 * Math.PI * tau - WEATHER_PHASE)
                + rest * factorState[ChannelCatalog.WEATHER];
        factor[ChannelCatalog.LEVEL] = factorState[ChannelCatalog.LEVEL];
        factor[ChannelCatalog.GRID] = factorState[ChannelCatalog.GRID];
        double y = intercept;
        for (int j = 0; j < own.length; j++) {
            own[j] = ar(own[j], OWN_PHI);
            double z = ownWeight[j] * own[j];
            for (int k = 0; k < factor.length; k++) {
                z += ChannelCatalog.loading(j, k) * factor[k];
            }
            double x = profile.center(j) + profile.scale(j) * z;
            out[j] = x;
            y += beta[j] * x;
        }
        out[own.length] = y + noiseSd * rng.nextGaussian();
    }

    private double ar(double a, double phi) {
        return phi * a + StrictMath.sqrt(1 - phi * phi) * rng.nextGaussian();
    }
}

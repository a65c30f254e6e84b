package lariat.scenario;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * One station's fixed character, drawn once from its seed: each channel's center and scale (the
 * catalog's values varied by up to ±5 % and ±10 %), the motor current at the centers, and the
 * drivers of its base model with their effects.
 *
 * <p>The true model keeps the current at the channel centers equal to {@code baseCurrent}:
 * {@code y = baseCurrent + Σ_j β_j (x_j − center_j) + ε}, so its raw intercept is
 * {@code baseCurrent − Σ_j β_j center_j}. A driver's effect is given in amperes per standard
 * deviation of the channel, {@code β_j = effect / scale_j}.
 */
final class StationProfile {

    private static final double MIN_EFFECT = 2.5;
    private static final double MAX_EFFECT = 6.0;

    private final double[] center;
    private final double[] scale;
    private final double baseCurrent;
    private final Map<String, Double> baseEffects;

    private StationProfile(double[] center, double[] scale, double baseCurrent, Map<String, Double> baseEffects) {
        this.center = center;
        this.scale = scale;
        this.baseCurrent = baseCurrent;
        this.baseEffects = baseEffects;
    }

    static StationProfile draw(SplitMix64 rng) {
        int p = ChannelCatalog.count();
        double[] center = new double[p];
        double[] scale = new double[p];
        for (int j = 0; j < p; j++) {
            center[j] = ChannelCatalog.center(j) * (1 + rng.uniform(-0.05, 0.05));
            scale[j] = ChannelCatalog.scale(j) * (1 + rng.uniform(-0.1, 0.1));
        }
        double base = rng.uniform(90, 130);
        List<String> drivers = new ArrayList<>(ChannelCatalog.ALWAYS_DRIVERS);
        List<String> pool = new ArrayList<>(ChannelCatalog.OPTIONAL_DRIVERS);
        int extra = 1 + rng.nextInt(3);
        for (int i = 0; i < extra; i++) {
            drivers.add(pool.remove(rng.nextInt(pool.size())));
        }
        Map<String, Double> effects = new LinkedHashMap<>();
        for (String d : drivers) {
            effects.put(d, ChannelCatalog.usualSign(d) * rng.uniform(MIN_EFFECT, MAX_EFFECT));
        }
        return new StationProfile(center, scale, base, effects);
    }

    double center(int j) {
        return center[j];
    }

    double scale(int j) {
        return scale[j];
    }

    /** The base model's raw coefficients. */
    Map<String, Double> baseCoefficients() {
        Map<String, Double> beta = new LinkedHashMap<>();
        for (Map.Entry<String, Double> e : baseEffects.entrySet()) {
            beta.put(e.getKey(), rawCoefficient(e.getKey(), e.getValue()));
        }
        return beta;
    }

    double rawCoefficient(String channel, double effectPerSd) {
        return effectPerSd / scale[ChannelCatalog.index(channel)];
    }

    /** The model with these raw coefficients that keeps the base current at the centers. */
    StationModel model(Map<String, Double> beta) {
        double intercept = baseCurrent;
        for (Map.Entry<String, Double> e : beta.entrySet()) {
            intercept -= e.getValue() * center[ChannelCatalog.index(e.getKey())];
        }
        return StationModel.of(intercept, beta);
    }
}

package lariat.scenario;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * A station's true model of the target during one regime:
 * {@code motor_current_a = intercept + Σ_j β_j x_j + ε}, ε ~ N(0, σ²), over the driving channels
 * only, in raw engineering units. Coefficients are listed in channel order.
 */
public final class StationModel {

    private final double intercept;
    private final Map<String, Double> coefficients;

    private StationModel(double intercept, Map<String, Double> coefficients) {
        if (!Double.isFinite(intercept)) {
            throw new IllegalArgumentException("intercept must be finite, got " + intercept);
        }
        Map<String, Double> ordered = new LinkedHashMap<>();
        for (String name : ChannelCatalog.NAMES) {
            Double b = coefficients.get(name);
            if (b != null) {
                if (!Double.isFinite(b) || b == 0) {
                    throw new IllegalArgumentException("coefficient of " + name + " must be finite and non-zero, got " + b);
                }
                ordered.put(name, b);
            }
        }
        for (String name : coefficients.keySet()) {
            ChannelCatalog.index(name);
        }
        this.intercept = intercept;
        this.coefficients = Collections.unmodifiableMap(ordered);
    }

    /**
     * @param coefficients channel name → non-zero raw coefficient (amperes per channel unit)
     * @throws IllegalArgumentException naming a channel that is unknown or has a zero or
     *                                  non-finite coefficient
     */
    public static StationModel of(double intercept, Map<String, Double> coefficients) {
        return new StationModel(intercept, coefficients);
    }

    public double intercept() {
        return intercept;
    }

    /** Driving channel → raw coefficient, in channel order (unmodifiable). */
    public Map<String, Double> coefficients() {
        return coefficients;
    }

    /** The active set: the driving channels, in channel order. */
    public List<String> active() {
        return List.copyOf(coefficients.keySet());
    }

    /** The raw coefficient of a channel, 0 when it does not drive the target. */
    public double coefficient(String channel) {
        return coefficients.getOrDefault(channel, 0.0);
    }

    @Override
    public String toString() {
        return "StationModel{intercept=" + intercept + ", coefficients=" + coefficients + "}";
    }
}

package lariat.scenario;

import java.util.List;

/**
 * The sensor channels of an invented pumping station and how they co-move.
 *
 * <p>Each channel is {@code center + scale * z}, where z has unit variance:
 * {@code z = Σ_k L_k f_k + sqrt(1 − Σ_k L_k²) e}, the f_k are four shared station factors (demand,
 * weather, reservoir level, supply grid; each of unit variance) and e is the channel's own
 * first-order autoregressive disturbance of unit variance. The loadings L give realistic
 * correlations (flow with discharge pressure, ambient with bearing and winding temperatures,
 * humidity against ambient) while every channel keeps at least a third of its variance to itself,
 * so no two channels are close to collinear.
 */
final class ChannelCatalog {

    static final String TARGET = "motor_current_a";

    static final int DEMAND = 0;
    static final int WEATHER = 1;
    static final int LEVEL = 2;
    static final int GRID = 3;
    static final int FACTORS = 4;

    /** Channel names, in record order; the target is not among them. */
    static final List<String> NAMES = List.of(
            "suction_kpa", "discharge_kpa", "flow_m3h", "speed_rpm", "valve_position_pct",
            "bearing_de_temp_c", "bearing_nde_temp_c", "winding_temp_c",
            "vib_1x_mm_s", "vib_2x_mm_s", "vib_hf_g",
            "ambient_temp_c", "humidity_pct", "oil_level_pct", "oil_temp_c", "supply_voltage_v",
            "filter_dp_kpa", "seal_leak_l_h", "cooling_water_temp_c", "tank_level_m",
            "motor_frame_temp_c", "casing_temp_c", "fluid_temp_c", "lube_pressure_kpa");

    /** Typical value of each channel, in its engineering unit. */
    private static final double[] CENTER = {
        180, 620, 340, 1480, 62,
        58, 52, 88,
        2.8, 1.1, 0.35,
        14, 65, 78, 46, 400,
        18, 0.8, 22, 4.2,
        55, 24, 12, 150};

    /** Standard deviation of each channel, in its engineering unit. */
    private static final double[] SCALE = {
        12, 35, 45, 25, 8,
        4, 3.5, 6,
        0.4, 0.2, 0.06,
        6, 12, 3, 3, 6,
        3, 0.2, 3, 0.6,
        4, 3, 2, 10};

    /** Loadings on (demand, weather, level, grid); every row has Σ L² ≤ 0.66. */
    private static final double[][] LOADING = {
        {-0.3, 0, 0.75, 0}, {0.7, 0, 0.2, 0}, {0.8, 0, 0, 0}, {0.6, 0, 0, 0}, {0.5, 0, 0, 0},
        {0.4, 0.5, 0, 0}, {0.35, 0.5, 0, 0}, {0.45, 0.45, 0, 0},
        {0.4, 0, 0, 0}, {0.2, 0, 0, 0}, {0, 0, 0, 0},
        {0, 0.8, 0, 0}, {0, -0.6, 0, 0}, {0, 0, 0, 0}, {0.3, 0.5, 0, 0}, {0, 0, 0, 0.8},
        {0.3, 0, 0, 0}, {0, 0, 0, 0}, {0, 0.7, 0, 0}, {0, 0, 0.7, 0},
        {0.3, 0.55, 0, 0}, {0, 0.6, 0, 0}, {0, 0.5, 0, 0}, {0, 0, 0, 0}};

    /**
     * Channels a station's base model draws its drivers from, with the sign of their effect on
     * motor current. {@code flow_m3h} and {@code supply_voltage_v} drive every station.
     */
    static final List<String> ALWAYS_DRIVERS = List.of("flow_m3h", "supply_voltage_v");
    static final List<String> OPTIONAL_DRIVERS = List.of(
            "discharge_kpa", "speed_rpm", "suction_kpa", "valve_position_pct", "fluid_temp_c", "oil_temp_c");

    private ChannelCatalog() {
    }

    static int count() {
        return NAMES.size();
    }

    static int index(String name) {
        int i = NAMES.indexOf(name);
        if (i < 0) {
            throw new IllegalArgumentException("channel must be one of " + NAMES + ", got " + name);
        }
        return i;
    }

    static double center(int j) {
        return CENTER[j];
    }

    static double scale(int j) {
        return SCALE[j];
    }

    static double loading(int j, int k) {
        return LOADING[j][k];
    }

    /** Sign of a driver's usual effect on motor current. */
    static double usualSign(String name) {
        switch (name) {
            case "supply_voltage_v":
            case "suction_kpa":
            case "fluid_temp_c":
                return -1;
            default:
                return 1;
        }
    }
}

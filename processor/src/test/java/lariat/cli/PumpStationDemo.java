package lariat.cli;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.Random;

/**
 * Generates the bundled demo table {@code processor/src/main/resources/demo/pump_station.csv}: an
 * invented pumping station sampled every 15 minutes, twenty sensor channels and the target
 * {@code motor_current_a}. The current is driven by five channels plus Gaussian noise:
 * <pre>
 *   motor_current_a = 15 + 0.25 flow_m3h + 6.0 outlet_pressure_bar - 4.0 inlet_pressure_bar
 *                     + 2.5 vib_1x_mm_s - 0.04 (supply_voltage_v - 400) + N(0, 1.5²)
 * </pre>
 * The other channels are correlated with the drivers (valve position with flow, bearing temperatures
 * with ambient temperature and flow, the 2x vibration band with the 1x band) or are independent.
 * Deterministic: {@link java.util.Random} is a specified generator, seeded here.
 * <p>Run from the repository root with the JDK's single-file launcher:
 * {@code java processor/src/test/java/lariat/cli/PumpStationDemo.java processor/src/main/resources/demo/pump_station.csv}
 */
public final class PumpStationDemo {

    static final long SEED = 20_240_611L;
    static final int ROWS = 2000;
    static final String HEADER = "flow_m3h,valve_position_pct,inlet_pressure_bar,tank_level_m,outlet_pressure_bar,"
            + "downstream_pressure_bar,suction_temp_c,discharge_temp_c,bearing_temp_de_c,bearing_temp_nde_c,"
            + "casing_temp_c,vib_1x_mm_s,vib_2x_mm_s,vib_axial_mm_s,vib_hf_g,oil_level_pct,supply_voltage_v,"
            + "cabinet_humidity_pct,seal_leak_lph,ambient_temp_c,motor_current_a";

    private PumpStationDemo() {
    }

    public static void main(String[] args) throws IOException {
        if (args.length != 1) {
            throw new IllegalArgumentException("usage: PumpStationDemo OUT.csv");
        }
        Files.writeString(Path.of(args[0]), csv(SEED, ROWS), StandardCharsets.UTF_8);
    }

    /** The demo table as CSV text with a header line and {@code rows} data lines. */
    static String csv(long seed, int rows) {
        Random rnd = new Random(seed);
        StringBuilder out = new StringBuilder(HEADER).append('\n');
        double flowNoise = 0;
        double network = 0;
        double misalign = 0;
        for (int i = 0; i < rows; i++) {
            double hours = i * 0.25;
            double day = 2 * Math.PI * hours / 24;
            flowNoise = 0.9 * flowNoise + rnd.nextGaussian() * 4;
            network = 0.95 * network + rnd.nextGaussian() * 0.1;
            misalign = 0.98 * misalign + rnd.nextGaussian() * 0.08;
            double ambient = 12 + 6 * Math.sin(day - 2) + 0.02 * hours / 24 + rnd.nextGaussian() * 0.8;
            double flow = 180 + 60 * Math.sin(day - 1.2) + flowNoise;
            double valve = 35 + 0.18 * flow + rnd.nextGaussian() * 3;
            double tank = 4 + 0.8 * Math.sin(2 * Math.PI * hours / (24 * 5)) + rnd.nextGaussian() * 0.05;
            double inlet = 0.5 + 0.098 * tank - 0.001 * flow + rnd.nextGaussian() * 0.03;
            double outlet = 6.5 - 0.004 * flow + network + rnd.nextGaussian() * 0.1;
            double downstream = outlet - 0.6 - 0.003 * flow + rnd.nextGaussian() * 0.08;
            double suction = 10 + 0.3 * ambient + rnd.nextGaussian() * 0.3;
            double discharge = suction + 0.4 + rnd.nextGaussian() * 0.2;
            double bearingDe = 35 + 0.6 * ambient + 0.04 * flow + rnd.nextGaussian();
            double bearingNde = 5 + 0.8 * bearingDe + rnd.nextGaussian() * 0.8;
            double casing = 20 + 0.5 * ambient + rnd.nextGaussian();
            double vib1x = 1.2 + 0.6 * misalign + rnd.nextGaussian() * 0.15;
            double vib2x = 0.4 + 0.3 * misalign + rnd.nextGaussian() * 0.1;
            double vibAxial = 0.8 + rnd.nextGaussian() * 0.12;
            double vibHf = 0.3 + 0.002 * flow + rnd.nextGaussian() * 0.05;
            double oil = 80 - 0.001 * hours + rnd.nextGaussian() * 0.8;
            double voltage = 400 + 3 * Math.sin(day) + rnd.nextGaussian() * 4;
            double humidity = 60 - 1.5 * (ambient - 12) + rnd.nextGaussian() * 4;
            double seal = 0.5 + rnd.nextGaussian() * 0.1;
            double current = 15 + 0.25 * flow + 6.0 * outlet - 4.0 * inlet + 2.5 * vib1x
                    - 0.04 * (voltage - 400) + rnd.nextGaussian() * 1.5;
            double[] row = {flow, valve, inlet, tank, outlet, downstream, suction, discharge, bearingDe, bearingNde,
                casing, vib1x, vib2x, vibAxial, vibHf, oil, voltage, humidity, seal, ambient, current};
            for (int j = 0; j < row.length; j++) {
                out.append(j == 0 ? "" : ",").append(String.format(Locale.ROOT, "%.4f", row[j]));
            }
            out.append('\n');
        }
        return out.toString();
    }
}

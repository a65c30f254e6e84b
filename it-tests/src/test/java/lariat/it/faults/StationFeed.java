package lariat.it.faults;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Random;

import lariat.schema.StationReading;
import org.apache.avro.generic.GenericDatumReader;
import org.apache.avro.generic.GenericRecord;
import org.apache.avro.io.DecoderFactory;

/**
 * Good readings of the invented pumping-station scenario, deterministic from a seed. Per station
 * the motor current depends linearly on flow and suction; the other channels are noise around
 * large offsets (so the moments' centered update matters). Event time advances 1 s per reading,
 * with every 17th reading 5 s late, to exercise the late-record branch of the forgetting.
 */
final class StationFeed {

    /** Feature channels in {@code field.features} order; the moments' columns are these, then the target. */
    static final List<String> FEATURES = List.of("flow_m3h", "suction_kpa", "discharge_kpa", "vibration_mm_s");
    static final String TARGET = "motor_current_a";
    static final long START_MS = 1_700_000_000_000L;

    private final Random rnd;
    private final List<String> stations;
    private final Map<String, Long> clock = new LinkedHashMap<>();
    private int next;

    private StationFeed(long seed, int stations) {
        this.rnd = new Random(seed);
        this.stations = new ArrayList<>();
        for (int i = 0; i < stations; i++) {
            String s = String.format("st-%02d", i);
            this.stations.add(s);
            clock.put(s, START_MS);
        }
    }

    static StationFeed of(long seed, int stations) {
        return new StationFeed(seed, stations);
    }

    List<String> stations() {
        return List.copyOf(stations);
    }

    /** The next reading, stations in turn. */
    StationReading next() {
        String s = stations.get(next++ % stations.size());
        return nextFor(s);
    }

    /** The next reading of station {@code s}. */
    StationReading nextFor(String s) {
        long t = clock.merge(s, 1000L, Long::sum);
        long time = (next % 17 == 0) ? t - 5000 : t;
        double flow = 120 + 10 * rnd.nextGaussian();
        double suction = 250 + 4 * rnd.nextGaussian();
        double discharge = 900 + 20 * rnd.nextGaussian();
        double vibration = 2 + 0.3 * rnd.nextGaussian();
        double current = 40 + 0.35 * flow - 0.12 * suction + 0.5 * rnd.nextGaussian();
        Map<String, Double> ch = new LinkedHashMap<>();
        ch.put("flow_m3h", flow);
        ch.put("suction_kpa", suction);
        ch.put("discharge_kpa", discharge);
        ch.put("vibration_mm_s", vibration);
        ch.put(TARGET, current);
        return StationReading.newBuilder()
                .setStation(s)
                .setTime(java.time.Instant.ofEpochMilli(time))
                .setChannels(ch)
                .setWeight(0.5 + rnd.nextDouble())
                .build();
    }

    /**
     * The inverse of {@link lariat.it.support.StageTestKit#encode}, with Avro's generic reader (the
     * Avro 1.12 class allow-list refuses specific classes by default) and the time as epoch milliseconds.
     */
    static StationReading decode(byte[] value) {
        try {
            GenericRecord g = new GenericDatumReader<GenericRecord>(StationReading.getClassSchema())
                    .read(null, DecoderFactory.get().binaryDecoder(value, 10, value.length - 10, null));
            Map<String, Double> ch = new LinkedHashMap<>();
            ((Map<?, ?>) g.get("channels")).forEach((k, v) -> ch.put(k.toString(), (Double) v));
            return StationReading.newBuilder()
                    .setStation(g.get("station").toString())
                    .setTime(java.time.Instant.ofEpochMilli((Long) g.get("time")))
                    .setChannels(ch)
                    .setWeight((Double) g.get("weight"))
                    .build();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** The moments' row of {@code r}: features in {@link #FEATURES} order, then the target. */
    static double[] row(StationReading r) {
        double[] z = new double[FEATURES.size() + 1];
        for (int i = 0; i < FEATURES.size(); i++) {
            z[i] = channel(r, FEATURES.get(i));
        }
        z[FEATURES.size()] = channel(r, TARGET);
        return z;
    }

    private static double channel(StationReading r, String name) {
        Double v = r.getChannels().get(name);
        if (v != null) {
            return v;
        }
        throw new IllegalArgumentException("reading lacks channel " + name + ": " + r);
    }
}

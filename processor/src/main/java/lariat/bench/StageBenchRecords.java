package lariat.bench;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.time.Instant;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.SplittableRandom;

import lariat.schema.StationReading;

/**
 * The input of {@code bench stage}: {@code records} Avro single-object {@code StationReading}
 * values over {@code keys} stations, taken in turn ({@code bench-000}, {@code bench-001}, …),
 * each with {@code features} channels {@code x000 …} drawn from a standard normal and a target
 * channel {@code y} = x000 − 0.5 x001 + 0.25 x002 + noise (standard deviation 0.1), event time one
 * second apart per station, weight 1. Station i goes to partition i mod partitions, so the input
 * is partitioned by model key. A seed gives the same records every time. Immutable.
 */
final class StageBenchRecords {

    static final String TARGET = "y";
    private static final long EPOCH_MS = 1_700_000_000_000L;
    private static final double[] TRUE_COEFFICIENTS = {1.0, -0.5, 0.25};
    private static final double NOISE_SD = 0.1;

    private final int features;
    private final int keys;
    private final int partitions;
    private final List<byte[]> values;

    private StageBenchRecords(int features, int keys, int partitions, List<byte[]> values) {
        this.features = features;
        this.keys = keys;
        this.partitions = partitions;
        this.values = values;
    }

    /**
     * Encodes the records.
     *
     * @throws IllegalArgumentException naming the argument when features, keys, records or
     *                                  partitions is below 1
     */
    static StageBenchRecords of(int features, int keys, int records, int partitions, long seed) {
        positive("features", features);
        positive("keys", keys);
        positive("records", records);
        positive("partitions", partitions);
        String[] names = featureNames(features);
        SplittableRandom random = new SplittableRandom(seed);
        List<byte[]> values = new ArrayList<>(records);
        for (int i = 0; i < records; i++) {
            Map<String, Double> channels = new LinkedHashMap<>();
            double y = NOISE_SD * gaussian(random);
            for (int j = 0; j < features; j++) {
                double x = gaussian(random);
                channels.put(names[j], x);
                if (j < TRUE_COEFFICIENTS.length) {
                    y += TRUE_COEFFICIENTS[j] * x;
                }
            }
            channels.put(TARGET, y);
            StationReading r = StationReading.newBuilder()
                    .setStation(station(i % keys))
                    .setTime(Instant.ofEpochMilli(EPOCH_MS + 1000L * (i / keys)))
                    .setChannels(channels)
                    .setWeight(1.0)
                    .build();
            values.add(encode(r));
        }
        return new StageBenchRecords(features, keys, partitions, values);
    }

    /** The feature channel names in order, {@code x000 …}. */
    static String[] featureNames(int features) {
        String[] names = new String[features];
        for (int j = 0; j < features; j++) {
            names[j] = String.format("x%03d", j);
        }
        return names;
    }

    static String station(int key) {
        return String.format("bench-%03d", key);
    }

    int count() {
        return values.size();
    }

    int keys() {
        return keys;
    }

    int features() {
        return features;
    }

    /** The record value i (not copied: the caller hands it to a producer and keeps no reference). */
    byte[] value(int i) {
        return values.get(i);
    }

    byte[] key(int i) {
        return station(i % keys).getBytes(StandardCharsets.UTF_8);
    }

    int partition(int i) {
        return (i % keys) % partitions;
    }

    /** Mean encoded value size in bytes. */
    double meanValueBytes() {
        long total = 0;
        for (byte[] v : values) {
            total += v.length;
        }
        return (double) total / values.size();
    }

    private static byte[] encode(StationReading r) {
        try {
            ByteBuffer buf = StationReading.getEncoder().encode(r);
            byte[] bytes = new byte[buf.remaining()];
            buf.get(bytes);
            return bytes;
        } catch (IOException e) {
            throw new UncheckedIOException("Avro encoding of a bench reading failed", e);
        }
    }

    /** A standard normal deviate: the first of a {@link SyntheticRows#polarPair} pair (the second is dropped). */
    private static double gaussian(SplittableRandom random) {
        return SyntheticRows.polarPair(random, new double[1]);
    }

    private static void positive(String name, int value) {
        if (value < 1) {
            throw new IllegalArgumentException(name + " must be at least 1, got " + value);
        }
    }
}

package lariat.bench;

import java.util.LinkedHashMap;
import java.util.Map;

import lariat.codec.Decoded;
import lariat.codec.KeyLayouts;
import lariat.codec.Reading;
import lariat.codec.RecordDecoder;
import lariat.codec.RowBuffer;
import lariat.config.StageConfig;

/**
 * {@code bench decode}: how fast the stage turns input values into rows, on the records of {@code bench
 * stage} and with its configuration. Times, in turn on the same thread, the stage's decoding
 * ({@link RecordDecoder#decodeInto}, the Avro fast path with its map templates) and the general path
 * ({@link RecordDecoder#decode}: Avro's {@code GenericDatumReader} and the field mapping), each over every
 * record per pass, after a warm-up of both. Every record must be accepted by both, with the same key and the
 * same bits of every value, or the benchmark fails: a faster path that reads something else is not faster.
 */
public final class DecodeBench {

    private DecodeBench() {
    }

    /**
     * Runs the benchmark.
     *
     * @throws IllegalArgumentException naming the argument when a count is below 1 or the warm-up is negative
     * @throws IllegalStateException    when the two paths disagree on a record
     */
    public static Result run(int features, int keys, int records, int repeat, long seed, double warmupSeconds) {
        if (repeat < 1) {
            throw new IllegalArgumentException("repeat must be at least 1, got " + repeat);
        }
        if (!(warmupSeconds >= 0)) {
            throw new IllegalArgumentException("warmup-s must be at least 0, got " + warmupSeconds);
        }
        StageBenchRecords in = StageBenchRecords.of(features, keys, records, 1, seed);
        byte[][] k = new byte[records][];
        byte[][] v = new byte[records][];
        for (int i = 0; i < records; i++) {
            k[i] = in.key(i);
            v[i] = in.value(i);
        }
        StageConfig config = StageConfig.of(StageBench.stageProperties("localhost:9092", "in", "bench", features));
        RecordDecoder stage = RecordDecoder.create(config);
        RecordDecoder general = RecordDecoder.create(config);
        KeyLayouts stageLayouts = KeyLayouts.create();
        KeyLayouts generalLayouts = KeyLayouts.create();
        RowBuffer row = RowBuffer.create();
        for (int i = 0; i < records; i++) {
            agree(i, general.decode(k[i], v[i], 0L, generalLayouts), stage.decodeInto(k[i], v[i], 0L, stageLayouts,
                    row), row);
        }
        long warmEnd = System.nanoTime() + (long) (warmupSeconds * 1e9);
        do {
            passFast(stage, k, v, stageLayouts, row);
            passGeneral(general, k, v, generalLayouts);
        } while (System.nanoTime() < warmEnd);
        double[] fast = new double[repeat];
        double[] slow = new double[repeat];
        for (int r = 0; r < repeat; r++) {
            fast[r] = passFast(stage, k, v, stageLayouts, row);
            slow[r] = passGeneral(general, k, v, generalLayouts);
        }
        return new Result(features, keys, records, in.meanValueBytes(), Timings.of(fast), Timings.of(slow));
    }

    private static void agree(int i, Decoded general, Decoded stage, RowBuffer row) {
        if (!(general instanceof Reading) || stage != null) {
            throw new IllegalStateException("record " + i + ": general path gave " + general + ", stage path "
                    + stage);
        }
        Reading r = (Reading) general;
        double[] z = r.z();
        boolean same = r.key().equals(row.key()) && z.length == row.z().length
                && Double.doubleToRawLongBits(r.weight()) == Double.doubleToRawLongBits(row.weight())
                && r.eventTimeMs() == row.eventTimeMs();
        for (int j = 0; same && j < z.length; j++) {
            same = Double.doubleToRawLongBits(z[j]) == Double.doubleToRawLongBits(row.z()[j]);
        }
        if (!same) {
            throw new IllegalStateException("record " + i + ": the stage path read other values than the general path");
        }
    }

    private static double passFast(RecordDecoder d, byte[][] k, byte[][] v, KeyLayouts layouts, RowBuffer row) {
        long t0 = System.nanoTime();
        for (int i = 0; i < v.length; i++) {
            if (d.decodeInto(k[i], v[i], 0L, layouts, row) != null) {
                throw new IllegalStateException("record " + i + " was not accepted");
            }
        }
        return (System.nanoTime() - t0) / 1e9;
    }

    private static double passGeneral(RecordDecoder d, byte[][] k, byte[][] v, KeyLayouts layouts) {
        long t0 = System.nanoTime();
        for (int i = 0; i < v.length; i++) {
            if (!(d.decode(k[i], v[i], 0L, layouts) instanceof Reading)) {
                throw new IllegalStateException("record " + i + " was not accepted");
            }
        }
        return (System.nanoTime() - t0) / 1e9;
    }

    /** Passes of both paths: nanoseconds per record (median, min, max) and the speed-up. Immutable. */
    public static final class Result implements BenchReport {
        private final int features;
        private final int keys;
        private final int records;
        private final double meanValueBytes;
        private final Timings stage;
        private final Timings general;

        private Result(int features, int keys, int records, double meanValueBytes, Timings stage, Timings general) {
            this.features = features;
            this.keys = keys;
            this.records = records;
            this.meanValueBytes = meanValueBytes;
            this.stage = stage;
            this.general = general;
        }

        private double ns(double seconds) {
            return seconds * 1e9 / records;
        }

        @Override
        public String table() {
            StringBuilder b = new StringBuilder();
            b.append(String.format("features %d, keys %d, records %d, mean value %.0f bytes, %d passes each%n",
                    features, keys, records, meanValueBytes, stage.runs()));
            b.append(String.format("%-28s %14s %10s %10s%n", "path", "median_ns_rec", "min", "max"));
            b.append(String.format("%-28s %14.1f %10.1f %10.1f%n", "stage (fast path, templates)",
                    ns(stage.median()), ns(stage.min()), ns(stage.max())));
            b.append(String.format("%-28s %14.1f %10.1f %10.1f%n", "general (GenericDatumReader)",
                    ns(general.median()), ns(general.min()), ns(general.max())));
            b.append(String.format("speed-up (general / stage, medians): %.2f%n", general.median() / stage.median()));
            return b.toString();
        }

        @Override
        public Map<String, Object> toJson() {
            Map<String, Object> m = new LinkedHashMap<>();
            m.put("features", features);
            m.put("keys", keys);
            m.put("records", records);
            m.put("mean_value_bytes", meanValueBytes);
            m.put("passes", stage.runs());
            m.put("stage_ns_per_record", ns(stage.median()));
            m.put("stage_min_ns_per_record", ns(stage.min()));
            m.put("stage_max_ns_per_record", ns(stage.max()));
            m.put("general_ns_per_record", ns(general.median()));
            m.put("general_min_ns_per_record", ns(general.min()));
            m.put("general_max_ns_per_record", ns(general.max()));
            m.put("speedup", general.median() / stage.median());
            return m;
        }
    }
}

package lariat.bench;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The outcome of {@code bench stage}: the shape of the input, the machine, and per round the
 * plain consumer's and the stage's elapsed and process CPU time. The reported figures are the
 * last round's. Immutable.
 */
public final class StageBenchResult implements BenchReport {

    /** One timed pass over every input record. */
    static final class Phase {
        final int records;
        final double seconds;
        final double cpuSeconds;
        final double pollCpuSeconds;
        final double jitSeconds;
        final long transactions;
        final double commitSeconds;

        private Phase(int records, double seconds, double cpuSeconds, double pollCpuSeconds, double jitSeconds,
                      long transactions, double commitSeconds) {
            this.records = records;
            this.seconds = seconds;
            this.cpuSeconds = cpuSeconds;
            this.pollCpuSeconds = pollCpuSeconds;
            this.jitSeconds = jitSeconds;
            this.transactions = transactions;
            this.commitSeconds = commitSeconds;
        }

        /**
         * A pass of {@code records} records that took {@code seconds} of wall time, {@code cpuSeconds} of
         * process CPU time, {@code pollCpuSeconds} of CPU time on the thread that called poll, and
         * {@code jitSeconds} of the JIT compiler's time (summed over its threads; negative when the JVM
         * does not report it), committing {@code transactions} transactions in {@code commitSeconds} of wall
         * time (from beginning each to its commit returning; 0 for the plain consumer).
         */
        static Phase of(int records, double seconds, double cpuSeconds, double pollCpuSeconds, double jitSeconds,
                        long transactions, double commitSeconds) {
            if (!(seconds > 0)) {
                throw new IllegalArgumentException("seconds must be positive, got " + seconds);
            }
            return new Phase(records, seconds, cpuSeconds, pollCpuSeconds, jitSeconds, transactions, commitSeconds);
        }

        double recordsPerSecond() {
            return records / seconds;
        }

        /** CPU time of the polling thread per record, in microseconds. */
        double pollMicrosPerRecord() {
            return pollCpuSeconds / records * 1e6;
        }
    }

    /** A plain-consumer pass and the stage pass after it. */
    static final class Round {
        final Phase consumer;
        final Phase stage;

        private Round(Phase consumer, Phase stage) {
            this.consumer = consumer;
            this.stage = stage;
        }

        static Round of(Phase consumer, Phase stage) {
            return new Round(consumer, stage);
        }

        double ratio() {
            return stage.recordsPerSecond() / consumer.recordsPerSecond();
        }

        /**
         * The plain consumer's polling-thread CPU per record over the stage's: the throughput ratio the two
         * would reach if each polling thread had a processor to itself and the broker kept up.
         */
        double pollCpuRatio() {
            return consumer.pollMicrosPerRecord() / stage.pollMicrosPerRecord();
        }
    }

    private final int features;
    private final int keys;
    private final int records;
    private final int partitions;
    private final double meanValueBytes;
    private final List<Round> rounds;
    private final int processors;
    private final double loadBefore;
    private final double loadAfter;
    private final Map<String, String> settings;

    private StageBenchResult(int features, int keys, int records, int partitions, double meanValueBytes,
                             Map<String, String> settings, List<Round> rounds, int processors, double loadBefore,
                             double loadAfter) {
        this.features = features;
        this.keys = keys;
        this.records = records;
        this.partitions = partitions;
        this.meanValueBytes = meanValueBytes;
        this.rounds = List.copyOf(rounds);
        this.processors = processors;
        this.loadBefore = loadBefore;
        this.loadAfter = loadAfter;
        this.settings = Map.copyOf(settings);
    }

    /** A result; {@code settings} are the benchmarked stage's settings beyond the input's (topics, fields). */
    static StageBenchResult of(int features, int keys, int records, int partitions, double meanValueBytes,
                               Map<String, String> settings, List<Round> rounds, int processors, double loadBefore,
                               double loadAfter) {
        if (rounds.isEmpty()) {
            throw new IllegalArgumentException("rounds must not be empty");
        }
        return new StageBenchResult(features, keys, records, partitions, meanValueBytes, settings, rounds, processors,
                loadBefore, loadAfter);
    }

    private Round last() {
        return rounds.get(rounds.size() - 1);
    }

    /** The stage's records per second in the last round. */
    public double stageRecordsPerSecond() {
        return last().stage.recordsPerSecond();
    }

    /** The plain consumer's records per second in the last round. */
    public double consumerRecordsPerSecond() {
        return last().consumer.recordsPerSecond();
    }

    /**
     * The JSON object: stage_records_per_s and consumer_records_per_s (the contract, last round),
     * their ratio, the input's shape, the stage settings, the machine, and every round.
     */
    public Map<String, Object> toJson() {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("stage_records_per_s", stageRecordsPerSecond());
        m.put("consumer_records_per_s", consumerRecordsPerSecond());
        m.put("ratio", last().ratio());
        m.put("consumer_poll_cpu_us_per_record", last().consumer.pollMicrosPerRecord());
        m.put("stage_poll_cpu_us_per_record", last().stage.pollMicrosPerRecord());
        m.put("poll_cpu_ratio", last().pollCpuRatio());
        m.put("features", features);
        m.put("keys", keys);
        m.put("records", records);
        m.put("partitions", partitions);
        m.put("mean_value_bytes", meanValueBytes);
        m.put("stage_settings", new java.util.TreeMap<>(settings));
        m.put("processors", processors);
        m.put("load_average_before", loadBefore);
        m.put("load_average_after", loadAfter);
        List<Map<String, Object>> all = new ArrayList<>();
        for (Round r : rounds) {
            Map<String, Object> o = new LinkedHashMap<>();
            o.put("consumer_s", r.consumer.seconds);
            o.put("consumer_cpu_s", r.consumer.cpuSeconds);
            o.put("consumer_poll_cpu_s", r.consumer.pollCpuSeconds);
            o.put("consumer_jit_s", r.consumer.jitSeconds);
            o.put("consumer_records_per_s", r.consumer.recordsPerSecond());
            o.put("stage_s", r.stage.seconds);
            o.put("stage_cpu_s", r.stage.cpuSeconds);
            o.put("stage_poll_cpu_s", r.stage.pollCpuSeconds);
            o.put("stage_jit_s", r.stage.jitSeconds);
            o.put("stage_records_per_s", r.stage.recordsPerSecond());
            o.put("stage_transactions", r.stage.transactions);
            o.put("stage_commit_s", r.stage.commitSeconds);
            o.put("ratio", r.ratio());
            o.put("poll_cpu_ratio", r.pollCpuRatio());
            all.add(o);
        }
        m.put("rounds", all);
        return m;
    }

    /** One line per round and phase, the last round marked as the reported one, then the machine. */
    public String table() {
        StringBuilder b = new StringBuilder();
        b.append(String.format("features %d, keys %d, records %d, partitions %d, mean value %.0f bytes%n", features,
                keys, records, partitions, meanValueBytes));
        List<String> changed = new ArrayList<>();
        new java.util.TreeMap<>(settings).forEach((k, v) -> {
            if (!v.equals(StageBench.STAGE_SETTINGS.get(k))) {
                changed.add(k + "=" + v);
            }
        });
        if (!changed.isEmpty()) {
            b.append("stage settings over the defaults: ").append(String.join(", ", changed)).append(String.format("%n"));
        }
        b.append(String.format("%6s %-9s %10s %10s %8s %12s %15s %13s %9s %7s %9s%n", "round", "reader",
                "elapsed_s", "cpu_s", "jit_s", "poll_us_rec", "records_per_s", "transactions", "commit_s", "ratio",
                "cpu_ratio"));
        for (int i = 0; i < rounds.size(); i++) {
            Round r = rounds.get(i);
            String mark = i == rounds.size() - 1 ? "*" : "";
            b.append(String.format("%6s %-9s %10.3f %10.3f %8.3f %12.3f %15.1f %13s %9s %7s %9s%n", (i + 1) + mark,
                    "consumer", r.consumer.seconds, r.consumer.cpuSeconds, r.consumer.jitSeconds,
                    r.consumer.pollMicrosPerRecord(), r.consumer.recordsPerSecond(), "-", "-", "", ""));
            b.append(String.format("%6s %-9s %10.3f %10.3f %8.3f %12.3f %15.1f %13d %9.3f %7.3f %9.3f%n",
                    (i + 1) + mark, "stage", r.stage.seconds, r.stage.cpuSeconds, r.stage.jitSeconds,
                    r.stage.pollMicrosPerRecord(), r.stage.recordsPerSecond(), r.stage.transactions,
                    r.stage.commitSeconds, r.ratio(), r.pollCpuRatio()));
        }
        b.append(String.format("* reported round; ratio = stage / consumer records_per_s; cpu_s = whole process "
                + "(broker included when embedded); jit_s = time the JIT compiler's threads spent "
                + "compiling meanwhile (elapsed, summed over them; they compete with the round for processors); "
                + "poll_us_rec = CPU time of the thread that polls, per record; commit_s = wall time the stage "
                + "spent from beginning each transaction to its commit returning (sends, offsets, commit), "
                + "part of elapsed_s; "
                + "cpu_ratio = consumer / stage poll_us_rec, the throughput ratio when each polling thread has a "
                + "processor to itself and the broker keeps up%nprocessors %d, load average %.2f before, %.2f after%n",
                processors, loadBefore, loadAfter));
        return b.toString();
    }
}

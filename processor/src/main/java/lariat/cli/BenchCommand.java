package lariat.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import java.io.File;
import java.io.IOException;
import java.io.PrintWriter;
import java.util.LinkedHashMap;
import java.util.Map;
import java.util.concurrent.Callable;
import lariat.bench.BenchReport;
import lariat.bench.DecodeBench;
import lariat.bench.MomentsBench;
import lariat.bench.PathBench;
import lariat.bench.StageBench;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/** {@code lariat bench}: speed of the path refit and of the moments update on seeded synthetic data. */
@Command(name = "bench", mixinStandardHelpOptions = true,
        description = "Benchmarks on synthetic data: Gaussian rows, 10% true nonzeros, seeded.",
        subcommands = {BenchCommand.Path.class, BenchCommand.MomentsUpdate.class, BenchCommand.StageThroughput.class,
            BenchCommand.Decode.class})
public final class BenchCommand implements Runnable {

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        spec.commandLine().usage(spec.commandLine().getOut());
    }

    static void writeJson(File out, Map<String, Object> json) throws IOException {
        if (out != null) {
            new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValue(out, json);
        }
    }

    /** A benchmark's run: may throw {@link IllegalArgumentException} naming a bad option value. */
    interface Measurement {
        BenchReport run() throws InterruptedException;
    }

    /** The options every benchmark takes. */
    static final class Common {
        @Option(names = "--seed", defaultValue = "1", description = "Random seed (default: ${DEFAULT-VALUE}).")
        long seed;

        @Option(names = "--json", paramLabel = "OUT", description = "Write the result as JSON to this file.")
        File json;
    }

    /**
     * Runs one benchmark, prints its table and writes its JSON; a bad option value gets one line on stderr
     * naming the subcommand, and exit code 2.
     */
    static int report(CommandLine.Model.CommandSpec spec, Common common, Measurement measurement)
            throws IOException, InterruptedException {
        BenchReport r;
        try {
            r = measurement.run();
        } catch (IllegalArgumentException e) {
            spec.commandLine().getErr().println("bench " + spec.name() + ": " + e.getMessage());
            return 2;
        }
        PrintWriter out = spec.commandLine().getOut();
        out.print(r.table());
        out.flush();
        writeJson(common.json, r.toJson());
        return 0;
    }

    /** {@code lariat bench path}. */
    @Command(name = "path", mixinStandardHelpOptions = true,
            description = "Time the lasso path refit from a prebuilt Gram matrix (the Gram build is not timed).")
    static final class Path implements Callable<Integer> {
        @CommandLine.Spec
        CommandLine.Model.CommandSpec spec;

        @Option(names = "--features", required = true, description = "Number of predictor columns p.")
        int features;

        @Option(names = "--rows", required = true, description = "Number of synthetic rows n.")
        int rows;

        @Option(names = "--steps", defaultValue = "0", description = "Maximum path steps; 0 for the whole path "
                + "(default: ${DEFAULT-VALUE}).")
        int steps;

        @Option(names = "--repeat", defaultValue = "5", description = "Timed refits (default: ${DEFAULT-VALUE}).")
        int repeat;

        @Option(names = "--warmup-s", defaultValue = "1.0", description = "Seconds of untimed warm-up refits; 0 for "
                + "none (default: ${DEFAULT-VALUE}).")
        double warmupSeconds;

        @Option(names = "--prototype", description = "Time the benchmark package's contiguous-rows lasso kernel "
                + "prototype instead of the path engine.")
        boolean prototype;

        @CommandLine.Mixin
        Common common;

        @Override
        public Integer call() throws IOException, InterruptedException {
            return report(spec, common, () -> PathBench.run(features, rows, steps, repeat, common.seed, warmupSeconds,
                    prototype));
        }
    }

    /** {@code lariat bench moments}. */
    @Command(name = "moments", mixinStandardHelpOptions = true,
            description = "Time the streaming moments update over z = (x, y) of width features + 1.")
    static final class MomentsUpdate implements Callable<Integer> {
        @CommandLine.Spec
        CommandLine.Model.CommandSpec spec;

        @Option(names = "--features", required = true, description = "Number of predictor columns p.")
        int features;

        @Option(names = "--rows", required = true, description = "Number of synthetic records n.")
        int rows;

        @Option(names = "--block-size", defaultValue = "" + MomentsBench.DEFAULT_BLOCK_SIZE,
                description = "Records per moments block (default: ${DEFAULT-VALUE}).")
        int blockSize;

        @Option(names = "--repeat", defaultValue = "5", description = "Timed passes (default: ${DEFAULT-VALUE}).")
        int repeat;

        @Option(names = "--warmup-s", defaultValue = "" + MomentsBench.DEFAULT_WARMUP_SECONDS,
                description = "Seconds of untimed warm-up passes, so that the timed ones run compiled code; 0 for "
                        + "one short pass only (default: ${DEFAULT-VALUE}).")
        double warmupSeconds;

        @Option(names = "--threads", description = "Threads a block merge may use, the benchmark thread included "
                + "(default: the system property lariat.moments.threads, else the available processors). Widths "
                + "up to 256 always use one; the table shows the threads used.")
        Integer threads;

        @CommandLine.Mixin
        Common common;

        @Override
        public Integer call() throws IOException, InterruptedException {
            int t = threads != null ? threads : lariat.moments.Moments.defaultThreads();
            return report(spec, common, () -> MomentsBench.run(features, rows, blockSize, repeat, common.seed, t,
                    warmupSeconds));
        }
    }

    /** {@code lariat bench stage}. */
    @Command(name = "stage", mixinStandardHelpOptions = true,
            description = {"Throughput of the stage next to a plain read_committed consumer on the same topic.",
                "Loads N Avro single-object readings over K keys with P channels each into a new topic "
                    + "(on an embedded broker unless --bootstrap-servers is given), then per round times a "
                    + "plain consumer reading every record (no decoding) and a new stage (refit every 1000 "
                    + "records of a key, BIC selection) from ready to the commit that covers the last offset."})
    static final class StageThroughput implements Callable<Integer> {
        @CommandLine.Spec
        CommandLine.Model.CommandSpec spec;

        @Option(names = "--features", required = true, description = "Feature channels per record P.")
        int features;

        @Option(names = "--keys", required = true, description = "Model keys K.")
        int keys;

        @Option(names = "--records", required = true, description = "Records N in all.")
        int records;

        @Option(names = "--partitions", defaultValue = "4", description = "Input partitions "
                + "(default: ${DEFAULT-VALUE}).")
        int partitions;

        @Option(names = "--rounds", defaultValue = "2", description = "Rounds of consumer then stage; the last "
                + "is reported (default: ${DEFAULT-VALUE}).")
        int rounds;

        @Option(names = "--bootstrap-servers", description = "Use this cluster instead of an embedded broker.")
        String bootstrapServers;

        @Option(names = "--set", paramLabel = "KEY=VALUE", description = "A setting of the benchmarked stage over "
                + "its defaults, repeatable: a Lariat key or a Kafka client property, e.g. --set "
                + "producer.batch.size=16384 --set moments.block.records=256 (topics, fields and stage.id "
                + "are the benchmark's own).")
        Map<String, String> overrides = new LinkedHashMap<>();

        @CommandLine.Mixin
        Common common;

        @Override
        public Integer call() throws IOException, InterruptedException {
            return report(spec, common, () -> StageBench.run(features, keys, records, partitions, rounds, common.seed,
                    bootstrapServers, overrides));
        }
    }

    /** {@code lariat bench decode}. */
    @Command(name = "decode", mixinStandardHelpOptions = true,
            description = {"Time the stage's decoding of input values into rows, next to the general path.",
                "Encodes N Avro single-object readings over K keys with P channels each (the records of bench "
                    + "stage), checks that the stage's fast path and the general path (Avro's GenericDatumReader "
                    + "and the field mapping) read every record to the same bits, then times passes of each "
                    + "over all records on one thread, in turn."})
    static final class Decode implements Callable<Integer> {
        @CommandLine.Spec
        CommandLine.Model.CommandSpec spec;

        @Option(names = "--features", required = true, description = "Feature channels per record P.")
        int features;

        @Option(names = "--keys", defaultValue = "8", description = "Model keys K (default: ${DEFAULT-VALUE}).")
        int keys;

        @Option(names = "--records", required = true, description = "Records N in all.")
        int records;

        @Option(names = "--repeat", defaultValue = "5", description = "Timed passes of each path "
                + "(default: ${DEFAULT-VALUE}).")
        int repeat;

        @Option(names = "--warmup-s", defaultValue = "1.0", description = "Seconds of untimed passes of both paths "
                + "first (default: ${DEFAULT-VALUE}).")
        double warmupSeconds;

        @CommandLine.Mixin
        Common common;

        @Override
        public Integer call() throws IOException, InterruptedException {
            return report(spec, common, () -> DecodeBench.run(features, keys, records, repeat, common.seed,
                    warmupSeconds));
        }
    }
}

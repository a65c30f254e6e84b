package lariat.cli;

import java.io.IOException;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import lariat.moments.Moments;
import lariat.path.LassoPath;
import lariat.path.PathEngine;
import lariat.path.PathMethod;
import lariat.path.PathOptions;
import lariat.report.PathReport;
import lariat.select.CrossValidation;
import lariat.select.CvCurve;
import lariat.select.FoldMoments;
import lariat.select.ModelSelector;
import lariat.select.RegressionMoments;
import lariat.select.RidgeRescale;
import lariat.select.SelectedModel;
import lariat.select.SelectionRule;
import lariat.select.SelectionSpec;
import lariat.table.NumericTable;
import lariat.table.TableFormatException;
import lariat.table.TableReader;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/**
 * {@code lariat fit}: the whole lasso (or LAR) path of one table, offline, and a model chosen on it.
 * Reads a CSV file with a header or an Avro object container file, accumulates the same moments the
 * streaming stage keeps, fits the path from them, selects a model, prints the knots and the model, and
 * optionally writes JSON, a CSV of the knots and an SVG plot. Bad input: one line on standard error
 * naming file, row and column, exit code 2.
 */
@Command(name = "fit", mixinStandardHelpOptions = true, sortOptions = false,
        description = {"Fit the lasso path of one table (CSV with a header, or an Avro object container file)",
            "from its moments, choose a model on it, and report the knots and the chosen model."},
        footerHeading = "%nExample:%n",
        footer = {"  java -jar processor/target/lariat.jar fit \\",
            "      --input processor/src/main/resources/demo/pump_station.csv --target motor_current_a \\",
            "      --select cv --folds 10 --one-se --refit --json fit.json --csv knots.csv --plot path.svg",
            "",
            "Exit codes: 0 success, 2 bad input or usage, 1 other failure."})
public final class FitCommand implements Callable<Integer> {

    static final int BAD_INPUT = 2;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Option(names = "--input", required = true, paramLabel = "FILE",
            description = "Input table: .avro for an Avro object container file, otherwise CSV with a header.")
    Path input;

    @Option(names = "--target", required = true, paramLabel = "COL", description = "Target column (the response).")
    String target;

    @Option(names = "--weight", paramLabel = "COL", description = "Column of positive record weights (default: all 1).")
    String weight;

    @Option(names = "--features", split = ",", paramLabel = "LIST",
            description = "Comma-separated feature columns (default: every column but target and weight).")
    List<String> features;

    @Option(names = "--method", paramLabel = "lar|lasso", defaultValue = "lasso",
            description = "lar (no drops) or lasso (default: ${DEFAULT-VALUE}).")
    String method;

    @Option(names = "--positive", description = "Constrain coefficients to be non-negative.")
    boolean positive;

    @Option(names = "--ridge", paramLabel = "L2", defaultValue = "0",
            description = "Ridge penalty lambda2 >= 0 on the standardized scale (elastic net; default: 0).")
    double ridge;

    @Option(names = "--ridge-rescale", description = "With --ridge > 0: report the elastic-net estimate, the chosen "
            + "coefficients multiplied by (1 + L2) (Zou & Hastie 2005), instead of the naive one.")
    boolean ridgeRescale;

    @Option(names = "--collinear-tolerance", paramLabel = "T", defaultValue = "1e-10",
            description = "Set a joining feature aside as collinear when its squared Cholesky pivot is at most T "
                    + "times its Gram diagonal, T in (0, 1) (default: ${DEFAULT-VALUE}).")
    double collinearTolerance;

    @Option(names = "--max-active", paramLabel = "N", description = "Stop the path at N active features.")
    Integer maxActive;

    @Option(names = "--max-steps", paramLabel = "N", description = "Stop the path after N steps.")
    Integer maxSteps;

    @Option(names = "--min-relative-penalty", paramLabel = "R",
            description = "Stop the path at lambda/lambda_max <= R, R in [0, 1).")
    Double minRelativePenalty;

    @Option(names = "--target-r2", paramLabel = "R2", description = "Stop the path when R2 reaches this value.")
    Double targetR2;

    @Option(names = "--select", paramLabel = "RULE", defaultValue = "cv",
            description = "relative-penalty, max-active, target-r2, cp, aic, bic or cv (default: ${DEFAULT-VALUE}).")
    String select;

    @Option(names = "--select-value", paramLabel = "V",
            description = "Parameter of relative-penalty (lambda/lambda_max), max-active (count) or target-r2.")
    Double selectValue;

    @Option(names = "--folds", paramLabel = "K", defaultValue = "5",
            description = "Cross-validation folds (default: ${DEFAULT-VALUE}); records go to folds by a stable hash "
                    + "of their row number.")
    int folds;

    @Option(names = "--one-se", description = "With cv: the sparsest model within one standard error of the best.")
    boolean oneSe;

    @Option(names = "--refit", description = "Also refit least squares on the chosen active set.")
    boolean refit;

    @Option(names = "--json", paramLabel = "OUT", description = "Write the path and the chosen model as JSON.")
    Path json;

    @Option(names = "--csv", paramLabel = "OUT", description = "Write the table of knots as CSV.")
    Path csv;

    @Option(names = "--plot", paramLabel = "OUT.svg", description = "Draw the coefficient paths as SVG.")
    Path plot;

    @Option(names = "--plot-scale", paramLabel = "standardized|raw", defaultValue = "standardized",
            description = "Coefficients drawn by --plot (default: ${DEFAULT-VALUE}).")
    String plotScale;

    /** What was read, for the reports. */
    record Input(String file, String target, String weight, int rows, List<String> features, String method,
                 boolean positive, double ridge, boolean ridgeRescale) {
    }

    @Override
    public Integer call() throws IOException {
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        SelectionSpec selection = selectionSpec();
        PathOptions options = pathOptions().build();
        boolean standardizedPlot = plotScale();
        NumericTable table;
        List<String> names;
        try {
            table = read();
            names = featureNames(table);
            checkRows(table);
        } catch (TableFormatException e) {
            err.println("lariat fit: " + e.getMessage());
            err.flush();
            return BAD_INPUT;
        }
        int p = names.size();
        double[] weights = weights(table, err);
        if (weights == null) {
            return BAD_INPUT;
        }
        int[] featureCols = new int[p];
        for (int j = 0; j < p; j++) {
            featureCols[j] = j;
        }
        Moments moments = new Moments(p + 1);
        FoldMoments foldMoments = selection.rule() == SelectionRule.CV ? new FoldMoments(p + 1, folds) : null;
        double[] z = new double[p + 1];
        int targetIndex = table.indexOf(target);
        for (int r = 0; r < table.rows(); r++) {
            for (int j = 0; j < p; j++) {
                z[j] = table.get(r, table.indexOf(names.get(j)));
            }
            z[p] = table.get(r, targetIndex);
            moments.add(z, weights[r], r);
            if (foldMoments != null) {
                foldMoments.add(z, weights[r], r, r);
            }
        }
        RegressionMoments full = RegressionMoments.of(moments, featureCols, p);
        LassoPath path = new PathEngine(p).fit(full.gramInput(), options);
        SelectedModel chosen;
        try {
            CvCurve cv = foldMoments == null ? null
                    : CrossValidation.run(path, foldMoments, featureCols, p, foldOptions(path));
            SelectedModel naive = ModelSelector.select(path, full, selection, cv);
            chosen = ridgeRescale ? RidgeRescale.apply(naive, full, ridge) : naive;
        } catch (IllegalArgumentException e) {
            err.println("lariat fit: " + table.source() + ": " + e.getMessage());
            err.flush();
            return BAD_INPUT;
        }
        Input in = new Input(table.source(), target, weight, table.rows(), names, method.toLowerCase(Locale.ROOT),
                positive, ridge, ridgeRescale);
        PathReport report = PathReport.of(names, path);
        out.print(summary(in, path, report, chosen));
        out.flush();
        write(json, () -> FitJson.write(in, path, chosen));
        write(csv, report::knotCsv);
        write(plot, () -> report.plot("Coefficient paths of " + target, standardizedPlot).toSvg());
        return 0;
    }

    private String summary(Input in, LassoPath path, PathReport report, SelectedModel chosen) {
        StringBuilder b = new StringBuilder();
        b.append(String.format(Locale.ROOT, "%s: %d rows, %d features, target %s%s; %s path%s%s, %d knots (%s)%n",
                in.file(), in.rows(), in.features().size(), target, weight == null ? "" : ", weights " + weight,
                in.method(), positive ? " (positive)" : "", ridge > 0 ? " with ridge " + ridge : "",
                path.knots().size(), path.stopReason()));
        b.append(report.excludedLines());
        b.append('\n').append(report.knotTable()).append('\n');
        b.append(report.selectedTable(chosen)).append('\n');
        b.append(PathReport.CAUTION).append('\n');
        return b.toString();
    }

    /** Output text producer that may fail while serializing. */
    private interface Text {
        String get() throws IOException;
    }

    private static void write(Path file, Text text) throws IOException {
        if (file != null) {
            Files.writeString(file, text.get(), StandardCharsets.UTF_8);
        }
    }

    private NumericTable read() {
        List<String> wanted = null;
        if (features != null) {
            LinkedHashSet<String> cols = new LinkedHashSet<>();
            for (String f : features) {
                String name = f.strip();
                if (name.isEmpty()) {
                    throw usage("--features has an empty name: " + features);
                }
                if (name.equals(target) || name.equals(weight)) {
                    throw usage("--features must not name the target or weight column: " + name);
                }
                if (!cols.add(name)) {
                    throw usage("--features names " + name + " twice");
                }
            }
            cols.add(target);
            if (weight != null) {
                cols.add(weight);
            }
            wanted = new ArrayList<>(cols);
        }
        if (weight != null && weight.equals(target)) {
            throw usage("--weight and --target name the same column: " + target);
        }
        NumericTable table = TableReader.forFile(input).read(input, wanted);
        for (String c : weight == null ? List.of(target) : List.of(target, weight)) {
            if (table.indexOf(c) < 0) {
                throw TableFormatException.ofColumn(table.source(), c, "no such column; columns are "
                        + table.columns());
            }
        }
        return table;
    }

    private List<String> featureNames(NumericTable table) {
        if (features != null) {
            return features.stream().map(String::strip).toList();
        }
        List<String> names = table.columnsExcept(weight == null ? List.of(target) : List.of(target, weight));
        if (names.isEmpty()) {
            throw TableFormatException.ofFile(table.source(), "no feature columns besides the target");
        }
        return names;
    }

    private static void checkRows(NumericTable table) {
        if (table.rows() < 2) {
            throw TableFormatException.ofFile(table.source(), "only " + table.rows()
                    + " data row; a fit needs at least 2");
        }
    }

    private double[] weights(NumericTable table, PrintWriter err) {
        double[] w = new double[table.rows()];
        if (weight == null) {
            java.util.Arrays.fill(w, 1.0);
            return w;
        }
        int c = table.indexOf(weight);
        for (int r = 0; r < w.length; r++) {
            w[r] = table.get(r, c);
            if (!(w[r] > 0)) {
                err.println("lariat fit: " + TableFormatException.ofCell(table.source(), r + 1L, weight,
                        "weight must be > 0, was " + w[r]).getMessage());
                err.flush();
                return null;
            }
        }
        return w;
    }

    private SelectionSpec selectionSpec() {
        SelectionRule rule;
        try {
            rule = SelectionRule.parse(select);
        } catch (IllegalArgumentException e) {
            throw usage("--select: " + e.getMessage());
        }
        boolean needsValue = rule == SelectionRule.RELATIVE_PENALTY || rule == SelectionRule.MAX_ACTIVE
                || rule == SelectionRule.TARGET_R2;
        if (needsValue && selectValue == null) {
            throw usage("--select " + rule.label() + " needs --select-value");
        }
        if (rule == SelectionRule.CV && folds < 2) {
            throw usage("--folds must be >= 2, was " + folds);
        }
        if (oneSe && rule != SelectionRule.CV) {
            throw usage("--one-se applies only to --select cv");
        }
        try {
            return SelectionSpec.of(rule, needsValue ? selectValue : Double.NaN, oneSe, refit);
        } catch (IllegalArgumentException e) {
            throw usage("--select-value: " + e.getMessage());
        }
    }

    private PathOptions.Builder pathOptions() {
        PathOptions.Builder b = PathOptions.builder();
        try {
            b.method(switch (method.toLowerCase(Locale.ROOT)) {
                case "lar" -> PathMethod.LAR;
                case "lasso" -> PathMethod.LASSO;
                default -> throw usage("--method must be lar or lasso, was " + method);
            });
            b.positive(positive).ridge(ridge).collinearTolerance(collinearTolerance);
            if (maxActive != null) {
                b.maxActive(maxActive);
            }
            if (maxSteps != null) {
                b.maxSteps(maxSteps);
            }
            if (minRelativePenalty != null) {
                b.minRelativePenalty(minRelativePenalty);
            }
            if (targetR2 != null) {
                b.targetR2(targetR2);
            }
        } catch (IllegalArgumentException e) {
            throw usage(e.getMessage());
        }
        return b;
    }

    /** Training paths of the folds: same method and penalties, run down to the grid's smallest point. */
    private PathOptions foldOptions(LassoPath path) {
        PathOptions.Builder b = PathOptions.builder().method(method.equalsIgnoreCase("lar") ? PathMethod.LAR
                : PathMethod.LASSO).positive(positive).ridge(ridge).collinearTolerance(collinearTolerance);
        double last = path.last().relativePenalty();
        if (last > 0 && last < 1) {
            b.minRelativePenalty(last);
        }
        return b.build();
    }

    private boolean plotScale() {
        return switch (plotScale.toLowerCase(Locale.ROOT)) {
            case "standardized" -> true;
            case "raw" -> false;
            default -> throw usage("--plot-scale must be standardized or raw, was " + plotScale);
        };
    }

    private CommandLine.ParameterException usage(String message) {
        return new CommandLine.ParameterException(spec.commandLine(), message);
    }
}

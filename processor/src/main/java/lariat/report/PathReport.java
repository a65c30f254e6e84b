package lariat.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import lariat.path.ExcludedColumn;
import lariat.path.Knot;
import lariat.path.LassoPath;
import lariat.select.LeastSquaresFit;
import lariat.select.SelectedModel;

/**
 * Human-readable views of a fitted path and its selected model, with feature names: the console table
 * of knots (step, event such as {@code +bmi} or {@code -hdl}, λ/λmax, active count, R²), the CSV table of
 * knots with one raw coefficient column per feature, the selected model's coefficient table, and the
 * coefficient trajectories as a {@link PathPlot}.
 */
public final class PathReport {

    /** The one caution line printed with every console report. */
    public static final String CAUTION = "Caution: these are statistical associations, not causes; decisions on "
            + "maintenance and safety follow the site's procedures and qualified engineers.";

    private final List<String> names;
    private final LassoPath path;

    private PathReport(List<String> names, LassoPath path) {
        this.names = names;
        this.path = path;
    }

    /** A report on {@code path} whose p features are named by {@code names}. */
    public static PathReport of(List<String> names, LassoPath path) {
        if (names.size() != path.p()) {
            throw new IllegalArgumentException("names has " + names.size() + " entries, path has p = " + path.p());
        }
        return new PathReport(List.copyOf(names), path);
    }

    /** {@code +name} for an entry, {@code -name} for a departure, both when both happen, else empty. */
    public String event(Knot k) {
        List<String> parts = new ArrayList<>();
        if (k.entered() >= 0) {
            parts.add("+" + names.get(k.entered()));
        }
        if (k.left() >= 0) {
            parts.add("-" + names.get(k.left()));
        }
        return String.join(" ", parts);
    }

    /** The knots table for the console. */
    public String knotTable() {
        TextTable t = new TextTable(List.of("step", "event", "lambda/lambda_max", "active", "R2"),
                List.of(TextTable.Align.RIGHT, TextTable.Align.LEFT, TextTable.Align.RIGHT, TextTable.Align.RIGHT,
                        TextTable.Align.RIGHT));
        for (Knot k : path.knots()) {
            t.row(Integer.toString(k.step()), event(k), fmt("%.4f", k.relativePenalty()),
                    Integer.toString(k.active().length), fmt("%.4f", k.r2()));
        }
        return t.render();
    }

    /** Columns set aside by the engine, one line each, or an empty string. */
    public String excludedLines() {
        StringBuilder b = new StringBuilder();
        for (ExcludedColumn e : path.excluded()) {
            b.append("set aside: ").append(names.get(e.column())).append(" (").append(e.reason()).append(": ")
                    .append(e.detail()).append(")\n");
        }
        return b.toString();
    }

    /** The selected model: a summary line and a table of its nonzero coefficients. */
    public String selectedTable(SelectedModel s) {
        StringBuilder b = new StringBuilder();
        b.append(fmt("selected by %s%s: lambda/lambda_max = %.4f, %d active, R2 = %.4f, intercept = %.6g%n",
                s.rule().label(), parameter(s),
                s.relativePenalty(), s.df(), s.r2(), s.intercept()));
        if (s.coefficientScale() != 1.0) {
            b.append(fmt("coefficients rescaled by %s = 1 + ridge (elastic-net estimate; the knots above are "
                    + "the naive path)%n", Double.toString(s.coefficientScale())));
        }
        if (s.criteria() != null) {
            b.append(fmt("criteria: Cp = %.6g, AIC = %.6g, BIC = %.6g (n_eff = %.6g, sigma2 = %.6g)%n",
                    s.criteria().cp(), s.criteria().aic(), s.criteria().bic(), s.criteria().effectiveSize(),
                    s.criteria().sigma2()));
        }
        LeastSquaresFit refit = s.refit();
        List<String> headers = new ArrayList<>(List.of("feature", "coefficient", "standardized"));
        List<TextTable.Align> aligns = new ArrayList<>(List.of(TextTable.Align.LEFT, TextTable.Align.RIGHT,
                TextTable.Align.RIGHT));
        if (refit != null) {
            headers.add("least-squares refit");
            aligns.add(TextTable.Align.RIGHT);
        }
        TextTable t = new TextTable(headers, aligns);
        double[] raw = s.rawCoefficients();
        double[] std = s.standardizedCoefficients();
        double[] ls = refit == null ? null : refit.coefficients();
        for (int j : s.active()) {
            if (ls == null) {
                t.row(names.get(j), fmt("%.6g", raw[j]), fmt("%.6g", std[j]));
            } else {
                t.row(names.get(j), fmt("%.6g", raw[j]), fmt("%.6g", std[j]), fmt("%.6g", ls[j]));
            }
        }
        if (t.rowCount() > 0) {
            b.append(t.render());
        }
        if (refit != null) {
            b.append(fmt("least-squares refit: intercept = %.6g, R2 = %.4f%n", refit.intercept(), refit.r2()));
        }
        if (s.note() != null) {
            b.append("note: ").append(s.note()).append('\n');
        }
        return b.toString();
    }

    /**
     * The knots as CSV (RFC 4180): step, event, penalty, relative_penalty, active_count, intercept, rss, r2,
     * df, then one raw coefficient column per feature.
     */
    public String knotCsv() {
        StringBuilder b = new StringBuilder("step,event,penalty,relative_penalty,active_count,intercept,rss,r2,df");
        for (String n : names) {
            b.append(',').append(csvField(n));
        }
        b.append('\n');
        for (Knot k : path.knots()) {
            b.append(k.step()).append(',').append(csvField(event(k))).append(',').append(k.penalty()).append(',')
                    .append(k.relativePenalty()).append(',').append(k.active().length).append(',')
                    .append(k.intercept()).append(',').append(k.rss()).append(',').append(k.r2()).append(',')
                    .append(k.df());
            for (double v : k.raw()) {
                b.append(',').append(v);
            }
            b.append('\n');
        }
        return b.toString();
    }

    /** The coefficient trajectories at the knots, standardized or raw. */
    public PathPlot plot(String title, boolean standardized) {
        List<Knot> knots = path.knots();
        double[] rel = new double[knots.size()];
        double[][] values = new double[names.size()][knots.size()];
        for (int k = 0; k < rel.length; k++) {
            Knot knot = knots.get(k);
            rel[k] = Math.min(1.0, Math.max(0.0, knot.relativePenalty()));
            if (k > 0 && rel[k] > rel[k - 1]) {
                rel[k] = rel[k - 1];
            }
            double[] beta = standardized ? knot.standardized() : knot.raw();
            for (int j = 0; j < beta.length; j++) {
                values[j][k] = beta[j];
            }
        }
        return PathPlot.of(title, standardized ? "standardized" : "raw", rel, names, values);
    }

    private static String parameter(SelectedModel s) {
        double v = s.parameter();
        if (Double.isNaN(v)) {
            return "";
        }
        String text = v == Math.rint(v) && Math.abs(v) < 1e15 ? Long.toString((long) v) : fmt("%.6g", v);
        return s.rule() == lariat.select.SelectionRule.CV ? " with " + text + " folds" : " " + text;
    }

    static String csvField(String s) {
        if (s.indexOf(',') < 0 && s.indexOf('"') < 0 && s.indexOf('\n') < 0 && s.indexOf('\r') < 0) {
            return s;
        }
        return '"' + s.replace("\"", "\"\"") + '"';
    }

    private static String fmt(String pattern, Object... args) {
        return String.format(Locale.ROOT, pattern, args);
    }
}

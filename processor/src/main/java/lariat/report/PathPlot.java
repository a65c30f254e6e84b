package lariat.report;

import java.util.ArrayList;
import java.util.List;

/**
 * An SVG chart of coefficient trajectories along a regularization path: one line per feature that is
 * nonzero somewhere on the path, against the relative penalty λ/λmax on a horizontal axis running
 * from 1 (left, the empty model) to the smallest penalty (right). Between knots the lasso path is
 * linear in λ (Efron, Hastie, Johnstone & Tibshirani 2004, Annals of Statistics 32(2)), so straight
 * segments between knots draw it exactly. The chart has axes, tick labels, axis titles, a title
 * naming the coefficient scale, and a legend with one entry per plotted feature.
 */
public final class PathPlot {

    private static final String[] COLORS = {
        "#1f4e9c", "#c0392b", "#2e8b57", "#8e44ad", "#d35400",
        "#16a085", "#7f6000", "#c71585", "#34495e", "#6b8e23"
    };
    private static final String[] DASHES = {"", "6 3", "2 2", "8 3 2 3"};
    private static final double WIDTH = 900;
    private static final double LEFT = 80;
    private static final double TOP = 50;
    private static final double PLOT_W = 560;
    private static final double PLOT_H = 400;
    private static final double LEGEND_ROW = 18;

    private final String title;
    private final String scale;
    private final double[] relativePenalties;
    private final List<String> names;
    private final double[][] values;

    private PathPlot(String title, String scale, double[] relativePenalties, List<String> names,
                     double[][] values) {
        this.title = title;
        this.scale = scale;
        this.relativePenalties = relativePenalties;
        this.names = names;
        this.values = values;
    }

    /**
     * @param title             chart title
     * @param scale             which coefficients are drawn, e.g. "raw" or "standardized"
     * @param relativePenalties λ/λmax at each knot, non-increasing, within [0, 1]
     * @param names             feature names
     * @param values            {@code values[j][k]}: coefficient of feature j at knot k
     */
    public static PathPlot of(String title, String scale, double[] relativePenalties, List<String> names,
                              double[][] values) {
        if (relativePenalties.length == 0) {
            throw new IllegalArgumentException("relativePenalties must not be empty");
        }
        for (int k = 0; k < relativePenalties.length; k++) {
            double r = relativePenalties[k];
            if (!(r >= 0 && r <= 1) || k > 0 && r > relativePenalties[k - 1]) {
                throw new IllegalArgumentException("relativePenalties[" + k + "] = " + r
                        + " is outside [0, 1] or increases");
            }
        }
        if (names.size() != values.length) {
            throw new IllegalArgumentException("names (" + names.size() + ") and values (" + values.length
                    + ") differ in length");
        }
        double[][] copy = new double[values.length][];
        for (int j = 0; j < values.length; j++) {
            if (values[j].length != relativePenalties.length) {
                throw new IllegalArgumentException("values[" + j + "] has " + values[j].length + " knots, expected "
                        + relativePenalties.length);
            }
            for (double v : values[j]) {
                if (!Double.isFinite(v)) {
                    throw new IllegalArgumentException("values[" + j + "] holds a non-finite value: " + v);
                }
            }
            copy[j] = values[j].clone();
        }
        return new PathPlot(title, scale, relativePenalties.clone(), List.copyOf(names), copy);
    }

    /** Names of the features that are drawn: those nonzero at some knot, in input order. */
    public List<String> plottedFeatures() {
        List<String> out = new ArrayList<>();
        for (int j : plotted()) {
            out.add(names.get(j));
        }
        return out;
    }

    /** The SVG document. */
    public String toSvg() {
        List<Integer> shown = plotted();
        double height = Math.max(TOP + PLOT_H + 70, TOP + 20 + LEGEND_ROW * shown.size());
        SvgWriter svg = new SvgWriter(WIDTH, height);
        svg.title(title + " (" + scale + " coefficients)");
        svg.rect(0, 0, WIDTH, height, "none", "#ffffff");
        svg.text(LEFT + PLOT_W / 2, 28, title + " - " + scale + " coefficients", "middle", 16, 0);

        double xLow = relativePenalties[relativePenalties.length - 1];
        AxisTicks xt = AxisTicks.of(Math.min(xLow, 0), 1, 5);
        double lo = 0;
        double hi = 0;
        for (int j : shown) {
            for (double v : values[j]) {
                lo = Math.min(lo, v);
                hi = Math.max(hi, v);
            }
        }
        AxisTicks yt = AxisTicks.of(lo, hi, 6);
        Scale sx = new Scale(xt.high(), xt.low(), LEFT, LEFT + PLOT_W);
        Scale sy = new Scale(yt.low(), yt.high(), TOP + PLOT_H, TOP);

        axes(svg, xt, yt, sx, sy);
        svg.beginGroup("trajectories");
        double[] px = new double[relativePenalties.length];
        for (int k = 0; k < px.length; k++) {
            px[k] = sx.map(relativePenalties[k]);
        }
        for (int i = 0; i < shown.size(); i++) {
            double[] py = new double[px.length];
            for (int k = 0; k < py.length; k++) {
                py[k] = sy.map(values[shown.get(i)][k]);
            }
            svg.polyline(px, py, color(i), 1.8, dash(i));
        }
        svg.endGroup();
        legend(svg, shown);
        return svg.finish();
    }

    private void axes(SvgWriter svg, AxisTicks xt, AxisTicks yt, Scale sx, Scale sy) {
        svg.beginGroup("axes");
        svg.rect(LEFT, TOP, PLOT_W, PLOT_H, "#444444", "none");
        double zero = sy.map(0);
        svg.line(LEFT, zero, LEFT + PLOT_W, zero, "#999999", 1, "3 3");
        for (int i = 0; i < xt.count(); i++) {
            double x = sx.map(xt.value(i));
            svg.line(x, TOP + PLOT_H, x, TOP + PLOT_H + 5, "#444444", 1, null);
            svg.text(x, TOP + PLOT_H + 20, xt.label(i), "middle", 12, 0);
        }
        for (int i = 0; i < yt.count(); i++) {
            double y = sy.map(yt.value(i));
            svg.line(LEFT - 5, y, LEFT, y, "#444444", 1, null);
            svg.text(LEFT - 8, y + 4, yt.label(i), "end", 12, 0);
        }
        svg.text(LEFT + PLOT_W / 2, TOP + PLOT_H + 45, "relative penalty \u03bb/\u03bbmax (decreasing to the right)",
                "middle", 13, 0);
        svg.text(22, TOP + PLOT_H / 2, "coefficient (" + scale + ")", "middle", 13, -90);
        svg.endGroup();
    }

    private void legend(SvgWriter svg, List<Integer> shown) {
        svg.beginGroup("legend");
        double x = LEFT + PLOT_W + 25;
        for (int i = 0; i < shown.size(); i++) {
            double y = TOP + 10 + LEGEND_ROW * i;
            svg.beginGroup("legend-entry");
            svg.line(x, y - 4, x + 24, y - 4, color(i), 2.5, dash(i));
            svg.text(x + 30, y, names.get(shown.get(i)), "start", 12, 0);
            svg.endGroup();
        }
        svg.endGroup();
    }

    private List<Integer> plotted() {
        List<Integer> out = new ArrayList<>();
        for (int j = 0; j < values.length; j++) {
            for (double v : values[j]) {
                if (v != 0) {
                    out.add(j);
                    break;
                }
            }
        }
        return out;
    }

    private static String color(int i) {
        return COLORS[i % COLORS.length];
    }

    private static String dash(int i) {
        return DASHES[(i / COLORS.length) % DASHES.length];
    }

    /** Linear map from data to page coordinates. */
    private static final class Scale {
        private final double d0;
        private final double p0;
        private final double slope;

        Scale(double d0, double d1, double p0, double p1) {
            this.d0 = d0;
            this.p0 = p0;
            this.slope = (p1 - p0) / (d1 - d0);
        }

        double map(double d) {
            return p0 + (d - d0) * slope;
        }
    }
}

package lariat.report.demo;

import java.util.ArrayList;
import java.util.LinkedHashSet;
import java.util.List;
import java.util.Set;

/**
 * The coefficient path of a station's latest model as an SVG plot: coefficient against λ/λ_max,
 * penalty decreasing from 1 at the left to 0 at the right, one polyline per channel that is
 * non-zero at some knot (straight between knots, which is exact for the lasso path), a legend in
 * order of entry, and the selected penalty as a dashed vertical line.
 */
final class PathPlot {

    static final String CSS_CLASS = "path-plot";

    private static final double WIDTH = 660;
    private static final double HEIGHT = 300;
    private static final double LEFT = 64;
    private static final double RIGHT = 190;
    private static final double TOP = 16;
    private static final double BOTTOM = 44;
    private static final int MAX_LEGEND = 16;

    private PathPlot() {
    }

    static String draw(StationReport s) {
        Svg svg = new Svg(CSS_CLASS, WIDTH, HEIGHT, "Coefficient path of the latest model of " + s.station());
        double pw = WIDTH - LEFT - RIGHT;
        double ph = HEIGHT - TOP - BOTTOM;
        List<PathPoint> knots = s.path();
        List<String> channels = channelsByEntry(knots);
        double lo = 0;
        double hi = 0;
        for (PathPoint k : knots) {
            for (double b : k.coefficients().values()) {
                lo = Math.min(lo, b);
                hi = Math.max(hi, b);
            }
        }
        if (hi - lo == 0) {
            lo = -1;
            hi = 1;
        }
        double pad = 0.05 * (hi - lo);
        double ylo = lo - pad;
        double yhi = hi + pad;
        Scale y = v -> TOP + (yhi - v) / (yhi - ylo) * ph;
        Scale x = r -> LEFT + (1 - r) * pw;
        double step = Ticks.step(ylo, yhi, 8);
        for (double v : Ticks.values(ylo, yhi, step)) {
            svg.line(LEFT, y.at(v), LEFT + pw, y.at(v), "#e4e4e4", 1, null);
            svg.text(LEFT - 6, y.at(v) + 4, "end", Ticks.label(v, step));
        }
        for (int i = 0; i <= 5; i++) {
            double r = 1 - i * 0.2;
            svg.line(x.at(r), TOP + ph, x.at(r), TOP + ph + 4, "#333", 1, null);
            svg.text(x.at(r), TOP + ph + 16, "middle", Ticks.label(r, 0.1));
        }
        svg.line(LEFT, y.at(0), LEFT + pw, y.at(0), "#999", 1, null);
        svg.line(LEFT, TOP, LEFT, TOP + ph, "#333", 1, null);
        svg.line(LEFT, TOP + ph, LEFT + pw, TOP + ph, "#333", 1, null);
        svg.text(LEFT + pw / 2, HEIGHT - 8, "middle", "\u03bb / \u03bbmax  (penalty decreasing \u2192)");
        svg.rotatedText(16, TOP + ph / 2, "standardized coefficient");
        if (knots.isEmpty()) {
            svg.text(LEFT + pw / 2, TOP + ph / 2, "middle", "no path published yet");
        }
        if (!Double.isNaN(s.selectedRelativePenalty())) {
            double xs = x.at(s.selectedRelativePenalty());
            svg.line(xs, TOP, xs, TOP + ph, "#555", 1, "4 3");
            svg.text(xs + 3, TOP + 10, "start", "selected");
        }
        for (int c = 0; c < channels.size(); c++) {
            String ch = channels.get(c);
            double[] xs = new double[knots.size()];
            double[] ys = new double[knots.size()];
            for (int k = 0; k < knots.size(); k++) {
                xs[k] = x.at(knots.get(k).relativePenalty());
                ys[k] = y.at(knots.get(k).coefficient(ch));
            }
            svg.polyline(xs, ys, color(c), ch);
        }
        legend(svg, channels);
        return svg.finish();
    }

    static List<String> channelsByEntry(List<PathPoint> knots) {
        Set<String> order = new LinkedHashSet<>();
        for (PathPoint k : knots) {
            k.coefficients().forEach((ch, b) -> {
                if (b != 0) {
                    order.add(ch);
                }
            });
        }
        return new ArrayList<>(order);
    }

    static String color(int i) {
        return Svg.PALETTE[i % Svg.PALETTE.length];
    }

    private static void legend(Svg svg, List<String> channels) {
        double x0 = WIDTH - RIGHT + 14;
        int shown = channels.size() > MAX_LEGEND ? MAX_LEGEND - 1 : channels.size();
        for (int c = 0; c < shown; c++) {
            double yy = TOP + 8 + c * 15;
            svg.line(x0, yy, x0 + 18, yy, color(c), 2.5, null);
            svg.text(x0 + 24, yy + 4, "start", channels.get(c));
        }
        if (shown < channels.size()) {
            svg.text(x0, TOP + 8 + shown * 15 + 4, "start", "+" + (channels.size() - shown) + " more");
        }
    }

    /** Data to pixel. */
    private interface Scale {
        double at(double v);
    }
}

package lariat.demo;

import java.util.ArrayList;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import lariat.config.StageConfig;
import lariat.moments.MomentStream;
import lariat.moments.Moments;
import lariat.path.Knot;
import lariat.report.demo.PathPoint;
import lariat.scenario.Scenario;
import lariat.scenario.StationRow;
import lariat.stage.KeyFit;
import lariat.stage.RefitRecipe;

/**
 * The whole lasso path of a station's latest published version, which the model record only
 * summarizes: the station's first {@code recordCount} readings are replayed from the scenario
 * into moments built as the stage builds them (the version's channel order with the target last,
 * same block size and half-life), fitted by the
 * same recipe, and accepted only if the moments' fingerprint equals the one the version
 * carries, so the plotted path is the path of the published model and not an approximation.
 *
 * <p>Coefficients are reported per standard deviation of the channel: β_j · sqrt(C_jj / W), in
 * target units, so channels of different units share one axis.
 */
final class LatestPath {

    private final List<PathPoint> points;
    private final double selectedRelativePenalty;
    private final boolean verified;

    private LatestPath(List<PathPoint> points, double selectedRelativePenalty, boolean verified) {
        this.points = points;
        this.selectedRelativePenalty = selectedRelativePenalty;
        this.verified = verified;
    }

    /**
     * Replays and fits; when the fingerprint differs from {@code fingerprint}, returns an empty
     * path with {@link #verified()} false.
     */
    static LatestPath of(Scenario scenario, StageConfig config, String station, List<String> channels,
            long recordCount, String fingerprint) {
        int[] column = new int[channels.size() + 1];
        for (int j = 0; j < channels.size(); j++) {
            column[j] = scenario.columns().indexOf(channels.get(j));
            if (column[j] < 0) {
                return new LatestPath(List.of(), Double.NaN, false);
            }
        }
        column[channels.size()] = scenario.columns().indexOf(scenario.target());
        MomentStream stream = new MomentStream(column.length, config.get(StageConfig.MOMENTS_BLOCK_RECORDS),
                halfLife(config));
        double[] z = new double[column.length];
        Iterator<StationRow> rows = scenario.rows();
        while (stream.count() < recordCount && rows.hasNext()) {
            StationRow r = rows.next();
            if (r.station().equals(station)) {
                for (int j = 0; j < column.length; j++) {
                    z[j] = r.value(column[j]);
                }
                stream.add(z, r.weight(), r.timeMs());
            }
        }
        Moments m = stream.snapshot();
        if (!m.fingerprint().equals(fingerprint)) {
            return new LatestPath(List.of(), Double.NaN, false);
        }
        KeyFit fit = KeyFit.of(m, null, RefitRecipe.of(config));
        return new LatestPath(points(fit, m, channels), fit.selected().relativePenalty(), true);
    }

    private static double halfLife(StageConfig c) {
        long h = c.get(StageConfig.FORGET_HALF_LIFE_MS);
        return h == 0 ? Double.POSITIVE_INFINITY : (double) h;
    }

    private static List<PathPoint> points(KeyFit fit, Moments m, List<String> channels) {
        double w = m.totalWeight();
        List<PathPoint> out = new ArrayList<>();
        for (Knot k : fit.path().knots()) {
            double[] raw = k.raw();
            Map<String, Double> c = new LinkedHashMap<>();
            for (int j : k.active()) {
                c.put(channels.get(j), raw[j] * Math.sqrt(m.comoment(j, j) / w));
            }
            out.add(PathPoint.of(k.relativePenalty(), c));
        }
        return List.copyOf(out);
    }

    /** Knots from λ/λ_max = 1 downwards. */
    List<PathPoint> points() {
        return points;
    }

    /** λ/λ_max of the selected point, NaN if not verified. */
    double selectedRelativePenalty() {
        return selectedRelativePenalty;
    }

    /** Whether the replayed moments matched the published fingerprint. */
    boolean verified() {
        return verified;
    }
}

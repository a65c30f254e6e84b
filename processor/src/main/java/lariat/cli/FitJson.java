package lariat.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.List;
import lariat.path.ExcludedColumn;
import lariat.path.Knot;
import lariat.path.LassoPath;
import lariat.report.PathReport;
import lariat.select.Criteria;
import lariat.select.CvCurve;
import lariat.select.LeastSquaresFit;
import lariat.select.SelectedModel;

/**
 * The JSON document written by {@code fit --json}: the input description, {@code columns} (feature names),
 * {@code excluded}, {@code knots} (step, penalty, relativePenalty, active, entered, left, coefficients by
 * name in raw units, standardized, intercept, rss, r2, df) and {@code selected} (the same for the chosen
 * model, with {@code coefficientScale}: 1 + ridge when {@code ridgeRescale} applied, otherwise 1).
 */
final class FitJson {

    private static final ObjectMapper MAPPER = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    private FitJson() {
    }

    static String write(FitCommand.Input in, LassoPath path, SelectedModel s)
            throws com.fasterxml.jackson.core.JsonProcessingException {
        ObjectNode root = MAPPER.createObjectNode();
        root.put("input", in.file());
        root.put("target", in.target());
        if (in.weight() == null) {
            root.putNull("weight");
        } else {
            root.put("weight", in.weight());
        }
        root.put("rows", in.rows());
        root.put("method", in.method());
        root.put("positive", in.positive());
        root.put("ridge", in.ridge());
        root.put("ridgeRescale", in.ridgeRescale());
        root.put("lambdaMax", path.lambdaMax());
        root.put("stopReason", path.stopReason().toString());
        List<String> names = in.features();
        ArrayNode columns = root.putArray("columns");
        names.forEach(columns::add);
        ArrayNode excluded = root.putArray("excluded");
        for (ExcludedColumn e : path.excluded()) {
            excluded.addObject().put("column", names.get(e.column())).put("reason", e.reason().toString())
                    .put("detail", e.detail());
        }
        PathReport report = PathReport.of(names, path);
        ArrayNode knots = root.putArray("knots");
        for (Knot k : path.knots()) {
            ObjectNode n = knots.addObject();
            n.put("step", k.step());
            n.put("event", report.event(k));
            n.put("penalty", k.penalty());
            n.put("relativePenalty", k.relativePenalty());
            ArrayNode active = n.putArray("active");
            ObjectNode coef = n.putObject("coefficients");
            ObjectNode std = n.putObject("standardized");
            double[] raw = k.raw();
            double[] st = k.standardized();
            for (int j : k.active()) {
                active.add(names.get(j));
                coef.put(names.get(j), raw[j]);
                std.put(names.get(j), st[j]);
            }
            ArrayNode entered = n.putArray("entered");
            if (k.entered() >= 0) {
                entered.add(names.get(k.entered()));
            }
            ArrayNode left = n.putArray("left");
            if (k.left() >= 0) {
                left.add(names.get(k.left()));
            }
            n.put("intercept", k.intercept());
            n.put("rss", k.rss());
            n.put("r2", k.r2());
            n.put("df", k.df());
        }
        root.set("selected", selected(names, s));
        return MAPPER.writerWithDefaultPrettyPrinter().writeValueAsString(root);
    }

    private static ObjectNode selected(List<String> names, SelectedModel s) {
        ObjectNode n = MAPPER.createObjectNode();
        n.put("rule", s.rule().label());
        if (Double.isNaN(s.parameter())) {
            n.putNull("parameter");
        } else {
            n.put("parameter", s.parameter());
        }
        n.put("penalty", s.penalty());
        n.put("relativePenalty", s.relativePenalty());
        ArrayNode active = n.putArray("active");
        ObjectNode coef = n.putObject("coefficients");
        ObjectNode std = n.putObject("standardized");
        double[] raw = s.rawCoefficients();
        double[] st = s.standardizedCoefficients();
        for (int j : s.active()) {
            active.add(names.get(j));
            coef.put(names.get(j), raw[j]);
            std.put(names.get(j), st[j]);
        }
        n.put("intercept", s.intercept());
        n.put("rss", s.rss());
        n.put("r2", s.r2());
        n.put("df", s.df());
        n.put("coefficientScale", s.coefficientScale());
        Criteria c = s.criteria();
        if (c == null) {
            n.putNull("criteria");
        } else {
            n.putObject("criteria").put("cp", c.cp()).put("aic", c.aic()).put("bic", c.bic())
                    .put("sigma2", c.sigma2()).put("effectiveSize", c.effectiveSize());
        }
        LeastSquaresFit r = s.refit();
        if (r == null) {
            n.putNull("refit");
        } else {
            ObjectNode rn = n.putObject("refit");
            ObjectNode rc = rn.putObject("coefficients");
            double[] beta = r.coefficients();
            for (int j : s.active()) {
                rc.put(names.get(j), beta[j]);
            }
            rn.put("intercept", r.intercept()).put("rss", r.rss()).put("r2", r.r2());
        }
        CvCurve cv = s.cv();
        if (cv == null) {
            n.putNull("cv");
        } else {
            ObjectNode cn = n.putObject("cv");
            cn.put("folds", cv.folds());
            cn.put("minIndex", cv.minIndex());
            cn.put("oneSeIndex", cv.oneSeIndex());
            array(cn.putArray("relativePenalties"), cv.relativePenalties());
            array(cn.putArray("mean"), cv.mean());
            array(cn.putArray("standardError"), cv.standardError());
        }
        if (s.note() == null) {
            n.putNull("note");
        } else {
            n.put("note", s.note());
        }
        return n;
    }

    private static void array(ArrayNode a, double[] v) {
        for (double x : v) {
            a.add(x);
        }
    }
}

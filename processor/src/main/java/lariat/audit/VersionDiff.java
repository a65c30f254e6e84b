package lariat.audit;

import lariat.schema.ActiveFeature;
import lariat.schema.ModelVersion;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;

/**
 * What changed from one version of a key to another: features that entered or left the active
 * set, features whose raw coefficient changed sign, every coefficient that changed (a feature
 * absent from a version has coefficient 0), and the selection (rule, parameter, penalty) and fit
 * (R², records) before and after. Names are listed in the order of the later version's features,
 * then the earlier one's. Immutable.
 */
public final class VersionDiff {

    /** One coefficient before and after; 0 stands for a feature not active in that version. */
    public static final class CoefficientChange {
        private final String name;
        private final double before;
        private final double after;

        private CoefficientChange(String name, double before, double after) {
            this.name = name;
            this.before = before;
            this.after = after;
        }

        public String name() {
            return name;
        }

        public double before() {
            return before;
        }

        public double after() {
            return after;
        }

        /** {@code after - before}. */
        public double change() {
            return after - before;
        }
    }

    private final String key;
    private final long fromVersion;
    private final long toVersion;
    private final List<String> entered;
    private final List<String> left;
    private final List<String> signFlipped;
    private final List<CoefficientChange> coefficients;
    private final List<FieldDifference> selection;

    private VersionDiff(String key, long fromVersion, long toVersion, List<String> entered, List<String> left,
                        List<String> signFlipped, List<CoefficientChange> coefficients,
                        List<FieldDifference> selection) {
        this.key = key;
        this.fromVersion = fromVersion;
        this.toVersion = toVersion;
        this.entered = entered;
        this.left = left;
        this.signFlipped = signFlipped;
        this.coefficients = coefficients;
        this.selection = selection;
    }

    /**
     * The change from {@code from} to {@code to}.
     *
     * @throws IllegalArgumentException when the versions belong to different keys
     */
    public static VersionDiff of(ModelVersion from, ModelVersion to) {
        if (!from.getKey().equals(to.getKey())) {
            throw new IllegalArgumentException("versions of different keys: '" + from.getKey() + "' and '"
                    + to.getKey() + "'");
        }
        Map<String, Double> before = coefficients(from);
        Map<String, Double> after = coefficients(to);
        List<String> entered = new ArrayList<>();
        List<String> flipped = new ArrayList<>();
        List<CoefficientChange> changes = new ArrayList<>();
        for (Map.Entry<String, Double> e : after.entrySet()) {
            Double b = before.get(e.getKey());
            double a = e.getValue();
            if (b == null) {
                entered.add(e.getKey());
            } else if (Math.signum(b) * Math.signum(a) < 0) {
                flipped.add(e.getKey());
            }
            double bv = b == null ? 0.0 : b;
            if (Double.doubleToLongBits(bv) != Double.doubleToLongBits(a)) {
                changes.add(new CoefficientChange(e.getKey(), bv, a));
            }
        }
        List<String> left = new ArrayList<>();
        for (Map.Entry<String, Double> e : before.entrySet()) {
            if (!after.containsKey(e.getKey())) {
                left.add(e.getKey());
                changes.add(new CoefficientChange(e.getKey(), e.getValue(), 0.0));
            }
        }
        return new VersionDiff(from.getKey(), from.getVersion(), to.getVersion(), List.copyOf(entered),
                List.copyOf(left), List.copyOf(flipped), List.copyOf(changes), selection(from, to));
    }

    private static Map<String, Double> coefficients(ModelVersion v) {
        Map<String, Double> m = new LinkedHashMap<>();
        for (ActiveFeature f : v.getFeatures()) {
            m.put(f.getName(), f.getCoefficient());
        }
        return m;
    }

    private static List<FieldDifference> selection(ModelVersion from, ModelVersion to) {
        List<FieldDifference> out = new ArrayList<>();
        add(out, "selectionRule", from.getSelectionRule(), to.getSelectionRule());
        add(out, "selectionParameter", from.getSelectionParameter(), to.getSelectionParameter());
        add(out, "penalty", from.getPenalty(), to.getPenalty());
        add(out, "relativePenalty", from.getRelativePenalty(), to.getRelativePenalty());
        add(out, "r2", from.getR2(), to.getR2());
        add(out, "recordCount", from.getRecordCount(), to.getRecordCount());
        add(out, "configHash", from.getConfigHash(), to.getConfigHash());
        return List.copyOf(out);
    }

    private static void add(List<FieldDifference> out, String field, Object before, Object after) {
        boolean same = before instanceof Double && after instanceof Double
                ? Double.doubleToLongBits((Double) before) == Double.doubleToLongBits((Double) after)
                : Objects.equals(before, after);
        if (!same) {
            out.add(FieldDifference.of(field, String.valueOf(before), String.valueOf(after)));
        }
    }

    public String key() {
        return key;
    }

    public long fromVersion() {
        return fromVersion;
    }

    public long toVersion() {
        return toVersion;
    }

    /** Features active in the later version and not in the earlier one. */
    public List<String> entered() {
        return entered;
    }

    /** Features active in the earlier version and not in the later one. */
    public List<String> left() {
        return left;
    }

    /** Features active in both whose coefficient has the opposite sign. */
    public List<String> signFlipped() {
        return signFlipped;
    }

    /** Every coefficient whose bits differ, including entering (from 0) and leaving (to 0) ones. */
    public List<CoefficientChange> coefficientChanges() {
        return coefficients;
    }

    /**
     * Selection and fit fields that differ, as earlier ("expected") and later ("actual") values:
     * selectionRule, selectionParameter, penalty, relativePenalty, r2, recordCount, configHash.
     */
    public List<FieldDifference> selectionChanges() {
        return selection;
    }

    /** Whether the selected active set is the same, signs included. */
    public boolean sameActiveSet() {
        return entered.isEmpty() && left.isEmpty() && signFlipped.isEmpty();
    }
}

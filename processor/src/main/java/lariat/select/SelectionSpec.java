package lariat.select;

/**
 * What to select: a rule, its parameter, the one-standard-error option (cross-validation only) and
 * whether to refit least squares on the chosen active set. Immutable.
 */
public final class SelectionSpec {

    private final SelectionRule rule;
    private final double value;
    private final boolean oneStandardError;
    private final boolean refit;

    private SelectionSpec(SelectionRule rule, double value, boolean oneStandardError, boolean refit) {
        this.rule = rule;
        this.value = value;
        this.oneStandardError = oneStandardError;
        this.refit = refit;
    }

    /**
     * @param value r in [0, 1] for {@code RELATIVE_PENALTY}; a whole number m &gt;= 0 for {@code MAX_ACTIVE};
     *              R² in [0, 1] for {@code TARGET_R2}; ignored (may be NaN) for the other rules
     * @throws IllegalArgumentException naming the rule and value when the value is out of range
     */
    public static SelectionSpec of(SelectionRule rule, double value, boolean oneStandardError, boolean refit) {
        if (rule == null) {
            throw new IllegalArgumentException("rule is null");
        }
        switch (rule) {
            case RELATIVE_PENALTY, TARGET_R2 -> {
                if (!(value >= 0 && value <= 1)) {
                    throw new IllegalArgumentException(rule.label() + " needs a value in [0, 1], got " + value);
                }
            }
            case MAX_ACTIVE -> {
                if (!(value >= 0) || value != Math.rint(value) || value > Integer.MAX_VALUE) {
                    throw new IllegalArgumentException("max-active needs a whole number >= 0, got " + value);
                }
            }
            default -> {
            }
        }
        return new SelectionSpec(rule, value, oneStandardError, refit);
    }

    public SelectionRule rule() {
        return rule;
    }

    public double value() {
        return value;
    }

    public boolean oneStandardError() {
        return oneStandardError;
    }

    public boolean refit() {
        return refit;
    }
}

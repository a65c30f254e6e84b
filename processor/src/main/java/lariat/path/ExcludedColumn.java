package lariat.path;

import java.util.Objects;

/** A column the engine set aside, with the reason and the numbers behind it. */
public final class ExcludedColumn {

    /** Why a column was set aside. */
    public enum Reason {
        /** Zero (or negligible) variance: it cannot explain anything and cannot be standardized. */
        CONSTANT,
        /** Linearly dependent on the active set when it was about to join it. */
        COLLINEAR
    }

    private final int column;
    private final Reason reason;
    private final int step;
    private final String detail;

    private ExcludedColumn(int column, Reason reason, int step, String detail) {
        if (column < 0) {
            throw new IllegalArgumentException("column must be >= 0, was " + column);
        }
        if (step < 0) {
            throw new IllegalArgumentException("step must be >= 0, was " + step);
        }
        this.column = column;
        this.step = step;
        this.reason = Objects.requireNonNull(reason, "reason");
        this.detail = Objects.requireNonNull(detail, "detail");
    }

    /**
     * Creates an exclusion record.
     *
     * @param column zero-based column index of the input
     * @param step   the step from which on the column is set aside (0 for constant columns); a collinear
     *               column may have been active, with a nonzero coefficient, at knots before this step
     */
    public static ExcludedColumn of(int column, Reason reason, int step, String detail) {
        return new ExcludedColumn(column, reason, step, detail);
    }

    public int column() {
        return column;
    }

    public Reason reason() {
        return reason;
    }

    /** The first step (knot index) at which the column no longer takes part. */
    public int step() {
        return step;
    }

    /** Human-readable numbers that triggered the exclusion. */
    public String detail() {
        return detail;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof ExcludedColumn e && e.column == column && e.reason == reason && e.step == step
                && e.detail.equals(detail);
    }

    @Override
    public int hashCode() {
        return Objects.hash(column, reason, step, detail);
    }

    @Override
    public String toString() {
        return "ExcludedColumn{" + column + ", " + reason + ", step " + step + ", " + detail + "}";
    }
}

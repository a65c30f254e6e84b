package lariat.path;

/** Why a path ended where it did. */
public enum StopReason {
    /** The path reached its end: the least-squares (or ridge) fit on a design of full column rank. */
    COMPLETE,
    /** A column would have joined the active set beyond {@link PathOptions#maxActive()}. */
    MAX_ACTIVE,
    /** A knot reached {@link PathOptions#targetR2()}. */
    TARGET_R2,
    /** A knot's relative penalty fell to {@link PathOptions#minRelativePenalty()} or below. */
    MIN_PENALTY,
    /** The number of steps reached {@link PathOptions#maxSteps()} or the engine's guard of 10·(p + 1). */
    MAX_STEPS,
    /**
     * The path reached its end on a rank-deficient design: at least one column was set aside as
     * {@link ExcludedColumn.Reason#COLLINEAR}, so the last knot is the least-squares fit on a maximal
     * linearly independent subset of the columns (always the case when p exceeds the number of rows).
     */
    RANK
}

package lariat.path;

/**
 * Which path the engine follows.
 *
 * <p>Both are the algorithms of Efron, Hastie, Johnstone and Tibshirani, "Least angle regression",
 * Annals of Statistics 32(2), 2004, 407-499 (section 2 for {@link #LAR}, section 3.1 for the lasso
 * modification).
 */
public enum PathMethod {
    /** Least angle regression: columns only ever join the active set. */
    LAR,
    /** The lasso path: LAR with the lasso modification, a coefficient that would cross zero leaves. */
    LASSO
}

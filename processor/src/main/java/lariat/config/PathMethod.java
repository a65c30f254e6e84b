package lariat.config;

/** Which path the engine traces ({@code path.method}). */
public enum PathMethod implements Choice {
    /** Least angle regression with the lasso modification: a coefficient crossing zero leaves the active set. */
    LASSO("lasso"),
    /** Plain least angle regression: variables only enter. */
    LAR("lar");

    private final String id;

    PathMethod(String id) {
        this.id = id;
    }

    @Override
    public String id() {
        return id;
    }
}

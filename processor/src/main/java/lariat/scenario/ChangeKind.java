package lariat.scenario;

/** How an injected change alters a station's true model. */
public enum ChangeKind {
    /** A channel starts driving the target. */
    ENTERS("enters"),
    /** A driving channel stops driving the target. */
    LEAVES("leaves"),
    /** A driving channel's coefficient changes sign, keeping its size. */
    SIGN_FLIP("flips sign");

    private final String verb;

    ChangeKind(String verb) {
        this.verb = verb;
    }

    /** A short verb phrase, e.g. "enters". */
    public String verb() {
        return verb;
    }
}

package lariat.config;

/** What happens to a record that lacks one of its key's feature channels ({@code missing.channel.policy}). */
public enum MissingChannelPolicy implements Choice {
    /** The record goes to the dead-letter topic with reason MISSING_FIELD. */
    REJECT("reject"),
    /** The record is counted as skipped and does not update its key; it is not a dead letter. */
    SKIP("skip");

    private final String id;

    MissingChannelPolicy(String id) {
        this.id = id;
    }

    @Override
    public String id() {
        return id;
    }
}

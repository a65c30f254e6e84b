package lariat.audit;

/** Receives a replay's progress; called from the replaying thread. */
@FunctionalInterface
public interface Progress {

    /** Does nothing. */
    Progress NONE = (what, offset, target, records, seconds, finished) -> { };

    /**
     * @param what     what is replayed, e.g. {@code topic/partition}
     * @param offset   next input offset to read
     * @param target   offset the replay stops at
     * @param records  records read so far
     * @param seconds  seconds since the replay started
     * @param finished whether this is the last call for this replay
     */
    void report(String what, long offset, long target, long records, double seconds, boolean finished);
}

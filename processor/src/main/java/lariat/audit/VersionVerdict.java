package lariat.audit;

import java.util.List;

/**
 * The audit result of one published version: its status and the evidence. Immutable.
 *
 * <ul>
 *   <li>{@link Status#PASS}: the configuration hash matches and the replay reproduced every
 *       compared field bit for bit.</li>
 *   <li>{@link Status#FAIL}: a field differs ({@link #differences()}, the first is the first in
 *       schema order), or the replay could not produce the version ({@link #detail()}).</li>
 *   <li>{@link Status#MISSING_INPUT}: input records the version depends on are no longer in the
 *       log; {@link #missingFrom()} to {@link #missingTo()} (inclusive) are the missing offsets.</li>
 * </ul>
 */
public final class VersionVerdict {

    /** Outcome of one version's audit. */
    public enum Status { PASS, FAIL, MISSING_INPUT }

    private final String key;
    private final long version;
    private final String inputTopic;
    private final int inputPartition;
    private final long inputEndOffset;
    private final Status status;
    private final String recordedConfigHash;
    private final String givenConfigHash;
    private final String expectedFingerprint;
    private final String actualFingerprint;
    private final List<FieldDifference> differences;
    private final long missingFrom;
    private final long missingTo;
    private final String detail;

    private VersionVerdict(Builder b) {
        this.key = b.key;
        this.version = b.version;
        this.inputTopic = b.inputTopic;
        this.inputPartition = b.inputPartition;
        this.inputEndOffset = b.inputEndOffset;
        this.status = b.status;
        this.recordedConfigHash = b.recordedConfigHash;
        this.givenConfigHash = b.givenConfigHash;
        this.expectedFingerprint = b.expectedFingerprint;
        this.actualFingerprint = b.actualFingerprint;
        this.differences = List.copyOf(b.differences);
        this.missingFrom = b.missingFrom;
        this.missingTo = b.missingTo;
        this.detail = b.detail;
    }

    /** A builder for the verdict of {@code v} under the configuration hash {@code givenConfigHash}. */
    static Builder builder(PublishedVersion v, String givenConfigHash) {
        Builder b = new Builder();
        b.key = v.key();
        b.version = v.version();
        b.inputTopic = v.inputTopic();
        b.inputPartition = v.inputPartition();
        b.inputEndOffset = v.inputEndOffset();
        b.recordedConfigHash = v.record().getConfigHash();
        b.givenConfigHash = givenConfigHash;
        b.expectedFingerprint = v.record().getMomentsFingerprint();
        return b;
    }

    /** Collects a verdict's parts. */
    static final class Builder {
        private String key;
        private long version;
        private String inputTopic;
        private int inputPartition;
        private long inputEndOffset;
        private Status status = Status.FAIL;
        private String recordedConfigHash;
        private String givenConfigHash;
        private String expectedFingerprint;
        private String actualFingerprint;
        private List<FieldDifference> differences = List.of();
        private long missingFrom = -1;
        private long missingTo = -1;
        private String detail;

        Builder actual(String fingerprint, List<FieldDifference> diffs) {
            this.actualFingerprint = fingerprint;
            this.differences = diffs;
            this.status = diffs.isEmpty() ? Status.PASS : Status.FAIL;
            return this;
        }

        Builder failed(String why) {
            this.status = Status.FAIL;
            this.detail = why;
            return this;
        }

        Builder missing(long from, long to, String why) {
            this.status = Status.MISSING_INPUT;
            this.missingFrom = from;
            this.missingTo = to;
            this.detail = why;
            return this;
        }

        Builder note(String text) {
            this.detail = detail == null ? text : detail + "; " + text;
            return this;
        }

        VersionVerdict build() {
            return new VersionVerdict(this);
        }
    }

    public String key() {
        return key;
    }

    public long version() {
        return version;
    }

    public String inputTopic() {
        return inputTopic;
    }

    public int inputPartition() {
        return inputPartition;
    }

    public long inputEndOffset() {
        return inputEndOffset;
    }

    public Status status() {
        return status;
    }

    public boolean passed() {
        return status == Status.PASS;
    }

    public String recordedConfigHash() {
        return recordedConfigHash;
    }

    public String givenConfigHash() {
        return givenConfigHash;
    }

    public boolean configHashMatches() {
        return recordedConfigHash.equals(givenConfigHash);
    }

    /** The published moments fingerprint. */
    public String expectedFingerprint() {
        return expectedFingerprint;
    }

    /** The recomputed moments fingerprint, or null when nothing was recomputed. */
    public String actualFingerprint() {
        return actualFingerprint;
    }

    /** Fields that differ, in schema order. */
    public List<FieldDifference> differences() {
        return differences;
    }

    /** The first differing field, or null. */
    public String firstDifferingField() {
        return differences.isEmpty() ? null : differences.get(0).field();
    }

    /** First missing input offset, or -1. */
    public long missingFrom() {
        return missingFrom;
    }

    /** Last missing input offset (inclusive), or -1. */
    public long missingTo() {
        return missingTo;
    }

    /** Why the version failed or is missing input, or a note; null when there is nothing to say. */
    public String detail() {
        return detail;
    }
}

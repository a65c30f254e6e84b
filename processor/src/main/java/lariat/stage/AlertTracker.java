package lariat.stage;

import java.io.DataInput;
import java.io.DataOutput;
import java.io.IOException;

/**
 * Decides when a change of a key's selected active set is announced. A set that differs from
 * the announced one becomes a candidate; the candidate is announced once it has been selected
 * at {@code persistence} consecutive refits (1 announces every change at once). Selecting the
 * announced set again, or a different set, resets the count. Mutable; part of a key's
 * snapshot so the rule survives restarts. The announced set starts empty, so a key's first
 * non-empty selection is announced as features entering.
 */
final class AlertTracker {

    /** An announcement: the set announced before, and when the new set was first seen. */
    static final class Announcement {
        final ActiveSet before;
        final long beforeVersion;
        final long firstSeenVersion;
        final int heldRefits;

        private Announcement(ActiveSet before, long beforeVersion, long firstSeenVersion, int heldRefits) {
            this.before = before;
            this.beforeVersion = beforeVersion;
            this.firstSeenVersion = firstSeenVersion;
            this.heldRefits = heldRefits;
        }
    }

    private ActiveSet announced;
    private long announcedVersion;
    private ActiveSet candidate;
    private long candidateSince;
    private int held;

    AlertTracker() {
        this(ActiveSet.empty(), 0, ActiveSet.empty(), 0, 0);
    }

    private AlertTracker(ActiveSet announced, long announcedVersion, ActiveSet candidate, long candidateSince,
                         int held) {
        this.announced = announced;
        this.announcedVersion = announcedVersion;
        this.candidate = candidate;
        this.candidateSince = candidateSince;
        this.held = held;
    }

    /**
     * Feeds the set selected at the refit that produced {@code version}. Returns the
     * announcement when {@code selected} is announced now, or null.
     *
     * @throws IllegalArgumentException when {@code persistence < 1}
     */
    Announcement offer(ActiveSet selected, long version, int persistence) {
        if (persistence < 1) {
            throw new IllegalArgumentException("persistence must be >= 1, was " + persistence);
        }
        if (selected.equals(announced)) {
            candidate = ActiveSet.empty();
            held = 0;
            return null;
        }
        if (held > 0 && selected.equals(candidate)) {
            held++;
        } else {
            candidate = selected;
            candidateSince = version;
            held = 1;
        }
        if (held < persistence) {
            return null;
        }
        Announcement a = new Announcement(announced, announcedVersion, candidateSince, held);
        announced = selected;
        announcedVersion = version;
        candidate = ActiveSet.empty();
        held = 0;
        return a;
    }

    ActiveSet announced() {
        return announced;
    }

    void write(DataOutput out) throws IOException {
        announced.write(out);
        out.writeLong(announcedVersion);
        candidate.write(out);
        out.writeLong(candidateSince);
        out.writeInt(held);
    }

    static AlertTracker read(DataInput in) throws IOException {
        ActiveSet a = ActiveSet.read(in);
        long av = in.readLong();
        ActiveSet c = ActiveSet.read(in);
        long cs = in.readLong();
        int h = in.readInt();
        if (h < 0 || av < 0 || cs < 0) {
            throw new IOException("corrupt alert state: held=" + h + ", versions " + av + ", " + cs);
        }
        return new AlertTracker(a, av, c, cs, h);
    }
}

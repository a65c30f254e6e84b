package lariat.stage;

import java.io.DataInput;
import java.io.DataOutput;
import java.io.IOException;

/**
 * Decides when a change of a key's selected active set is announced. A set that differs from
 * the announced one becomes a candidate; the candidate is announced once it has been selected
 * at {@code persistence} consecutive refits (1 announces every change at once). Selecting the
 * announced set again, or a different set, resets the count. Mutable; part of a key's
 * snapshot so the rule survives restarts.
 */
final class AlertTracker {

    private ActiveSet announced;
    private ActiveSet candidate;
    private int held;

    AlertTracker() {
        this(ActiveSet.empty(), ActiveSet.empty(), 0);
    }

    private AlertTracker(ActiveSet announced, ActiveSet candidate, int held) {
        this.announced = announced;
        this.candidate = candidate;
        this.held = held;
    }

    /**
     * Feeds the set selected at one refit. Returns the previously announced set when
     * {@code selected} is now announced, or null when nothing is announced.
     *
     * @throws IllegalArgumentException when {@code persistence < 1}
     */
    ActiveSet offer(ActiveSet selected, int persistence) {
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
            held = 1;
        }
        if (held < persistence) {
            return null;
        }
        ActiveSet before = announced;
        announced = selected;
        candidate = ActiveSet.empty();
        held = 0;
        return before;
    }

    ActiveSet announced() {
        return announced;
    }

    AlertTracker copy() {
        return new AlertTracker(announced, candidate, held);
    }

    void write(DataOutput out) throws IOException {
        announced.write(out);
        candidate.write(out);
        out.writeInt(held);
    }

    static AlertTracker read(DataInput in) throws IOException {
        ActiveSet a = ActiveSet.read(in);
        ActiveSet c = ActiveSet.read(in);
        int h = in.readInt();
        if (h < 0) {
            throw new IOException("negative persistence count " + h);
        }
        return new AlertTracker(a, c, h);
    }
}

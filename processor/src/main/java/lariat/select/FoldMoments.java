package lariat.select;

import java.util.ArrayList;
import java.util.List;
import lariat.moments.Accumulator;
import lariat.moments.Moments;

/**
 * K accumulators, one per cross-validation fold. A record goes to the fold chosen by {@link FoldAssignment}
 * from its ordinal, or to a fold the caller names. The training moments of fold k are the merge of the
 * other folds; the held-out moments are fold k's own.
 *
 * <p>Every fold is an {@link Accumulator} of one kind: plain moments, or the same kind and parameters as a
 * key's main accumulator ({@link #FoldMoments(Accumulator, int)}: same block size and half-life, or same
 * window), so the folds forget, or move with the window, exactly as the main moments do. Folds are read aligned on the
 * largest event time any fold has seen ({@link Accumulator#momentsAsOf}), so that with forgetting every
 * record carries weight w · 2^(−(T − t)/h) in its fold and the merge of all folds equals the main moments up
 * to rounding. Mutable, not thread-safe.
 */
public final class FoldMoments {

    private final Accumulator[] folds;
    private long latest = Long.MIN_VALUE;

    /** K empty plain folds of width {@code width} (record-by-record moments, no forgetting). */
    public FoldMoments(int width, int folds) {
        this(Accumulator.plain(width), folds);
    }

    /**
     * K empty folds of the kind and parameters of {@code prototype} (its contents are not copied).
     *
     * @throws IllegalArgumentException when {@code folds < 2} or the prototype is null
     */
    public FoldMoments(Accumulator prototype, int folds) {
        if (folds < 2) {
            throw new IllegalArgumentException("folds must be >= 2, was " + folds);
        }
        if (prototype == null) {
            throw new IllegalArgumentException("prototype is null");
        }
        this.folds = new Accumulator[folds];
        for (int k = 0; k < folds; k++) {
            this.folds[k] = prototype.emptyLike();
        }
    }

    private FoldMoments(Accumulator[] folds) {
        this.folds = folds;
        for (Accumulator f : folds) {
            if (f.count() > 0) {
                latest = Math.max(latest, f.moments().maxEventTimeMs());
            }
        }
    }

    /**
     * Plain folds holding copies of {@code folds}, in order, e.g. to restore fold moments written as plain
     * {@link Moments}.
     *
     * @throws IllegalArgumentException when fewer than two folds are given or widths differ
     */
    public static FoldMoments of(List<Moments> folds) {
        List<Accumulator> a = new ArrayList<>(folds.size());
        for (Moments m : folds) {
            a.add(Accumulator.plainOf(m));
        }
        return ofAccumulators(a);
    }

    /**
     * Folds made of {@code folds} themselves (not copied), in order: the inverse of {@link #accumulators()}
     * after a round trip through {@link Accumulator#toBytes()}.
     *
     * @throws IllegalArgumentException when fewer than two folds are given or widths differ
     */
    public static FoldMoments ofAccumulators(List<Accumulator> folds) {
        if (folds.size() < 2) {
            throw new IllegalArgumentException("folds must hold >= 2 accumulators, was " + folds.size());
        }
        Accumulator[] a = folds.toArray(new Accumulator[0]);
        for (int k = 0; k < a.length; k++) {
            if (a[k].width() != a[0].width()) {
                throw new IllegalArgumentException("folds[" + k + "] has width " + a[k].width()
                        + ", folds[0] has " + a[0].width());
            }
        }
        return new FoldMoments(a);
    }

    /**
     * Adds a record to the fold of its ordinal. Modifies one fold; see {@link Accumulator#add}.
     *
     * @return false when the fold is a window and refused the record as too old (nothing changed)
     */
    public boolean add(double[] z, double weight, long eventTimeMs, long ordinal) {
        return addToFold(FoldAssignment.fold(ordinal, folds.length), z, weight, eventTimeMs);
    }

    /**
     * Adds a record to fold {@code fold}.
     *
     * @return false when the fold is a window and refused the record as too old (nothing changed)
     */
    public boolean addToFold(int fold, double[] z, double weight, long eventTimeMs) {
        checkFold(fold);
        boolean added = folds[fold].add(z, weight, eventTimeMs);
        if (added) {
            latest = Math.max(latest, eventTimeMs);
        }
        return added;
    }

    public int folds() {
        return folds.length;
    }

    public int width() {
        return folds[0].width();
    }

    /** Fold k's moments aligned on the latest event time (the held-out part), a new object. */
    public Moments heldOut(int fold) {
        checkFold(fold);
        return folds[fold].momentsAsOf(latest);
    }

    /** The merge of every fold but k, aligned on the latest event time (the training part), a new object. */
    public Moments training(int fold) {
        checkFold(fold);
        Moments t = new Moments(width());
        for (int k = 0; k < folds.length; k++) {
            if (k != fold) {
                t.merge(folds[k].momentsAsOf(latest));
            }
        }
        return t;
    }

    /** The merge of all folds aligned on the latest event time, a new object. */
    public Moments all() {
        Moments t = new Moments(width());
        for (Accumulator f : folds) {
            t.merge(f.momentsAsOf(latest));
        }
        return t;
    }

    /**
     * Plain folds holding each fold's aligned moments: what {@link #heldOut} and {@link #training} read,
     * computed once (cross-validation reads every fold K times).
     */
    public FoldMoments aligned() {
        Accumulator[] a = new Accumulator[folds.length];
        for (int k = 0; k < a.length; k++) {
            a[k] = Accumulator.plainOf(folds[k].momentsAsOf(latest));
        }
        return new FoldMoments(a);
    }

    /** Copies of all folds' aligned moments in order. */
    public List<Moments> foldList() {
        List<Moments> out = new ArrayList<>();
        for (Accumulator f : folds) {
            out.add(f.momentsAsOf(latest));
        }
        return out;
    }

    /** Canonical bytes of each fold's accumulator in order (see {@link Accumulator#toBytes()}). */
    public List<byte[]> accumulators() {
        List<byte[]> out = new ArrayList<>();
        for (Accumulator f : folds) {
            out.add(f.toBytes());
        }
        return out;
    }

    private void checkFold(int fold) {
        if (fold < 0 || fold >= folds.length) {
            throw new IllegalArgumentException("fold must be in [0, " + folds.length + "), was " + fold);
        }
    }
}

package lariat.select;

import java.util.ArrayList;
import java.util.List;
import lariat.moments.Moments;

/**
 * K accumulators of {@link Moments}, one per cross-validation fold. A record goes to the fold chosen by
 * {@link FoldAssignment} from its ordinal, or to a fold the caller names. The training moments of fold k
 * are the merge of the other folds; the held-out moments are fold k's own. Mutable, not thread-safe.
 */
public final class FoldMoments {

    private final Moments[] folds;

    /** K empty folds of width {@code width}. */
    public FoldMoments(int width, int folds) {
        if (folds < 2) {
            throw new IllegalArgumentException("folds must be >= 2, was " + folds);
        }
        this.folds = new Moments[folds];
        for (int k = 0; k < folds; k++) {
            this.folds[k] = new Moments(width);
        }
    }

    /**
     * Folds holding copies of {@code folds}, in order (the inverse of {@link #foldList()}), e.g. to
     * restore fold moments from their canonical bytes.
     *
     * @throws IllegalArgumentException when fewer than two folds are given or widths differ
     */
    public static FoldMoments of(List<Moments> folds) {
        if (folds.size() < 2) {
            throw new IllegalArgumentException("folds must hold >= 2 moments, was " + folds.size());
        }
        FoldMoments f = new FoldMoments(folds.get(0).width(), folds.size());
        for (int k = 0; k < folds.size(); k++) {
            if (folds.get(k).width() != f.width()) {
                throw new IllegalArgumentException("folds[" + k + "] has width " + folds.get(k).width()
                        + ", folds[0] has " + f.width());
            }
            f.folds[k] = folds.get(k).copy();
        }
        return f;
    }

    /** Adds a record to the fold of its ordinal. Modifies one fold; see {@link Moments#add}. */
    public void add(double[] z, double weight, long eventTimeMs, long ordinal) {
        folds[FoldAssignment.fold(ordinal, folds.length)].add(z, weight, eventTimeMs);
    }

    /** Adds a record to fold {@code fold}. */
    public void addToFold(int fold, double[] z, double weight, long eventTimeMs) {
        checkFold(fold);
        folds[fold].add(z, weight, eventTimeMs);
    }

    public int folds() {
        return folds.length;
    }

    public int width() {
        return folds[0].width();
    }

    /** A copy of fold k's moments (the held-out part). */
    public Moments heldOut(int fold) {
        checkFold(fold);
        return folds[fold].copy();
    }

    /** The merge of every fold but k (the training part), a new object. */
    public Moments training(int fold) {
        checkFold(fold);
        Moments t = new Moments(width());
        for (int k = 0; k < folds.length; k++) {
            if (k != fold) {
                t.merge(folds[k]);
            }
        }
        return t;
    }

    /** The merge of all folds, a new object. */
    public Moments all() {
        Moments t = new Moments(width());
        for (Moments f : folds) {
            t.merge(f);
        }
        return t;
    }

    /** Copies of all folds in order. */
    public List<Moments> foldList() {
        List<Moments> out = new ArrayList<>();
        for (Moments f : folds) {
            out.add(f.copy());
        }
        return out;
    }

    private void checkFold(int fold) {
        if (fold < 0 || fold >= folds.length) {
            throw new IllegalArgumentException("fold must be in [0, " + folds.length + "), was " + fold);
        }
    }
}

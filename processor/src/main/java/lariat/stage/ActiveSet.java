package lariat.stage;

import java.io.DataInput;
import java.io.DataOutput;
import java.io.IOException;
import java.util.Arrays;

/**
 * A selected active set: feature indexes in increasing order, each with the sign (+1 or -1)
 * of its coefficient. Immutable.
 */
public final class ActiveSet {

    private static final ActiveSet EMPTY = new ActiveSet(new int[0], new int[0]);

    private final int[] features;
    private final int[] signs;

    private ActiveSet(int[] features, int[] signs) {
        this.features = features;
        this.signs = signs;
    }

    /** The empty set. */
    public static ActiveSet empty() {
        return EMPTY;
    }

    /**
     * The set of features with nonzero {@code coefficients}, signed by them.
     */
    public static ActiveSet ofCoefficients(double[] coefficients) {
        int n = 0;
        for (double c : coefficients) {
            if (c != 0.0) {
                n++;
            }
        }
        int[] f = new int[n];
        int[] s = new int[n];
        for (int j = 0, k = 0; j < coefficients.length; j++) {
            if (coefficients[j] != 0.0) {
                f[k] = j;
                s[k++] = coefficients[j] > 0 ? 1 : -1;
            }
        }
        return new ActiveSet(f, s);
    }

    /**
     * A set from strictly increasing {@code features} and their {@code signs}.
     *
     * @throws IllegalArgumentException when lengths differ, indexes are not strictly increasing
     *                                  and non-negative, or a sign is not +1 or -1
     */
    public static ActiveSet of(int[] features, int[] signs) {
        if (features.length != signs.length) {
            throw new IllegalArgumentException("signs length " + signs.length + " != features length "
                    + features.length);
        }
        for (int i = 0; i < features.length; i++) {
            if (features[i] < 0 || (i > 0 && features[i] <= features[i - 1])) {
                throw new IllegalArgumentException("features must be strictly increasing and >= 0, was "
                        + Arrays.toString(features));
            }
            if (signs[i] != 1 && signs[i] != -1) {
                throw new IllegalArgumentException("signs[" + i + "] must be +1 or -1, was " + signs[i]);
            }
        }
        return new ActiveSet(features.clone(), signs.clone());
    }

    public int size() {
        return features.length;
    }

    public int[] features() {
        return features.clone();
    }

    public int[] signs() {
        return signs.clone();
    }

    /** Sign of feature {@code j}, or 0 when it is not in the set. */
    public int signOf(int j) {
        int i = Arrays.binarySearch(features, j);
        return i < 0 ? 0 : signs[i];
    }

    /** Features in this set and not in {@code before}. */
    public int[] enteredSince(ActiveSet before) {
        return Arrays.stream(features).filter(j -> before.signOf(j) == 0).toArray();
    }

    /** Features in {@code before} and not in this set. */
    public int[] leftSince(ActiveSet before) {
        return Arrays.stream(before.features).filter(j -> signOf(j) == 0).toArray();
    }

    /** Features in both sets with opposite signs. */
    public int[] flippedSince(ActiveSet before) {
        return Arrays.stream(features).filter(j -> before.signOf(j) == -signOf(j)).toArray();
    }

    void write(DataOutput out) throws IOException {
        out.writeInt(features.length);
        for (int i = 0; i < features.length; i++) {
            out.writeInt(features[i]);
            out.writeByte(signs[i]);
        }
    }

    static ActiveSet read(DataInput in) throws IOException {
        int n = in.readInt();
        if (n < 0 || n > 1 << 24) {
            throw new IOException("active set size out of range: " + n);
        }
        int[] f = new int[n];
        int[] s = new int[n];
        for (int i = 0; i < n; i++) {
            f[i] = in.readInt();
            s[i] = in.readByte();
        }
        try {
            return of(f, s);
        } catch (IllegalArgumentException e) {
            throw new IOException("corrupt active set", e);
        }
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof ActiveSet && Arrays.equals(features, ((ActiveSet) o).features)
                && Arrays.equals(signs, ((ActiveSet) o).signs);
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(features) + Arrays.hashCode(signs);
    }

    @Override
    public String toString() {
        StringBuilder b = new StringBuilder("{");
        for (int i = 0; i < features.length; i++) {
            b.append(i == 0 ? "" : ", ").append(signs[i] > 0 ? '+' : '-').append(features[i]);
        }
        return b.append('}').toString();
    }
}

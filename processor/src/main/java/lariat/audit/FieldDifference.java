package lariat.audit;

/**
 * One field whose published and recomputed values differ: its path in the record (for example
 * {@code features[0].coefficient}) and both values as text. A double is written as its decimal
 * (shortest form that reads back to the same bits, {@link Double#toString(double)}) followed by
 * its IEEE 754 bits in hex, so two values that print alike still show how they differ. Immutable.
 */
public final class FieldDifference {

    private final String field;
    private final String expected;
    private final String actual;

    private FieldDifference(String field, String expected, String actual) {
        this.field = field;
        this.expected = expected;
        this.actual = actual;
    }

    /**
     * @param field    path of the field in the record
     * @param expected the published value as text
     * @param actual   the recomputed value as text
     * @throws IllegalArgumentException when {@code field} is null or empty
     */
    public static FieldDifference of(String field, String expected, String actual) {
        if (field == null || field.isEmpty()) {
            throw new IllegalArgumentException("field must be non-empty, was " + field);
        }
        return new FieldDifference(field, String.valueOf(expected), String.valueOf(actual));
    }

    public String field() {
        return field;
    }

    /** The published value. */
    public String expected() {
        return expected;
    }

    /** The recomputed value. */
    public String actual() {
        return actual;
    }

    @Override
    public String toString() {
        return field + ": published " + expected + ", recomputed " + actual;
    }
}

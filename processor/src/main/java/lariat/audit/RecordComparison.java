package lariat.audit;

import org.apache.avro.Schema;
import org.apache.avro.generic.IndexedRecord;

import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.Set;

/**
 * Field-by-field comparison of two Avro records of one schema, walking the schema so that every
 * field is compared, including fields added later. Doubles and floats are equal only when their
 * bits are ({@link Double#doubleToLongBits}: so 0.0 and -0.0 differ, and NaN equals NaN); every
 * other value by {@code equals}. Arrays are compared element by element after their lengths.
 * Differences come in schema order, the first being the first differing field.
 */
public final class RecordComparison {

    private final Set<String> ignored;

    private RecordComparison(Set<String> ignored) {
        this.ignored = ignored;
    }

    /** A comparison that skips the top-level fields named in {@code ignored}. */
    public static RecordComparison ignoring(Set<String> ignored) {
        return new RecordComparison(Set.copyOf(ignored));
    }

    /**
     * Differences between {@code expected} and {@code actual}.
     *
     * @throws IllegalArgumentException when the records have different schemas
     */
    public List<FieldDifference> compare(IndexedRecord expected, IndexedRecord actual) {
        if (!expected.getSchema().equals(actual.getSchema())) {
            throw new IllegalArgumentException("records have different schemas: " + expected.getSchema().getFullName()
                    + " and " + actual.getSchema().getFullName());
        }
        List<FieldDifference> out = new ArrayList<>();
        for (Schema.Field f : expected.getSchema().getFields()) {
            if (!ignored.contains(f.name())) {
                value(f.name(), f.schema(), expected.get(f.pos()), actual.get(f.pos()), out);
            }
        }
        return out;
    }

    private static void record(String path, IndexedRecord e, IndexedRecord a, List<FieldDifference> out) {
        for (Schema.Field f : e.getSchema().getFields()) {
            value(path + "." + f.name(), f.schema(), e.get(f.pos()), a.get(f.pos()), out);
        }
    }

    private static void value(String path, Schema schema, Object e, Object a, List<FieldDifference> out) {
        if (e == null || a == null) {
            if (e != a) {
                out.add(FieldDifference.of(path, text(e), text(a)));
            }
            return;
        }
        if (e instanceof IndexedRecord && a instanceof IndexedRecord) {
            record(path, (IndexedRecord) e, (IndexedRecord) a, out);
            return;
        }
        if (e instanceof List && a instanceof List) {
            list(path, schema, (List<?>) e, (List<?>) a, out);
            return;
        }
        if (!sameValue(e, a)) {
            out.add(FieldDifference.of(path, text(e), text(a)));
        }
    }

    private static void list(String path, Schema schema, List<?> e, List<?> a, List<FieldDifference> out) {
        if (e.size() != a.size()) {
            out.add(FieldDifference.of(path + ".length", Integer.toString(e.size()), Integer.toString(a.size())));
        }
        Schema items = arrayItems(schema);
        int n = Math.min(e.size(), a.size());
        for (int i = 0; i < n; i++) {
            value(path + "[" + i + "]", items, e.get(i), a.get(i), out);
        }
    }

    private static Schema arrayItems(Schema s) {
        if (s.getType() == Schema.Type.ARRAY) {
            return s.getElementType();
        }
        if (s.getType() == Schema.Type.UNION) {
            for (Schema b : s.getTypes()) {
                if (b.getType() == Schema.Type.ARRAY) {
                    return b.getElementType();
                }
            }
        }
        return s;
    }

    private static boolean sameValue(Object e, Object a) {
        if (e instanceof Double && a instanceof Double) {
            return Double.doubleToLongBits((Double) e) == Double.doubleToLongBits((Double) a);
        }
        if (e instanceof Float && a instanceof Float) {
            return Float.floatToIntBits((Float) e) == Float.floatToIntBits((Float) a);
        }
        if (e instanceof CharSequence && a instanceof CharSequence) {
            return e.toString().equals(a.toString());
        }
        if (e instanceof Map || a instanceof Map) {
            return String.valueOf(e).equals(String.valueOf(a));
        }
        return e.equals(a);
    }

    /** A value as text; a double with its bits in hex, an instant with its epoch milliseconds. */
    static String text(Object v) {
        if (v instanceof Double) {
            double d = (Double) v;
            return d + " [0x" + String.format("%016x", Double.doubleToRawLongBits(d)) + "]";
        }
        if (v instanceof Instant) {
            return v + " [" + ((Instant) v).toEpochMilli() + " ms]";
        }
        return String.valueOf(v);
    }
}

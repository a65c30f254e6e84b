package lariat.codec;

import java.lang.invoke.MethodHandles;
import java.lang.invoke.VarHandle;
import java.nio.ByteOrder;
import java.util.Arrays;
import java.util.HashMap;
import java.util.IdentityHashMap;
import java.util.List;
import java.util.Map;
import lariat.config.TimeUnitChoice;
import org.apache.avro.Schema;
import org.apache.avro.SchemaNormalization;
import org.apache.avro.SystemLimitException;

/**
 * The decoding fast path for Avro input whose writer schema is the reader schema (same parsing
 * fingerprint, so schema resolution is the identity): reads the binary body (Avro 1.12 specification,
 * "Binary Encoding") straight into a {@link RowBuffer}, matching channel-map keys as UTF-8 bytes against a
 * {@link ChannelTable} and model keys through a {@link KeyCache}, with no {@code String}, map or boxed
 * number per record. Compiled once from the reader schema and the field plan.
 *
 * <p>It only ever accepts: a record it takes is one the general path ({@link FieldMapper} over Avro's
 * {@code GenericDatumReader}) accepts with the same key, layout and bits. Whenever anything is not plainly
 * valid (another fingerprint, a short or long body, a varint or length out of range, a null or text or
 * boolean where a number belongs, a non-finite or too large value, a missing or repeated channel, a bad
 * weight, time or key, a key's first record, a malformed boolean, enum or union index) it declines, and the
 * caller runs the general path on the same bytes, so every rejection and its detail come from there.
 * Not thread-safe.
 */
final class DirectAvroReader {

    private static final VarHandle LONG_LE = MethodHandles.byteArrayViewVarHandle(long[].class, ByteOrder.LITTLE_ENDIAN);
    private static final VarHandle INT_LE = MethodHandles.byteArrayViewVarHandle(int[].class, ByteOrder.LITTLE_ENDIAN);
    private static final List<String> LIMIT_PROPERTIES = List.of(SystemLimitException.MAX_BYTES_LENGTH_PROPERTY,
            SystemLimitException.MAX_COLLECTION_LENGTH_PROPERTY, SystemLimitException.MAX_STRING_LENGTH_PROPERTY,
            SystemLimitException.MAX_COLLECTION_ALLOCATION_PROPERTY);
    private static final int LAYOUT_CACHE_LIMIT = 1 << 14;
    /** Map templates kept for a fixed layout (writers that send channels in a few orders). */
    private static final int TEMPLATES = 4;

    /** What one branch of a used field holds, as the fast path reads it. */
    private static final byte OTHER = 0;
    private static final byte INT = 1;
    private static final byte LONG = 2;
    private static final byte FLOAT = 3;
    private static final byte DOUBLE = 4;
    private static final byte STRING = 5;
    private static final byte MAP = 6;

    private enum Role { UNUSED, KEY, TIME, WEIGHT, MAP, COLUMN }

    /** Thrown to leave a record the fast path does not take; never escapes this class. */
    private static final class Decline extends RuntimeException {
        private static final long serialVersionUID = 1L;

        Decline() {
            super(null, null, false, false);
        }
    }

    private static final Decline DECLINE = new Decline();

    /** The branches of one used field: kinds (one per branch), the branch schemas, whether it is a union. */
    private static final class Shape {
        final boolean union;
        final byte[] kinds;
        final Schema[] branches;

        Shape(Schema s) {
            union = s.getType() == Schema.Type.UNION;
            List<Schema> b = union ? s.getTypes() : List.of(s);
            branches = b.toArray(new Schema[0]);
            kinds = new byte[branches.length];
            for (int i = 0; i < branches.length; i++) {
                kinds[i] = kind(branches[i]);
            }
        }
    }

    private final int headerLength;
    private final long fingerprint;
    private final Schema[] fieldSchemas;
    private final Role[] roles;
    private final Shape[] shapes;
    private final int[] columnOf;
    private final Shape mapValues;
    private final boolean plainDoubles;
    private final String target;
    private final boolean keyFromRecordKey;
    private final boolean timeFromTimestamp;
    private final boolean weighted;
    private final TimeUnitChoice timeUnit;
    private final double maxAbs;
    private final ChannelLayout fixedLayout;
    private final KeyCache keys;
    private final Map<ChannelLayout, ChannelTable> tables = new IdentityHashMap<>();
    private ChannelLayout lastLayout;
    private ChannelTable lastTable;

    private byte[] buf;
    private int pos;
    private int end;
    private int keyOff;
    private int keyLen;
    private long keyNumber;
    private boolean keyIsText;
    private long timeValue;
    private double weightValue;
    private double[] columnValues;
    private int entries;
    private int[] entryOff = new int[64];
    private int[] entryLen = new int[64];
    private double[] entryValue = new double[64];
    private boolean[] entryUsable = new boolean[64];
    private int[] seen = new int[0];
    private int stamp;
    private RowBuffer row;
    private boolean mapped;
    private boolean mapFilled;
    private final MapTemplate[] templates = new MapTemplate[TEMPLATES];
    private int nextTemplate;
    private int[] slotOff = new int[64];
    private int[] slotCol = new int[64];

    private DirectAvroReader(Schema reader, FieldMapper.Plan p, Map<String, Role> roleOf, Map<String, Integer> columns,
                             boolean singleObject) {
        this.headerLength = singleObject ? AvroSingleObjectParser.HEADER_LENGTH : 0;
        this.fingerprint = SchemaNormalization.parsingFingerprint64(reader);
        List<Schema.Field> fields = reader.getFields();
        int n = fields.size();
        this.fieldSchemas = new Schema[n];
        this.roles = new Role[n];
        this.shapes = new Shape[n];
        this.columnOf = new int[n];
        Shape values = null;
        for (int i = 0; i < n; i++) {
            Schema.Field f = fields.get(i);
            fieldSchemas[i] = f.schema();
            roles[i] = roleOf.getOrDefault(f.name(), Role.UNUSED);
            shapes[i] = new Shape(f.schema());
            columnOf[i] = columns.getOrDefault(f.name(), -1);
            if (roles[i] == Role.MAP) {
                for (Schema b : shapes[i].branches) {
                    if (b.getType() == Schema.Type.MAP) {
                        values = new Shape(b.getValueType());
                    }
                }
            }
        }
        this.mapValues = values;
        this.plainDoubles = values != null && !values.union && values.kinds[0] == DOUBLE;
        this.target = p.target;
        this.keyFromRecordKey = p.keyField.isEmpty();
        this.timeFromTimestamp = p.timeField.isEmpty();
        this.weighted = !p.weightField.isEmpty();
        this.timeUnit = p.timeUnit;
        this.maxAbs = p.maxAbs;
        this.fixedLayout = p.fixedLayout;
        this.keys = new KeyCache(keyFromRecordKey);
        this.columnValues = new double[p.fixedLayout == null ? 0 : p.fixedLayout.size() + 1];
    }

    /**
     * The fast path for bodies written with {@code writer} and read as {@code reader} under plan {@code p}, or
     * {@code null} when it would not be exact: the writer's parsing fingerprint is not the reader's, a field
     * has two roles, the reader schema is recursive, features are top-level fields without a fixed layout, or
     * an Avro decoding limit is set by a system property.
     */
    static DirectAvroReader compile(Schema reader, Schema writer, FieldMapper.Plan p, boolean singleObject) {
        if (SchemaNormalization.parsingFingerprint64(writer) != SchemaNormalization.parsingFingerprint64(reader)
                || recursive(reader, new HashMap<>()) || LIMIT_PROPERTIES.stream().anyMatch(k -> System.getProperty(k) != null)) {
            return null;
        }
        Map<String, Role> roleOf = new HashMap<>();
        Map<String, Integer> columns = new HashMap<>();
        boolean ok = assign(roleOf, p.keyField, Role.KEY) && assign(roleOf, p.timeField, Role.TIME)
                && assign(roleOf, p.weightField, Role.WEIGHT);
        if (p.mapField.isEmpty()) {
            if (p.fixedLayout == null) {
                return null;
            }
            for (int c = 0; c < p.fixedLayout.size(); c++) {
                ok &= assign(roleOf, p.fixedLayout.name(c), Role.COLUMN);
                columns.put(p.fixedLayout.name(c), c);
            }
            ok &= assign(roleOf, p.target, Role.COLUMN);
            columns.put(p.target, p.fixedLayout.size());
        } else {
            ok &= assign(roleOf, p.mapField, Role.MAP);
        }
        for (String f : roleOf.keySet()) {
            ok &= reader.getField(f) != null;
        }
        return ok ? new DirectAvroReader(reader, p, roleOf, columns, singleObject) : null;
    }

    private static boolean assign(Map<String, Role> roleOf, String field, Role role) {
        return field.isEmpty() || roleOf.putIfAbsent(field, role) == null;
    }

    /** Whether a named type refers to itself (such a record would nest as deep as its bytes allow). */
    private static boolean recursive(Schema s, Map<String, Boolean> open) {
        switch (s.getType()) {
            case RECORD: {
                Boolean state = open.get(s.getFullName());
                if (state != null) {
                    return state;
                }
                open.put(s.getFullName(), true);
                for (Schema.Field f : s.getFields()) {
                    if (recursive(f.schema(), open)) {
                        return true;
                    }
                }
                open.put(s.getFullName(), false);
                return false;
            }
            case ARRAY:
                return recursive(s.getElementType(), open);
            case MAP:
                return recursive(s.getValueType(), open);
            case UNION:
                for (Schema b : s.getTypes()) {
                    if (recursive(b, open)) {
                        return true;
                    }
                }
                return false;
            default:
                return false;
        }
    }

    private static byte kind(Schema s) {
        switch (s.getType()) {
            case INT:
                return INT;
            case LONG:
                return LONG;
            case FLOAT:
                return FLOAT;
            case DOUBLE:
                return DOUBLE;
            case STRING:
                return STRING;
            case MAP:
                return MAP;
            default:
                return OTHER;
        }
    }

    /**
     * Reads one record value into {@code out}.
     *
     * @param layouts the partition's layouts, read only
     * @return true when the record is accepted and {@code out} holds it; false, with {@code out}'s contents
     *     unspecified, when the general path must decide
     */
    boolean read(byte[] recordKey, byte[] value, long timestampMs, KeyLayouts layouts, RowBuffer out) {
        if (value.length <= headerLength || (headerLength > 0 && !header(value))) {
            return false;
        }
        buf = value;
        pos = headerLength;
        end = value.length;
        entries = 0;
        mapped = false;
        row = out;
        try {
            for (int i = 0; i < roles.length; i++) {
                field(i);
            }
            if (pos != end) {
                return false;
            }
            return finish(recordKey, timestampMs, layouts, out);
        } catch (Decline d) {
            return false;
        } finally {
            buf = null;
            row = null;
        }
    }

    private boolean header(byte[] v) {
        return v[0] == (byte) 0xC3 && v[1] == (byte) 0x01 && AvroSingleObjectParser.littleEndianLong(v, 2) == fingerprint;
    }

    private void field(int i) {
        Role role = roles[i];
        if (role == Role.UNUSED) {
            skip(fieldSchemas[i]);
            return;
        }
        Shape s = shapes[i];
        byte kind = s.kinds[branch(s)];
        switch (role) {
            case KEY:
                if (kind == STRING) {
                    keyLen = length();
                    keyOff = pos;
                    pos += keyLen;
                    keyIsText = true;
                } else if (kind == INT || kind == LONG) {
                    keyNumber = integer(kind);
                    keyIsText = false;
                } else {
                    throw DECLINE;
                }
                break;
            case TIME:
                if (kind != INT && kind != LONG) {
                    throw DECLINE;
                }
                timeValue = integer(kind);
                break;
            case WEIGHT:
                weightValue = number(kind);
                break;
            case COLUMN:
                columnValues[columnOf[i]] = number(kind);
                break;
            default:
                if (kind != MAP) {
                    throw DECLINE;
                }
                map();
                break;
        }
    }

    /** The branch index of a union (checked), or 0. */
    private int branch(Shape s) {
        if (!s.union) {
            return 0;
        }
        int b = varInt();
        if (b < 0 || b >= s.kinds.length) {
            throw DECLINE;
        }
        return b;
    }

    private void map() {
        ChannelTable t = fixedLayout == null ? null : table(fixedLayout);
        if (t != null) {
            mapInto(t);
            return;
        }
        for (long count = varLong(); count != 0; count = varLong()) {
            if (count < 0 || count > end - pos) {
                throw DECLINE;
            }
            for (long j = 0; j < count; j++) {
                int len = length();
                int e = entries++;
                if (e == entryOff.length) {
                    growEntries();
                }
                entryOff[e] = pos;
                entryLen[e] = len;
                pos += len;
                int b = branch(mapValues);
                byte kind = mapValues.kinds[b];
                if (kind >= INT && kind <= DOUBLE) {
                    entryValue[e] = number(kind);
                    entryUsable[e] = true;
                } else {
                    skip(mapValues.branches[b]);
                    entryUsable[e] = false;
                }
            }
        }
    }

    /**
     * Reads the map straight into the row's columns by the fixed layout's table, declining on a repeated
     * column or a column that holds no number; {@link #mapFilled} tells whether every column was found.
     * A map whose bytes match a {@link MapTemplate} everywhere but in its double values is read by the
     * template; any other map is parsed entry by entry, and a parsed map whose values are all doubles
     * becomes a template.
     */
    private void mapInto(ChannelTable t) {
        double[] z = row.values(t.columns());
        for (MapTemplate m : templates) {
            if (m != null && m.matches(buf, pos, end)) {
                m.read(buf, pos, z);
                pos += m.length;
                mapped = true;
                mapFilled = m.filled;
                return;
            }
        }
        int base = pos;
        int mark = nextMark(t.columns());
        int found = 0;
        int e = 0;
        boolean doubles = true;
        for (long count = varLong(); count != 0; count = varLong()) {
            if (count < 0 || count > end - pos) {
                throw DECLINE;
            }
            for (int j = (int) count; j > 0; j--, e++) {
                int len = length();
                int off = pos;
                pos += len;
                int c = t.column(e, buf, off, len);
                double v;
                byte kind = DOUBLE;
                if (!plainDoubles) {
                    int b = branch(mapValues);
                    kind = mapValues.kinds[b];
                    if (kind < INT || kind > DOUBLE) {
                        if (c >= 0) {
                            throw DECLINE;
                        }
                        skip(mapValues.branches[b]);
                        doubles = false;
                        continue;
                    }
                }
                if (kind == DOUBLE) {
                    if (e == slotOff.length) {
                        slotOff = Arrays.copyOf(slotOff, 2 * e);
                        slotCol = Arrays.copyOf(slotCol, 2 * e);
                    }
                    slotOff[e] = pos - base;
                    slotCol[e] = c;
                } else {
                    doubles = false;
                }
                v = number(kind);
                if (c >= 0) {
                    if (seen[c] == mark) {
                        throw DECLINE;
                    }
                    seen[c] = mark;
                    z[c] = v;
                    found++;
                }
            }
        }
        mapped = true;
        mapFilled = found == t.columns();
        if (doubles) {
            templates[nextTemplate] = MapTemplate.of(buf, base, pos, slotOff, slotCol, e, mapFilled);
            nextTemplate = (nextTemplate + 1) % TEMPLATES;
        }
    }

    /**
     * The bytes of one parsed channel map with its values taken out: block counts, name lengths, names and
     * union branch indexes as little-endian words under masks, and where each double value sits and which
     * column it fills (-1: a channel outside the layout). A map whose bytes equal the template's at every
     * byte outside the values parses, by the Avro binary encoding, to the same entries in the same order,
     * so reading the values at the template's places gives the same row as parsing it; the values
     * themselves are checked afterwards as any parsed value is. Immutable.
     */
    private static final class MapTemplate {
        final int length;
        final boolean filled;
        private final int[] wordOff;
        private final long[] word;
        private final long[] mask;
        private final int[] valueOff;
        private final int[] valueCol;

        private MapTemplate(int length, boolean filled, int[] wordOff, long[] word, long[] mask, int[] valueOff,
                            int[] valueCol) {
            this.length = length;
            this.filled = filled;
            this.wordOff = wordOff;
            this.word = word;
            this.mask = mask;
            this.valueOff = valueOff;
            this.valueCol = valueCol;
        }

        /** The template of {@code b[from, to)}, a map of {@code values} doubles at offsets {@code off} (from {@code from}). */
        static MapTemplate of(byte[] b, int from, int to, int[] off, int[] col, int values, boolean filled) {
            int[] wo = new int[to - from];
            long[] w = new long[wo.length];
            long[] m = new long[wo.length];
            int words = 0;
            int at = 0;
            for (int v = 0; v <= values; v++) {
                int stop = v < values ? off[v] : to - from;
                while (at < stop) {
                    int n = Math.min(8, stop - at);
                    long mk = n == 8 ? -1L : (1L << (8 * n)) - 1;
                    wo[words] = at;
                    m[words] = mk;
                    w[words] = load(b, from + at) & mk;
                    words++;
                    at += n;
                }
                at += 8;
            }
            return new MapTemplate(to - from, filled, Arrays.copyOf(wo, words), Arrays.copyOf(w, words),
                    Arrays.copyOf(m, words), Arrays.copyOf(off, values), Arrays.copyOf(col, values));
        }

        /** Whether {@code b[at, at + length)} fits before {@code end} and equals the template outside its values. */
        boolean matches(byte[] b, int at, int end) {
            if (end - at < length) {
                return false;
            }
            for (int i = 0; i < word.length; i++) {
                if ((load(b, at + wordOff[i]) & mask[i]) != word[i]) {
                    return false;
                }
            }
            return true;
        }

        /** Reads the values of the map at {@code at} into their columns of {@code z}. */
        void read(byte[] b, int at, double[] z) {
            for (int i = 0; i < valueOff.length; i++) {
                int c = valueCol[i];
                if (c >= 0) {
                    z[c] = Double.longBitsToDouble((long) LONG_LE.get(b, at + valueOff[i]));
                }
            }
        }

        /** Eight bytes from {@code at} as a little-endian word, bytes past the array's end read as zero. */
        private static long load(byte[] b, int at) {
            if (at + 8 <= b.length) {
                return (long) LONG_LE.get(b, at);
            }
            long v = 0;
            for (int i = b.length - at - 1; i >= 0; i--) {
                v = (v << 8) | (b[at + i] & 0xFF);
            }
            return v;
        }
    }

    /** A fresh mark for {@link #seen} over {@code columns} columns. */
    private int nextMark(int columns) {
        if (seen.length < columns) {
            seen = new int[columns];
        }
        if (++stamp == Integer.MAX_VALUE) {
            Arrays.fill(seen, 0);
            stamp = 1;
        }
        return stamp;
    }

    private void growEntries() {
        int n = entryOff.length * 2;
        entryOff = Arrays.copyOf(entryOff, n);
        entryLen = Arrays.copyOf(entryLen, n);
        entryValue = Arrays.copyOf(entryValue, n);
        entryUsable = Arrays.copyOf(entryUsable, n);
    }

    private boolean finish(byte[] recordKey, long timestampMs, KeyLayouts layouts, RowBuffer out) {
        String key;
        if (keyFromRecordKey) {
            key = recordKey == null ? null : keys.text(recordKey, 0, recordKey.length);
        } else {
            key = keyIsText ? keys.text(buf, keyOff, keyLen) : Long.toString(keyNumber);
        }
        if (key == null || key.isEmpty() || key.length() > FieldMapper.MAX_KEY_CHARS) {
            return false;
        }
        long ms;
        if (timeFromTimestamp) {
            ms = timestampMs;
        } else {
            try {
                ms = timeUnit.toMillis(timeValue);
            } catch (ArithmeticException e) {
                return false;
            }
        }
        double w = weighted ? weightValue : 1.0;
        if (ms < 0 || !(w > 0 && w <= maxAbs && Double.isFinite(w))) {
            return false;
        }
        ChannelLayout layout = fixedLayout != null ? fixedLayout : layouts.get(key);
        if (layout == null) {
            return false;
        }
        double[] z = out.values(layout.size() + 1);
        if (mapValues == null) {
            System.arraycopy(columnValues, 0, z, 0, z.length);
        } else if (mapped ? !mapFilled : !channels(layout, z)) {
            return false;
        }
        for (double v : z) {
            if (!(Double.isFinite(v) && Math.abs(v) <= maxAbs)) {
                return false;
            }
        }
        out.set(key, layout, w, ms);
        return true;
    }

    /** Fills {@code z} from the map entries by the layout's table; false when a column is missing, repeated or not a number. */
    private boolean channels(ChannelLayout layout, double[] z) {
        ChannelTable t = table(layout);
        if (t == null) {
            return false;
        }
        int mark = nextMark(t.columns());
        int found = 0;
        for (int e = 0; e < entries; e++) {
            int c = t.column(e, buf, entryOff[e], entryLen[e]);
            if (c < 0) {
                continue;
            }
            if (!entryUsable[e] || seen[c] == mark) {
                return false;
            }
            seen[c] = mark;
            z[c] = entryValue[e];
            found++;
        }
        return found == t.columns();
    }

    private ChannelTable table(ChannelLayout layout) {
        if (layout == lastLayout) {
            return lastTable;
        }
        ChannelTable t = tables.get(layout);
        if (t == null && !tables.containsKey(layout)) {
            if (tables.size() >= LAYOUT_CACHE_LIMIT) {
                tables.clear();
            }
            t = ChannelTable.of(layout, target);
            tables.put(layout, t);
        }
        lastLayout = layout;
        lastTable = t;
        return t;
    }

    /** Skips one value of schema {@code s}, declining on anything the general path might read differently. */
    private void skip(Schema s) {
        switch (s.getType()) {
            case NULL:
                return;
            case BOOLEAN:
                need(1);
                if ((buf[pos] & 0xFE) != 0) {
                    throw DECLINE;
                }
                pos++;
                return;
            case INT:
                varInt();
                return;
            case LONG:
                varLong();
                return;
            case FLOAT:
                need(4);
                pos += 4;
                return;
            case DOUBLE:
                need(8);
                pos += 8;
                return;
            case STRING:
            case BYTES: {
                int n = length();
                pos += n;
                return;
            }
            case FIXED:
                need(s.getFixedSize());
                pos += s.getFixedSize();
                return;
            case ENUM: {
                int i = varInt();
                if (i < 0 || i >= s.getEnumSymbols().size()) {
                    throw DECLINE;
                }
                return;
            }
            case ARRAY:
            case MAP:
                for (long count = varLong(); count != 0; count = varLong()) {
                    if (count < 0 || count > end - pos) {
                        throw DECLINE;
                    }
                    for (long j = 0; j < count; j++) {
                        if (s.getType() == Schema.Type.MAP) {
                            int n = length();
                            pos += n;
                            skip(s.getValueType());
                        } else {
                            skip(s.getElementType());
                        }
                    }
                }
                return;
            case UNION: {
                int i = varInt();
                if (i < 0 || i >= s.getTypes().size()) {
                    throw DECLINE;
                }
                skip(s.getTypes().get(i));
                return;
            }
            case RECORD:
                for (Schema.Field f : s.getFields()) {
                    skip(f.schema());
                }
                return;
            default:
                throw DECLINE;
        }
    }

    private double number(byte kind) {
        switch (kind) {
            case INT:
                return varInt();
            case LONG:
                return varLong();
            case FLOAT: {
                need(4);
                float f = Float.intBitsToFloat((int) INT_LE.get(buf, pos));
                pos += 4;
                return f;
            }
            case DOUBLE: {
                need(8);
                double d = Double.longBitsToDouble((long) LONG_LE.get(buf, pos));
                pos += 8;
                return d;
            }
            default:
                throw DECLINE;
        }
    }

    private long integer(byte kind) {
        return kind == INT ? varInt() : varLong();
    }

    /** A string or bytes length that fits in what is left. */
    private int length() {
        long len = varLong();
        if (len < 0 || len > end - pos) {
            throw DECLINE;
        }
        return (int) len;
    }

    private void need(int bytes) {
        if (end - pos < bytes) {
            throw DECLINE;
        }
    }

    /** A zig-zag varint of at most 5 bytes whose value fits 32 bits. */
    private int varInt() {
        return (int) varint(5, 0x0F);
    }

    /** A zig-zag varint of at most 10 bytes whose value fits 64 bits. */
    private long varLong() {
        return varint(10, 0x01);
    }

    /**
     * A zig-zag varint of at most {@code maxBytes} bytes whose last byte is at most {@code lastMax}, so the
     * value fits 32 (5, 0x0F) or 64 (10, 0x01) bits; Avro's own decoder reads such varints to the same value.
     */
    private long varint(int maxBytes, int lastMax) {
        if (pos < end && buf[pos] >= 0) {
            int b = buf[pos++];
            return (b >>> 1) ^ -(b & 1);
        }
        long v = 0;
        for (int i = 0, shift = 0; i < maxBytes; i++, shift += 7) {
            if (pos >= end) {
                throw DECLINE;
            }
            int b = buf[pos++] & 0xFF;
            if (i == maxBytes - 1 && b > lastMax) {
                throw DECLINE;
            }
            v |= (long) (b & 0x7F) << shift;
            if (b < 0x80) {
                return (v >>> 1) ^ -(v & 1);
            }
        }
        throw DECLINE;
    }
}

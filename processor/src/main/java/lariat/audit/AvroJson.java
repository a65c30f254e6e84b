package lariat.audit;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import org.apache.avro.Schema;
import org.apache.avro.generic.IndexedRecord;

import java.time.Instant;
import java.util.List;

/**
 * An Avro record as a JSON tree for the command line: field names as keys, in schema order;
 * doubles as JSON numbers (Jackson writes the shortest decimal that reads back to the same bits;
 * NaN and infinities as strings); timestamps as epoch milliseconds; null as null.
 */
public final class AvroJson {

    private static final JsonNodeFactory F = JsonNodeFactory.instance;

    private AvroJson() {
    }

    /** {@code r} as a JSON object. */
    public static ObjectNode of(IndexedRecord r) {
        ObjectNode o = F.objectNode();
        for (Schema.Field f : r.getSchema().getFields()) {
            o.set(f.name(), value(r.get(f.pos())));
        }
        return o;
    }

    private static JsonNode value(Object v) {
        if (v == null) {
            return F.nullNode();
        }
        if (v instanceof IndexedRecord) {
            return of((IndexedRecord) v);
        }
        if (v instanceof List) {
            ArrayNode a = F.arrayNode();
            for (Object e : (List<?>) v) {
                a.add(value(e));
            }
            return a;
        }
        if (v instanceof Double) {
            double d = (Double) v;
            return Double.isFinite(d) ? F.numberNode(d) : F.textNode(Double.toString(d));
        }
        if (v instanceof Float) {
            return F.numberNode((Float) v);
        }
        if (v instanceof Long) {
            return F.numberNode((Long) v);
        }
        if (v instanceof Integer) {
            return F.numberNode((Integer) v);
        }
        if (v instanceof Boolean) {
            return F.booleanNode((Boolean) v);
        }
        if (v instanceof Instant) {
            return F.numberNode(((Instant) v).toEpochMilli());
        }
        return F.textNode(v.toString());
    }
}

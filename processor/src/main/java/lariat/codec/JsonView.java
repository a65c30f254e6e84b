package lariat.codec;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.util.Iterator;
import java.util.List;

/** A {@link RecordView} of one JSON object; reused from record to record. */
final class JsonView implements RecordView {

    private ObjectNode node;

    void reset(ObjectNode n) {
        this.node = n;
    }

    @Override
    public Object field(String name) {
        return plain(node.get(name));
    }

    @Override
    public void fieldNames(List<String> out) {
        Iterator<String> it = node.fieldNames();
        while (it.hasNext()) {
            out.add(it.next());
        }
    }

    @Override
    public boolean isMap(Object value) {
        return value instanceof ObjectNode;
    }

    @Override
    public Object mapEntry(Object map, ChannelLayout layout, int i) {
        return plain(((ObjectNode) map).get(layout.name(i)));
    }


    @Override
    public void mapNames(Object map, List<String> out) {
        Iterator<String> it = ((ObjectNode) map).fieldNames();
        while (it.hasNext()) {
            out.add(it.next());
        }
    }

    @Override
    public String typeName(Object value) {
        if (value instanceof CharSequence) {
            return "string";
        }
        return value instanceof JsonNode ? ((JsonNode) value).getNodeType().name().toLowerCase(java.util.Locale.ROOT)
                : value.getClass().getSimpleName();
    }

    private static Object plain(JsonNode n) {
        if (n == null || n.isNull() || n.isMissingNode()) {
            return null;
        }
        if (n.isIntegralNumber()) {
            return n.canConvertToLong() ? (Object) n.longValue() : (Object) n.doubleValue();
        }
        if (n.isNumber()) {
            return n.doubleValue();
        }
        if (n.isTextual()) {
            return n.textValue();
        }
        return n;
    }
}

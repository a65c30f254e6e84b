package lariat.codec;

import java.util.List;
import java.util.Map;
import org.apache.avro.Schema;
import org.apache.avro.generic.GenericContainer;
import org.apache.avro.generic.GenericEnumSymbol;
import org.apache.avro.generic.GenericRecord;

/** A {@link RecordView} of an Avro generic record of the reader schema; reused from record to record. */
final class AvroView implements RecordView {

    private final List<Schema.Field> fields;
    private GenericRecord record;

    AvroView(Schema reader) {
        this.fields = reader.getFields();
    }

    void reset(GenericRecord r) {
        this.record = r;
    }

    @Override
    public Object field(String name) {
        return plain(record.get(name));
    }

    @Override
    public void fieldNames(List<String> out) {
        for (Schema.Field f : fields) {
            out.add(f.name());
        }
    }

    @Override
    public boolean isMap(Object value) {
        return value instanceof Map;
    }

    @Override
    public Object mapEntry(Object map, ChannelLayout layout, int i) {
        Map<?, ?> m = (Map<?, ?>) map;
        Object v = m.get(layout.utf8(i));
        return plain(v != null ? v : m.get(layout.name(i)));
    }


    @Override
    public void mapNames(Object map, List<String> out) {
        for (Object k : ((Map<?, ?>) map).keySet()) {
            out.add(k.toString());
        }
    }

    @Override
    public String typeName(Object value) {
        if (value instanceof CharSequence) {
            return "string";
        }
        if (value instanceof Map) {
            return "map";
        }
        if (value instanceof GenericContainer) {
            return ((GenericContainer) value).getSchema().getType().getName();
        }
        return value.getClass().getSimpleName();
    }

    private static Object plain(Object v) {
        if (v instanceof Integer) {
            return (long) (Integer) v;
        }
        if (v instanceof Float) {
            return (double) (Float) v;
        }
        if (v instanceof GenericEnumSymbol) {
            return v.toString();
        }
        return v;
    }
}

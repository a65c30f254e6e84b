package lariat.it.faults;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.util.LinkedHashMap;
import java.util.Map;

import lariat.schema.StationReading;
import org.apache.avro.Schema;
import org.apache.avro.SchemaNormalization;
import org.apache.avro.generic.GenericData;
import org.apache.avro.generic.GenericDatumWriter;
import org.apache.avro.generic.GenericRecord;
import org.apache.avro.io.BinaryEncoder;
import org.apache.avro.io.EncoderFactory;

/**
 * Station readings in a deliberately loose Avro schema (unions admit text, booleans and nulls
 * where numbers belong), used as the stage's reader schema in the poison test so that wrong types
 * and nulls can reach the stage inside well-formed Avro. Encoded with Avro's single-object
 * encoding (Avro 1.12 specification: marker C3 01, 8-byte little-endian CRC-64-AVRO fingerprint of
 * the schema's parsing canonical form, binary body).
 */
final class LooseReadings {

    static final String SCHEMA_JSON = """
            {"type": "record", "name": "LooseReading", "namespace": "lariat.it.faults",
             "fields": [
               {"name": "station", "type": ["string", "double", "null"]},
               {"name": "time", "type": ["long", "string"]},
               {"name": "channels", "type": {"type": "map", "values": ["double", "string", "boolean", "null"]}},
               {"name": "weight", "type": ["double", "string"]}
             ]}
            """;
    static final Schema SCHEMA = new Schema.Parser().parse(SCHEMA_JSON);

    private LooseReadings() {
    }

    /** {@code r} as a record of the loose schema. */
    static GenericRecord of(StationReading r) {
        GenericRecord g = new GenericData.Record(SCHEMA);
        g.put("station", r.getStation().toString());
        g.put("time", r.getTime().toEpochMilli());
        Map<String, Object> ch = new LinkedHashMap<>(r.getChannels());
        g.put("channels", ch);
        g.put("weight", r.getWeight());
        return g;
    }

    /** A copy whose channel map can be changed without touching {@code r}'s. */
    static GenericRecord copy(GenericRecord r) {
        GenericRecord g = new GenericData.Record(SCHEMA);
        for (Schema.Field f : SCHEMA.getFields()) {
            g.put(f.name(), r.get(f.name()));
        }
        g.put("channels", new LinkedHashMap<>((Map<?, ?>) r.get("channels")));
        return g;
    }

    static byte[] encode(GenericRecord r) {
        return singleObject(SCHEMA, r);
    }

    /** {@code r}'s reading under the bundled StationReading schema, whose fingerprint the poison stage does not know. */
    static byte[] encodeWithBundledSchema(GenericRecord r) {
        Schema s = StationReading.getClassSchema();
        GenericRecord g = new GenericData.Record(s);
        g.put("station", r.get("station"));
        g.put("time", r.get("time"));
        g.put("channels", r.get("channels"));
        g.put("weight", r.get("weight"));
        return singleObject(s, g);
    }

    private static byte[] singleObject(Schema schema, GenericRecord r) {
        try {
            ByteArrayOutputStream out = new ByteArrayOutputStream(128);
            out.write(0xC3);
            out.write(0x01);
            out.write(ByteBuffer.allocate(8).order(ByteOrder.LITTLE_ENDIAN)
                    .putLong(SchemaNormalization.parsingFingerprint64(schema)).array());
            BinaryEncoder e = EncoderFactory.get().binaryEncoder(out, null);
            new GenericDatumWriter<GenericRecord>(schema).write(r, e);
            e.flush();
            return out.toByteArray();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}

package lariat.codec;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.URISyntaxException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.HashMap;
import java.util.Map;
import lariat.config.StageConfig;
import org.apache.avro.Schema;
import org.apache.avro.generic.GenericData;
import org.apache.avro.generic.GenericDatumWriter;
import org.apache.avro.generic.GenericRecord;
import org.apache.avro.io.BinaryEncoder;
import org.apache.avro.io.EncoderFactory;
import org.apache.avro.message.BinaryMessageEncoder;

/** Schemas, encoders (Avro's own, as the reference) and decoder set-up shared by the codec tests. */
final class CodecFixtures {

    static final long T0 = 1_767_225_600_000L;

    private CodecFixtures() {
    }

    static Path schemaDir() {
        try {
            return Path.of(CodecFixtures.class.getResource("/codec/pump-v1.avsc").toURI()).getParent();
        } catch (URISyntaxException e) {
            throw new IllegalStateException(e);
        }
    }

    static Schema schema(String file) {
        try {
            return new Schema.Parser().parse(schemaDir().resolve(file).toFile());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Settings for the explicit-field pump schemas (reader v2, older writer v1). */
    static Map<String, String> pumpProps(String... kv) {
        Map<String, String> m = new HashMap<>();
        m.put("input.topic", "pump-readings");
        m.put("input.schema.file", "pump-v2.avsc");
        m.put("input.writer.schema.files", "pump-v1.avsc");
        m.put("field.target", "current");
        m.put("field.features", "flow,pressure");
        m.put("field.key", "station");
        m.put("field.time", "time");
        m.put("field.weight", "quality");
        for (int i = 0; i < kv.length; i += 2) {
            if (kv[i + 1] == null) {
                m.remove(kv[i]);
            } else {
                m.put(kv[i], kv[i + 1]);
            }
        }
        return m;
    }

    /** Settings for JSON with a map of channels, keyed by the Kafka record key. */
    static Map<String, String> jsonMapProps(String... kv) {
        Map<String, String> m = new HashMap<>();
        m.put("input.topic", "station-readings");
        m.put("input.format", "json");
        m.put("field.target", "motor_current_a");
        m.put("field.features.map", "channels");
        m.put("field.time", "time");
        for (int i = 0; i < kv.length; i += 2) {
            if (kv[i + 1] == null) {
                m.remove(kv[i]);
            } else {
                m.put(kv[i], kv[i + 1]);
            }
        }
        return m;
    }

    static RecordDecoder decoder(Map<String, String> props) {
        return RecordDecoder.create(StageConfig.of(props), schemaDir());
    }

    static GenericRecord pumpV1(String station, long time, double pressure, double flow, double current) {
        GenericRecord r = new GenericData.Record(schema("pump-v1.avsc"));
        r.put("station", station);
        r.put("time", time);
        r.put("pressure", pressure);
        r.put("flow", flow);
        r.put("current", current);
        return r;
    }

    static GenericRecord pumpV2(String station, long time, double pressure, double flow, double current,
                                double quality, Double temperature) {
        GenericRecord r = new GenericData.Record(schema("pump-v2.avsc"));
        r.put("station", station);
        r.put("time", time);
        r.put("pressure", pressure);
        r.put("flow", flow);
        r.put("current", current);
        r.put("quality", quality);
        r.put("temperature", temperature);
        return r;
    }

    /** Avro's own single-object encoder. */
    static byte[] singleObject(GenericRecord r) {
        try {
            ByteBuffer b = new BinaryMessageEncoder<GenericRecord>(GenericData.get(), r.getSchema()).encode(r);
            byte[] out = new byte[b.remaining()];
            b.get(out);
            return out;
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    /** Avro's own binary encoder, body only. */
    static byte[] binary(GenericRecord r) {
        try {
            ByteArrayOutputStream out = new ByteArrayOutputStream();
            BinaryEncoder enc = EncoderFactory.get().binaryEncoder(out, null);
            new GenericDatumWriter<GenericRecord>(r.getSchema()).write(r, enc);
            enc.flush();
            return out.toByteArray();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    static byte[] utf8(String s) {
        return s.getBytes(StandardCharsets.UTF_8);
    }
}

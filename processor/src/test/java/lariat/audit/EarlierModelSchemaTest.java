package lariat.audit;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.nio.ByteBuffer;
import lariat.codec.SchemaTrust;
import lariat.schema.ModelVersion;
import org.apache.avro.Schema;
import org.apache.avro.generic.GenericData;
import org.apache.avro.generic.GenericDatumReader;
import org.apache.avro.generic.GenericRecord;
import org.apache.avro.io.BinaryEncoder;
import org.apache.avro.io.DecoderFactory;
import org.apache.avro.io.EncoderFactory;
import org.apache.avro.message.BinaryMessageEncoder;
import org.apache.avro.message.MissingSchemaException;
import org.apache.avro.specific.SpecificDatumWriter;
import org.junit.jupiter.api.Test;

/** Model records written with the first ModelVersion schema (before coefficientScale) still read. */
class EarlierModelSchemaTest {

    private static Schema firstSchema() throws IOException {
        try (InputStream in = EarlierModelSchemaTest.class.getResourceAsStream(
                ModelTopicReader.HISTORY + "ModelVersion-1.avsc")) {
            return new Schema.Parser().parse(in);
        }
    }

    /** {@code mv} as the first schema's writer would have encoded it (single-object encoding). */
    private static byte[] asFirstSchema(ModelVersion mv, Schema first) throws IOException {
        ByteArrayOutputStream body = new ByteArrayOutputStream();
        BinaryEncoder enc = EncoderFactory.get().binaryEncoder(body, null);
        new SpecificDatumWriter<ModelVersion>(ModelVersion.getClassSchema()).write(mv, enc);
        enc.flush();
        GenericRecord old = new GenericDatumReader<GenericRecord>(ModelVersion.getClassSchema(), first)
                .read(null, DecoderFactory.get().binaryDecoder(body.toByteArray(), null));
        ByteBuffer b = new BinaryMessageEncoder<GenericRecord>(GenericData.get(), first).encode(old);
        byte[] out = new byte[b.remaining()];
        b.get(out);
        return out;
    }

    @Test
    void decode_recordOfTheFirstSchema_readsWithCoefficientScaleOne() throws IOException {
        SchemaTrust.ensure();
        Schema first = firstSchema();
        assertEquals(null, first.getField("coefficientScale"));
        ModelVersion mv = ModelVersion.newBuilder(Versions.of("north-03", 4, 1000, 2000, new String[] {"a", "c"},
                new double[] {1.5, -2.0})).setCoefficientScale(1.25).build();
        byte[] old = asFirstSchema(mv, first);
        assertThrows(MissingSchemaException.class, () -> ModelVersion.fromByteBuffer(ByteBuffer.wrap(old)));
        ModelVersion read = ModelTopicReader.decode(old);
        assertNotNull(read);
        assertEquals(1.0, read.getCoefficientScale(), 0.0);
        assertEquals(ModelVersion.newBuilder(mv).setCoefficientScale(1.0).build(), read);
    }

    @Test
    void decode_recordOfTheCurrentSchema_keepsItsCoefficientScale() throws IOException {
        ModelVersion mv = ModelVersion.newBuilder(Versions.of("k", 1, 1, 2, new String[] {"b"}, new double[] {3}))
                .setCoefficientScale(1.25).build();
        ByteBuffer b = mv.toByteBuffer();
        byte[] bytes = new byte[b.remaining()];
        b.get(bytes);
        assertEquals(mv, ModelTopicReader.decode(bytes));
    }
}

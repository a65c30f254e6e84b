package lariat.codec;

import static lariat.codec.CodecFixtures.T0;
import static lariat.codec.CodecFixtures.decoder;
import static lariat.codec.CodecFixtures.pumpProps;
import static lariat.codec.CodecFixtures.pumpV1;
import static lariat.codec.CodecFixtures.pumpV2;
import static lariat.codec.CodecFixtures.singleObject;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.ByteBuffer;
import java.util.List;
import java.util.Map;
import lariat.config.StageConfig;
import lariat.schema.StationReading;
import org.apache.avro.SchemaNormalization;
import org.apache.avro.generic.GenericData;
import org.apache.avro.generic.GenericRecord;
import org.apache.avro.message.BinaryMessageDecoder;
import org.apache.avro.message.SchemaStore;
import org.junit.jupiter.api.Test;

class AvroSingleObjectDecodingTest {

    @Test
    void decode_readerSchemaRecord_givesConfiguredOrderAndTargetLast() {
        RecordDecoder d = decoder(pumpProps("field.features", "temperature,flow,pressure"));
        GenericRecord r = pumpV2("north-07", T0, 412.5, 88.25, 31.75, 0.5, 61.0);
        Reading reading = assertInstanceOf(Reading.class, d.decode(null, singleObject(r), -1, KeyLayouts.create()));
        assertEquals("north-07", reading.key());
        assertEquals(List.of("temperature", "flow", "pressure"), reading.channels());
        assertArrayEquals(new double[] {61.0, 88.25, 412.5, 31.75}, reading.z());
        assertEquals(0.5, reading.weight());
        assertEquals(T0, reading.eventTimeMs());
    }

    /** Avro's own BinaryMessageDecoder, given the same writer schemas, reads the same values. */
    @Test
    void decode_olderWriter_agreesWithAvroMessageDecoder() throws java.io.IOException {
        GenericRecord old = pumpV1("south-02", T0 + 5, 399.0, 70.5, 28.0);
        byte[] bytes = singleObject(old);
        SchemaStore.Cache store = new SchemaStore.Cache();
        store.addSchema(CodecFixtures.schema("pump-v1.avsc"));
        BinaryMessageDecoder<GenericRecord> avro = new BinaryMessageDecoder<>(GenericData.get(),
                CodecFixtures.schema("pump-v2.avsc"), store);
        GenericRecord reference = avro.decode(ByteBuffer.wrap(bytes), null);

        Reading reading = assertInstanceOf(Reading.class, decoder(pumpProps()).decode(null, bytes, -1, KeyLayouts.create()));
        assertArrayEquals(new double[] {(Double) reference.get("flow"), (Double) reference.get("pressure"),
                (Double) reference.get("current")}, reading.z());
        assertEquals(1.0, (Double) reference.get("quality"));
        assertEquals(1.0, reading.weight());
        assertEquals("south-02", reading.key());
    }

    /** Avro specification, "Single object encoding": marker C3 01, then the 8-byte little-endian fingerprint. */
    @Test
    void header_ofAvroEncoding_isMarkerThenLittleEndianFingerprint() {
        byte[] bytes = singleObject(pumpV1("a", T0, 1, 2, 3));
        assertEquals((byte) 0xC3, bytes[0]);
        assertEquals((byte) 0x01, bytes[1]);
        assertEquals(SchemaNormalization.parsingFingerprint64(CodecFixtures.schema("pump-v1.avsc")),
                AvroSingleObjectParser.littleEndianLong(bytes, 2));
    }

    @Test
    void decode_olderWriterLacksNullableChannel_followsPolicy() {
        byte[] bytes = singleObject(pumpV1("south-02", T0, 399.0, 70.5, 28.0));
        Map<String, String> p = pumpProps("field.features", "flow,temperature");
        Rejection r = assertInstanceOf(Rejection.class, decoder(p).decode(null, bytes, -1, KeyLayouts.create()));
        assertEquals(RejectReason.MISSING_FIELD, r.reason());
        assertTrue(r.detail().contains("'temperature'"), r.detail());
        p.put("missing.channel.policy", "skip");
        Skipped s = assertInstanceOf(Skipped.class, decoder(p).decode(null, bytes, -1, KeyLayouts.create()));
        assertEquals("south-02", s.key());
        assertTrue(s.detail().contains("'temperature'"), s.detail());
    }

    @Test
    void decode_patternOverReaderSchema_keepsSchemaOrder() {
        RecordDecoder d = decoder(pumpProps("field.features", null, "field.features.pattern", ".*"));
        byte[] bytes = singleObject(pumpV2("east-11", T0, 400.0, 80.0, 30.0, 1.0, 55.5));
        Reading reading = assertInstanceOf(Reading.class, d.decode(null, bytes, -1, KeyLayouts.create()));
        assertEquals(List.of("pressure", "flow", "temperature"), reading.channels());
        assertArrayEquals(new double[] {400.0, 80.0, 55.5, 30.0}, reading.z());
    }

    @Test
    void decode_generatedDemoRecord_mapChannelsSortedTargetLast() throws Exception {
        StationReading demo = StationReading.newBuilder().setStation("north-07").setTime(java.time.Instant.ofEpochMilli(T0))
                .setChannels(Map.of("suction_kpa", 95.0, "motor_current_a", 31.5, "flow_m3h", 88.0, "bearing_temp_c", 60.5))
                .build();
        ByteBuffer buf = demo.toByteBuffer();
        byte[] bytes = new byte[buf.remaining()];
        buf.get(bytes);
        StageConfig c = StageConfig.of(Map.of("input.topic", "station-readings", "field.target", "motor_current_a",
                "field.features.map", "channels", "field.key", "station", "field.time", "time", "field.weight", "weight"));
        KeyLayouts layouts = KeyLayouts.create();
        Reading reading = assertInstanceOf(Reading.class, RecordDecoder.create(c).decode(null, bytes, -1, layouts));
        assertEquals(List.of("bearing_temp_c", "flow_m3h", "suction_kpa"), reading.channels());
        assertArrayEquals(new double[] {60.5, 88.0, 95.0, 31.5}, reading.z());
        assertEquals(1.0, reading.weight());
        assertEquals(T0, reading.eventTimeMs());
        assertEquals(reading.layout(), layouts.of("north-07").orElseThrow());
    }

    @Test
    void create_incompatibleWriterSchema_namesKeyAndFile() {
        String msg = assertThrows(IllegalArgumentException.class,
                () -> decoder(pumpProps("input.writer.schema.files", "pump-incompatible.avsc"))).getMessage();
        assertTrue(msg.startsWith("input.writer.schema.files: writer schema 'pump-incompatible.avsc' does not resolve"), msg);
    }

    @Test
    void create_fieldNotInReaderSchema_namesKeyAndField() {
        String msg = assertThrows(IllegalArgumentException.class,
                () -> decoder(pumpProps("field.target", "amps"))).getMessage();
        assertTrue(msg.startsWith("field.target: reader schema lariat.test.PumpReading has no field 'amps'"), msg);
        String type = assertThrows(IllegalArgumentException.class,
                () -> decoder(pumpProps("field.features", "flow,station", "field.key", null))).getMessage();
        assertTrue(type.startsWith("field.features: field 'station' of lariat.test.PumpReading has type"), type);
    }

    @Test
    void create_missingSchemaFile_namesKeyAndFile() {
        String msg = assertThrows(IllegalArgumentException.class,
                () -> decoder(pumpProps("input.schema.file", "no-such.avsc"))).getMessage();
        assertTrue(msg.startsWith("input.schema.file: cannot read 'no-such.avsc'"), msg);
    }
}

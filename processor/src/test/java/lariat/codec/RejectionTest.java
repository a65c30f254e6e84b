package lariat.codec;

import static lariat.codec.CodecFixtures.T0;
import static lariat.codec.CodecFixtures.decoder;
import static lariat.codec.CodecFixtures.jsonMapProps;
import static lariat.codec.CodecFixtures.pumpProps;
import static lariat.codec.CodecFixtures.pumpV1;
import static lariat.codec.CodecFixtures.pumpV2;
import static lariat.codec.CodecFixtures.singleObject;
import static lariat.codec.CodecFixtures.utf8;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.EnumSet;
import java.util.List;
import java.util.Set;
import org.apache.avro.Schema;
import org.apache.avro.SchemaBuilder;
import org.apache.avro.generic.GenericData;
import org.apache.avro.generic.GenericRecord;
import org.junit.jupiter.api.Test;

/** Every {@link RejectReason} from a crafted bad input, with a detail naming the field or the problem. */
class RejectionTest {

    private static Rejection reject(RecordDecoder d, byte[] key, byte[] value, long ts, RejectReason reason,
                                    String detailPart) {
        KeyLayouts layouts = KeyLayouts.create();
        Rejection r = assertInstanceOf(Rejection.class, d.decode(key, value, ts, layouts));
        assertEquals(reason, r.reason(), r.toString());
        assertTrue(r.detail().contains(detailPart), r.detail());
        assertEquals(0, layouts.count());
        return r;
    }

    private static Rejection json(String json, RejectReason reason, String detailPart, String... props) {
        return reject(decoder(jsonMapProps(props)), utf8("north-07"), utf8(json), -1, reason, detailPart);
    }

    private static String mapJson(String channels) {
        return "{\"time\":" + T0 + ",\"channels\":{" + channels + "}}";
    }

    /** One crafted input per reason, so that a reason added to the enum without a test fails here. */
    @Test
    void decode_oneCraftedInputPerReason_coversEveryReason() {
        RecordDecoder avro = decoder(pumpProps());
        RecordDecoder js = decoder(jsonMapProps("field.weight", "w"));
        Schema other = SchemaBuilder.record("Other").namespace("lariat.test").fields().requiredDouble("x").endRecord();
        GenericRecord o = new GenericData.Record(other);
        o.put("x", 1.0);
        byte[] good = singleObject(pumpV1("a", T0, 1, 2, 3));
        byte[] k = utf8("k");
        List<Decoded> out = List.of(
                avro.decode(null, Arrays.copyOf(good, good.length - 1), -1, KeyLayouts.create()),
                avro.decode(null, singleObject(o), -1, KeyLayouts.create()),
                avro.decode(null, new byte[] {1, 2, 3}, -1, KeyLayouts.create()),
                js.decode(k, utf8("{\"time\":1,\"w\":1,\"channels\":{\"a\":1}}"), -1, KeyLayouts.create()),
                js.decode(k, utf8("{\"time\":1,\"w\":1,\"channels\":{\"a\":\"x\",\"motor_current_a\":1}}"), -1, KeyLayouts.create()),
                js.decode(k, utf8("{\"time\":1,\"w\":1,\"channels\":{\"a\":NaN,\"motor_current_a\":1}}"), -1, KeyLayouts.create()),
                js.decode(k, utf8("{\"time\":1,\"w\":1,\"channels\":{\"a\":1e308,\"motor_current_a\":1}}"), -1, KeyLayouts.create()),
                js.decode(k, utf8("{\"time\":1,\"w\":1,\"channels\":{\"motor_current_a\":1}}"), -1, KeyLayouts.create()),
                js.decode(null, utf8("{\"time\":1,\"w\":1,\"channels\":{\"a\":1,\"motor_current_a\":1}}"), -1, KeyLayouts.create()),
                js.decode(k, utf8("{\"time\":-1,\"w\":1,\"channels\":{\"a\":1,\"motor_current_a\":1}}"), -1, KeyLayouts.create()),
                js.decode(k, utf8("{\"time\":1,\"w\":0,\"channels\":{\"a\":1,\"motor_current_a\":1}}"), -1, KeyLayouts.create()));
        Set<RejectReason> seen = EnumSet.noneOf(RejectReason.class);
        for (Decoded d : out) {
            seen.add(assertInstanceOf(Rejection.class, d).reason());
        }
        assertEquals(EnumSet.allOf(RejectReason.class), seen);
    }

    @Test
    void decode_randomBytesAsSingleObject_badMarker() {
        reject(decoder(pumpProps()), null, new byte[] {0x17, 0x2A, 0x05}, -1, RejectReason.BAD_MARKER, "marker C3 01, got 17 2A");
        reject(decoder(pumpProps()), null, new byte[0], -1, RejectReason.BAD_MARKER, "empty value");
    }

    @Test
    void decode_wrongSecondMarkerByte_badMarker() {
        byte[] b = singleObject(pumpV1("a", T0, 1, 2, 3));
        b[1] = 0x02;
        reject(decoder(pumpProps()), null, b, -1, RejectReason.BAD_MARKER, "got C3 02");
    }

    @Test
    void decode_truncatedSingleObject_undecodableWithException() {
        byte[] b = singleObject(pumpV1("a", T0, 1, 2, 3));
        Rejection r = reject(decoder(pumpProps()), null, Arrays.copyOf(b, b.length - 4), -1,
                RejectReason.UNDECODABLE, "Avro body does not decode");
        assertTrue(r.exceptionClass().isPresent());
        reject(decoder(pumpProps()), null, Arrays.copyOf(b, 6), -1, RejectReason.UNDECODABLE, "10-byte single-object header");
    }

    @Test
    void decode_unknownFingerprint_unknownSchema() {
        Schema other = SchemaBuilder.record("Other").namespace("lariat.test").fields().requiredDouble("current").endRecord();
        GenericRecord r = new GenericData.Record(other);
        r.put("current", 1.0);
        String hex = String.format("%016x", org.apache.avro.SchemaNormalization.parsingFingerprint64(other));
        reject(decoder(pumpProps()), null, singleObject(r), -1, RejectReason.UNKNOWN_SCHEMA, hex);
    }

    @Test
    void decode_nanOrInfinity_nonFiniteNamingField() {
        reject(decoder(pumpProps()), null, singleObject(pumpV2("a", T0, 1, Double.NaN, 3, 1, null)), -1,
                RejectReason.NON_FINITE, "field 'flow' (feature): value NaN");
        reject(decoder(pumpProps()), null, singleObject(pumpV2("a", T0, 1, 2, Double.NEGATIVE_INFINITY, 1, null)), -1,
                RejectReason.NON_FINITE, "field 'current' (target)");
        json(mapJson("\"a\":Infinity,\"motor_current_a\":1"), RejectReason.NON_FINITE, "channel 'a' of map 'channels'");
    }

    @Test
    void decode_hugeMagnitude_outOfRangeNamingField() {
        reject(decoder(pumpProps()), null, singleObject(pumpV2("a", T0, 1e308, 2, 3, 1, null)), -1,
                RejectReason.OUT_OF_RANGE, "field 'pressure' (feature): |1.0E308| exceeds value.max.abs");
        json(mapJson("\"a\":1,\"motor_current_a\":-2e101"), RejectReason.OUT_OF_RANGE, "'motor_current_a'");
    }

    @Test
    void decode_missingTarget_missingField() {
        json(mapJson("\"a\":1"), RejectReason.MISSING_FIELD, "channel 'motor_current_a' of map 'channels' (target): missing");
        json("{\"time\":1}", RejectReason.MISSING_FIELD, "field 'channels' (channel map): missing");
        json("{\"channels\":{\"a\":1,\"motor_current_a\":2}}", RejectReason.MISSING_FIELD, "field 'time' (time)");
    }

    @Test
    void decode_wrongTypes_wrongTypeNamingField() {
        json(mapJson("\"a\":\"high\",\"motor_current_a\":1"), RejectReason.WRONG_TYPE, "channel 'a' of map 'channels' (feature): string high");
        json("{\"time\":1,\"channels\":[1,2]}", RejectReason.WRONG_TYPE, "field 'channels' (channel map): array");
        json("{\"time\":\"noon\",\"channels\":{\"a\":1,\"motor_current_a\":2}}", RejectReason.WRONG_TYPE, "field 'time' (time)");
        json(mapJson("\"a\":1,\"motor_current_a\":2").replace("{\"time\"", "{\"st\":true,\"time\""),
                RejectReason.WRONG_TYPE, "field 'st' (key): boolean", "field.key", "st");
        json(mapJson("\"a\":1,\"motor_current_a\":2").replace("{\"time\"", "{\"w\":[1],\"time\""),
                RejectReason.WRONG_TYPE, "field 'w' (weight)", "field.weight", "w");
    }

    @Test
    void decode_malformedJson_undecodable() {
        Rejection r = json("{\"time\":1,", RejectReason.UNDECODABLE, "not JSON");
        assertTrue(r.exceptionClass().orElseThrow().startsWith("com.fasterxml.jackson"));
        json("[1,2]", RejectReason.UNDECODABLE, "JSON value is of type array, need an object");
        json(mapJson("\"a\":1,\"motor_current_a\":2") + " {}", RejectReason.UNDECODABLE, "not JSON");
        reject(decoder(jsonMapProps()), utf8("k"), null, -1, RejectReason.UNDECODABLE, "tombstone");
    }

    @Test
    void decode_noOrTooManyChannels_wrongWidth() {
        json(mapJson("\"motor_current_a\":1"), RejectReason.WRONG_WIDTH, "0 feature channels");
        json(mapJson("\"a\":1,\"b\":2,\"c\":3,\"motor_current_a\":4"), RejectReason.WRONG_WIDTH, "has 3 feature channels",
                "field.features.max.count", "2");
    }

    @Test
    void decode_badKafkaKey_badKey() {
        RecordDecoder d = decoder(jsonMapProps());
        byte[] v = utf8(mapJson("\"a\":1,\"motor_current_a\":2"));
        reject(d, null, v, -1, RejectReason.BAD_KEY, "Kafka record key is null");
        reject(d, new byte[] {(byte) 0xFF, (byte) 0xFE}, v, -1, RejectReason.BAD_KEY, "not UTF-8");
        reject(d, new byte[0], v, -1, RejectReason.BAD_KEY, "length must be 1 to 1024, got 0");
    }

    @Test
    void decode_badTime_badTime() {
        json("{\"time\":-5,\"channels\":{\"a\":1,\"motor_current_a\":2}}", RejectReason.BAD_TIME, "before the epoch");
        json("{\"time\":" + Long.MAX_VALUE + ",\"channels\":{\"a\":1,\"motor_current_a\":2}}", RejectReason.BAD_TIME,
                "overflows", "field.time.unit", "s");
        json("{\"time\":NaN,\"channels\":{\"a\":1,\"motor_current_a\":2}}", RejectReason.BAD_TIME, "field 'time' (time)");
        reject(decoder(jsonMapProps("field.time", null)), utf8("k"), utf8(mapJson("\"a\":1,\"motor_current_a\":2")), -1,
                RejectReason.BAD_TIME, "Kafka record timestamp is -1");
    }

    @Test
    void decode_badWeight_badWeight() {
        String[] w = {"field.weight", "w"};
        for (String bad : new String[] {"0", "-1", "NaN", "1e101"}) {
            json(mapJson("\"a\":1,\"motor_current_a\":2").replace("{\"time\"", "{\"w\":" + bad + ",\"time\""),
                    RejectReason.BAD_WEIGHT, "field 'w' (weight): must be in (0, 1.0E100]", w);
        }
        reject(decoder(pumpProps()), null, singleObject(pumpV2("a", T0, 1, 2, 3, 0.0, null)), -1,
                RejectReason.BAD_WEIGHT, "field 'quality' (weight)");
    }
}

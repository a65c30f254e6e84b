package lariat.codec;

import static lariat.codec.CodecFixtures.T0;
import static lariat.codec.CodecFixtures.decoder;
import static lariat.codec.CodecFixtures.jsonMapProps;
import static lariat.codec.CodecFixtures.utf8;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;

import java.util.List;
import org.junit.jupiter.api.Test;

class JsonDecodingTest {

    @Test
    void decode_explicitFields_readsConfiguredOrder() {
        RecordDecoder d = decoder(jsonMapProps("field.features.map", null, "field.target", "current",
                "field.features", "pressure,flow", "field.key", "station", "field.weight", "w"));
        String json = "{\"station\":\"north-07\",\"time\":" + T0 + ",\"flow\":88,\"pressure\":412.5,"
                + "\"current\":31.75,\"w\":0.25,\"note\":\"ignored\"}";
        Reading r = assertInstanceOf(Reading.class, d.decode(null, utf8(json), -1, KeyLayouts.create()));
        assertEquals("north-07", r.key());
        assertEquals(List.of("pressure", "flow"), r.channels());
        assertArrayEquals(new double[] {412.5, 88.0, 31.75}, r.z());
        assertEquals(0.25, r.weight());
        assertEquals(T0, r.eventTimeMs());
    }

    @Test
    void decode_mapField_sortsChannelsAndUsesKafkaKey() {
        RecordDecoder d = decoder(jsonMapProps());
        String json = "{\"time\":" + T0 + ",\"channels\":{\"suction_kpa\":95,\"motor_current_a\":31.5,\"flow_m3h\":88}}";
        Reading r = assertInstanceOf(Reading.class, d.decode(utf8("south-02"), utf8(json), -1, KeyLayouts.create()));
        assertEquals("south-02", r.key());
        assertEquals(List.of("flow_m3h", "suction_kpa"), r.channels());
        assertArrayEquals(new double[] {88.0, 95.0, 31.5}, r.z());
    }

    @Test
    void decode_patternOverFields_sortsMatchingNumericFields() {
        RecordDecoder d = decoder(jsonMapProps("field.features.map", null, "field.target", "current",
                "field.features.pattern", "s_.*", "field.time", null));
        String json = "{\"s_b\":2,\"current\":9,\"s_a\":1,\"s_text\":\"x\",\"other\":5}";
        Reading r = assertInstanceOf(Reading.class, d.decode(utf8("k"), utf8(json), T0, KeyLayouts.create()));
        assertEquals(List.of("s_a", "s_b"), r.channels());
        assertArrayEquals(new double[] {1, 2, 9}, r.z());
        assertEquals(T0, r.eventTimeMs());
    }

    @Test
    void decode_timeInFractionalSeconds_convertsToMillis() {
        RecordDecoder d = decoder(jsonMapProps("field.time.unit", "s"));
        String json = "{\"time\":1767225600.25,\"channels\":{\"a\":1,\"motor_current_a\":2}}";
        Reading r = assertInstanceOf(Reading.class, d.decode(utf8("k"), utf8(json), -1, KeyLayouts.create()));
        assertEquals(T0 + 250, r.eventTimeMs());
        RecordDecoder ns = decoder(jsonMapProps("field.time.unit", "ns"));
        String nsJson = "{\"time\":" + T0 + "999999,\"channels\":{\"a\":1,\"motor_current_a\":2}}";
        assertEquals(T0, ((Reading) ns.decode(utf8("k"), utf8(nsJson), -1, KeyLayouts.create())).eventTimeMs());
    }
}

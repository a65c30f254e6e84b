package lariat.codec;

import static lariat.codec.CodecFixtures.decoder;
import static lariat.codec.CodecFixtures.jsonMapProps;
import static lariat.codec.CodecFixtures.utf8;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.junit.jupiter.api.Test;

/** A key's first accepted record fixes its channels; later records follow missing.channel.policy. */
class MissingChannelTest {

    private static byte[] rec(String channels) {
        return utf8("{\"time\":1,\"channels\":{" + channels + "}}");
    }

    @Test
    void decode_laterRecordLacksChannel_rejectPolicyRejects() {
        RecordDecoder d = decoder(jsonMapProps());
        KeyLayouts layouts = KeyLayouts.create();
        assertInstanceOf(Reading.class, d.decode(utf8("k"), rec("\"b\":2,\"a\":1,\"motor_current_a\":9"), -1, layouts));
        Rejection r = assertInstanceOf(Rejection.class, d.decode(utf8("k"), rec("\"a\":1,\"motor_current_a\":9"), -1, layouts));
        assertEquals(RejectReason.MISSING_FIELD, r.reason());
        assertTrue(r.detail().contains("channel 'b' of map 'channels' (feature): missing"), r.detail());
        assertEquals(List.of("a", "b"), layouts.of("k").orElseThrow().names());
    }

    @Test
    void decode_laterRecordLacksChannel_skipPolicySkips() {
        RecordDecoder d = decoder(jsonMapProps("missing.channel.policy", "skip"));
        KeyLayouts layouts = KeyLayouts.create();
        assertInstanceOf(Reading.class, d.decode(utf8("k"), rec("\"b\":2,\"a\":1,\"motor_current_a\":9"), -1, layouts));
        Skipped s = assertInstanceOf(Skipped.class, d.decode(utf8("k"), rec("\"a\":1,\"motor_current_a\":9"), -1, layouts));
        assertEquals("k", s.key());
        assertTrue(s.detail().contains("'b'"), s.detail());
    }

    @Test
    void decode_skipPolicyButBadValueElsewhere_rejects() {
        RecordDecoder d = decoder(jsonMapProps("missing.channel.policy", "skip"));
        KeyLayouts layouts = KeyLayouts.create();
        d.decode(utf8("k"), rec("\"b\":2,\"a\":1,\"motor_current_a\":9"), -1, layouts);
        Rejection r = assertInstanceOf(Rejection.class, d.decode(utf8("k"), rec("\"a\":NaN,\"motor_current_a\":9"), -1, layouts));
        assertEquals(RejectReason.NON_FINITE, r.reason());
    }

    @Test
    void decode_extraChannels_ignoredInKeyOrder() {
        RecordDecoder d = decoder(jsonMapProps());
        KeyLayouts layouts = KeyLayouts.create();
        d.decode(utf8("k"), rec("\"b\":2,\"a\":1,\"motor_current_a\":9"), -1, layouts);
        Reading r = assertInstanceOf(Reading.class,
                d.decode(utf8("k"), rec("\"c\":7,\"a\":5,\"b\":6,\"motor_current_a\":8"), -1, layouts));
        assertEquals(List.of("a", "b"), r.channels());
        assertArrayEquals(new double[] {5, 6, 8}, r.z());
        Reading other = assertInstanceOf(Reading.class, d.decode(utf8("j"), rec("\"c\":7,\"motor_current_a\":8"), -1, layouts));
        assertEquals(List.of("c"), other.channels());
        assertEquals(2, layouts.count());
    }

    @Test
    void decode_rejectedFirstRecord_doesNotFixLayout() {
        RecordDecoder d = decoder(jsonMapProps());
        KeyLayouts layouts = KeyLayouts.create();
        assertInstanceOf(Rejection.class, d.decode(utf8("k"), rec("\"a\":1,\"b\":\"x\",\"motor_current_a\":9"), -1, layouts));
        assertEquals(0, layouts.count());
        Reading r = assertInstanceOf(Reading.class, d.decode(utf8("k"), rec("\"a\":1,\"motor_current_a\":9"), -1, layouts));
        assertEquals(List.of("a"), r.channels());
    }

    @Test
    void put_conflictingLayout_throwsNamingKey() {
        KeyLayouts layouts = KeyLayouts.create();
        layouts.put("k", ChannelLayout.of(List.of("a")));
        String msg = assertThrows(IllegalArgumentException.class,
                () -> layouts.put("k", ChannelLayout.of(List.of("b")))).getMessage();
        assertTrue(msg.contains("key 'k'"), msg);
        KeyLayouts copy = layouts.copy();
        layouts.clear();
        assertEquals(1, copy.count());
    }
}

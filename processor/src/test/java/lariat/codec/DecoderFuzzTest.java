package lariat.codec;

import static lariat.codec.CodecFixtures.T0;
import static lariat.codec.CodecFixtures.decoder;
import static lariat.codec.CodecFixtures.jsonMapProps;
import static lariat.codec.CodecFixtures.pumpProps;
import static lariat.codec.CodecFixtures.pumpV2;
import static lariat.codec.CodecFixtures.singleObject;
import static lariat.codec.CodecFixtures.utf8;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertNotNull;

import java.util.Random;
import org.junit.jupiter.api.Test;

/** Random and mutated inputs never make the decoder throw. */
class DecoderFuzzTest {

    private static final int CASES = 2000;

    private static byte[] random(Random rnd) {
        byte[] b = new byte[rnd.nextInt(64)];
        rnd.nextBytes(b);
        return b;
    }

    @Test
    void decode_randomBytes_neverThrowsAlwaysRejects() {
        RecordDecoder[] decoders = {decoder(pumpProps()), decoder(pumpProps("input.format", "avro-binary")),
            decoder(jsonMapProps())};
        Random rnd = new Random(20260101L);
        KeyLayouts layouts = KeyLayouts.create();
        for (RecordDecoder d : decoders) {
            for (int i = 0; i < CASES; i++) {
                assertInstanceOf(Rejection.class, d.decode(random(rnd), random(rnd), rnd.nextLong(), layouts));
            }
        }
        assertEquals(0, layouts.count());
    }

    @Test
    void decode_mutatedValidRecords_neverThrow() {
        Random rnd = new Random(7L);
        byte[] avro = singleObject(pumpV2("north-07", T0, 412.5, 88.25, 31.75, 0.5, 61.0));
        byte[] json = utf8("{\"time\":" + T0 + ",\"channels\":{\"a\":1.5,\"b\":-2,\"motor_current_a\":3}}");
        RecordDecoder avroDecoder = decoder(pumpProps());
        RecordDecoder jsonDecoder = decoder(jsonMapProps());
        for (int i = 0; i < CASES; i++) {
            assertNotNull(avroDecoder.decode(null, mutate(avro, rnd), -1, KeyLayouts.create()));
            assertNotNull(jsonDecoder.decode(utf8("k"), mutate(json, rnd), -1, KeyLayouts.create()));
        }
    }

    /** Huge item counts and string lengths in an otherwise tiny body must not allocate their claimed size. */
    @Test
    void decode_hugeClaimedLengths_rejectedAsUndecodable() {
        RecordDecoder d = decoder(pumpProps("input.format", "avro-binary", "input.writer.schema.files", null));
        byte[] hugeString = {(byte) 0xFE, (byte) 0xFF, (byte) 0xFF, (byte) 0xFF, 0x0F, 'a'};
        Rejection r = assertInstanceOf(Rejection.class, d.decode(null, hugeString, -1, KeyLayouts.create()));
        assertEquals(RejectReason.UNDECODABLE, r.reason());
        RecordDecoder demo = RecordDecoder.create(lariat.config.StageConfig.of(java.util.Map.of("input.topic", "t",
                "input.format", "avro-binary", "field.target", "y", "field.features.map", "channels",
                "field.key", "station", "field.time", "time")));
        byte[] hugeMap = {0x02, 'a', 0x00, (byte) 0xFE, (byte) 0xFF, (byte) 0xFF, (byte) 0xFF, 0x07, 0x02, 'b'};
        Rejection m = assertInstanceOf(Rejection.class, demo.decode(null, hugeMap, -1, KeyLayouts.create()));
        assertEquals(RejectReason.UNDECODABLE, m.reason());
    }

    private static byte[] mutate(byte[] in, Random rnd) {
        byte[] b = in.clone();
        int edits = 1 + rnd.nextInt(4);
        for (int e = 0; e < edits; e++) {
            int op = rnd.nextInt(3);
            if (op == 0) {
                b[rnd.nextInt(b.length)] = (byte) rnd.nextInt(256);
            } else if (op == 1) {
                b = java.util.Arrays.copyOf(b, rnd.nextInt(b.length) + 1);
            } else {
                b = java.util.Arrays.copyOf(b, b.length + 1 + rnd.nextInt(8));
            }
        }
        return b;
    }
}

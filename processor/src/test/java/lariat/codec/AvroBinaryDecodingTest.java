package lariat.codec;

import static lariat.codec.CodecFixtures.T0;
import static lariat.codec.CodecFixtures.binary;
import static lariat.codec.CodecFixtures.decoder;
import static lariat.codec.CodecFixtures.pumpProps;
import static lariat.codec.CodecFixtures.pumpV1;
import static lariat.codec.CodecFixtures.pumpV2;
import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import org.junit.jupiter.api.Test;

class AvroBinaryDecodingTest {

    @Test
    void decode_configuredOlderWriter_resolvesToReader() {
        RecordDecoder d = decoder(pumpProps("input.format", "avro-binary"));
        byte[] bytes = binary(pumpV1("west-03", T0 + 60_000, 401.0, 77.0, 29.5));
        Reading r = assertInstanceOf(Reading.class, d.decode(null, bytes, -1, KeyLayouts.create()));
        assertEquals("west-03", r.key());
        assertArrayEquals(new double[] {77.0, 401.0, 29.5}, r.z());
        assertEquals(T0 + 60_000, r.eventTimeMs());
    }

    @Test
    void decode_noWriterConfigured_readsReaderSchemaBodies() {
        RecordDecoder d = decoder(pumpProps("input.format", "avro-binary", "input.writer.schema.files", null));
        byte[] bytes = binary(pumpV2("west-03", T0, 401.0, 77.0, 29.5, 2.0, null));
        Reading r = assertInstanceOf(Reading.class, d.decode(null, bytes, -1, KeyLayouts.create()));
        assertEquals(2.0, r.weight());
    }

    @Test
    void decode_truncatedOrPaddedBody_undecodable() {
        RecordDecoder d = decoder(pumpProps("input.format", "avro-binary"));
        byte[] bytes = binary(pumpV1("west-03", T0, 401.0, 77.0, 29.5));
        Rejection cut = assertInstanceOf(Rejection.class,
                d.decode(null, Arrays.copyOf(bytes, bytes.length - 3), -1, KeyLayouts.create()));
        assertEquals(RejectReason.UNDECODABLE, cut.reason());
        assertTrue(cut.exceptionClass().isPresent());
        Rejection pad = assertInstanceOf(Rejection.class,
                d.decode(null, Arrays.copyOf(bytes, bytes.length + 2), -1, KeyLayouts.create()));
        assertEquals(RejectReason.UNDECODABLE, pad.reason());
        assertTrue(pad.detail().contains("trailing bytes"), pad.detail());
    }
}

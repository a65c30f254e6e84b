package lariat.codec;

import java.util.HashMap;
import java.util.List;
import java.util.Map;
import org.apache.avro.Schema;
import org.apache.avro.SchemaNormalization;
import org.apache.avro.generic.GenericData;
import org.apache.avro.generic.GenericDatumReader;
import org.apache.avro.generic.GenericRecord;
import org.apache.avro.io.BinaryDecoder;
import org.apache.avro.io.DecoderFactory;

/**
 * Avro single-object encoding (Avro 1.12 specification, "Single object encoding"): the two marker
 * bytes C3 01, the 8-byte little-endian CRC-64-AVRO fingerprint of the writer schema's parsing
 * canonical form ({@link SchemaNormalization#parsingFingerprint64}), then the binary body. The writer
 * schema is looked up by fingerprint among the known writer schemas and the body is resolved to the
 * reader schema. One resolving reader per writer schema and one binary decoder are reused.
 */
final class AvroSingleObjectParser implements ValueParser {

    static final int HEADER_LENGTH = 10;
    private static final byte MARKER_0 = (byte) 0xC3;
    private static final byte MARKER_1 = (byte) 0x01;

    private final Map<Long, GenericDatumReader<GenericRecord>> readers = new HashMap<>();
    private final AvroView view;
    private BinaryDecoder decoder;
    private GenericRecord reuse;

    /**
     * @param writers every known writer schema (the reader schema among them), each already checked to resolve
     */
    AvroSingleObjectParser(Schema reader, List<Schema> writers) {
        for (Schema w : writers) {
            readers.putIfAbsent(SchemaNormalization.parsingFingerprint64(w),
                    new GenericDatumReader<>(w, reader, GenericData.get()));
        }
        this.view = new AvroView(reader);
    }

    @Override
    public RecordView parse(byte[] value) {
        if (value.length < 2 || value[0] != MARKER_0 || value[1] != MARKER_1) {
            throw new RejectSignal(RejectReason.BAD_MARKER, "value does not start with the single-object marker C3 01, got "
                    + firstBytes(value));
        }
        if (value.length < HEADER_LENGTH) {
            throw new RejectSignal(RejectReason.UNDECODABLE, "value of " + value.length
                    + " bytes is shorter than the 10-byte single-object header");
        }
        long fingerprint = littleEndianLong(value, 2);
        GenericDatumReader<GenericRecord> reader = readers.get(fingerprint);
        if (reader == null) {
            throw new RejectSignal(RejectReason.UNKNOWN_SCHEMA, String.format(
                    "writer schema fingerprint %016x is none of the %d known writer schemas", fingerprint, readers.size()));
        }
        decoder = DecoderFactory.get().binaryDecoder(value, HEADER_LENGTH, value.length - HEADER_LENGTH, decoder);
        reuse = AvroBody.read(reader, decoder, reuse);
        view.reset(reuse);
        return view;
    }

    static long littleEndianLong(byte[] b, int off) {
        long v = 0;
        for (int i = 7; i >= 0; i--) {
            v = (v << 8) | (b[off + i] & 0xFFL);
        }
        return v;
    }

    private static String firstBytes(byte[] v) {
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < Math.min(2, v.length); i++) {
            sb.append(String.format("%02X ", v[i] & 0xFF));
        }
        return v.length == 0 ? "an empty value" : sb.toString().trim();
    }
}

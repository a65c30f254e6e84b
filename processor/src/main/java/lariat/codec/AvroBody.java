package lariat.codec;

import java.io.IOException;
import org.apache.avro.generic.GenericDatumReader;
import org.apache.avro.generic.GenericRecord;
import org.apache.avro.io.BinaryDecoder;

/** Reads one Avro binary body that must fill its buffer exactly; any failure becomes UNDECODABLE. */
final class AvroBody {

    private AvroBody() {
    }

    /**
     * @param reuse a record to refill, or {@code null}
     * @return the decoded record (possibly {@code reuse})
     * @throws RejectSignal UNDECODABLE if the body is malformed, truncated or followed by more bytes
     */
    static GenericRecord read(GenericDatumReader<GenericRecord> reader, BinaryDecoder decoder, GenericRecord reuse) {
        GenericRecord r;
        boolean end;
        try {
            r = reader.read(reuse, decoder);
            end = decoder.isEnd();
        } catch (IOException | RuntimeException e) {
            throw new RejectSignal(RejectReason.UNDECODABLE, "Avro body does not decode: " + RejectSignal.message(e), e);
        }
        if (!end) {
            throw new RejectSignal(RejectReason.UNDECODABLE, "Avro body has trailing bytes after the record");
        }
        return r;
    }
}

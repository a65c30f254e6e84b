package lariat.codec;

import org.apache.avro.Schema;
import org.apache.avro.generic.GenericData;
import org.apache.avro.generic.GenericDatumReader;
import org.apache.avro.generic.GenericRecord;
import org.apache.avro.io.BinaryDecoder;
import org.apache.avro.io.DecoderFactory;

/** Plain Avro binary bodies written with one configured writer schema, resolved to the reader schema. */
final class AvroBinaryParser implements ValueParser {

    private final GenericDatumReader<GenericRecord> reader;
    private final AvroView view;
    private BinaryDecoder decoder;
    private GenericRecord reuse;

    AvroBinaryParser(Schema reader, Schema writer) {
        this.reader = new GenericDatumReader<>(writer, reader, GenericData.get());
        this.view = new AvroView(reader);
    }

    @Override
    public RecordView parse(byte[] value) {
        if (value.length == 0) {
            throw new RejectSignal(RejectReason.UNDECODABLE, "value is empty");
        }
        decoder = DecoderFactory.get().binaryDecoder(value, decoder);
        reuse = AvroBody.read(reader, decoder, reuse);
        view.reset(reuse);
        return view;
    }
}

package lariat.it.faults;

import java.io.IOException;
import java.io.UncheckedIOException;

import lariat.schema.ModelVersion;
import org.apache.avro.generic.GenericDatumReader;
import org.apache.avro.generic.GenericRecord;
import org.apache.avro.io.DecoderFactory;

/**
 * The fields of a published {@code ModelVersion} record the exactly-once checks read, decoded with
 * Avro's generic reader (the Avro 1.12 class allow-list refuses specific classes by default).
 */
record PublishedModel(String key, long version, long recordCount, String fingerprint) {

    private static final int HEADER = 10;

    /** Decodes a single-object encoded {@code ModelVersion} value. */
    static PublishedModel decode(byte[] value) {
        try {
            GenericRecord r = new GenericDatumReader<GenericRecord>(ModelVersion.getClassSchema())
                    .read(null, DecoderFactory.get().binaryDecoder(value, HEADER, value.length - HEADER, null));
            return new PublishedModel(r.get("key").toString(), (Long) r.get("version"), (Long) r.get("recordCount"),
                    r.get("momentsFingerprint").toString());
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}

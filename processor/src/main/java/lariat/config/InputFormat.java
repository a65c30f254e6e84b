package lariat.config;

/** Wire format of the input topic's record values ({@code input.format}). */
public enum InputFormat implements Choice {
    /** Avro single-object encoding: marker C3 01, 8-byte little-endian CRC-64-AVRO fingerprint, body. */
    AVRO_SINGLE_OBJECT("avro-single-object"),
    /** Plain Avro binary body written with one configured writer schema. */
    AVRO_BINARY("avro-binary"),
    /** One JSON object per record value, UTF-8. */
    JSON("json");

    private final String id;

    InputFormat(String id) {
        this.id = id;
    }

    @Override
    public String id() {
        return id;
    }
}

package lariat.scenario;

import java.util.Locale;

/** How a reading is written as a Kafka record value. */
public enum WireFormat {
    /** Avro single-object encoding of {@code lariat.schema.StationReading} (stage: input.format=avro-single-object). */
    AVRO("avro"),
    /** One UTF-8 JSON object with the same fields (stage: input.format=json). */
    JSON("json");

    private final String label;

    WireFormat(String label) {
        this.label = label;
    }

    public String label() {
        return label;
    }

    /**
     * @throws IllegalArgumentException naming the value if it is neither "avro" nor "json"
     */
    public static WireFormat parse(String text) {
        for (WireFormat f : values()) {
            if (f.label.equals(text.trim().toLowerCase(Locale.ROOT))) {
                return f;
            }
        }
        throw new IllegalArgumentException("format must be avro or json, got " + text);
    }
}

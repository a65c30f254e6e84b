package lariat.scenario;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonGenerator;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.charset.StandardCharsets;
import java.time.Instant;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

import lariat.schema.StationReading;

/**
 * Turns generated rows into Kafka record keys and values. The key is the station name in UTF-8,
 * so Kafka's default partitioner keeps each station on one partition. The value is a
 * {@code StationReading} with every column in the {@code channels} map, in column order, in
 * the chosen {@link WireFormat}: Avro single-object encoding (the Avro 1.12 specification's
 * two marker bytes C3 01, the schema's 8-byte CRC-64-AVRO fingerprint, then the binary body),
 * or a JSON object {@code {"station":…,"time":ms,"channels":{…},"weight":…}}.
 */
public final class ReadingEncoder {

    private static final JsonFactory JSON = new JsonFactory();

    private final List<String> columns;
    private final WireFormat format;

    private ReadingEncoder(List<String> columns, WireFormat format) {
        this.columns = List.copyOf(columns);
        this.format = java.util.Objects.requireNonNull(format, "format");
    }

    /** An encoder of the rows of {@code scenario}. */
    public static ReadingEncoder of(Scenario scenario, WireFormat format) {
        return new ReadingEncoder(scenario.columns(), format);
    }

    public WireFormat format() {
        return format;
    }

    /**
     * The stage's input settings (lariat.config.StageConfig keys) that decode what this encoder
     * writes: the format, the channel map with the target in it, the station as model key, the
     * event-time field and the weight field. The caller adds {@code input.topic}.
     */
    public Map<String, String> stageInputProperties() {
        Map<String, String> p = new LinkedHashMap<>();
        p.put("input.format", format == WireFormat.AVRO ? "avro-single-object" : "json");
        p.put("field.features.map", "channels");
        p.put("field.target", columns.get(columns.size() - 1));
        p.put("field.key", "station");
        p.put("field.time", "time");
        p.put("field.weight", "weight");
        return Map.copyOf(p);
    }

    /** The record key: the station name, UTF-8. */
    public byte[] key(StationRow row) {
        return row.station().getBytes(StandardCharsets.UTF_8);
    }

    /** The record value in this encoder's format. */
    public byte[] value(StationRow row) {
        return format == WireFormat.AVRO ? avro(row) : json(row);
    }

    /** The row as the generated Avro class; the channel map iterates in column order. */
    public StationReading reading(StationRow row) {
        checkWidth(row);
        Map<String, Double> channels = new LinkedHashMap<>();
        for (int i = 0; i < columns.size(); i++) {
            channels.put(columns.get(i), row.value(i));
        }
        return StationReading.newBuilder()
                .setStation(row.station())
                .setTime(Instant.ofEpochMilli(row.timeMs()))
                .setChannels(channels)
                .setWeight(row.weight())
                .build();
    }

    private byte[] avro(StationRow row) {
        try {
            ByteBuffer buf = StationReading.getEncoder().encode(reading(row));
            byte[] bytes = new byte[buf.remaining()];
            buf.get(bytes);
            return bytes;
        } catch (IOException e) {
            throw new UncheckedIOException("Avro encoding of a reading of " + row.station() + " failed", e);
        }
    }

    private byte[] json(StationRow row) {
        checkWidth(row);
        ByteArrayOutputStream out = new ByteArrayOutputStream(64 + 32 * columns.size());
        try (JsonGenerator g = JSON.createGenerator(out)) {
            g.writeStartObject();
            g.writeStringField("station", row.station());
            g.writeNumberField("time", row.timeMs());
            g.writeObjectFieldStart("channels");
            for (int i = 0; i < columns.size(); i++) {
                g.writeNumberField(columns.get(i), row.value(i));
            }
            g.writeEndObject();
            g.writeNumberField("weight", row.weight());
            g.writeEndObject();
        } catch (IOException e) {
            throw new UncheckedIOException("JSON encoding of a reading of " + row.station() + " failed", e);
        }
        return out.toByteArray();
    }

    private void checkWidth(StationRow row) {
        if (row.width() != columns.size()) {
            throw new IllegalArgumentException("row width must be " + columns.size() + ", got " + row.width());
        }
    }
}

package lariat.codec;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;
import java.util.regex.Pattern;
import java.util.stream.Collectors;
import lariat.config.InputFormat;
import lariat.config.StageConfig;
import lariat.schema.StationReading;
import org.apache.avro.Schema;
import org.apache.avro.SchemaCompatibility;

/**
 * Decodes the raw bytes of one input record into a {@link Decoded}: never throws for bad input, so
 * one bad record cannot wedge the consumer and never touches state (a key's layout is fixed only by an
 * accepted record). Configuration problems (a missing schema file, a field the reader schema lacks, a
 * writer schema that does not resolve) are found once, by {@link #create}.
 *
 * <p>Hot path: the schemas are parsed once, one resolving Avro reader per writer schema and one
 * binary decoder are reused, field positions and Avro patterns are resolved at construction, and a
 * name pattern over JSON or map channels is applied only to a key's first record (with a cache).
 * {@link #decodeInto} adds a fast path for Avro bodies of the reader schema's own fingerprint that
 * reads them straight into a reused {@link RowBuffer} and leaves everything else to {@link #decode}.
 * One instance per thread.
 */
public final class RecordDecoder {

    private final ValueParser parser;
    private final FieldMapper mapper;
    private final Schema reader;
    private final DirectAvroReader direct;
    private long directAccepted;

    private RecordDecoder(ValueParser parser, FieldMapper mapper, Schema reader, DirectAvroReader direct) {
        this.parser = parser;
        this.mapper = mapper;
        this.reader = reader;
        this.direct = direct;
    }

    /** A decoder whose schema files resolve against the working directory. */
    public static RecordDecoder create(StageConfig config) {
        return create(config, Path.of(""));
    }

    /**
     * A decoder whose relative schema file names resolve against {@code baseDir} (e.g. the folder of the
     * configuration file).
     *
     * @throws IllegalArgumentException naming the key when a schema file cannot be read, a writer schema
     *                                  does not resolve to the reader schema, or a field is not in the reader schema
     */
    public static RecordDecoder create(StageConfig config, Path baseDir) {
        InputFormat format = config.get(StageConfig.INPUT_FORMAT);
        if (format == InputFormat.JSON) {
            return new RecordDecoder(new JsonRecordParser(), new FieldMapper(plan(config, null)), null, null);
        }
        String readerFile = config.get(StageConfig.INPUT_SCHEMA_FILE);
        Schema reader = readerFile.isEmpty() ? StationReading.getClassSchema()
                : SchemaFiles.read(StageConfig.INPUT_SCHEMA_FILE.name(), baseDir, readerFile);
        List<Schema> writers = new ArrayList<>();
        for (String f : config.get(StageConfig.INPUT_WRITER_SCHEMA_FILES)) {
            Schema w = SchemaFiles.read(StageConfig.INPUT_WRITER_SCHEMA_FILES.name(), baseDir, f);
            checkResolves(reader, w, f);
            writers.add(w);
        }
        FieldMapper.Plan plan = plan(config, reader);
        FieldMapper mapper = new FieldMapper(plan);
        if (format == InputFormat.AVRO_BINARY) {
            Schema writer = writers.isEmpty() ? reader : writers.get(0);
            return new RecordDecoder(new AvroBinaryParser(reader, writer), mapper, reader,
                    DirectAvroReader.compile(reader, writer, plan, false));
        }
        writers.add(0, reader);
        return new RecordDecoder(new AvroSingleObjectParser(reader, writers), mapper, reader,
                DirectAvroReader.compile(reader, reader, plan, true));
    }

    /**
     * Decodes one record.
     *
     * @param recordKey the Kafka record key bytes (the model key when field.key is empty), may be null
     * @param value the Kafka record value bytes, may be null (a tombstone, rejected)
     * @param timestampMs the Kafka record timestamp (the event time when field.time is empty)
     * @param layouts the partition's per-key channel layouts; gains the layout of a new key when its
     *                first record is accepted, otherwise unchanged
     * @return a {@link Reading}, a {@link Rejection} or a {@link Skipped}
     */
    public Decoded decode(byte[] recordKey, byte[] value, long timestampMs, KeyLayouts layouts) {
        if (value == null) {
            return Rejection.of(RejectReason.UNDECODABLE, "value is null (a tombstone)", null);
        }
        try {
            return mapper.map(parser.parse(value), recordKey, timestampMs, layouts);
        } catch (RejectSignal r) {
            return r.toRejection();
        } catch (RuntimeException e) {
            return Rejection.of(RejectReason.UNDECODABLE, "record does not decode: " + RejectSignal.message(e),
                    e.getClass().getName());
        }
    }

    /**
     * Decodes one record as {@link #decode} does, an accepted one into {@code out} instead of a new
     * {@link Reading}. Avro records of the reader schema's own fingerprint go through a fast path
     * compiled at {@link #create} ({@link DirectAvroReader}) that only ever accepts, and declines to
     * {@link #decode} whatever it does not plainly accept, so outcomes, rejection reasons and details are
     * those of {@link #decode}.
     *
     * @param out modified: holds the record when it is accepted
     * @return {@code null} when the record is accepted into {@code out}, otherwise its {@link Rejection}
     *     or {@link Skipped}
     */
    public Decoded decodeInto(byte[] recordKey, byte[] value, long timestampMs, KeyLayouts layouts, RowBuffer out) {
        if (direct != null && value != null && direct.read(recordKey, value, timestampMs, layouts, out)) {
            directAccepted++;
            return null;
        }
        Decoded d = decode(recordKey, value, timestampMs, layouts);
        if (d instanceof Reading) {
            out.fill((Reading) d);
            return null;
        }
        return d;
    }

    /** How many records the fast path of {@link #decodeInto} accepted (the rest went through {@link #decode}). */
    long directAccepted() {
        return directAccepted;
    }

    /** Whether {@link #decodeInto} has a fast path for this configuration. */
    boolean hasDirectPath() {
        return direct != null;
    }

    /** The reader schema, or {@code null} for JSON input. */
    public Schema readerSchema() {
        return reader;
    }

    private static void checkResolves(Schema reader, Schema writer, String file) {
        SchemaCompatibility.SchemaPairCompatibility c = SchemaCompatibility.checkReaderWriterCompatibility(reader, writer);
        if (c.getType() != SchemaCompatibility.SchemaCompatibilityType.COMPATIBLE) {
            throw new IllegalArgumentException(StageConfig.INPUT_WRITER_SCHEMA_FILES.name() + ": writer schema '" + file
                    + "' does not resolve to the reader schema " + reader.getFullName() + ": "
                    + c.getResult().getIncompatibilities().stream()
                    .map(i -> i.getType() + " at " + i.getLocation() + " (" + i.getMessage() + ")")
                    .collect(Collectors.joining("; ")));
        }
    }

    private static FieldMapper.Plan plan(StageConfig config, Schema reader) {
        FieldMapper.Plan p = new FieldMapper.Plan();
        p.keyField = config.get(StageConfig.FIELD_KEY);
        p.timeField = config.get(StageConfig.FIELD_TIME);
        p.timeUnit = config.get(StageConfig.FIELD_TIME_UNIT);
        p.weightField = config.get(StageConfig.FIELD_WEIGHT);
        p.target = config.get(StageConfig.FIELD_TARGET);
        p.mapField = config.get(StageConfig.FIELD_FEATURES_MAP);
        p.policy = config.get(StageConfig.MISSING_CHANNEL_POLICY);
        p.maxAbs = config.get(StageConfig.VALUE_MAX_ABS);
        p.maxCount = config.get(StageConfig.FIELD_FEATURES_MAX_COUNT);
        Pattern pattern = config.get(StageConfig.FIELD_FEATURES_PATTERN);
        p.pattern = pattern.pattern().isEmpty() ? null : pattern;
        Set<String> roles = new HashSet<>(List.of(p.target, p.keyField, p.timeField, p.weightField, p.mapField));
        roles.remove("");
        p.roleFields = roles;
        List<String> list = config.get(StageConfig.FIELD_FEATURES);
        if (!list.isEmpty()) {
            p.fixedLayout = ChannelLayout.of(list);
        }
        if (reader != null) {
            AvroFieldCheck.check(reader, p, list);
            if (p.mapField.isEmpty() && p.pattern != null) {
                p.fixedLayout = AvroFieldCheck.patternLayout(reader, p);
                p.pattern = null;
            }
        }
        return p;
    }
}

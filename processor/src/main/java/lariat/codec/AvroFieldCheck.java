package lariat.codec;

import java.util.ArrayList;
import java.util.EnumSet;
import java.util.List;
import java.util.Set;
import java.util.stream.Collectors;
import lariat.config.StageConfig;
import org.apache.avro.Schema;

/** Checks the configured fields against an Avro reader schema once, before any record is read. */
final class AvroFieldCheck {

    private static final Set<Schema.Type> NUMBERS = EnumSet.of(Schema.Type.INT, Schema.Type.LONG,
            Schema.Type.FLOAT, Schema.Type.DOUBLE);
    private static final Set<Schema.Type> KEYS = EnumSet.of(Schema.Type.STRING, Schema.Type.INT,
            Schema.Type.LONG, Schema.Type.ENUM);

    private AvroFieldCheck() {
    }

    /**
     * @throws IllegalArgumentException naming the key when a field is absent or can never hold a usable value
     */
    static void check(Schema reader, FieldMapper.Plan p, List<String> features) {
        boolean map = !p.mapField.isEmpty();
        if (!map) {
            require(reader, StageConfig.FIELD_TARGET.name(), p.target, NUMBERS);
            for (String f : features) {
                require(reader, StageConfig.FIELD_FEATURES.name(), f, NUMBERS);
            }
        } else {
            Schema m = unwrap(require(reader, StageConfig.FIELD_FEATURES_MAP.name(), p.mapField,
                    EnumSet.of(Schema.Type.MAP)), EnumSet.of(Schema.Type.MAP));
            if (!holds(m.getValueType(), NUMBERS)) {
                throw new IllegalArgumentException(StageConfig.FIELD_FEATURES_MAP.name() + ": map field '" + p.mapField
                        + "' of " + reader.getFullName() + " has values of type " + m.getValueType() + ", need numbers");
            }
        }
        if (!p.keyField.isEmpty()) {
            require(reader, StageConfig.FIELD_KEY.name(), p.keyField, KEYS);
        }
        if (!p.timeField.isEmpty()) {
            require(reader, StageConfig.FIELD_TIME.name(), p.timeField, NUMBERS);
        }
        if (!p.weightField.isEmpty()) {
            require(reader, StageConfig.FIELD_WEIGHT.name(), p.weightField, NUMBERS);
        }
    }

    /** The numeric fields matching the pattern, in schema order, role fields excluded. */
    static ChannelLayout patternLayout(Schema reader, FieldMapper.Plan p) {
        List<String> names = new ArrayList<>();
        for (Schema.Field f : reader.getFields()) {
            if (!p.roleFields.contains(f.name()) && holds(f.schema(), NUMBERS) && p.pattern.matcher(f.name()).matches()) {
                names.add(f.name());
            }
        }
        if (names.isEmpty() || names.size() > p.maxCount) {
            throw new IllegalArgumentException(StageConfig.FIELD_FEATURES_PATTERN.name() + ": matches " + names.size()
                    + " numeric fields of " + reader.getFullName() + ", need 1 to " + p.maxCount + ", got "
                    + p.pattern.pattern());
        }
        return ChannelLayout.of(names);
    }

    private static Schema require(Schema reader, String key, String field, Set<Schema.Type> types) {
        Schema.Field f = reader.getField(field);
        if (f == null) {
            throw new IllegalArgumentException(key + ": reader schema " + reader.getFullName() + " has no field '"
                    + field + "' (fields: " + reader.getFields().stream().map(Schema.Field::name)
                    .collect(Collectors.joining(", ")) + ")");
        }
        if (!holds(f.schema(), types)) {
            throw new IllegalArgumentException(key + ": field '" + field + "' of " + reader.getFullName()
                    + " has type " + f.schema() + ", need one of " + types);
        }
        return f.schema();
    }

    private static boolean holds(Schema s, Set<Schema.Type> types) {
        if (s.getType() == Schema.Type.UNION) {
            return s.getTypes().stream().anyMatch(t -> types.contains(t.getType()));
        }
        return types.contains(s.getType());
    }

    private static Schema unwrap(Schema s, Set<Schema.Type> types) {
        if (s.getType() != Schema.Type.UNION) {
            return s;
        }
        return s.getTypes().stream().filter(t -> types.contains(t.getType())).findFirst().orElseThrow();
    }
}

package lariat.config;

import java.util.Objects;
import java.util.function.Predicate;

/**
 * The definition of one Lariat configuration key: its dotted name, type, default, validator and
 * a one-line doc. Instances are the constants of {@link StageConfig}; values are read with
 * {@link StageConfig#get(ConfigKey)}.
 *
 * <p>A key marked {@linkplain #computing() computing} changes what a model version contains for the
 * same input records, and therefore enters {@link StageConfig#configHash()}; other keys only decide
 * where records go or when work happens.
 *
 * @param <T> the parsed Java type of the value
 */
public final class ConfigKey<T> {

    private final String name;
    private final ValueType<T> type;
    private final String defaultValue;
    private final Predicate<T> valid;
    private final String validDoc;
    private final String doc;
    private final boolean computing;

    private ConfigKey(String name, ValueType<T> type, String defaultValue, Predicate<T> valid,
                      String validDoc, String doc, boolean computing) {
        this.name = Objects.requireNonNull(name, "name");
        this.type = Objects.requireNonNull(type, "type");
        this.defaultValue = defaultValue;
        this.valid = Objects.requireNonNull(valid, "valid");
        this.validDoc = Objects.requireNonNull(validDoc, "validDoc");
        this.doc = Objects.requireNonNull(doc, "doc");
        this.computing = computing;
        if (defaultValue != null) {
            parse(defaultValue);
        }
    }

    static <T> ConfigKey<T> of(String name, ValueType<T> type, String defaultValue, Predicate<T> valid,
                               String validDoc, String doc, boolean computing) {
        return new ConfigKey<>(name, type, defaultValue, valid, validDoc, doc, computing);
    }

    /** The dotted key name, e.g. {@code refit.every.records}. */
    public String name() {
        return name;
    }

    /** The type as shown in the configuration reference, e.g. {@code long} or {@code reject | skip}. */
    public String typeName() {
        return type.name();
    }

    /** The default spelling, or {@code null} when the key is required. */
    public String defaultValue() {
        return defaultValue;
    }

    /** Whether the key must be set because it has no default. */
    public boolean required() {
        return defaultValue == null;
    }

    /** What a valid value is, e.g. {@code >= 1}; empty when every well-typed value is valid. */
    public String validDoc() {
        return validDoc;
    }

    /** The one-line description. */
    public String doc() {
        return doc;
    }

    /** Whether the value changes what is computed and so enters the configuration hash. */
    public boolean computing() {
        return computing;
    }

    /**
     * Parses and validates a spelling.
     *
     * @throws IllegalArgumentException "name: reason, got 'raw'" when malformed or invalid
     */
    T parse(String raw) {
        T value;
        try {
            value = type.parse(raw);
        } catch (IllegalArgumentException e) {
            throw new IllegalArgumentException(name + ": " + e.getMessage() + ", got '" + raw + "'", e);
        }
        if (!valid.test(value)) {
            throw new IllegalArgumentException(name + ": must be " + validDoc + ", got " + raw);
        }
        return value;
    }

    /** The canonical spelling of a parsed value, used by the configuration hash. */
    String canonical(Object value) {
        @SuppressWarnings("unchecked")
        T v = (T) value;
        return type.canonical(v);
    }

    @Override
    public String toString() {
        return name;
    }
}

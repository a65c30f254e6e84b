package lariat.codec;

/** Why an input record was rejected; carried in the dead-letter record's headers and counted by the metrics. */
public enum RejectReason {
    /** The bytes are not a record of the configured format (malformed, truncated, trailing bytes, empty). */
    UNDECODABLE,
    /** Avro single-object encoding with a fingerprint of no known writer schema. */
    UNKNOWN_SCHEMA,
    /** The value does not start with the Avro single-object marker C3 01. */
    BAD_MARKER,
    /** A configured field (target, key, time, weight, map, or a channel under missing.channel.policy = reject) is absent or null. */
    MISSING_FIELD,
    /** A field holds a value of the wrong type, e.g. text where a number is needed. */
    WRONG_TYPE,
    /** A target or feature value is NaN or infinite. */
    NON_FINITE,
    /** A target or feature magnitude exceeds value.max.abs. */
    OUT_OF_RANGE,
    /** The record has no feature channels, or more than field.features.max.count. */
    WRONG_WIDTH,
    /** The model key is null, empty, too long or not UTF-8. */
    BAD_KEY,
    /** The event time is negative, not finite or out of range. */
    BAD_TIME,
    /** The weight is not a finite number in (0, value.max.abs]. */
    BAD_WEIGHT
}

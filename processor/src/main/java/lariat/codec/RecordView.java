package lariat.codec;

import java.util.List;

/**
 * A decoded record seen through plain Java values, so that field mapping is the same for every
 * format. A value is a {@link Number} ({@code Long} for integers, {@code Double} otherwise), a
 * {@link CharSequence}, a map handle for {@link #mapEntry}, {@code null} when absent or null, or any
 * other object for a value of another type (a boolean, an array), whose text names the type.
 */
interface RecordView {

    /** The value of a top-level field. */
    Object field(String name);

    /** The top-level field names in record order. */
    void fieldNames(List<String> out);

    /** Whether a value returned by {@link #field} is a map of channel to value. */
    boolean isMap(Object value);

    /** The value of channel {@code i} of a layout in a map, or {@code null} when absent. */
    Object mapEntry(Object map, ChannelLayout layout, int i);


    /** The channel names of a map in any order. */
    void mapNames(Object map, List<String> out);

    /** A name for the type of an unusable value, e.g. "boolean". */
    String typeName(Object value);
}

package lariat.codec;

/**
 * The reusable target of {@link RecordDecoder#decodeInto}: the model key, channel layout, values
 * z = (x_1 ... x_p, y), weight and event time of the last accepted record. Mutable and owned by one
 * thread; every accepted record overwrites it, and {@link #z()} is the live array (not copied), so a
 * caller copies what it keeps before the next decode. The values are finite and the weight positive,
 * as for a {@link Reading}.
 */
public final class RowBuffer {

    private String key;
    private ChannelLayout layout;
    private double[] z = new double[0];
    private double weight;
    private long eventTimeMs;

    private RowBuffer() {
    }

    /** An empty buffer. */
    public static RowBuffer create() {
        return new RowBuffer();
    }

    public String key() {
        return key;
    }

    public ChannelLayout layout() {
        return layout;
    }

    /** The live values of the last accepted record (features in layout order, then the target); not a copy. */
    public double[] z() {
        return z;
    }

    public double weight() {
        return weight;
    }

    public long eventTimeMs() {
        return eventTimeMs;
    }

    /** The value array resized to {@code length} (reused when it already has that length), for the decoder to fill. */
    double[] values(int length) {
        if (z.length != length) {
            z = new double[length];
        }
        return z;
    }

    void set(String key, ChannelLayout layout, double weight, long eventTimeMs) {
        this.key = key;
        this.layout = layout;
        this.weight = weight;
        this.eventTimeMs = eventTimeMs;
    }

    /** Copies an accepted {@link Reading} in. */
    void fill(Reading r) {
        r.copyZ(values(r.width() + 1));
        set(r.key(), r.layout(), r.weight(), r.eventTimeMs());
    }
}

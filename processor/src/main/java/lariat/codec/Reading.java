package lariat.codec;

import java.util.List;
import java.util.Objects;

/**
 * One accepted input record: its model key, the key's channel layout, the values
 * z = (x_1 ... x_p, y) with the target last, a positive weight and the event time. Every value is
 * finite; the arrays are copied in and out.
 */
public final class Reading implements Decoded {

    private final String key;
    private final ChannelLayout channels;
    private final double[] z;
    private final double weight;
    private final long eventTimeMs;

    private Reading(String key, ChannelLayout channels, double[] z, double weight, long eventTimeMs) {
        this.key = Objects.requireNonNull(key, "key");
        this.channels = Objects.requireNonNull(channels, "channels");
        if (key.isEmpty()) {
            throw new IllegalArgumentException("key: must be non-empty");
        }
        if (z.length != channels.size() + 1) {
            throw new IllegalArgumentException("z: length must be channels + 1 = " + (channels.size() + 1)
                    + ", got " + z.length);
        }
        for (int i = 0; i < z.length; i++) {
            if (!Double.isFinite(z[i])) {
                throw new IllegalArgumentException("z[" + i + "]: must be finite, got " + z[i]);
            }
        }
        if (!(weight > 0) || !Double.isFinite(weight)) {
            throw new IllegalArgumentException("weight: must be finite and > 0, got " + weight);
        }
        this.z = z;
        this.weight = weight;
        this.eventTimeMs = eventTimeMs;
    }

    /**
     * @param z features in the layout's order, then the target; copied
     * @throws IllegalArgumentException if the key is empty, a value is not finite, the width is wrong
     *                                  or the weight is not positive
     */
    public static Reading of(String key, ChannelLayout channels, double[] z, double weight, long eventTimeMs) {
        return new Reading(key, channels, z.clone(), weight, eventTimeMs);
    }

    static Reading ofOwned(String key, ChannelLayout channels, double[] z, double weight, long eventTimeMs) {
        return new Reading(key, channels, z, weight, eventTimeMs);
    }

    public String key() {
        return key;
    }

    /** The key's channel layout (feature names in column order). */
    public ChannelLayout layout() {
        return channels;
    }

    /** The feature channel names in column order. */
    public List<String> channels() {
        return channels.names();
    }

    /** A copy of z: the features in channel order, then the target. */
    public double[] z() {
        return z.clone();
    }

    /** Copies z into {@code out} (length channels + 1), which is modified; for loops that allocate nothing. */
    public void copyZ(double[] out) {
        if (out.length != z.length) {
            throw new IllegalArgumentException("out: length must be " + z.length + ", got " + out.length);
        }
        System.arraycopy(z, 0, out, 0, z.length);
    }

    /** The number of features p. */
    public int width() {
        return z.length - 1;
    }

    public double target() {
        return z[z.length - 1];
    }

    public double weight() {
        return weight;
    }

    public long eventTimeMs() {
        return eventTimeMs;
    }

    @Override
    public String toString() {
        return "Reading(" + key + ", t=" + eventTimeMs + ", w=" + weight + ", " + channels + ")";
    }
}

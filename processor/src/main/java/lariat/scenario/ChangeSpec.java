package lariat.scenario;

import java.util.Objects;

/**
 * A planned change of one station's true model, placed at a fraction of the run so the same plan
 * fits any run length. The change takes effect at reading {@code round(atFraction × N)} of the
 * station, N being the readings per station.
 */
public final class ChangeSpec {

    private final int stationIndex;
    private final double atFraction;
    private final ChangeKind kind;
    private final String channel;
    private final double effectPerSd;

    private ChangeSpec(int stationIndex, double atFraction, ChangeKind kind, String channel, double effectPerSd) {
        if (stationIndex < 0) {
            throw new IllegalArgumentException("stationIndex must be >= 0, got " + stationIndex);
        }
        if (!(atFraction > 0 && atFraction < 1)) {
            throw new IllegalArgumentException("atFraction must be in (0, 1), got " + atFraction);
        }
        ChannelCatalog.index(Objects.requireNonNull(channel, "channel"));
        if (kind == ChangeKind.ENTERS && !(Double.isFinite(effectPerSd) && effectPerSd != 0)) {
            throw new IllegalArgumentException("effectPerSd must be finite and non-zero, got " + effectPerSd);
        }
        this.stationIndex = stationIndex;
        this.atFraction = atFraction;
        this.kind = kind;
        this.channel = channel;
        this.effectPerSd = effectPerSd;
    }

    /**
     * The channel starts driving the target with the given effect, in target units (amperes) per
     * standard deviation of the channel.
     */
    public static ChangeSpec enters(int stationIndex, double atFraction, String channel, double effectPerSd) {
        return new ChangeSpec(stationIndex, atFraction, ChangeKind.ENTERS, channel, effectPerSd);
    }

    /** The channel stops driving the target. */
    public static ChangeSpec leaves(int stationIndex, double atFraction, String channel) {
        return new ChangeSpec(stationIndex, atFraction, ChangeKind.LEAVES, channel, Double.NaN);
    }

    /** The channel's coefficient changes sign. */
    public static ChangeSpec signFlip(int stationIndex, double atFraction, String channel) {
        return new ChangeSpec(stationIndex, atFraction, ChangeKind.SIGN_FLIP, channel, Double.NaN);
    }

    public int stationIndex() {
        return stationIndex;
    }

    public double atFraction() {
        return atFraction;
    }

    public ChangeKind kind() {
        return kind;
    }

    public String channel() {
        return channel;
    }

    /** Effect of an entering channel in amperes per standard deviation; NaN for other kinds. */
    public double effectPerSd() {
        return effectPerSd;
    }

    @Override
    public String toString() {
        return "station " + stationIndex + " at " + atFraction + ": " + channel + " " + kind.verb();
    }
}

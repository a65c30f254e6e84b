package lariat.report.demo;

import java.util.ArrayList;
import java.util.List;

/**
 * A change alert of a station: the event time and version at which its selected active set
 * changed, with the channels that entered, left, or flipped sign.
 */
public final class AlertMark {

    private final long timeMs;
    private final long version;
    private final List<String> entered;
    private final List<String> left;
    private final List<String> flipped;

    private AlertMark(long timeMs, long version, List<String> entered, List<String> left, List<String> flipped) {
        this.timeMs = timeMs;
        this.version = version;
        this.entered = Checks.names(entered, "entered");
        this.left = Checks.names(left, "left");
        this.flipped = Checks.names(flipped, "flipped");
    }

    public static AlertMark of(long timeMs, long version, List<String> entered, List<String> left,
            List<String> flipped) {
        return new AlertMark(timeMs, version, entered, left, flipped);
    }

    public long timeMs() {
        return timeMs;
    }

    public long version() {
        return version;
    }

    public List<String> entered() {
        return entered;
    }

    public List<String> left() {
        return left;
    }

    public List<String> flipped() {
        return flipped;
    }

    /** Whether this alert reports the given change of a channel. */
    public boolean reports(ChangeMark change) {
        switch (change.kind()) {
            case ENTERS:
                return entered.contains(change.channel());
            case LEAVES:
                return left.contains(change.channel());
            default:
                return flipped.contains(change.channel());
        }
    }

    /** For example "v12: +bearing_de_temp_c −flow_m3h ±supply_voltage_v". */
    public String describe() {
        List<String> parts = new ArrayList<>();
        entered.forEach(c -> parts.add("+" + c));
        left.forEach(c -> parts.add("\u2212" + c));
        flipped.forEach(c -> parts.add("\u00b1" + c));
        return "v" + version + ": " + String.join(" ", parts);
    }
}

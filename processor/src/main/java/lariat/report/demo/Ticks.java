package lariat.report.demo;

import java.time.Instant;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Axis ticks. Numbers: steps of 1, 2 or 5 × 10^k giving at most {@code maxTicks} ticks over the
 * range (the common practice of "nice numbers"). Event times: the smallest step from a list of
 * round durations (1 min … 30 d) giving at most {@code maxTicks} ticks, aligned to UTC midnight.
 */
final class Ticks {

    private static final long MINUTE = 60_000L;
    private static final long HOUR = 60 * MINUTE;
    private static final long DAY = 24 * HOUR;
    private static final long[] TIME_STEPS = {
        MINUTE, 5 * MINUTE, 15 * MINUTE, 30 * MINUTE, HOUR, 2 * HOUR, 3 * HOUR, 6 * HOUR, 12 * HOUR,
        DAY, 2 * DAY, 7 * DAY, 14 * DAY, 30 * DAY};
    private static final DateTimeFormatter DAY_LABEL = DateTimeFormatter.ofPattern("MM-dd", Locale.ROOT)
            .withZone(ZoneOffset.UTC);
    private static final DateTimeFormatter TIME_LABEL = DateTimeFormatter.ofPattern("MM-dd HH:mm", Locale.ROOT)
            .withZone(ZoneOffset.UTC);

    private Ticks() {
    }

    /** The step of nice ticks covering [lo, hi], lo &lt; hi. */
    static double step(double lo, double hi, int maxTicks) {
        double raw = (hi - lo) / Math.max(1, maxTicks - 1);
        double mag = Math.pow(10, Math.floor(Math.log10(raw)));
        for (double m : new double[] {1, 2, 5, 10}) {
            if (m * mag >= raw) {
                return m * mag;
            }
        }
        return 10 * mag;
    }

    /** Multiples of {@code step} inside [lo, hi]. */
    static List<Double> values(double lo, double hi, double step) {
        List<Double> out = new ArrayList<>();
        for (long k = (long) Math.ceil(lo / step - 1e-9); k * step <= hi + 1e-9 * step; k++) {
            out.add(k * step);
        }
        return out;
    }

    /** A number label with as few decimals as the step needs. */
    static String label(double v, double step) {
        int decimals = Math.max(0, (int) -Math.floor(Math.log10(step) + 1e-9));
        return String.format(Locale.ROOT, "%." + decimals + "f", Math.abs(v) < step * 1e-6 ? 0.0 : v);
    }

    static long timeStep(long fromMs, long toMs, int maxTicks) {
        for (long s : TIME_STEPS) {
            if ((toMs - fromMs) / s < maxTicks) {
                return s;
            }
        }
        return TIME_STEPS[TIME_STEPS.length - 1];
    }

    static List<Long> times(long fromMs, long toMs, long step) {
        List<Long> out = new ArrayList<>();
        for (long t = Math.floorDiv(fromMs + step - 1, step) * step; t <= toMs; t += step) {
            out.add(t);
        }
        return out;
    }

    static String timeLabel(long ms, long step) {
        return (step >= DAY ? DAY_LABEL : TIME_LABEL).format(Instant.ofEpochMilli(ms));
    }
}

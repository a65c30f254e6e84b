package lariat.audit;

import java.io.PrintStream;
import java.util.Locale;

/**
 * Writes a replay's progress as one line at most every {@code intervalMs} (and a last line at the
 * end): offset reached of the target, percent, records per second and the time left estimated from
 * the rate of offsets so far, e.g.
 * {@code replay readings/0: offset 120000 of 500000 (24.0%), 85210 records/s, about 4 s left}.
 */
public final class ProgressLine implements Progress {

    private final PrintStream out;
    private final long intervalNanos;
    private long lastNanos = Long.MIN_VALUE;

    public ProgressLine(PrintStream out, long intervalMs) {
        this.out = out;
        this.intervalNanos = intervalMs * 1_000_000L;
    }

    @Override
    public void report(String what, long offset, long target, long records, double seconds, boolean finished) {
        long now = System.nanoTime();
        if (!finished && lastNanos != Long.MIN_VALUE && now - lastNanos < intervalNanos) {
            return;
        }
        lastNanos = now;
        out.println(line(what, offset, target, records, seconds, finished));
        out.flush();
    }

    /** The text of one progress line. */
    static String line(String what, long offset, long target, long records, double seconds, boolean finished) {
        double pct = target <= 0 ? 100.0 : Math.min(100.0, 100.0 * offset / target);
        double rate = seconds > 0 ? records / seconds : 0.0;
        String left;
        if (finished) {
            left = String.format(Locale.ROOT, "done in %.1f s", seconds);
        } else if (offset > 0 && seconds > 0) {
            left = String.format(Locale.ROOT, "about %.0f s left", seconds * (target - offset) / offset);
        } else {
            left = "time left unknown";
        }
        return String.format(Locale.ROOT, "replay %s: offset %d of %d (%.1f%%), %.0f records/s, %s", what, offset,
                target, pct, rate, left);
    }
}

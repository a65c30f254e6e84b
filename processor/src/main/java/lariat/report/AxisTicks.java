package lariat.report;

import java.util.Locale;

/**
 * Tick positions at "nice" round steps (1, 2 or 5 times a power of ten) covering a data range, in the
 * manner of Heckbert (1990), "Nice numbers for graph labels", Graphics Gems, Academic Press.
 */
final class AxisTicks {

    private final double start;
    private final double step;
    private final int count;

    private AxisTicks(double start, double step, int count) {
        this.start = start;
        this.step = step;
        this.count = count;
    }

    /** About {@code target} ticks spanning {@code [lo, hi]}; a degenerate range is widened by one unit. */
    static AxisTicks of(double lo, double hi, int target) {
        if (!(hi > lo)) {
            double pad = lo == 0 ? 1 : Math.abs(lo) * 0.1;
            lo -= pad;
            hi += pad;
        }
        double raw = (hi - lo) / Math.max(1, target);
        double mag = Math.pow(10, Math.floor(Math.log10(raw)));
        double f = raw / mag;
        double step = (f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10) * mag;
        double start = Math.floor(lo / step) * step;
        double end = Math.ceil(hi / step) * step;
        int count = (int) Math.round((end - start) / step) + 1;
        return new AxisTicks(start, step, count);
    }

    int count() {
        return count;
    }

    double value(int i) {
        double v = start + i * step;
        return Math.abs(v) < step * 1e-9 ? 0.0 : v;
    }

    double low() {
        return value(0);
    }

    double high() {
        return value(count - 1);
    }

    /** A label with just enough decimals for the step. */
    String label(int i) {
        int decimals = Math.max(0, (int) -Math.floor(Math.log10(step) + 1e-9));
        return String.format(Locale.ROOT, "%." + decimals + "f", value(i));
    }
}

package lariat.bench;

import java.util.Arrays;

/** Wall-clock durations of repeated runs, in seconds, with their median, minimum and maximum. Immutable. */
final class Timings {

    private final double[] seconds;

    private Timings(double[] seconds) {
        if (seconds == null || seconds.length == 0) {
            throw new IllegalArgumentException("seconds must hold at least one run");
        }
        this.seconds = seconds.clone();
        Arrays.sort(this.seconds);
    }

    static Timings of(double[] seconds) {
        return new Timings(seconds);
    }

    int runs() {
        return seconds.length;
    }

    /** The middle value, or the mean of the two middle values for an even count. */
    double median() {
        int m = seconds.length / 2;
        return seconds.length % 2 == 1 ? seconds[m] : 0.5 * (seconds[m - 1] + seconds[m]);
    }

    double min() {
        return seconds[0];
    }

    double max() {
        return seconds[seconds.length - 1];
    }
}

package lariat.demo;

import java.io.PrintWriter;
import java.time.Instant;
import java.time.ZoneOffset;
import java.time.format.DateTimeFormatter;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;

import lariat.schema.ChangeAlert;
import lariat.schema.ModelVersion;

/**
 * The demo's console: a progress line, one line per published model version, one per change
 * alert, lines of at most {@value #WIDTH} characters, ASCII only. On a terminal the progress line
 * is rewritten in place and event lines are printed above it; otherwise every line is printed
 * once, top to bottom, with no control characters. Thread-safe.
 */
final class DemoConsole {

    static final int WIDTH = 79;
    private static final DateTimeFormatter SHORT = DateTimeFormatter.ofPattern("MM-dd HH:mm", Locale.ROOT)
            .withZone(ZoneOffset.UTC);
    private static final DateTimeFormatter LONG = DateTimeFormatter.ofPattern("yyyy-MM-dd HH:mm", Locale.ROOT)
            .withZone(ZoneOffset.UTC);

    private final PrintWriter out;
    private final boolean terminal;
    private String progress;

    DemoConsole(PrintWriter out, boolean terminal) {
        this.out = out;
        this.terminal = terminal;
    }

    /** Event time as "MM-dd HH:mm" (UTC). */
    static String shortTime(long ms) {
        return SHORT.format(Instant.ofEpochMilli(ms));
    }

    /** Event time as "yyyy-MM-dd HH:mm" (UTC). */
    static String longTime(long ms) {
        return LONG.format(Instant.ofEpochMilli(ms));
    }

    /** Prints a line of text above the progress line. */
    synchronized void line(String text) {
        clearProgress();
        out.println(text);
        redrawProgress();
        out.flush();
    }

    /** Replaces the progress line (on a terminal) or prints it as a line. */
    synchronized void progress(long sent, long total, long eventTimeMs, double recordsPerSecond, long lag,
            double elapsedSeconds) {
        String text = String.format(Locale.ROOT, "[%3.0fs] sent %d/%d  %5.0f rec/s  event time %s  lag %d",
                elapsedSeconds, sent, total, recordsPerSecond, longTime(eventTimeMs), lag);
        text = fit(text);
        if (terminal) {
            clearProgress();
            progress = text;
            redrawProgress();
        } else {
            out.println(text);
        }
        out.flush();
    }

    /** Ends the progress line so that later output starts on a fresh line. */
    synchronized void endProgress() {
        clearProgress();
        progress = null;
        out.flush();
    }

    /** Text wrapped at {@value #WIDTH} columns, continuation lines indented. */
    void paragraph(String text) {
        String[] words = text.split(" ");
        lines(words[0], List.of(words).subList(1, words.length));
    }

    /** One line for a new model version: what changed against the version before it. */
    void version(ModelVersion mv, Map<String, Double> before) {
        Map<String, Double> now = StationLog.coefficients(mv);
        String head = String.format(Locale.ROOT, "v%-3d %-9s %s  R2 %.3f  %2d active", mv.getVersion(), mv.getKey(),
                shortTime(mv.getLastEventTimeMs().toEpochMilli()), mv.getR2(), now.size());
        if (mv.getVersion() == 1) {
            lines(head + ":", new ArrayList<>(now.keySet()));
            return;
        }
        List<String> changes = changes(before, now);
        if (changes.isEmpty()) {
            line(head);
        } else {
            lines(head, changes);
        }
    }

    /** One line for a change alert. */
    void alert(ChangeAlert a) {
        List<String> words = new ArrayList<>();
        a.getEntered().forEach(c -> words.add("+" + c));
        a.getLeft().forEach(c -> words.add("-" + c));
        a.getSignFlipped().forEach(c -> words.add("~" + c));
        String head = String.format(Locale.ROOT, "ALERT %s v%d %s (held %d refits):", a.getKey(), a.getVersion(),
                shortTime(a.getEventTimeMs().toEpochMilli()), a.getPersistedRefits());
        lines(head, words);
    }

    /** +entered, -left, ~flipped (sign changed) channels from {@code before} to {@code now}. */
    static List<String> changes(Map<String, Double> before, Map<String, Double> now) {
        List<String> out = new ArrayList<>();
        for (Map.Entry<String, Double> e : now.entrySet()) {
            Double b = before.get(e.getKey());
            if (b == null) {
                out.add("+" + e.getKey());
            } else if (Math.signum(b) != Math.signum(e.getValue())) {
                out.add("~" + e.getKey());
            }
        }
        for (String c : before.keySet()) {
            if (!now.containsKey(c)) {
                out.add("-" + c);
            }
        }
        return out;
    }

    /** {@code head} followed by the words, wrapped at {@value #WIDTH} with an indent of 6. */
    private synchronized void lines(String head, List<String> words) {
        StringBuilder b = new StringBuilder(head);
        List<String> done = new ArrayList<>();
        for (String w : words) {
            if (b.length() + 1 + w.length() > WIDTH && b.length() > 6) {
                done.add(b.toString());
                b = new StringBuilder("      ");
            }
            b.append(b.toString().isBlank() ? "" : " ").append(w);
        }
        done.add(b.toString());
        clearProgress();
        for (String l : done) {
            out.println(fit(l));
        }
        redrawProgress();
        out.flush();
    }

    private static String fit(String text) {
        return text.length() <= WIDTH ? text : text.substring(0, WIDTH - 3) + "...";
    }

    private void clearProgress() {
        if (terminal && progress != null) {
            out.print("\r" + " ".repeat(WIDTH) + "\r");
        }
    }

    private void redrawProgress() {
        if (terminal && progress != null) {
            out.print(progress);
        }
    }
}

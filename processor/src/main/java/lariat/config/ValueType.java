package lariat.config;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.function.Function;
import java.util.regex.Pattern;
import java.util.regex.PatternSyntaxException;
import java.util.stream.Collectors;

/**
 * How a configuration value is spelled, parsed and written back in canonical form.
 * Parsing a malformed spelling throws {@link IllegalArgumentException} whose message completes the
 * sentence "key: ...", e.g. "must be an integer".
 *
 * @param <T> the parsed Java type
 */
final class ValueType<T> {

    static final ValueType<Long> LONG = new ValueType<>("long", s -> parseLong(s), String::valueOf);
    static final ValueType<Integer> INT = new ValueType<>("int", s -> parseInt(s), String::valueOf);
    static final ValueType<Double> DOUBLE = new ValueType<>("double", s -> parseDouble(s), String::valueOf);
    static final ValueType<Boolean> BOOLEAN = new ValueType<>("boolean", s -> parseBoolean(s), String::valueOf);
    static final ValueType<String> STRING = new ValueType<>("string", s -> s, s -> s);
    static final ValueType<List<String>> LIST = new ValueType<>("list", s -> parseList(s), l -> String.join(",", l));
    static final ValueType<Pattern> REGEX = new ValueType<>("regex", s -> parseRegex(s), Pattern::pattern);

    private final String name;
    private final Function<String, T> parser;
    private final Function<T, String> canonical;

    private ValueType(String name, Function<String, T> parser, Function<T, String> canonical) {
        this.name = name;
        this.parser = parser;
        this.canonical = canonical;
    }

    /** A type whose values are the ids of the given choices. */
    static <E extends Enum<E> & Choice> ValueType<E> choice(Class<E> type) {
        E[] all = type.getEnumConstants();
        String ids = Arrays.stream(all).map(Choice::id).collect(Collectors.joining(" | "));
        return new ValueType<>(ids, s -> {
            for (E e : all) {
                if (e.id().equals(s)) {
                    return e;
                }
            }
            throw new IllegalArgumentException("must be one of " + ids.replace(" | ", ", "));
        }, Choice::id);
    }

    String name() {
        return name;
    }

    T parse(String raw) {
        return parser.apply(raw);
    }

    String canonical(T value) {
        return canonical.apply(value);
    }

    private static long parseLong(String s) {
        try {
            return Long.parseLong(s);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("must be an integer", e);
        }
    }

    private static int parseInt(String s) {
        try {
            return Integer.parseInt(s);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("must be an integer in int range", e);
        }
    }

    private static double parseDouble(String s) {
        double v;
        try {
            v = Double.parseDouble(s);
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException("must be a number", e);
        }
        if (!Double.isFinite(v)) {
            throw new IllegalArgumentException("must be a finite number");
        }
        return v;
    }

    private static boolean parseBoolean(String s) {
        String l = s.toLowerCase(Locale.ROOT);
        if (l.equals("true")) {
            return true;
        }
        if (l.equals("false")) {
            return false;
        }
        throw new IllegalArgumentException("must be true or false");
    }

    private static List<String> parseList(String s) {
        if (s.isEmpty()) {
            return List.of();
        }
        List<String> out = new ArrayList<>();
        for (String item : s.split(",", -1)) {
            String t = item.trim();
            if (t.isEmpty()) {
                throw new IllegalArgumentException("must be a comma-separated list without empty items");
            }
            out.add(t);
        }
        return List.copyOf(out);
    }

    private static Pattern parseRegex(String s) {
        try {
            return Pattern.compile(s);
        } catch (PatternSyntaxException e) {
            throw new IllegalArgumentException("must be a valid regular expression ("
                    + e.getDescription() + " near index " + e.getIndex() + ")", e);
        }
    }
}

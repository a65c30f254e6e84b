package lariat.report.demo;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/** Argument checks and defensive copies shared by the report's value classes. */
final class Checks {

    private Checks() {
    }

    static String name(String value, String what) {
        if (value == null || value.isBlank()) {
            throw new IllegalArgumentException(what + " must be a non-empty name, got " + value);
        }
        return value;
    }

    static double finite(double value, String what) {
        if (!Double.isFinite(value)) {
            throw new IllegalArgumentException(what + " must be finite, got " + value);
        }
        return value;
    }

    /** An unmodifiable copy keeping the iteration order; names non-empty, values finite. */
    static Map<String, Double> coefficients(Map<String, Double> in, String what) {
        if (in == null) {
            throw new IllegalArgumentException(what + " must not be null");
        }
        Map<String, Double> out = new LinkedHashMap<>();
        for (Map.Entry<String, Double> e : in.entrySet()) {
            name(e.getKey(), what + " channel");
            if (e.getValue() == null || !Double.isFinite(e.getValue())) {
                throw new IllegalArgumentException(what + " of " + e.getKey() + " must be finite, got " + e.getValue());
            }
            out.put(e.getKey(), e.getValue());
        }
        return Collections.unmodifiableMap(out);
    }

    static List<String> names(List<String> in, String what) {
        if (in == null) {
            throw new IllegalArgumentException(what + " must not be null");
        }
        List<String> out = new ArrayList<>(in.size());
        for (String s : in) {
            out.add(name(s, what));
        }
        return List.copyOf(out);
    }

    static <T> List<T> list(List<T> in, String what) {
        if (in == null) {
            throw new IllegalArgumentException(what + " must not be null");
        }
        return List.copyOf(in);
    }
}

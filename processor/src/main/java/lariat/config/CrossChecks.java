package lariat.config;

import java.util.ArrayList;
import java.util.HashSet;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;

import static lariat.config.StageConfig.*;

/** Rules that involve more than one key; each error names the keys involved and their values. */
final class CrossChecks {

    private final Map<ConfigKey<?>, Object> values;
    private final List<String> errors = new ArrayList<>();

    private CrossChecks(Map<ConfigKey<?>, Object> values) {
        this.values = values;
    }

    static List<String> of(Map<ConfigKey<?>, Object> values) {
        CrossChecks c = new CrossChecks(values);
        c.featureSource();
        c.roleFields();
        c.formats();
        c.momentsAndSchedule();
        c.topics();
        c.selection();
        return c.errors;
    }

    private <T> T v(ConfigKey<T> key) {
        @SuppressWarnings("unchecked")
        T t = (T) values.get(key);
        return t;
    }

    private void featureSource() {
        List<String> list = v(FIELD_FEATURES);
        boolean pattern = !v(FIELD_FEATURES_PATTERN).pattern().isEmpty();
        if (!list.isEmpty() && pattern) {
            errors.add(FIELD_FEATURES + ", " + FIELD_FEATURES_PATTERN + ": set one, not both, got "
                    + String.join(",", list) + " and " + v(FIELD_FEATURES_PATTERN).pattern());
        }
        if (list.isEmpty() && !pattern && v(FIELD_FEATURES_MAP).isEmpty()) {
            errors.add(FIELD_FEATURES + ": no features configured; set field.features, "
                    + "field.features.pattern or field.features.map");
        }
        Set<String> seen = new HashSet<>();
        for (String f : list) {
            if (!seen.add(f)) {
                errors.add(FIELD_FEATURES + ": feature '" + f + "' listed twice");
            }
        }
        if (list.size() > v(FIELD_FEATURES_MAX_COUNT)) {
            errors.add(FIELD_FEATURES + ": " + list.size() + " features exceed "
                    + FIELD_FEATURES_MAX_COUNT + " = " + v(FIELD_FEATURES_MAX_COUNT));
        }
    }

    private void roleFields() {
        Map<String, ConfigKey<String>> roles = new LinkedHashMap<>();
        boolean map = !v(FIELD_FEATURES_MAP).isEmpty();
        for (ConfigKey<String> k : List.of(FIELD_TARGET, FIELD_FEATURES_MAP, FIELD_KEY, FIELD_TIME, FIELD_WEIGHT)) {
            String name = v(k);
            if (name.isEmpty() || map && k == FIELD_TARGET) {
                continue;
            }
            ConfigKey<String> other = roles.putIfAbsent(name, k);
            if (other != null) {
                errors.add(other + ", " + k + ": must name different fields, both got " + name);
            }
        }
        List<String> features = v(FIELD_FEATURES);
        String target = v(FIELD_TARGET);
        if (features.contains(target)) {
            errors.add(FIELD_FEATURES + ": must not contain the target " + FIELD_TARGET + " = " + target);
        }
        if (!map) {
            for (Map.Entry<String, ConfigKey<String>> e : roles.entrySet()) {
                if (e.getValue() != FIELD_TARGET && features.contains(e.getKey())) {
                    errors.add(FIELD_FEATURES + ": must not contain " + e.getValue() + " = " + e.getKey());
                }
            }
        }
    }

    private void formats() {
        if (v(INPUT_FORMAT) == InputFormat.AVRO_BINARY && v(INPUT_WRITER_SCHEMA_FILES).size() > 1) {
            errors.add(INPUT_WRITER_SCHEMA_FILES + ": avro-binary takes at most one writer schema, got "
                    + String.join(",", v(INPUT_WRITER_SCHEMA_FILES)));
        }
    }

    private void momentsAndSchedule() {
        if (v(FORGET_HALF_LIFE_MS) > 0 && v(WINDOW_PANE_MS) > 0) {
            errors.add(FORGET_HALF_LIFE_MS + ", " + WINDOW_PANE_MS + ": choose forgetting or a window, not both, got "
                    + v(FORGET_HALF_LIFE_MS) + " and " + v(WINDOW_PANE_MS));
        }
        if (v(REFIT_EVERY_RECORDS) == 0 && v(REFIT_EVERY_EVENT_MS) == 0) {
            errors.add(REFIT_EVERY_RECORDS + ", " + REFIT_EVERY_EVENT_MS + ": at least one must be > 0, got 0 and 0");
        }
    }

    private void topics() {
        Map<String, ConfigKey<String>> seen = new LinkedHashMap<>();
        for (ConfigKey<String> k : List.of(INPUT_TOPIC, MODEL_TOPIC, ALERT_TOPIC, SNAPSHOT_TOPIC, DEADLETTER_TOPIC,
                CLAIM_TOPIC)) {
            ConfigKey<String> other = seen.putIfAbsent(v(k), k);
            if (other != null) {
                errors.add(other + ", " + k + ": must be different topics, both got " + v(k));
            }
        }
    }

    private void selection() {
        int pathMax = v(PATH_MAX_ACTIVE);
        if (v(SELECT_RULE) == SelectRule.MAX_ACTIVE && pathMax > 0 && pathMax < v(SELECT_MAX_ACTIVE)) {
            errors.add(SELECT_MAX_ACTIVE + ": must be <= " + PATH_MAX_ACTIVE + " = " + pathMax + ", got "
                    + v(SELECT_MAX_ACTIVE));
        }
        if (v(SELECT_RULE) == SelectRule.TARGET_R2 && v(SELECT_TARGET_R2) > v(PATH_MAX_R2)) {
            errors.add(SELECT_TARGET_R2 + ": must be <= " + PATH_MAX_R2 + " = " + v(PATH_MAX_R2) + ", got "
                    + v(SELECT_TARGET_R2));
        }
    }
}

package lariat.codec;

import java.nio.ByteBuffer;
import java.nio.charset.CharacterCodingException;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;
import java.util.ArrayList;
import java.util.Collections;
import java.util.HashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import java.util.regex.Pattern;
import lariat.config.MissingChannelPolicy;
import lariat.config.TimeUnitChoice;

/**
 * Maps a {@link RecordView} to a {@link Reading} by the configured fields, checking every value.
 *
 * <p>Channel order: a configured list keeps its order, and a pattern over an Avro reader schema keeps
 * schema order; both are fixed for every key ({@code fixedLayout}). Otherwise (a map field, or a
 * pattern over JSON fields) the key's first accepted record fixes its layout with the channel names
 * sorted, and later records of the key are read in that layout: a missing channel follows the
 * missing-channel policy and extra channels are ignored. Not thread-safe.
 */
final class FieldMapper {

    static final int MAX_KEY_CHARS = 1024;
    private static final int PATTERN_CACHE_LIMIT = 1 << 16;

    private final String keyField;
    private final String timeField;
    private final TimeUnitChoice timeUnit;
    private final String weightField;
    private final String target;
    private final String mapField;
    private final ChannelLayout targetInMap;
    private final ChannelLayout fixedLayout;
    private final Pattern pattern;
    private final Set<String> roleFields;
    private final MissingChannelPolicy policy;
    private final double maxAbs;
    private final int maxCount;

    private final Map<String, Boolean> patternCache = new HashMap<>();
    private final CharsetDecoder utf8 = StandardCharsets.UTF_8.newDecoder()
            .onMalformedInput(CodingErrorAction.REPORT).onUnmappableCharacter(CodingErrorAction.REPORT);
    private final List<String> names = new ArrayList<>();

    FieldMapper(Plan plan) {
        this.keyField = plan.keyField;
        this.timeField = plan.timeField;
        this.timeUnit = plan.timeUnit;
        this.weightField = plan.weightField;
        this.target = plan.target;
        this.mapField = plan.mapField;
        this.targetInMap = mapField.isEmpty() ? null : ChannelLayout.of(List.of(target));
        this.fixedLayout = plan.fixedLayout;
        this.pattern = plan.pattern;
        this.roleFields = Set.copyOf(plan.roleFields);
        this.policy = plan.policy;
        this.maxAbs = plan.maxAbs;
        this.maxCount = plan.maxCount;
    }

    /** Everything the mapper needs from the configuration, resolved against the reader schema. */
    static final class Plan {
        String keyField = "";
        String timeField = "";
        TimeUnitChoice timeUnit = TimeUnitChoice.MILLISECONDS;
        String weightField = "";
        String target;
        String mapField = "";
        ChannelLayout fixedLayout;
        Pattern pattern;
        Set<String> roleFields = Set.of();
        MissingChannelPolicy policy = MissingChannelPolicy.REJECT;
        double maxAbs;
        int maxCount;
    }

    /**
     * @param layouts per-key layouts; a new key's layout is added only when the record is accepted
     * @throws RejectSignal for a bad record
     */
    Decoded map(RecordView view, byte[] kafkaKey, long kafkaTimestampMs, KeyLayouts layouts) {
        String key = key(view, kafkaKey);
        long time = time(view, kafkaTimestampMs);
        double weight = weight(view);
        Object map = null;
        if (!mapField.isEmpty()) {
            map = view.field(mapField);
            if (map == null) {
                throw new RejectSignal(RejectReason.MISSING_FIELD, "field '" + mapField + "' (channel map): missing");
            }
            if (!view.isMap(map)) {
                throw new RejectSignal(RejectReason.WRONG_TYPE, "field '" + mapField + "' (channel map): "
                        + view.typeName(map) + " " + RejectSignal.show(map) + ", need a map of channel to number");
            }
        }
        ChannelLayout layout = fixedLayout != null ? fixedLayout : layouts.get(key);
        boolean fresh = layout == null;
        if (fresh) {
            layout = discover(view, map);
        }
        double[] z = new double[layout.size() + 1];
        Object t = map == null ? view.field(target) : view.mapEntry(map, targetInMap, 0);
        if (t == null) {
            throw new RejectSignal(RejectReason.MISSING_FIELD, where(target, "target", map) + ": missing");
        }
        z[layout.size()] = number(t, target, "target", map, view);
        String missing = null;
        for (int i = 0; i < layout.size(); i++) {
            Object v = map == null ? view.field(layout.name(i)) : view.mapEntry(map, layout, i);
            if (v == null) {
                if (policy == MissingChannelPolicy.REJECT) {
                    throw new RejectSignal(RejectReason.MISSING_FIELD, where(layout.name(i), "feature", map)
                            + ": missing, and missing.channel.policy = reject");
                }
                if (missing == null) {
                    missing = layout.name(i);
                }
                continue;
            }
            z[i] = number(v, layout.name(i), "feature", map, view);
        }
        if (missing != null) {
            return Skipped.of(key, where(missing, "feature", map) + ": missing, and missing.channel.policy = skip");
        }
        if (fresh && fixedLayout == null) {
            layouts.put(key, layout);
        }
        return Reading.ofOwned(key, layout, z, weight, time);
    }

    private String key(RecordView view, byte[] kafkaKey) {
        String key;
        if (keyField.isEmpty()) {
            if (kafkaKey == null) {
                throw new RejectSignal(RejectReason.BAD_KEY, "Kafka record key is null and field.key is empty");
            }
            try {
                key = utf8.decode(ByteBuffer.wrap(kafkaKey)).toString();
            } catch (CharacterCodingException e) {
                throw new RejectSignal(RejectReason.BAD_KEY, "Kafka record key is not UTF-8", e);
            }
        } else {
            Object v = view.field(keyField);
            if (v == null) {
                throw new RejectSignal(RejectReason.MISSING_FIELD, "field '" + keyField + "' (key): missing");
            }
            if (v instanceof Long) {
                key = v.toString();
            } else if (v instanceof CharSequence) {
                key = v.toString();
            } else {
                throw new RejectSignal(RejectReason.WRONG_TYPE, "field '" + keyField + "' (key): "
                        + view.typeName(v) + " " + RejectSignal.show(v) + ", need text or an integer");
            }
        }
        if (key.isEmpty() || key.length() > MAX_KEY_CHARS) {
            throw new RejectSignal(RejectReason.BAD_KEY, (keyField.isEmpty() ? "Kafka record key" : "field '"
                    + keyField + "' (key)") + ": length must be 1 to " + MAX_KEY_CHARS + ", got " + key.length());
        }
        return key;
    }

    private long time(RecordView view, long kafkaTimestampMs) {
        if (timeField.isEmpty()) {
            if (kafkaTimestampMs < 0) {
                throw new RejectSignal(RejectReason.BAD_TIME, "Kafka record timestamp is " + kafkaTimestampMs
                        + " (none) and field.time is empty");
            }
            return kafkaTimestampMs;
        }
        Object v = view.field(timeField);
        String name = "field '" + timeField + "' (time)";
        if (v == null) {
            throw new RejectSignal(RejectReason.MISSING_FIELD, name + ": missing");
        }
        long ms;
        if (v instanceof Long) {
            try {
                ms = timeUnit.toMillis((Long) v);
            } catch (ArithmeticException e) {
                throw new RejectSignal(RejectReason.BAD_TIME, name + ": " + v + " " + timeUnit.id()
                        + " overflows epoch milliseconds", e);
            }
        } else if (v instanceof Double) {
            double d = Math.floor((Double) v * timeUnit.millisPerUnit());
            if (!(d >= 0 && d < 0x1p63)) {
                throw new RejectSignal(RejectReason.BAD_TIME, name + ": " + v + " " + timeUnit.id()
                        + " is not a time from the epoch in range");
            }
            ms = (long) d;
        } else {
            throw new RejectSignal(RejectReason.WRONG_TYPE, name + ": " + view.typeName(v) + " "
                    + RejectSignal.show(v) + ", need a number");
        }
        if (ms < 0) {
            throw new RejectSignal(RejectReason.BAD_TIME, name + ": " + v + " " + timeUnit.id() + " is before the epoch");
        }
        return ms;
    }

    private double weight(RecordView view) {
        if (weightField.isEmpty()) {
            return 1.0;
        }
        Object v = view.field(weightField);
        String name = "field '" + weightField + "' (weight)";
        if (v == null) {
            throw new RejectSignal(RejectReason.MISSING_FIELD, name + ": missing");
        }
        if (!(v instanceof Number)) {
            throw new RejectSignal(RejectReason.WRONG_TYPE, name + ": " + view.typeName(v) + " "
                    + RejectSignal.show(v) + ", need a number");
        }
        double w = ((Number) v).doubleValue();
        if (!(w > 0 && w <= maxAbs)) {
            throw new RejectSignal(RejectReason.BAD_WEIGHT, name + ": must be in (0, " + maxAbs + "], got " + w);
        }
        return w;
    }

    private double number(Object v, String channel, String role, Object map, RecordView view) {
        if (!(v instanceof Number)) {
            throw new RejectSignal(RejectReason.WRONG_TYPE, where(channel, role, map) + ": "
                    + view.typeName(v) + " " + RejectSignal.show(v) + ", need a number");
        }
        double d = ((Number) v).doubleValue();
        if (!Double.isFinite(d)) {
            throw new RejectSignal(RejectReason.NON_FINITE, where(channel, role, map) + ": value " + d + " is not finite");
        }
        if (Math.abs(d) > maxAbs) {
            throw new RejectSignal(RejectReason.OUT_OF_RANGE, where(channel, role, map) + ": |" + d
                    + "| exceeds value.max.abs = " + maxAbs);
        }
        return d;
    }

    private String where(String channel, String role, Object map) {
        return map == null ? "field '" + channel + "' (" + role + ")"
                : "channel '" + channel + "' of map '" + mapField + "' (" + role + ")";
    }

    private ChannelLayout discover(RecordView view, Object map) {
        names.clear();
        if (map != null) {
            view.mapNames(map, names);
            names.remove(target);
        } else {
            List<String> all = new ArrayList<>();
            view.fieldNames(all);
            for (String f : all) {
                if (!roleFields.contains(f) && view.field(f) instanceof Number) {
                    names.add(f);
                }
            }
        }
        if (pattern != null) {
            names.removeIf(n -> !matches(n));
        }
        if (names.isEmpty() || names.size() > maxCount) {
            throw new RejectSignal(RejectReason.WRONG_WIDTH, "first record of the key has " + names.size()
                    + " feature channels, need 1 to field.features.max.count = " + maxCount);
        }
        Collections.sort(names);
        return ChannelLayout.of(names);
    }

    private boolean matches(String name) {
        Boolean hit = patternCache.get(name);
        if (hit == null) {
            hit = pattern.matcher(name).matches();
            if (patternCache.size() < PATTERN_CACHE_LIMIT) {
                patternCache.put(name, hit);
            }
        }
        return hit;
    }
}

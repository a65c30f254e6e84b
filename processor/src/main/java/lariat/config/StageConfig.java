package lariat.config;

import java.io.IOException;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.security.MessageDigest;
import java.security.NoSuchAlgorithmException;
import java.util.ArrayList;
import java.util.Collections;
import java.util.HashMap;
import java.util.HashSet;
import java.util.HexFormat;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Properties;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;
import java.util.function.Predicate;
import java.util.regex.Pattern;

/**
 * The stage configuration: every Lariat key is defined once below, with type, default, validator
 * and one-line doc; any other key must be a Kafka client key (see {@link ClientProperties}: a name
 * of kafka-clients' producer, consumer or admin configuration, or one prefixed by {@code producer.},
 * {@code consumer.} or {@code admin.}) and passes through untouched. A key that is neither is
 * rejected with the nearest known name as a suggestion, so a misspelt Lariat key never silently
 * falls back to its default.
 *
 * <p>Lariat values are trimmed before parsing; Kafka values are passed as written. Errors are
 * {@link IllegalArgumentException}s naming the key and the value, one line per bad key. Secret
 * values (see {@link SecretMask}) never appear in {@link #toString()}.
 */
public final class StageConfig {

    // ---- input and field mapping ----
    public static final ConfigKey<String> INPUT_TOPIC = topic("input.topic", null,
            "Topic the readings are consumed from (raw bytes, decoded by the stage).");
    public static final ConfigKey<InputFormat> INPUT_FORMAT = choice("input.format", InputFormat.class,
            "avro-single-object", "Wire format of the input record values.", true);
    public static final ConfigKey<String> INPUT_SCHEMA_FILE = string("input.schema.file", "", false,
            "Reader schema (.avsc) for the Avro formats; empty = the bundled lariat.schema.StationReading.", true);
    public static final ConfigKey<List<String>> INPUT_WRITER_SCHEMA_FILES = list("input.writer.schema.files",
            "Older writer schemas (.avsc) resolved to the reader schema; for avro-binary at most one, "
                    + "the writer (empty = the reader schema).", true);
    public static final ConfigKey<String> FIELD_TARGET = string("field.target", null, true,
            "Target field; when field.features.map is set, a channel of that map.", true);
    public static final ConfigKey<List<String>> FIELD_FEATURES = list("field.features",
            "Feature fields (or map channels), in this order.", true);
    public static final ConfigKey<Pattern> FIELD_FEATURES_PATTERN = ConfigKey.of("field.features.pattern",
            ValueType.REGEX, "", p -> true, "",
            "Regex a whole field (or map channel) name must match to be a feature; empty = unused.", true);
    public static final ConfigKey<String> FIELD_FEATURES_MAP = string("field.features.map", "", false,
            "Map field of channel -> number holding the features (and the target); empty = none.", true);
    public static final ConfigKey<Integer> FIELD_FEATURES_MAX_COUNT = intRange("field.features.max.count",
            "4096", 1, 100_000, "Most feature channels a key may have; a record with more is rejected.", true);
    public static final ConfigKey<String> FIELD_KEY = string("field.key", "", false,
            "Field holding the model key; empty = the Kafka record key (UTF-8).", true);
    public static final ConfigKey<String> FIELD_TIME = string("field.time", "", false,
            "Field holding the event time; empty = the Kafka record timestamp.", true);
    public static final ConfigKey<TimeUnitChoice> FIELD_TIME_UNIT = choice("field.time.unit",
            TimeUnitChoice.class, "ms", "Unit of the numeric event-time field, since the epoch.", true);
    public static final ConfigKey<String> FIELD_WEIGHT = string("field.weight", "", false,
            "Field holding a positive record weight; empty = every record weighs 1.", true);
    public static final ConfigKey<MissingChannelPolicy> MISSING_CHANNEL_POLICY = choice("missing.channel.policy",
            MissingChannelPolicy.class, "reject",
            "A record lacking one of its key's channels: reject (dead letter) or skip (counted, no update).", true);
    public static final ConfigKey<Double> VALUE_MAX_ABS = doubleRange("value.max.abs", "1e100", 0, true, 1e150, false,
            "Largest accepted magnitude of a target, feature or weight; larger would overflow squared sums.", true);

    // ---- moments ----
    public static final ConfigKey<Integer> MOMENTS_BLOCK_RECORDS = intRange("moments.block.records", "64", 1,
            1_000_000, "Records per moments block, counted per key (blocks are merged by matrix products).", true);
    public static final ConfigKey<Long> FORGET_HALF_LIFE_MS = longRange("forget.half.life.ms", "0", 0,
            Long.MAX_VALUE, "Event-time half-life of a record's weight; 0 = no forgetting.", true);
    public static final ConfigKey<Long> WINDOW_PANE_MS = longRange("window.pane.ms", "0", 0, Long.MAX_VALUE,
            "Event-time length of one window pane; 0 = no sliding window.", true);
    public static final ConfigKey<Integer> WINDOW_PANES = intRange("window.panes", "12", 1, 100_000,
            "Panes in the sliding window (window length = panes x window.pane.ms).", true);

    // ---- refit schedule ----
    public static final ConfigKey<Long> REFIT_EVERY_RECORDS = longRange("refit.every.records", "1000", 0,
            Long.MAX_VALUE, "A key refits after this many new records; 0 = no count trigger.", false);
    public static final ConfigKey<Long> REFIT_EVERY_EVENT_MS = longRange("refit.every.event.ms", "0", 0,
            Long.MAX_VALUE, "A key refits when its event time advanced this far since its last refit; 0 = off.",
            false);
    public static final ConfigKey<Long> CYCLE_INTERVAL_MS = longRange("cycle.interval.ms", "1000", 1, 3_600_000,
            "Wall-clock length of one cycle (one transaction); due refits publish at its end.", false);

    // ---- path ----
    public static final ConfigKey<PathMethod> PATH_METHOD = choice("path.method", PathMethod.class, "lasso",
            "Path traced from the moments: lasso (variables may leave) or lar.", true);
    public static final ConfigKey<Boolean> PATH_POSITIVE = bool("path.positive", "false",
            "Constrain every coefficient to be >= 0.", true);
    public static final ConfigKey<Double> PATH_RIDGE = doubleRange("path.ridge", "0", 0, false, Double.MAX_VALUE,
            false, "Ridge penalty added to the standardized Gram diagonal (elastic net); 0 = plain lasso.", true);
    public static final ConfigKey<Boolean> PATH_RIDGE_RESCALE = bool("path.ridge.rescale", "false",
            "Publish the elastic-net estimate: the chosen model's coefficients times (1 + path.ridge), with intercept, "
                    + "RSS, R2 and criteria recomputed (coefficientScale in the record); false = the naive estimate.",
            true);
    public static final ConfigKey<Integer> PATH_MAX_ACTIVE = intRange("path.max.active", "0", 0, Integer.MAX_VALUE,
            "Stop the path when this many features are active; 0 = no limit.", true);
    public static final ConfigKey<Integer> PATH_MAX_STEPS = intRange("path.max.steps", "0", 0, Integer.MAX_VALUE,
            "Stop the path after this many steps (entries and drops); 0 = no limit.", true);
    public static final ConfigKey<Double> PATH_MIN_RELATIVE_PENALTY = doubleRange("path.min.relative.penalty", "0",
            0, false, 1, true, "Stop the path when penalty / largest penalty falls to this ratio.", true);
    public static final ConfigKey<Double> PATH_MAX_R2 = doubleRange("path.max.r2", "1", 0, true, 1, false,
            "Stop the path when R-squared reaches this value.", true);
    public static final ConfigKey<Double> PATH_COLLINEAR_TOLERANCE = doubleRange("path.collinear.tolerance",
            "1e-10", 0, true, 1, true,
            "A candidate whose Cholesky pivot squared is below this times its Gram diagonal is collinear.", true);

    // ---- selection ----
    public static final ConfigKey<SelectRule> SELECT_RULE = choice("select.rule", SelectRule.class, "bic",
            "How the published point on the path is chosen.", true);
    public static final ConfigKey<Double> SELECT_RELATIVE_PENALTY = doubleRange("select.relative.penalty", "0.1",
            0, true, 1, false, "Penalty / largest penalty of the point chosen by relative-penalty.", true);
    public static final ConfigKey<Integer> SELECT_MAX_ACTIVE = intRange("select.max.active", "10", 1,
            Integer.MAX_VALUE, "Most active features of the point chosen by max-active.", true);
    public static final ConfigKey<Double> SELECT_TARGET_R2 = doubleRange("select.target.r2", "0.9", 0, true, 1,
            false, "R-squared the point chosen by target-r2 must reach.", true);
    public static final ConfigKey<Integer> SELECT_CV_FOLDS = intRange("select.cv.folds", "5", 2, 50,
            "Cross-validation folds kept as fold moments when select.rule = cv.", true);
    public static final ConfigKey<Boolean> SELECT_CV_ONE_SE = bool("select.cv.one.se", "false",
            "Under cv, take the sparsest point within one standard error of the best.", true);
    public static final ConfigKey<Boolean> SELECT_REFIT = bool("select.refit", "true",
            "Also publish a least-squares refit on the chosen active set.", true);

    // ---- outputs ----
    public static final ConfigKey<String> MODEL_TOPIC = topic("model.topic", "lariat.models",
            "Topic of published model versions.");
    public static final ConfigKey<String> ALERT_TOPIC = topic("alert.topic", "lariat.alerts",
            "Topic of active-set change alerts.");
    public static final ConfigKey<String> SNAPSHOT_TOPIC = topic("snapshot.topic", "lariat.snapshots",
            "Compacted topic of per-key state snapshots, co-partitioned with the input.");
    public static final ConfigKey<String> DEADLETTER_TOPIC = topic("deadletter.topic", "lariat.deadletters",
            "Topic of rejected input records (original bytes, reason headers).");
    public static final ConfigKey<String> CLAIM_TOPIC = topic("claim.topic", "lariat.claims",
            "Compacted one-partition topic of key claims; a key's earliest claim names the partition that owns it.");
    public static final ConfigKey<Integer> SNAPSHOT_CHUNK_BYTES = intRange("snapshot.chunk.bytes", "524288", 1024,
            64 << 20, "Largest state bytes in one snapshot chunk record.", false);
    public static final ConfigKey<Integer> ALERT_PERSIST_REFITS = intRange("alert.persist.refits", "1", 1, 1000,
            "An active-set change is alerted once it has held for this many consecutive refits.", false);

    // ---- operation ----
    public static final ConfigKey<String> STAGE_ID = ConfigKey.of("stage.id", ValueType.STRING, "lariat",
            s -> s.matches("[A-Za-z0-9._-]{1,200}"), "1-200 of [A-Za-z0-9._-]",
            "Name of this stage; prefix of its transactional ids.", false);
    public static final ConfigKey<String> STAGE_INSTANCE = ConfigKey.of("stage.instance", ValueType.STRING, "0",
            s -> s.matches("[A-Za-z0-9._-]{1,100}"), "1-100 of [A-Za-z0-9._-]",
            "Name of this instance of the stage, stable across its restarts; transactional.id = stage.id-stage.instance.",
            false);
    public static final ConfigKey<String> GROUP_ID = string("group.id", "", false,
            "Consumer group of the input topic; empty = stage.id.", false);
    public static final ConfigKey<Integer> METRICS_PORT = intRange("metrics.port", "9400", 0, 65535,
            "Port of the metrics and health endpoint; 0 = no endpoint.", false);
    public static final ConfigKey<Long> SHUTDOWN_TIMEOUT_MS = longRange("shutdown.timeout.ms", "30000", 0,
            600_000, "Longest wait for the current cycle and the clients to close on shutdown.", false);
    public static final ConfigKey<Long> RESTORE_TIMEOUT_MS = longRange("restore.timeout.ms", "120000", 1000,
            3_600_000, "Longest wait, on a partition assignment, for its committed offsets (then the stage starts new "
                    + "clients) and for its snapshots to reach them; at least transaction.timeout.ms + 15000.", false);

    /**
     * Margin of {@code restore.timeout.ms} over {@code transaction.timeout.ms}: the transaction
     * coordinator aborts a timed-out transaction at its next check, every
     * {@code transaction.abort.timed.out.transaction.cleanup.interval.ms} (a broker setting, 10 s
     * by default), and then writes the abort markers.
     */
    static final long RESTORE_MARGIN_MS = 15_000;

    /** Every Lariat key, in the order of the configuration reference. */
    public static final List<ConfigKey<?>> KEYS = List.of(
            INPUT_TOPIC, INPUT_FORMAT, INPUT_SCHEMA_FILE, INPUT_WRITER_SCHEMA_FILES, FIELD_TARGET, FIELD_FEATURES,
            FIELD_FEATURES_PATTERN, FIELD_FEATURES_MAP, FIELD_FEATURES_MAX_COUNT, FIELD_KEY, FIELD_TIME,
            FIELD_TIME_UNIT, FIELD_WEIGHT, MISSING_CHANNEL_POLICY, VALUE_MAX_ABS,
            MOMENTS_BLOCK_RECORDS, FORGET_HALF_LIFE_MS, WINDOW_PANE_MS, WINDOW_PANES,
            REFIT_EVERY_RECORDS, REFIT_EVERY_EVENT_MS, CYCLE_INTERVAL_MS,
            PATH_METHOD, PATH_POSITIVE, PATH_RIDGE, PATH_RIDGE_RESCALE, PATH_MAX_ACTIVE, PATH_MAX_STEPS,
            PATH_MIN_RELATIVE_PENALTY, PATH_MAX_R2, PATH_COLLINEAR_TOLERANCE,
            SELECT_RULE, SELECT_RELATIVE_PENALTY, SELECT_MAX_ACTIVE, SELECT_TARGET_R2, SELECT_CV_FOLDS,
            SELECT_CV_ONE_SE, SELECT_REFIT,
            MODEL_TOPIC, ALERT_TOPIC, SNAPSHOT_TOPIC, DEADLETTER_TOPIC, CLAIM_TOPIC, SNAPSHOT_CHUNK_BYTES,
            ALERT_PERSIST_REFITS,
            STAGE_ID, STAGE_INSTANCE, GROUP_ID, METRICS_PORT, SHUTDOWN_TIMEOUT_MS, RESTORE_TIMEOUT_MS);

    private static final Map<String, ConfigKey<?>> BY_NAME = byName();
    private static final String HASH_VERSION = "lariat.config.hash.v1";

    private final Map<ConfigKey<?>, Object> values;
    private final Set<String> setExplicitly;
    private final ClientProperties clients;

    private StageConfig(Map<ConfigKey<?>, Object> values, Set<String> setExplicitly, ClientProperties clients) {
        this.values = values;
        this.setExplicitly = setExplicitly;
        this.clients = clients;
    }

    /**
     * Parses and validates a configuration.
     *
     * @throws IllegalArgumentException one line per bad key, each naming the key and its value
     */
    public static StageConfig of(Map<String, String> properties) {
        List<String> errors = new ArrayList<>();
        Map<ConfigKey<?>, Object> values = new HashMap<>();
        Set<String> explicit = new HashSet<>();
        ClientProperties clients = new ClientProperties();
        for (Map.Entry<String, String> e : new TreeMap<>(properties).entrySet()) {
            String name = e.getKey();
            ConfigKey<?> key = BY_NAME.get(name);
            try {
                if (key != null) {
                    values.put(key, key.parse(e.getValue().trim()));
                    explicit.add(name);
                } else if (ClientProperties.isClientKey(name)) {
                    clients.put(name, e.getValue());
                } else {
                    errors.add(unknown(name));
                }
            } catch (IllegalArgumentException ex) {
                errors.add(ex.getMessage());
            }
        }
        for (ConfigKey<?> key : KEYS) {
            if (!values.containsKey(key)) {
                if (key.required()) {
                    errors.add(key.name() + ": required, not set");
                } else {
                    values.put(key, key.parse(key.defaultValue()));
                }
            }
        }
        if (errors.isEmpty()) {
            errors.addAll(CrossChecks.of(values));
            restoreOutlastsTransactions(values, clients, errors);
        }
        if (!errors.isEmpty()) {
            throw new IllegalArgumentException(String.join("\n", errors));
        }
        return new StageConfig(Collections.unmodifiableMap(values), Set.copyOf(explicit), clients);
    }

    /**
     * A dead instance's open transaction hides the snapshots committed after it until the
     * coordinator aborts it, up to {@code transaction.timeout.ms} plus the coordinator's check
     * interval after it began; a restore that gave up sooner would resume from a stale snapshot, so
     * the restore must be allowed to wait longer.
     */
    private static void restoreOutlastsTransactions(Map<ConfigKey<?>, Object> values, ClientProperties clients,
                                                    List<String> errors) {
        long restore = (Long) values.get(RESTORE_TIMEOUT_MS);
        long txn;
        try {
            txn = clients.transactionTimeoutMs();
        } catch (IllegalArgumentException e) {
            errors.add(e.getMessage());
            return;
        }
        if (restore < txn + RESTORE_MARGIN_MS) {
            errors.add(RESTORE_TIMEOUT_MS + ": must be at least the producer's transaction.timeout.ms = " + txn
                    + " plus " + RESTORE_MARGIN_MS + " (an open transaction of a dead instance hides snapshots until "
                    + "the broker aborts it), got " + restore);
        }
    }

    /** Parses {@link Properties}; see {@link #of(Map)}. */
    public static StageConfig of(Properties properties) {
        Map<String, String> map = new LinkedHashMap<>();
        for (String name : properties.stringPropertyNames()) {
            map.put(name, properties.getProperty(name));
        }
        return of(map);
    }

    /**
     * Loads a {@code .properties} file (UTF-8).
     *
     * @throws IOException if the file cannot be read
     * @throws IllegalArgumentException if the configuration is invalid
     */
    public static StageConfig load(Path file) throws IOException {
        Properties p = new Properties();
        try (Reader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            p.load(r);
        }
        return of(p);
    }

    /** The definition of a Lariat key by name. */
    public static Optional<ConfigKey<?>> key(String name) {
        return Optional.ofNullable(BY_NAME.get(name));
    }

    /** The value of a key: as configured, or its default. */
    public <T> T get(ConfigKey<T> key) {
        Object v = values.get(key);
        if (v == null) {
            throw new IllegalArgumentException("key: not a Lariat key, got " + key);
        }
        @SuppressWarnings("unchecked")
        T t = (T) v;
        return t;
    }

    /** Whether a key was set in the configuration rather than defaulted. */
    public boolean isSet(ConfigKey<?> key) {
        return setExplicitly.contains(key.name());
    }

    /** The consumer group: {@code group.id}, or {@code stage.id} when that is empty. */
    public String groupId() {
        String g = get(GROUP_ID);
        return g.isEmpty() ? get(STAGE_ID) : g;
    }

    /**
     * Properties for the transactional producer: the pass-through keys the producer knows, then
     * {@code producer.} overrides, then the managed byte serializers and idempotence. The caller adds
     * {@code transactional.id} (derived from {@code stage.id}). A new mutable map on each call.
     */
    public Map<String, Object> producerProperties() {
        return clients.producer();
    }

    /**
     * Properties for the input consumer: pass-through keys the consumer knows, {@code consumer.}
     * overrides, then the group id, manual commits, read_committed and byte deserializers.
     */
    public Map<String, Object> consumerProperties() {
        return clients.consumer(groupId());
    }

    /** Properties for the admin client: pass-through keys it knows and {@code admin.} overrides. */
    public Map<String, Object> adminProperties() {
        return clients.admin();
    }

    /**
     * SHA-256 (FIPS 180-4), as 64 lower-case hex digits, of the UTF-8 text
     * {@code "lariat.config.hash.v1\n"} followed by one line {@code name=canonical value} per
     * computing key in name order. Defaults are included, so leaving a key out and setting it to its
     * default give the same hash; connection, topic and schedule keys are not included.
     */
    public String configHash() {
        try {
            MessageDigest sha = MessageDigest.getInstance("SHA-256");
            return HexFormat.of().formatHex(sha.digest(canonicalComputingText().getBytes(StandardCharsets.UTF_8)));
        } catch (NoSuchAlgorithmException e) {
            throw new IllegalStateException("SHA-256 is required of every Java platform", e);
        }
    }

    /** The text hashed by {@link #configHash()}. */
    String canonicalComputingText() {
        Map<String, String> lines = new TreeMap<>();
        for (ConfigKey<?> key : KEYS) {
            if (key.computing()) {
                lines.put(key.name(), key.canonical(values.get(key)));
            }
        }
        StringBuilder sb = new StringBuilder(HASH_VERSION).append('\n');
        lines.forEach((k, v) -> sb.append(k).append('=').append(v).append('\n'));
        return sb.toString();
    }

    /**
     * The configuration reference as a Markdown table (key, type, default, valid values, hashed,
     * description), generated from the definitions.
     */
    public static String referenceMarkdown() {
        StringBuilder sb = new StringBuilder();
        sb.append("| Key | Type | Default | Valid | Hashed | Description |\n");
        sb.append("|---|---|---|---|---|---|\n");
        for (ConfigKey<?> k : KEYS) {
            String def = k.required() ? "(required)" : k.defaultValue().isEmpty() ? "(empty)"
                    : "`" + k.defaultValue() + "`";
            sb.append("| `").append(k.name()).append("` | ").append(cell(k.typeName())).append(" | ")
                    .append(cell(def)).append(" | ").append(cell(k.validDoc())).append(" | ")
                    .append(k.computing() ? "yes" : "no").append(" | ").append(cell(k.doc())).append(" |\n");
        }
        return sb.toString();
    }

    /** Every key and value, Lariat keys first, secrets masked. */
    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder("StageConfig{");
        String sep = "";
        for (ConfigKey<?> k : KEYS) {
            sb.append(sep).append(k.name()).append('=').append(SecretMask.shown(k.name(), k.canonical(values.get(k))));
            sep = ", ";
        }
        for (Map.Entry<String, String> e : clients.asConfigured().entrySet()) {
            sb.append(sep).append(e.getKey()).append('=').append(SecretMask.shown(e.getKey(), e.getValue()));
        }
        return sb.append('}').toString();
    }

    private static String unknown(String name) {
        Set<String> known = new TreeSet<>(BY_NAME.keySet());
        known.addAll(ClientProperties.allClientNames());
        String near = NearestName.of(name, known);
        return name + ": unknown key (neither a Lariat key nor a Kafka client config)"
                + (near == null ? "" : "; did you mean " + near + "?");
    }

    private static String cell(String s) {
        return s.replace("|", "\\|");
    }

    private static Map<String, ConfigKey<?>> byName() {
        Map<String, ConfigKey<?>> m = new HashMap<>();
        for (ConfigKey<?> k : KEYS) {
            if (m.put(k.name(), k) != null) {
                throw new IllegalStateException("duplicate key definition " + k.name());
            }
        }
        return Map.copyOf(m);
    }

    private static ConfigKey<String> string(String name, String def, boolean nonEmpty, String doc, boolean computing) {
        return ConfigKey.of(name, ValueType.STRING, def, s -> !nonEmpty || !s.isEmpty(),
                nonEmpty ? "non-empty" : "", doc, computing);
    }

    private static ConfigKey<String> topic(String name, String def, String doc) {
        return ConfigKey.of(name, ValueType.STRING, def, s -> s.matches("[A-Za-z0-9._-]{1,249}"),
                "a topic name (1-249 of [A-Za-z0-9._-])", doc, false);
    }

    private static ConfigKey<List<String>> list(String name, String doc, boolean computing) {
        return ConfigKey.of(name, ValueType.LIST, "", l -> true, "comma-separated", doc, computing);
    }

    private static ConfigKey<Boolean> bool(String name, String def, String doc, boolean computing) {
        return ConfigKey.of(name, ValueType.BOOLEAN, def, b -> true, "true or false", doc, computing);
    }

    private static <E extends Enum<E> & Choice> ConfigKey<E> choice(String name, Class<E> type, String def,
                                                                    String doc, boolean computing) {
        return ConfigKey.of(name, ValueType.choice(type), def, e -> true, "", doc, computing);
    }

    private static ConfigKey<Long> longRange(String name, String def, long min, long max, String doc,
                                             boolean computing) {
        Predicate<Long> p = v -> v >= min && v <= max;
        return ConfigKey.of(name, ValueType.LONG, def, p, rangeDoc(min, max, Long.MAX_VALUE), doc, computing);
    }

    private static ConfigKey<Integer> intRange(String name, String def, int min, int max, String doc,
                                               boolean computing) {
        Predicate<Integer> p = v -> v >= min && v <= max;
        return ConfigKey.of(name, ValueType.INT, def, p, rangeDoc(min, max, Integer.MAX_VALUE), doc, computing);
    }

    private static String rangeDoc(long min, long max, long unbounded) {
        return max == unbounded ? ">= " + min : "in [" + min + ", " + max + "]";
    }

    private static ConfigKey<Double> doubleRange(String name, String def, double lo, boolean loOpen, double hi,
                                                 boolean hiOpen, String doc, boolean computing) {
        Predicate<Double> p = v -> (loOpen ? v > lo : v >= lo) && (hiOpen ? v < hi : v <= hi);
        String d = hi == Double.MAX_VALUE ? (loOpen ? "> " : ">= ") + fmt(lo)
                : (loOpen ? "in (" : "in [") + fmt(lo) + ", " + fmt(hi) + (hiOpen ? ")" : "]");
        return ConfigKey.of(name, ValueType.DOUBLE, def, p, d, doc, computing);
    }

    private static String fmt(double v) {
        return v == Math.rint(v) && Math.abs(v) < 1e6 ? String.valueOf((long) v) : String.valueOf(v);
    }
}

package lariat.config;

import java.util.Collections;
import java.util.HashMap;
import java.util.Map;
import java.util.Set;
import java.util.TreeMap;
import java.util.TreeSet;
import org.apache.kafka.clients.admin.AdminClientConfig;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.common.serialization.ByteArrayDeserializer;
import org.apache.kafka.common.serialization.ByteArraySerializer;

/**
 * The Kafka client part of a configuration. A key that is not a Lariat key is a client key when
 * <ul>
 *   <li>it is one of the names of kafka-clients' {@code ProducerConfig}, {@code ConsumerConfig} or
 *       {@code AdminClientConfig}: it goes, untouched, to every client that knows that name; or</li>
 *   <li>it starts with {@code producer.}, {@code consumer.} or {@code admin.}: the prefix is
 *       stripped and the rest goes to that client only, overriding a shared value; the rest is not
 *       checked, so plugin settings unknown to Kafka can be passed this way.</li>
 * </ul>
 * A few client keys are managed by the stage because exactly-once processing depends on them; they
 * are set here ({@link #MANAGED}) or by the stage (transactional.id) and may not be configured.
 */
final class ClientProperties {

    static final Set<String> PRODUCER_NAMES = ProducerConfig.configNames();
    static final Set<String> CONSUMER_NAMES = ConsumerConfig.configNames();
    static final Set<String> ADMIN_NAMES = AdminClientConfig.configNames();

    /** Client keys whose values the stage fixes, with the value (or how it is set). */
    static final Map<String, String> MANAGED = managed();

    /** kafka-clients' default of {@code transaction.timeout.ms}. */
    static final long DEFAULT_TRANSACTION_TIMEOUT_MS = 60_000;

    private static final String[] PREFIXES = {"producer.", "consumer.", "admin."};

    private final Map<String, String> shared = new TreeMap<>();
    private final Map<String, String> producer = new TreeMap<>();
    private final Map<String, String> consumer = new TreeMap<>();
    private final Map<String, String> admin = new TreeMap<>();

    /** Whether the key is a Kafka client key by the rule above. */
    static boolean isClientKey(String key) {
        return hasClientPrefix(key) || PRODUCER_NAMES.contains(key) || CONSUMER_NAMES.contains(key)
                || ADMIN_NAMES.contains(key);
    }

    static String stripClientPrefix(String key) {
        for (String p : PREFIXES) {
            if (key.startsWith(p)) {
                return key.substring(p.length());
            }
        }
        return key;
    }

    static Set<String> allClientNames() {
        Set<String> all = new TreeSet<>(PRODUCER_NAMES);
        all.addAll(CONSUMER_NAMES);
        all.addAll(ADMIN_NAMES);
        return all;
    }

    /**
     * Records one client key.
     *
     * @throws IllegalArgumentException if the key is managed by the stage
     */
    void put(String key, String value) {
        String bare = stripClientPrefix(key);
        if (MANAGED.containsKey(bare)) {
            throw new IllegalArgumentException(key + ": set by Lariat (" + MANAGED.get(bare)
                    + "), remove it from the configuration");
        }
        if (key.startsWith("producer.")) {
            producer.put(bare, value);
        } else if (key.startsWith("consumer.")) {
            consumer.put(bare, value);
        } else if (key.startsWith("admin.")) {
            admin.put(bare, value);
        } else {
            shared.put(key, value);
        }
    }

    Map<String, Object> producer() {
        Map<String, Object> out = pick(PRODUCER_NAMES, producer);
        out.put(ProducerConfig.ENABLE_IDEMPOTENCE_CONFIG, "true");
        out.put(ProducerConfig.KEY_SERIALIZER_CLASS_CONFIG, ByteArraySerializer.class.getName());
        out.put(ProducerConfig.VALUE_SERIALIZER_CLASS_CONFIG, ByteArraySerializer.class.getName());
        return out;
    }

    Map<String, Object> consumer(String groupId) {
        Map<String, Object> out = pick(CONSUMER_NAMES, consumer);
        out.put(ConsumerConfig.GROUP_ID_CONFIG, groupId);
        out.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, "false");
        out.put(ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        out.put(ConsumerConfig.KEY_DESERIALIZER_CLASS_CONFIG, ByteArrayDeserializer.class.getName());
        out.put(ConsumerConfig.VALUE_DESERIALIZER_CLASS_CONFIG, ByteArrayDeserializer.class.getName());
        return out;
    }

    /**
     * The producer's {@code transaction.timeout.ms} as configured (60000, Kafka's default, when
     * unset).
     *
     * @throws IllegalArgumentException naming the key when the value is not a whole number
     */
    long transactionTimeoutMs() {
        Object v = producer().get(ProducerConfig.TRANSACTION_TIMEOUT_CONFIG);
        if (v == null) {
            return DEFAULT_TRANSACTION_TIMEOUT_MS;
        }
        try {
            return Long.parseLong(v.toString().trim());
        } catch (NumberFormatException e) {
            throw new IllegalArgumentException(ProducerConfig.TRANSACTION_TIMEOUT_CONFIG
                    + ": not a whole number of milliseconds, got " + v);
        }
    }

    Map<String, Object> admin() {
        return pick(ADMIN_NAMES, admin);
    }

    /** Every client key as configured (prefixes kept), for display. */
    Map<String, String> asConfigured() {
        Map<String, String> out = new TreeMap<>(shared);
        producer.forEach((k, v) -> out.put("producer." + k, v));
        consumer.forEach((k, v) -> out.put("consumer." + k, v));
        admin.forEach((k, v) -> out.put("admin." + k, v));
        return Collections.unmodifiableMap(out);
    }

    private Map<String, Object> pick(Set<String> names, Map<String, String> overrides) {
        Map<String, Object> out = new HashMap<>();
        shared.forEach((k, v) -> {
            if (names.contains(k)) {
                out.put(k, v);
            }
        });
        out.putAll(overrides);
        return out;
    }

    private static boolean hasClientPrefix(String key) {
        for (String p : PREFIXES) {
            if (key.startsWith(p) && key.length() > p.length()) {
                return true;
            }
        }
        return false;
    }

    private static Map<String, String> managed() {
        Map<String, String> m = new TreeMap<>();
        m.put(ProducerConfig.KEY_SERIALIZER_CLASS_CONFIG, "bytes");
        m.put(ProducerConfig.VALUE_SERIALIZER_CLASS_CONFIG, "bytes");
        m.put(ConsumerConfig.KEY_DESERIALIZER_CLASS_CONFIG, "bytes");
        m.put(ConsumerConfig.VALUE_DESERIALIZER_CLASS_CONFIG, "bytes");
        m.put(ProducerConfig.ENABLE_IDEMPOTENCE_CONFIG, "true");
        m.put(ProducerConfig.TRANSACTIONAL_ID_CONFIG, "from stage.id");
        m.put(ConsumerConfig.GROUP_ID_CONFIG, "from the Lariat key group.id");
        m.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, "false");
        m.put(ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        return Collections.unmodifiableMap(m);
    }
}

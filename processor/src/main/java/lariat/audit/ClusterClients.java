package lariat.audit;

import org.apache.kafka.clients.admin.Admin;
import org.apache.kafka.clients.admin.AdminClientConfig;
import org.apache.kafka.clients.consumer.Consumer;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.consumer.KafkaConsumer;
import org.apache.kafka.clients.producer.KafkaProducer;
import org.apache.kafka.clients.producer.Producer;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.common.serialization.ByteArrayDeserializer;
import org.apache.kafka.common.serialization.ByteArraySerializer;

import java.io.IOException;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.HashMap;
import java.util.Map;
import java.util.Properties;
import java.util.Set;

/**
 * The clients the audit commands use, from one map of Kafka client properties (bootstrap servers,
 * TLS, SASL, ...): a read_committed consumer without a group (partitions are assigned, nothing is
 * committed), an admin client, and an idempotent producer for recompute output. Client keys that
 * the client does not know are dropped by the client itself, as Kafka does.
 */
public final class ClusterClients {

    private final Map<String, Object> base;
    private final String clientId;

    private ClusterClients(Map<String, Object> base, String clientId) {
        this.base = base;
        this.clientId = clientId;
    }

    /**
     * Clients from {@code properties}, which must name {@code bootstrap.servers}; {@code clientId}
     * prefixes each client's id.
     *
     * @throws IllegalArgumentException when bootstrap.servers is missing or empty
     */
    public static ClusterClients of(Map<String, ?> properties, String clientId) {
        Object b = properties.get(AdminClientConfig.BOOTSTRAP_SERVERS_CONFIG);
        if (b == null || String.valueOf(b).isBlank()) {
            throw new IllegalArgumentException("bootstrap.servers: required, give --bootstrap-servers or a client "
                    + "properties file naming it");
        }
        return new ClusterClients(new HashMap<>(properties), clientId);
    }

    /**
     * Client properties for the commands: those of {@code stageClients} (a stage configuration's
     * pass-through client properties; may be empty), then the file {@code clientConfig} (Kafka
     * client properties such as TLS and SASL settings; may be null), then {@code bootstrapServers}
     * (may be null).
     *
     * @throws IOException when the file cannot be read
     */
    public static Map<String, Object> properties(Map<String, Object> stageClients, Path clientConfig,
                                                 String bootstrapServers) throws IOException {
        Map<String, Object> p = new HashMap<>(stageClients);
        if (clientConfig != null) {
            Properties file = new Properties();
            try (Reader r = Files.newBufferedReader(clientConfig, StandardCharsets.UTF_8)) {
                file.load(r);
            }
            for (String name : file.stringPropertyNames()) {
                p.put(name, file.getProperty(name));
            }
        }
        if (bootstrapServers != null) {
            p.put(AdminClientConfig.BOOTSTRAP_SERVERS_CONFIG, bootstrapServers);
        }
        return p;
    }

    /** A read_committed, group-less consumer of raw bytes. */
    public Consumer<byte[], byte[]> consumer() {
        Map<String, Object> p = new HashMap<>(base);
        p.remove(ConsumerConfig.GROUP_ID_CONFIG);
        p.remove(ConsumerConfig.GROUP_INSTANCE_ID_CONFIG);
        p.remove(ConsumerConfig.KEY_DESERIALIZER_CLASS_CONFIG);
        p.remove(ConsumerConfig.VALUE_DESERIALIZER_CLASS_CONFIG);
        p.put(ConsumerConfig.ISOLATION_LEVEL_CONFIG, "read_committed");
        p.put(ConsumerConfig.ENABLE_AUTO_COMMIT_CONFIG, "false");
        p.put(ConsumerConfig.AUTO_OFFSET_RESET_CONFIG, "earliest");
        p.putIfAbsent(ConsumerConfig.MAX_POLL_RECORDS_CONFIG, 2000);
        p.put(ConsumerConfig.CLIENT_ID_CONFIG, clientId + "-consumer");
        return new KafkaConsumer<>(only(p, ConsumerConfig.configNames()), new ByteArrayDeserializer(),
                new ByteArrayDeserializer());
    }

    /** An admin client. */
    public Admin admin() {
        Map<String, Object> p = new HashMap<>(base);
        p.put(AdminClientConfig.CLIENT_ID_CONFIG, clientId + "-admin");
        return Admin.create(only(p, AdminClientConfig.configNames()));
    }

    /** An idempotent producer of raw bytes with {@code acks=all}. */
    public Producer<byte[], byte[]> producer() {
        Map<String, Object> p = new HashMap<>(base);
        p.remove(ProducerConfig.TRANSACTIONAL_ID_CONFIG);
        p.remove(ProducerConfig.KEY_SERIALIZER_CLASS_CONFIG);
        p.remove(ProducerConfig.VALUE_SERIALIZER_CLASS_CONFIG);
        p.put(ProducerConfig.ENABLE_IDEMPOTENCE_CONFIG, "true");
        p.put(ProducerConfig.ACKS_CONFIG, "all");
        p.put(ProducerConfig.CLIENT_ID_CONFIG, clientId + "-producer");
        return new KafkaProducer<>(only(p, ProducerConfig.configNames()), new ByteArraySerializer(),
                new ByteArraySerializer());
    }

    private static Map<String, Object> only(Map<String, Object> p, Set<String> known) {
        Map<String, Object> out = new HashMap<>();
        for (Map.Entry<String, Object> e : p.entrySet()) {
            if (known.contains(e.getKey()) || e.getKey().startsWith("sasl.") || e.getKey().startsWith("ssl.")) {
                out.put(e.getKey(), e.getValue());
            }
        }
        return out;
    }
}

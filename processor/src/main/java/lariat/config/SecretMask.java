package lariat.config;

import java.util.List;
import java.util.Locale;
import java.util.Set;
import java.util.TreeSet;
import org.apache.kafka.clients.admin.AdminClientConfig;
import org.apache.kafka.clients.consumer.ConsumerConfig;
import org.apache.kafka.clients.producer.ProducerConfig;
import org.apache.kafka.common.config.ConfigDef;

/**
 * Decides which configuration values are secrets and must never appear in text. A key is secret when
 * Kafka's own client definitions give it the PASSWORD type (ssl.key.password, sasl.jaas.config,
 * ssl.keystore.key, ...) or when its lower-cased name contains one of the words password, secret,
 * jaas, token, credential or private. Client prefixes ({@code producer.} ...) are looked through.
 */
final class SecretMask {

    static final String MASK = "[hidden]";

    private static final List<String> WORDS = List.of("password", "secret", "jaas", "token", "credential", "private");
    private static final Set<String> KAFKA_PASSWORDS = kafkaPasswords();

    private SecretMask() {
    }

    static boolean isSecret(String key) {
        String lower = key.toLowerCase(Locale.ROOT);
        for (String w : WORDS) {
            if (lower.contains(w)) {
                return true;
            }
        }
        return KAFKA_PASSWORDS.contains(ClientProperties.stripClientPrefix(key));
    }

    /** The value to print for a key: the value itself, or {@link #MASK} for a secret. */
    static String shown(String key, Object value) {
        return isSecret(key) ? MASK : String.valueOf(value);
    }

    private static Set<String> kafkaPasswords() {
        Set<String> out = new TreeSet<>();
        for (ConfigDef def : List.of(ProducerConfig.configDef(), ConsumerConfig.configDef(),
                AdminClientConfig.configDef())) {
            def.configKeys().forEach((name, key) -> {
                if (key.type == ConfigDef.Type.PASSWORD) {
                    out.add(name);
                }
            });
        }
        return Set.copyOf(out);
    }
}

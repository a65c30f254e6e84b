package lariat.codec;

import java.util.Objects;

/** A record of a known key that lacks one of the key's channels, under missing.channel.policy = skip. */
public final class Skipped implements Decoded {

    private final String key;
    private final String detail;

    private Skipped(String key, String detail) {
        this.key = Objects.requireNonNull(key, "key");
        this.detail = Objects.requireNonNull(detail, "detail");
    }

    public static Skipped of(String key, String detail) {
        return new Skipped(key, detail);
    }

    /** The model key whose update was skipped. */
    public String key() {
        return key;
    }

    /** Which channel was missing. */
    public String detail() {
        return detail;
    }

    @Override
    public String toString() {
        return "Skipped(" + key + "): " + detail;
    }
}

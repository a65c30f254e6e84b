package lariat.report.demo;

/** A change injected into a station's data, to be marked on its timeline. */
public final class ChangeMark {

    /** What happened to the channel. */
    public enum Kind {
        ENTERS("enters"), LEAVES("leaves"), SIGN_FLIP("flips sign");

        private final String verb;

        Kind(String verb) {
            this.verb = verb;
        }

        public String verb() {
            return verb;
        }
    }

    private final long timeMs;
    private final String channel;
    private final Kind kind;

    private ChangeMark(long timeMs, String channel, Kind kind) {
        this.timeMs = timeMs;
        this.channel = Checks.name(channel, "channel");
        if (kind == null) {
            throw new IllegalArgumentException("kind must not be null");
        }
        this.kind = kind;
    }

    public static ChangeMark of(long timeMs, String channel, Kind kind) {
        return new ChangeMark(timeMs, channel, kind);
    }

    public long timeMs() {
        return timeMs;
    }

    public String channel() {
        return channel;
    }

    public Kind kind() {
        return kind;
    }

    /** For example "bearing_de_temp_c enters". */
    public String describe() {
        return channel + " " + kind.verb();
    }
}

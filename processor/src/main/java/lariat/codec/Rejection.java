package lariat.codec;

import java.util.Objects;
import java.util.Optional;

/** A record that cannot be used: the reason, a detail naming the field and value, and the exception class if any. */
public final class Rejection implements Decoded {

    private final RejectReason reason;
    private final String detail;
    private final String exceptionClass;

    private Rejection(RejectReason reason, String detail, String exceptionClass) {
        this.reason = Objects.requireNonNull(reason, "reason");
        this.detail = Objects.requireNonNull(detail, "detail");
        this.exceptionClass = exceptionClass;
    }

    /**
     * @param exceptionClass the class name of the exception that caused it, or {@code null}
     */
    public static Rejection of(RejectReason reason, String detail, String exceptionClass) {
        return new Rejection(reason, detail, exceptionClass);
    }

    public RejectReason reason() {
        return reason;
    }

    /** A one-line explanation naming the field and the offending value. */
    public String detail() {
        return detail;
    }

    /** The fully qualified class of the exception behind the rejection, if there was one. */
    public Optional<String> exceptionClass() {
        return Optional.ofNullable(exceptionClass);
    }

    @Override
    public String toString() {
        return reason + ": " + detail + (exceptionClass == null ? "" : " (" + exceptionClass + ")");
    }
}

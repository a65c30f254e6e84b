package lariat.codec;

/**
 * Carries a rejection out of the decoding steps to {@link RecordDecoder#decode}, which turns it into
 * a {@link Rejection}; it never leaves the package. No stack trace is captured, so rejecting is cheap.
 */
final class RejectSignal extends RuntimeException {

    private final RejectReason reason;
    private final String exceptionClass;

    RejectSignal(RejectReason reason, String detail) {
        this(reason, detail, null);
    }

    RejectSignal(RejectReason reason, String detail, Throwable cause) {
        super(detail, null, false, false);
        this.reason = reason;
        this.exceptionClass = cause == null ? null : cause.getClass().getName();
    }

    Rejection toRejection() {
        return Rejection.of(reason, getMessage(), exceptionClass);
    }

    /** A short rendering of a bad value for a message: at most 80 characters. */
    static String show(Object value) {
        String s = String.valueOf(value);
        return s.length() <= 80 ? s : s.substring(0, 77) + "...";
    }

    /** The exception's message, shortened, for a detail line. */
    static String message(Throwable e) {
        return show(e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage());
    }
}

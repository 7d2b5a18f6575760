package eigencheck.oracle;

/**
 * The oracle refuses to answer rather than return a value it cannot vouch for. The reason is a
 * constant callers can test; the message says where, why and what to do.
 *
 * @since 0.1
 */
public final class OracleException extends RuntimeException {
    /** Why a value was refused or a problem could not be prepared. */
    public enum Reason {
        /** The certified bound exceeds the tolerance at this point (for example t = 0 on a jump). */
        NOT_CERTIFIED,
        /** The point is outside the domain. */
        OUTSIDE_DOMAIN,
        /** t is negative, not finite, or beyond the time horizon the oracle was prepared for. */
        OUTSIDE_TIME_RANGE,
        /** Problem data (initial, source or boundary) is NaN or infinite somewhere it is needed. */
        DATA_NOT_FINITE,
        /** Problem data is too rough for the series representation (a jump in time, say). */
        DATA_NOT_RESOLVED,
        /** The series would need more modes than the cap (very small t). */
        TOO_MANY_MODES,
        /** The problem is outside what this version solves. */
        UNSUPPORTED
    }

    private final Reason reason;

    public OracleException(Reason reason, String message) {
        super(message);
        this.reason = reason;
    }

    public Reason reason() {
        return reason;
    }
}

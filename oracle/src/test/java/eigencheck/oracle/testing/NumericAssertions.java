package eigencheck.oracle.testing;

import static org.junit.jupiter.api.Assertions.assertTrue;

import eigencheck.oracle.Evaluation;

/**
 * Shared checks for certified values: the bound is honest (never below the true error) and tight
 * (within a factor {@value #TIGHTNESS} of the true error wherever that error exceeds
 * {@value #NOISE} and 32 ulps of the reference value). Shared with the other modules through the oracle's test-jar.
 */
public final class NumericAssertions {
    /** Largest allowed ratio of bound to true error. */
    public static final double TIGHTNESS = 1000;
    /** Errors below this are rounding noise of the reference itself; tightness is not asked there. */
    public static final double NOISE = 1e-14;

    private static double worstRatio;
    private static long checked;

    private NumericAssertions() {
    }

    /**
     * Asserts |value - exact| <= bound, and bound <= 1000 |value - exact| when the error is above
     * 1e-14 (absolute, in the value's units).
     */
    public static void assertCertified(double exact, Evaluation e, String context) {
        assertCertified(exact, e, 0, context);
    }

    /**
     * As {@link #assertCertified(double, Evaluation, String)}, with tightness asked only above
     * {@code roundingFloor} too: where the value is a sum of terms much larger than itself (a boundary
     * amplitude of 100 K reaching a point as 1 K), both the oracle's and the reference's rounding scale
     * with those terms, not with the value.
     */
    public static void assertCertified(double exact, Evaluation e, double roundingFloor, String context) {
        double error = Math.abs(e.value() - exact);
        assertTrue(error <= e.bound(), () -> context + ": error " + error + " exceeds the bound " + e.bound()
            + " (value " + e.value() + ", exact " + exact + ")");
        // Below 1e-14, or below 32 ulps of the reference itself, the "true error" is the reference's
        // own rounding and cannot be measured; tightness is asked only above that.
        if (error > Math.max(roundingFloor, Math.max(NOISE, 32 * Math.ulp(exact)))) {
            assertTrue(e.bound() <= TIGHTNESS * error, () -> context + ": bound " + e.bound()
                + " is more than " + TIGHTNESS + " times the error " + error);
            synchronized (NumericAssertions.class) {
                worstRatio = Math.max(worstRatio, e.bound() / error);
            }
        }
        synchronized (NumericAssertions.class) {
            checked++;
        }
    }

    /**
     * Asserts |value - exact| <= bound <= limit: an honest bound within the tolerance, without asking
     * tightness (the multi-dimensional series size their modes so that the rigorous bound meets the
     * tolerance, which is looser than the error they reach).
     */
    public static void assertWithin(double exact, Evaluation e, double limit, String context) {
        double error = Math.abs(e.value() - exact);
        assertTrue(error <= e.bound(), () -> context + ": error " + error + " exceeds the bound " + e.bound()
            + " (value " + e.value() + ", exact " + exact + ")");
        assertTrue(e.bound() <= limit, () -> context + ": bound " + e.bound() + " above the limit " + limit);
        synchronized (NumericAssertions.class) {
            checked++;
        }
    }

    /** Asserts |actual - expected| <= tolerance with a message; rejects a negative or NaN tolerance. */
    public static void assertClose(double expected, double actual, double tolerance, String context) {
        if (!(tolerance >= 0)) {
            throw new IllegalArgumentException("tolerance " + tolerance + " must be >= 0");
        }
        double error = Math.abs(actual - expected);
        assertTrue(error <= tolerance, () -> context + ": expected " + expected + ", got " + actual
            + " (difference " + error + ", allowed " + tolerance + ")");
    }

    /** Largest bound/error ratio seen so far in this JVM (for reports). */
    public static synchronized double worstRatio() {
        return worstRatio;
    }

    /** Number of certified values checked so far in this JVM. */
    public static synchronized long checked() {
        return checked;
    }
}

package eigencheck.oracle;

/**
 * A reference value with a certified bound on its error: |value - exact| <= bound, in the value's
 * units. How the bound is made, and which parts of it rest on estimates rather than proofs, is
 * stated on {@link Oracle}.
 *
 * @since 0.1
 */
public record Evaluation(double value, double bound) {
    public Evaluation {
        if (!Double.isFinite(value) || !(bound >= 0) || bound == Double.POSITIVE_INFINITY) {
            throw new IllegalArgumentException("evaluation " + value + " +- " + bound + " is not finite");
        }
    }
}

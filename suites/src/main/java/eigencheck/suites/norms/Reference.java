package eigencheck.suites.norms;

/**
 * The exact solution at one time, for many points at once: values and gradients at points given
 * with three coordinates each.
 *
 * @since 0.1
 */
public interface Reference {
    /**
     * @param xyz flat, 3 coordinates per point
     * @param value receives u at each point
     * @param gradient receives grad u (3 per point), or null when not needed
     */
    void evaluate(double[] xyz, double[] value, double[] gradient);

    /** False when the reference gives no gradient (the H1 seminorm is then not computed). */
    default boolean hasGradient() {
        return true;
    }

    /**
     * The output coordinate along which a one-dimensional reference varies (0, 1 or 2), or -1 for a
     * reference that varies in more than one direction.
     */
    default int axis() {
        return -1;
    }

    /**
     * Exact mean over the axis-aligned box from lo to hi (3 coordinates each; a 2D output's z range is
     * empty), or NaN if the reference has none.
     */
    default double boxAverage(double[] lo, double[] hi) {
        return Double.NaN;
    }

    /** Exact mean over the segment [a, b] along {@link #axis()}, or NaN if the reference has none. */
    default double segmentAverage(double a, double b) {
        return Double.NaN;
    }
}

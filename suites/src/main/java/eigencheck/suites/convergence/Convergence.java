package eigencheck.suites.convergence;

import org.apache.commons.math3.stat.regression.SimpleRegression;

/**
 * Observed orders of convergence from errors on refined levels.
 *
 * <ul>
 * <li>Per pair of levels, any refinement ratio r = h_coarse/h_fine > 1:
 * p = ln(e_coarse/e_fine)/ln r.</li>
 * <li>Over all levels: least-squares fit of ln e against ln h (Commons Math SimpleRegression); the
 * slope is the order, with its two-sided 95 % confidence interval from Student's t with n - 2 degrees
 * of freedom (none with two levels).</li>
 * </ul>
 *
 * @since 0.1
 */
public final class Convergence {
    private Convergence() {
    }

    /** Observed order between a coarse and a fine level. */
    public static double pairOrder(double coarseSize, double coarseError, double fineSize, double fineError) {
        if (!(coarseSize > fineSize && fineSize > 0)) {
            throw new IllegalArgumentException("the coarse size " + coarseSize + " must exceed the fine size " + fineSize
                + " > 0");
        }
        return Math.log(coarseError / fineError) / Math.log(coarseSize / fineSize);
    }

    /** A log-log fit: order (slope), its 95 % interval (NaN with two levels), and the constant C of e = C h^p. */
    public record Fit(double order, double lower, double upper, double constant, int levels) {
    }

    /**
     * Fits ln e = ln C + p ln h over the levels with a positive, finite error.
     *
     * @throws IllegalArgumentException with fewer than two such levels
     */
    public static Fit fit(double[] sizes, double[] errors) {
        SimpleRegression r = new SimpleRegression(true);
        int n = 0;
        for (int i = 0; i < sizes.length; i++) {
            if (errors[i] > 0 && Double.isFinite(errors[i]) && sizes[i] > 0) {
                r.addData(Math.log(sizes[i]), Math.log(errors[i]));
                n++;
            }
        }
        if (n < 2) {
            throw new IllegalArgumentException("a fit needs two levels with a positive error, found " + n);
        }
        double slope = r.getSlope();
        double half = n > 2 ? r.getSlopeConfidenceInterval(0.05) : Double.NaN;
        return new Fit(slope, slope - half, slope + half, Math.exp(r.getIntercept()), n);
    }
}

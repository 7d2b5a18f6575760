package eigencheck.suites.convergence;

/**
 * Richardson extrapolation and the grid convergence index for a quantity without an exact solution,
 * following Celik, Ghia, Roache, Freitas, Coleman and Raad, "Procedure for estimation and reporting
 * of uncertainty due to discretization in CFD applications", J. Fluids Eng. 130 (2008) 078001:
 * with h1 < h2 < h3 (fine to coarse), r21 = h2/h1, r32 = h3/h2, e21 = phi2 - phi1, e32 = phi3 - phi2,
 * s = sgn(e32/e21), the observed order solves p = |ln|e32/e21| + q(p)| / ln r21 with
 * q(p) = ln((r21^p - s)/(r32^p - s)) (fixed-point iteration; q = 0 for equal ratios);
 * phi_ext = (r21^p phi1 - phi2)/(r21^p - 1); e_a = |(phi1 - phi2)/phi1|;
 * e_ext = |(phi_ext - phi1)/phi_ext|; GCI_fine = Fs e_a/(r21^p - 1) with Fs = 1.25 (three grids).
 * Convergence is monotonic for 0 < R < 1, R = e21/e32, oscillatory for R < 0, divergent for R > 1.
 * The asymptotic-range ratio GCI_32/(r21^p GCI_21) is near 1 in the asymptotic range.
 * With two grids the order must be given (the formal one) and Fs = 3 (Roache's recommendation as
 * cited there).
 *
 * @since 0.1
 */
public final class GridConvergence {
    private GridConvergence() {
    }

    /** How the three solutions approach their limit. */
    public enum Kind { MONOTONIC, OSCILLATORY, DIVERGENT }

    /** Relative quantities as fractions (0.015 is 1.5 %). NaN where undefined. */
    public record Result(double order, double extrapolated, double approxRelError, double extrapRelError,
                         double gciFine, double asymptoticRatio, Kind convergence, int iterations) {
    }

    /**
     * Three grids.
     *
     * @param h sizes, any order (sorted here fine to coarse together with phi)
     * @throws IllegalArgumentException if sizes are not distinct and positive, or the solutions do not
     *     change between grids
     */
    public static Result threeGrids(double[] h, double[] phi) {
        if (h.length != 3 || phi.length != 3) {
            throw new IllegalArgumentException("three grids need three sizes and three values");
        }
        Integer[] order = {0, 1, 2};
        java.util.Arrays.sort(order, (a, b) -> Double.compare(h[a], h[b]));
        double h1 = h[order[0]];
        double h2 = h[order[1]];
        double h3 = h[order[2]];
        double p1 = phi[order[0]];
        double p2 = phi[order[1]];
        double p3 = phi[order[2]];
        if (!(h1 > 0 && h2 > h1 && h3 > h2)) {
            throw new IllegalArgumentException("grid sizes must be distinct and > 0, found " + h1 + ", " + h2 + ", " + h3);
        }
        double r21 = h2 / h1;
        double r32 = h3 / h2;
        double e21 = p2 - p1;
        double e32 = p3 - p2;
        if (e21 == 0 || e32 == 0) {
            throw new IllegalArgumentException("the solution does not change between grids (e21 = " + e21 + ", e32 = "
                + e32 + "); the order is undefined");
        }
        double ratio = e21 / e32;
        Kind kind = ratio < 0 ? Kind.OSCILLATORY : ratio < 1 ? Kind.MONOTONIC : Kind.DIVERGENT;
        double s = Math.signum(e32 / e21);
        double p = Math.abs(Math.log(Math.abs(e32 / e21))) / Math.log(r21);
        int iterations = 0;
        for (; iterations < 500; iterations++) {
            double q = Math.log((Math.pow(r21, p) - s) / (Math.pow(r32, p) - s));
            double next = Math.abs(Math.log(Math.abs(e32 / e21)) + q) / Math.log(r21);
            if (!Double.isFinite(next)) {
                break;
            }
            if (Math.abs(next - p) < 1e-14 * Math.max(1, p)) {
                p = next;
                break;
            }
            p = next;
        }
        double rp = Math.pow(r21, p);
        double extrapolated = (rp * p1 - p2) / (rp - 1);
        double ea = Math.abs((p1 - p2) / p1);
        double eext = Math.abs((extrapolated - p1) / extrapolated);
        double gci21 = 1.25 * ea / (rp - 1);
        double gci32 = 1.25 * Math.abs((p2 - p3) / p2) / (Math.pow(r32, p) - 1);
        return new Result(p, extrapolated, ea, eext, gci21, gci32 / (rp * gci21), kind, iterations);
    }

    /** Two grids with a given (formal) order: Fs = 3, no convergence kind. */
    public static Result twoGrids(double[] h, double[] phi, double formalOrder) {
        int fine = h[0] < h[1] ? 0 : 1;
        int coarse = 1 - fine;
        double r = h[coarse] / h[fine];
        if (!(r > 1)) {
            throw new IllegalArgumentException("grid sizes must differ, found " + h[0] + " and " + h[1]);
        }
        double rp = Math.pow(r, formalOrder);
        double p1 = phi[fine];
        double p2 = phi[coarse];
        double extrapolated = (rp * p1 - p2) / (rp - 1);
        double ea = Math.abs((p1 - p2) / p1);
        return new Result(formalOrder, extrapolated, ea, Math.abs((extrapolated - p1) / extrapolated),
            3 * ea / (rp - 1), Double.NaN, null, 0);
    }
}

package eigencheck.oracle.series;

import java.util.ArrayList;
import java.util.List;

/**
 * Adaptive piecewise Chebyshev interpolation of a family of functions f_m(x), m = 0..M-1, on
 * [a, b] with one panel structure for all: a panel is accepted when, at some degree up to
 * {@link #MAX_POINTS} - 1, the last three coefficients of every member fall below
 * {@code relTol} times the family's scale; otherwise it is halved. A panel narrower than
 * {@code minWidth} that still does not converge is kept and marked unresolved (a jump or a kink
 * inside it); its width and the family's scale there bound what it can hide.
 *
 * <p>The acceptance test is the usual one for Chebyshev interpolants (Trefethen, <i>Approximation
 * Theory and Approximation Practice</i>, SIAM, 2013, ch. 3-4: coefficients of a smooth function
 * decay geometrically, and the sum of the discarded ones estimates the error). It is an estimate,
 * not a proof; the solver checks it again at random points and reports the measured difference.
 * A panel must also match the family at the points of a uniform scan of {@link #SCAN} points over
 * [a, b] that fall inside it, so that a feature narrower than the first Chebyshev sampling (a heater
 * 1/1000 of the length wide between two nodes) is found and split for instead of being read as
 * nothing; features narrower than about (b - a)/4096 can still pass unseen.
 */
final class PiecewiseFit {
    static final int MAX_POINTS = 129;
    /** Points of the uniform scan every accepted panel is checked against. */
    static final int SCAN = 4097;
    private static final int[] POINTS = {9, 17, 33, 65, 129};

    /** A family of functions of x evaluated together. */
    interface Family {
        int size();

        /** Writes f_m(x) for all m into out. */
        void values(double x, double[] out);
    }

    /** One accepted panel: coefficients per member, trimmed to a common length. */
    record Panel(double a, double b, double[][] coefficients, boolean resolved, double tail) {
    }

    private final Family family;
    private final double relTol;
    private final double minWidth;
    private double scale;
    /** The largest |value| of the family on the scan. */
    double scanMax;
    /** The scan: its interval, and the family's values there [member][point]. */
    private double scanFrom;
    private double scanStep;
    private double[][] scanValues;
    final List<Panel> panels = new ArrayList<>();
    double maxTail;
    double unresolvedWidth;

    private PiecewiseFit(Family family, double scale, double relTol, double minWidth) {
        this.family = family;
        this.scale = scale;
        this.relTol = relTol;
        this.minWidth = minWidth;
    }

    /**
     * Fits the family on [a, b].
     *
     * @param scale magnitude the tolerance is relative to (the family's sup, or larger)
     * @throws NonFiniteException if a sample is NaN or infinite
     */
    static PiecewiseFit fit(Family family, double a, double b, double scale, double relTol, double minWidth) {
        PiecewiseFit f = new PiecewiseFit(family, scale, relTol, minWidth);
        f.scan(a, b);
        // the scale the tolerance is relative to includes what the scan saw (a narrow feature the caller's
        // sampling missed would otherwise be held to a tolerance of nothing)
        f.scale = Math.max(scale, f.scanMax) > 0 ? Math.max(scale, f.scanMax) : 1;
        f.split(a, b);
        return f;
    }

    /** A sample that is NaN or infinite, with where it was taken. */
    static final class NonFiniteException extends RuntimeException {
        final double x;
        final int member;
        final double value;

        NonFiniteException(double x, int member, double value) {
            super("value " + value + " at x = " + x);
            this.x = x;
            this.member = member;
            this.value = value;
        }
    }

    private void scan(double a, double b) {
        int m = family.size();
        double[] buffer = new double[m];
        scanFrom = a;
        scanStep = (b - a) / (SCAN - 1);
        scanValues = new double[m][SCAN];
        for (int j = 0; j < SCAN; j++) {
            double x = j == SCAN - 1 ? b : a + j * scanStep;
            family.values(x, buffer);
            for (int i = 0; i < m; i++) {
                if (!Double.isFinite(buffer[i])) {
                    throw new NonFiniteException(x, i, buffer[i]);
                }
                scanValues[i][j] = buffer[i];
                scanMax = Math.max(scanMax, Math.abs(buffer[i]));
            }
        }
    }

    /**
     * True when the interpolants on [a, b] match the scan's values inside the panel to 100 times the
     * larger of their tail and the tolerance, plus rounding.
     */
    private boolean matchesScan(double a, double b, double[][] coef, double tail) {
        int first = (int) Math.ceil((a - scanFrom) / scanStep);
        int last = (int) Math.floor((b - scanFrom) / scanStep);
        for (int i = 0; i < coef.length; i++) {
            double allowed = 100 * Math.max(tail, relTol * scale) + 16 * Math.ulp(1.0) * Chebyshev.absSum(coef[i]);
            for (int j = Math.max(first, 0); j <= Math.min(last, SCAN - 1); j++) {
                double x = scanFrom + j * scanStep;
                if (x < a || x > b) {
                    continue;
                }
                double r = Chebyshev.value(coef[i], Chebyshev.reference(x, a, b));
                if (!(Math.abs(r - scanValues[i][j]) <= allowed)) {
                    return false;
                }
            }
        }
        return true;
    }

    private void split(double a, double b) {
        int m = family.size();
        double[] buffer = new double[m];
        double[][] coef = null;
        for (int n : POINTS) {
            double[] nodes = Chebyshev.nodes(a, b, n);
            double[][] values = new double[m][n];
            for (int j = 0; j < n; j++) {
                family.values(nodes[j], buffer);
                for (int i = 0; i < m; i++) {
                    double v = buffer[i];
                    if (!Double.isFinite(v)) {
                        throw new NonFiniteException(nodes[j], i, v);
                    }
                    values[i][j] = v;
                }
            }
            coef = new double[m][];
            double tail = 0;
            for (int i = 0; i < m; i++) {
                coef[i] = Chebyshev.fromValues(values[i]);
                tail = Math.max(tail, tail(coef[i]));
            }
            if (tail <= relTol * scale && matchesScan(a, b, coef, tail)) {
                accept(a, b, coef, true, tail);
                return;
            }
        }
        if (b - a > minWidth) {
            double mid = 0.5 * (a + b);
            split(a, mid);
            split(mid, b);
        } else {
            accept(a, b, coef, false, scale);
            unresolvedWidth += b - a;
        }
    }

    private static double tail(double[] c) {
        int n = c.length;
        double t = 0;
        for (int k = Math.max(0, n - 3); k < n; k++) {
            t = Math.max(t, Math.abs(c[k]));
        }
        return t;
    }

    private void accept(double a, double b, double[][] coef, boolean resolved, double tail) {
        // trim trailing coefficients that are below the rounding level of the scale
        int keep = 1;
        for (double[] c : coef) {
            for (int k = c.length - 1; k >= keep; k--) {
                if (Math.abs(c[k]) > 1e-17 * scale) {
                    keep = Math.max(keep, k + 1);
                    break;
                }
            }
        }
        double[][] trimmed = new double[coef.length][];
        for (int i = 0; i < coef.length; i++) {
            trimmed[i] = Chebyshev.resize(coef[i], keep);
        }
        panels.add(new Panel(a, b, trimmed, resolved, tail));
        if (resolved) {
            maxTail = Math.max(maxTail, tail);
        }
    }
}

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
 */
final class PiecewiseFit {
    static final int MAX_POINTS = 129;
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
    private final double scale;
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
        PiecewiseFit f = new PiecewiseFit(family, scale > 0 ? scale : 1, relTol, minWidth);
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
            if (tail <= relTol * scale) {
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

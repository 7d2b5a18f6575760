package eigencheck.oracle.series;

import java.util.function.DoubleUnaryOperator;

/**
 * Chebyshev series \(\sum_k c_k T_k(\hat x)\), \(\hat x = (2x - a - b)/(b - a)\), on an interval
 * [a, b]: interpolation at the first-kind points, Clenshaw evaluation, exact derivative and
 * antiderivative. Static helpers on coefficient arrays; nothing here allocates in evaluation.
 *
 * <p>Formulas: Mason and Handscomb, <i>Chebyshev Polynomials</i>, Chapman and Hall/CRC, 2003,
 * section 2.4.4 (derivative recurrence \(c'_{k-1} = c'_{k+1} + 2k c_k\)), 2.4.5 (integral
 * \(\int T_k = T_{k+1}/(2(k+1)) - T_{k-1}/(2(k-1))\)), 6.3 (interpolation at the zeros of T_n).
 */
final class Chebyshev {
    private Chebyshev() {
    }

    /** Coefficients of the degree n-1 interpolant of f at the n zeros of T_n on [a, b]. */
    static double[] interpolate(DoubleUnaryOperator f, double a, double b, int n) {
        double[] values = new double[n];
        double[] nodes = nodes(a, b, n);
        for (int j = 0; j < n; j++) {
            values[j] = f.applyAsDouble(nodes[j]);
        }
        return fromValues(values);
    }

    /** The n zeros of T_n mapped to [a, b], in decreasing order of the reference variable. */
    static double[] nodes(double a, double b, int n) {
        double[] x = new double[n];
        double mid = 0.5 * (a + b);
        double half = 0.5 * (b - a);
        for (int j = 0; j < n; j++) {
            x[j] = mid + half * Math.cos(Math.PI * (j + 0.5) / n);
        }
        return x;
    }

    /**
     * Coefficients from values at {@link #nodes}: c_k = (2/n) sum_j f_j cos(pi k (2j+1)/(2n)), with
     * the angle reduced exactly (integer index modulo 4n) so that rounding stays at a few ulps.
     */
    static double[] fromValues(double[] values) {
        int n = values.length;
        double[] table = new double[4 * n];
        for (int m = 0; m < 4 * n; m++) {
            table[m] = Math.cos(Math.PI * m / (2.0 * n));
        }
        double[] c = new double[n];
        for (int k = 0; k < n; k++) {
            double s = 0;
            for (int j = 0; j < n; j++) {
                int m = (int) (((long) k * (2 * j + 1)) % (4L * n));
                s += values[j] * table[m];
            }
            c[k] = 2.0 * s / n;
        }
        c[0] *= 0.5;
        return c;
    }

    /**
     * True when the last four coefficients are below 1e-15 of the largest (or all vanish): the series
     * resolves its function to rounding, the test of the adaptive interpolations.
     */
    static boolean resolved(double[] c) {
        double tailMax = 0;
        double max = 0;
        for (int i = 0; i < c.length; i++) {
            max = Math.max(max, Math.abs(c[i]));
            if (i >= c.length - 4) {
                tailMax = Math.max(tailMax, Math.abs(c[i]));
            }
        }
        return tailMax <= 1e-15 * Math.max(max, Double.MIN_NORMAL) || max == 0;
    }

    /** Clenshaw's recurrence at the reference variable s in [-1, 1]. */
    static double value(double[] c, double s) {
        int n = c.length;
        if (n == 0) {
            return 0;
        }
        if (n == 1) {
            return c[0];
        }
        double b1 = 0;
        double b2 = 0;
        double s2 = 2 * s;
        for (int k = n - 1; k >= 1; k--) {
            double b0 = c[k] + s2 * b1 - b2;
            b2 = b1;
            b1 = b0;
        }
        return c[0] + s * b1 - b2;
    }

    /** Clenshaw on the coefficients c[from .. from+count) of a flat array. */
    static double value(double[] c, int from, int count, double s) {
        if (count == 0) {
            return 0;
        }
        double b1 = 0;
        double b2 = 0;
        double s2 = 2 * s;
        for (int k = from + count - 1; k >= from + 1; k--) {
            double b0 = c[k] + s2 * b1 - b2;
            b2 = b1;
            b1 = b0;
        }
        return c[from] + s * b1 - b2;
    }

    /** Reference variable of x on [a, b]. */
    static double reference(double x, double a, double b) {
        return (2 * x - a - b) / (b - a);
    }

    /** Derivative with respect to x of the series on [a, b] (length n-1, at least 1). */
    static double[] derivative(double[] c, double a, double b) {
        int n = c.length;
        if (n <= 1) {
            return new double[] {0};
        }
        double[] d = new double[n - 1];
        double scale = 2 / (b - a);
        double next = 0; // d_{k+1}
        double nextNext = 0; // d_{k+2}
        for (int k = n - 1; k >= 1; k--) {
            double dk = nextNext + 2 * k * c[k]; // d_{k-1}
            nextNext = next;
            next = dk;
            d[k - 1] = dk;
        }
        d[0] *= 0.5;
        for (int k = 0; k < d.length; k++) {
            d[k] *= scale;
        }
        return d;
    }

    /** Antiderivative with respect to x on [a, b] that vanishes at a (length n+1). */
    static double[] antiderivative(double[] c, double a, double b) {
        int n = c.length;
        double[] r = new double[n + 1];
        double half = 0.5 * (b - a);
        for (int k = 0; k < n; k++) {
            double ck = c[k] * half;
            if (k == 0) {
                r[1] += ck;
            } else if (k == 1) {
                r[0] += 0; // T_1 integrates to T_2/4 + const
                r[2] += ck / 4;
            } else {
                r[k + 1] += ck / (2.0 * (k + 1));
                r[k - 1] -= ck / (2.0 * (k - 1));
            }
        }
        // fix the constant so that the value at s = -1 is zero
        double atLeft = value(r, -1);
        r[0] -= atLeft;
        return r;
    }

    /** Sum of |c_k|: a bound on the series' magnitude on its interval. */
    static double absSum(double[] c) {
        double s = 0;
        for (double v : c) {
            s += Math.abs(v);
        }
        return s;
    }

    /** Sum of |c_k| over c[from .. from+count). */
    static double absSum(double[] c, int from, int count) {
        double s = 0;
        for (int k = from; k < from + count; k++) {
            s += Math.abs(c[k]);
        }
        return s;
    }

    /** Exact integral over [a, b]: (b-a)/2 * sum over even k of 2 c_k/(1-k^2). */
    static double integral(double[] c, double a, double b) {
        double s = 0;
        for (int k = 0; k < c.length; k += 2) {
            s += c[k] * 2.0 / (1.0 - (double) k * k);
        }
        return s * 0.5 * (b - a);
    }

    /** c padded with zeros or cut to length n. */
    static double[] resize(double[] c, int n) {
        double[] r = new double[n];
        System.arraycopy(c, 0, r, 0, Math.min(n, c.length));
        return r;
    }

    /**
     * Coefficients, on [a, b], of the polynomial whose monomial coefficients in x are m
     * (m[0] + m[1] x + m[2] x^2 + ...).
     */
    static double[] fromMonomial(double[] m, double a, double b) {
        // x = mid + half * s; build powers of x as Chebyshev series in s by repeated multiplication.
        double mid = 0.5 * (a + b);
        double half = 0.5 * (b - a);
        double[] result = new double[Math.max(1, m.length)];
        double[] power = {1};
        for (int p = 0; p < m.length; p++) {
            for (int k = 0; k < power.length; k++) {
                result[k] += m[p] * power[k];
            }
            power = timesLinear(power, mid, half);
        }
        return result;
    }

    /** (mid + half*s) * series(s): uses s T_k = (T_{k+1} + T_{|k-1|})/2. */
    private static double[] timesLinear(double[] c, double mid, double half) {
        double[] r = new double[c.length + 1];
        for (int k = 0; k < c.length; k++) {
            r[k] += mid * c[k];
            if (k == 0) {
                r[1] += half * c[0];
            } else {
                r[k + 1] += 0.5 * half * c[k];
                r[k - 1] += 0.5 * half * c[k];
            }
        }
        return r;
    }
}

package eigencheck.oracle.series;

import eigencheck.oracle.expr.Expression;
import org.apache.commons.math3.analysis.differentiation.DerivativeStructure;

/**
 * The part of a box's source that couples x, y and z, when it is one product Q_t = F(x) G(y) H(z) (a spot
 * heater whose strength falls off as a Gaussian in each direction, say). Each factor f of an axis whose two
 * faces are not both insulated or flux-driven is split by the blend of that axis,
 * \(f = f_r + \sum_e \psi_e\, B_e f\), psi_e linear with \(B_{e'} \psi_e = \delta_{e e'}\) and B_e the end's
 * condition as the modes meet it (the value on a Dirichlet face, \(f' \mp (h/k) f\) on a flux or convective
 * one), so that \(Q_t = F_b G H + F_r G_b H + F_r G_r H_b + F_r G_r H_r\).
 * <ul>
 * <li>The first three are psi(x_c) times a function of the other two coordinates. Since psi'' = 0 their
 * steady solutions are psi(x_c) V(x_a, x_b), V a rectangle's solution of that function under the
 * homogeneous conditions of a and b (the caller's pair terms).</li>
 * <li>The last meets every face's homogeneous condition. Its modal coefficients are products of the
 * factors' own, \(a_i b_j c_k\), and its steady part is \(W = \sum a_i b_j c_k X_i Y_j Z_k / (k\lambda_{ijk})\);
 * this class gives the coefficients and the bounds of what a table leaves out.</li>
 * </ul>
 *
 * <p>Bounds of one factor's coefficients beyond those computed, for a mode X (|X| &lt;= 1, |X'| &lt;= mu,
 * X'' = -mu^2 X, \(B_e X = 0\)) and f_r meeting the same conditions: integrating by parts twice, the end terms
 * [f X' - f' X] vanish, so \(|\langle f_r, X\rangle| \le (\sum_e (\mu |f''(e)| + |f'''(e)|) + \|f''''\|_1)/\mu^4\);
 * on an insulated pair (not blended, X'(e) = 0) \(\le \sum_e |f'(e)|/\mu^2 + (\sum_e |f'''(e)| + \|f''''\|_1)/\mu^4\).
 * Divided by a lower bound of \(\|X\|^2\) and summed with \(\mu_j \ge j\pi/L\). The L1 norm is measured on a
 * 2048-point Gauss rule and doubled: the bound rests on the factor being smooth (non-smooth sources are
 * refused), as {@link SourceRemainder}'s does.
 */
final class ProductSource {
    private static final double EPS = Math.ulp(1.0);
    private final AxisModes[] axes;
    private final double[] len;
    private final boolean[] blended = new boolean[3];
    /** psi_e = {c0, c1} per axis and end (null rows on an axis that is not blended). */
    private final double[][][] weight = new double[3][][];
    /** B_e f of each axis's factor, [axis][end] (0 where not blended). */
    private final double[][] endData = new double[3][2];
    private final Expression[] factor = new Expression[3];
    private final Expression[] rest = new Expression[3];
    /** Per axis {A2, A3, A4}: |<f_r, X_j>| <= A2/mu^2 + A3/mu^3 + A4/mu^4. */
    private final double[][] tailConstants = new double[3][];
    private final double[] restNorm = new double[3];
    private double[][] coefficients = new double[3][0];
    private final double[] projectionError = new double[3];

    /**
     * @param factors F, G, H, each an expression of its own coordinate alone (over x, y, z in turn)
     * @param hOverK per axis and end: h/k of a convective face, 0 of a flux face, infinity of a Dirichlet one
     */
    ProductSource(Expression[] factors, AxisModes[] axes, double[] len, double[][] hOverK) {
        this.axes = axes;
        this.len = len.clone();
        String[] names = {"x", "y", "z"};
        for (int i = 0; i < 3; i++) {
            factor[i] = factors[i];
            blended[i] = !axes[i].zero;
            Expression r = factors[i];
            if (blended[i]) {
                double[][] m = new double[2][2];
                for (int e = 0; e < 2; e++) {
                    double at = e == 0 ? 0 : len[i];
                    boolean dirichlet = hOverK[i][e] == Double.POSITIVE_INFINITY;
                    // B_e f = c_value f(e) + c_slope f'(e)
                    double cValue = dirichlet ? 1 : (e == 0 ? -1 : 1) * hOverK[i][e];
                    double cSlope = dirichlet ? 0 : 1;
                    m[e][0] = cValue;
                    m[e][1] = cValue * at + cSlope;
                    double[] f = derivatives(factors[i], at, 1);
                    endData[i][e] = cValue * f[0] + cSlope * f[1];
                }
                double det = m[0][0] * m[1][1] - m[0][1] * m[1][0];
                weight[i] = new double[][] {{m[1][1] / det, -m[1][0] / det}, {-m[0][1] / det, m[0][0] / det}};
                for (int e = 0; e < 2; e++) {
                    Expression psi = Expression.constant(weight[i][e][0], names[i])
                        .linear(1, Expression.parse(names[i], names[i]), weight[i][e][1]);
                    r = r.linear(1, psi, -endData[i][e]);
                }
            }
            rest[i] = r;
            tailConstants[i] = tailConstants(i);
        }
    }

    /** Whether the axis carries the blend. */
    boolean blended(int axis) {
        return blended[axis];
    }

    /** psi_e = {c0, c1} of an end of a blended axis. */
    double[] weight(int axis, int end) {
        return weight[axis][end].clone();
    }

    /** B_e of the axis's factor at that end (the factor of psi_e in its blend). */
    double endData(int axis, int end) {
        return endData[axis][end];
    }

    /** The factor of an axis, over its coordinate. */
    Expression factor(int axis) {
        return factor[axis];
    }

    /** The factor less its blend, f_r, over its coordinate (the factor itself on an insulated pair). */
    Expression rest(int axis) {
        return rest[axis];
    }

    /** The L2 norm of f_r over its axis (64-point Gauss rule, times 1.01). */
    double restNorm(int axis) {
        return restNorm[axis];
    }

    /** f, f', ..., f^(order) at x by forward automatic differentiation. */
    private static double[] derivatives(Expression f, double x, int order) {
        DerivativeStructure v = f.value(new DerivativeStructure(1, order, 0, x));
        double[] out = new double[order + 1];
        for (int o = 0; o <= order; o++) {
            out[o] = v.getPartialDerivative(o);
        }
        return out;
    }

    private double[] tailConstants(int axis) {
        double l = len[axis];
        double a2 = 0;
        double a3 = 0;
        double a4 = 0;
        for (int e = 0; e < 2; e++) {
            double[] f = derivatives(rest[axis], e == 0 ? 0 : l, 3);
            a4 += Math.abs(f[3]);
            if (blended[axis]) {
                a3 += Math.abs(f[2]);
            } else {
                a2 += Math.abs(f[1]);
            }
        }
        double[][] rule = GaussLegendre.onInterval(2048, l);
        double fourth = 0;
        for (int q = 0; q < 2048; q++) {
            fourth += rule[1][q] * Math.abs(derivatives(rest[axis], rule[0][q], 4)[4]);
        }
        a4 += 2 * fourth;
        double[][] small = GaussLegendre.onInterval(64, l);
        double norm = 0;
        for (int q = 0; q < 64; q++) {
            double v = rest[axis].value(small[0][q]);
            norm += small[1][q] * v * v;
        }
        restNorm[axis] = 1.01 * Math.sqrt(norm);
        double[] c = {a2, a3, a4};
        for (double v : c) {
            if (!Double.isFinite(v)) {
                return new double[] {Double.POSITIVE_INFINITY, 0, 0};
            }
        }
        return c;
    }

    /**
     * The coefficients a_j = <f_r, X_j> / ||X_j||^2 of every axis for j < n, on a Gauss rule of 1.6 n + 40
     * nodes; the error per coefficient is 10 times the difference from a rule 25 % finer.
     */
    synchronized void ensure(int n) {
        if (coefficients[0].length >= n) {
            return;
        }
        double[][] next = new double[3][];
        for (int i = 0; i < 3; i++) {
            axes[i].ensure(n);
            int nodes = (int) Math.ceil(1.6 * n + 40);
            double[] first = project(i, n, nodes);
            double[] second = project(i, n, nodes + nodes / 4 + 8);
            double diff = 0;
            double max = 0;
            for (int j = 0; j < n; j++) {
                diff = Math.max(diff, Math.abs(first[j] - second[j]));
                max = Math.max(max, Math.abs(first[j]));
            }
            projectionError[i] = 10 * diff + 4 * EPS * max;
            next[i] = first;
        }
        coefficients = next;
    }

    private double[] project(int axis, int n, int nodes) {
        AxisModes a = axes[axis];
        double[][] rule = GaussLegendre.onInterval(nodes, len[axis]);
        double[] f = new double[nodes];
        for (int q = 0; q < nodes; q++) {
            f[q] = rule[1][q] * rest[axis].value(rule[0][q]);
        }
        double[] out = new double[n];
        for (int j = 0; j < n; j++) {
            double sum = 0;
            for (int q = 0; q < nodes; q++) {
                sum += f[q] * Math.sin(a.mu[j] * rule[0][q] + a.phase[j]);
            }
            out[j] = sum / a.norm[j];
        }
        return out;
    }

    /** Coefficient j of an axis (after {@link #ensure}). */
    double coefficient(int axis, int j) {
        return coefficients[axis][j];
    }

    /** The error of each computed coefficient of an axis. */
    double projectionError(int axis) {
        return projectionError[axis];
    }

    /** How many coefficients per axis are computed. */
    int computed() {
        return coefficients[0].length;
    }

    /**
     * sum over j >= from of |a_j| mu_j^-q: the computed ones (with their error), and beyond them the
     * integration-by-parts bound summed with mu_j >= j pi / L (from >= 1).
     */
    double tail(int axis, int from, int q) {
        int n = computed();
        double sum = 0;
        AxisModes a = axes[axis];
        for (int j = from; j < n; j++) {
            double mu = a.mu[j];
            sum += (Math.abs(coefficients[axis][j]) + projectionError[axis]) * Math.pow(mu, -q);
        }
        int start = Math.max(from, n);
        double normLow = a.normLowerBound(n);
        double[] c = tailConstants[axis];
        double scale = len[axis] / Math.PI;
        for (int p = 0; p < 3; p++) {
            if (c[p] == 0) {
                continue;
            }
            int s = p + 2 + q;
            sum += c[p] / normLow * Math.pow(scale, s) * zetaTail(start, s);
        }
        return sum;
    }

    /** sum over all j of |a_j| (the zero mode included). */
    double total(int axis) {
        double sum = 0;
        int n = computed();
        for (int j = 0; j < Math.min(1, n); j++) {
            sum += Math.abs(coefficients[axis][j]) + projectionError[axis];
        }
        return sum + tail(axis, 1, 0);
    }

    /** sum_{j >= n} j^-s <= n^-s + n^(1-s)/(s - 1), for n >= 1 and s > 1. */
    static double zetaTail(int n, int s) {
        return Math.pow(n, -s) + Math.pow(n, 1 - s) / (s - 1);
    }
}

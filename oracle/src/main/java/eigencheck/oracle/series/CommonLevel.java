package eigencheck.oracle.series;

import eigencheck.oracle.OracleException;
import eigencheck.oracle.OracleException.Reason;
import eigencheck.oracle.expr.Expression;

/**
 * A temperature level b(t), b(0) = 0, that every Dirichlet side's temperature and every convective
 * side's ambient of a rectangle or box share on top of data constant in time:
 * g(s, t) = g(s, 0) + b(t) (a furnace or bath whose temperature follows a schedule). Then
 * <pre>
 *   u = b(t) + S - b'(t) P + v,
 * </pre>
 * S the steady solution for the data at t = 0 and the source, P the solution of -alpha Laplace P = 1
 * under the homogeneous conditions (the quasi-static subtraction of the uniform source -b'(t)), and
 * v_t - alpha Laplace v = b''(t) P under homogeneous conditions with v(0) = u_0 - S + b'(0) P. Mode J
 * of v is the decaying transient plus the particular part
 * <pre>
 *   (1_J / lambda_J) I_J(t),   I_J(t) = int_0^t exp(-lambda_J (t - s)) b''(s) ds,
 * </pre>
 * 1_J the projection of 1 on the mode; it is at most max|b''| |1_J| / lambda_J^2, and the tails are
 * bounded in closed form ({@link #tail}). The sizes of b' and b'' are taken from 2049 samples over the
 * horizon with a 5 % margin: a schedule with a feature narrower than 1/2048 of the horizon would be
 * misjudged. Thread-safe after construction.
 */
final class CommonLevel {
    /** Modes of each axis summed exactly inside the tail bounds; beyond, integral comparison. */
    private static final int CUTOFF = 4096;
    private static final int SAMPLES = 2049;

    private final Expression level;
    private final Expression slope;
    private final Expression curvature;
    private final ScheduleIntegral duhamel;
    private final double alpha;
    private final AxisModes[] axes;
    private final boolean[] active;
    private final int activeCount;
    // suffix sums of |1_j| mu_j^-r on each active axis, [0] for values (p = 2), [1] for gradients (p = 3/2)
    private final double[][][] suffix;
    private final double[][] whole;
    final double levelMax;
    /** max |r|, r = b' - sigma the rate the lag follows. */
    final double rateMax;
    final double curvatureMax;
    /** r(0), which enters the transient's initial projections. */
    final double initialRate;

    /**
     * @param level b(t) - b(0) over the single variable t
     * @param heating sigma(t) = (Q(t) - Q(0)) / (rho c), a uniform source's change in K/s over t, or null:
     *     the lag then follows the rate r = b' - sigma instead of b' (u = b + S - r P + v, v's forcing r' P)
     * @param axes the body's axes (ensured here to {@link #CUTOFF} modes)
     */
    CommonLevel(Expression level, Expression heating, double horizon, double alpha, AxisModes[] axes) {
        this.level = level;
        this.slope = heating == null ? level.derivative("t") : level.derivative("t").linear(1, heating, -1);
        this.curvature = slope.derivative("t");
        this.duhamel = new ScheduleIntegral(curvature);
        this.alpha = alpha;
        this.axes = axes;
        double[] sizes = sizes(level, slope, curvature, horizon);
        this.levelMax = sizes[0];
        this.rateMax = sizes[1];
        this.curvatureMax = sizes[2];
        this.initialRate = slope.value(0);
        int d = axes.length;
        active = new boolean[d];
        double[][] magnitude = new double[d][];
        double[] normLow = new double[d];
        int count = 0;
        for (int i = 0; i < d; i++) {
            // a Neumann-Neumann axis: 1 projects on its constant mode alone (the others integrate to 0)
            active[i] = !axes[i].zero;
            if (!active[i]) {
                continue;
            }
            count++;
            axes[i].ensure(CUTOFF);
            magnitude[i] = new double[CUTOFF];
            for (int j = 0; j < CUTOFF; j++) {
                magnitude[i][j] = Math.abs(axes[i].integral(j) / axes[i].norm[j]);
            }
            normLow[i] = axes[i].normLowerBound(CUTOFF);
        }
        this.activeCount = count;
        double w0 = 1 - (activeCount - 1) / 8.0;
        double[] powers = {2, 1.5};
        suffix = new double[2][d][];
        whole = new double[2][d];
        for (int pi = 0; pi < 2; pi++) {
            for (int i = 0; i < d; i++) {
                if (active[i]) {
                    suffix[pi][i] = suffixSums(magnitude[i], normLow[i], i, 2 * powers[pi] * w0);
                    whole[pi][i] = suffixSums(magnitude[i], normLow[i], i, powers[pi] / 4)[0];
                }
            }
        }
        this.normLow = normLow;
    }

    private final double[] normLow;

    /**
     * sum_{j' >= j} |1_j'| mu_j'^-r for j <= CUTOFF: exact to CUTOFF, and beyond with |1_j| <= 2/(mu_j N),
     * mu_j >= j pi / L and sum_{j >= C} j^-(r+1) <= (C - 1)^-r / r.
     */
    private double[] suffixSums(double[] magnitude, double normLower, int i, double r) {
        double l = axes[i].length / Math.PI;
        double[] out = new double[CUTOFF + 1];
        out[CUTOFF] = beyond(normLower, l, r, CUTOFF);
        for (int j = CUTOFF - 1; j >= 0; j--) {
            out[j] = out[j + 1] + magnitude[j] * Math.pow(axes[i].mu[j], -r);
        }
        return out;
    }

    private static double beyond(double normLower, double l, double r, int from) {
        return 2 / normLower * Math.pow(l, r + 1) * Math.pow(from - 1, -r) / r;
    }

    /**
     * {max |b|, max |b'|, max |b''|} over [0, horizon] from 2049 samples, the derivatives with a 5 %
     * margin for what lies between the samples.
     *
     * @throws OracleException if one of them is not finite at a sample
     */
    static double[] sizes(Expression level, Expression slope, Expression curvature, double horizon) {
        return sizes(level, slope, curvature, horizon, "the common level");
    }

    /** As above, {@code what} naming the schedule in messages. */
    static double[] sizes(Expression level, Expression slope, Expression curvature, double horizon, String what) {
        double bMax = 0;
        double b1Max = 0;
        double b2Max = 0;
        for (int i = 0; i < SAMPLES; i++) {
            double t = horizon * i / (SAMPLES - 1);
            bMax = Math.max(bMax, Math.abs(finite(level, t, what)));
            b1Max = Math.max(b1Max, Math.abs(finite(slope, t, "the rate of " + what)));
            b2Max = Math.max(b2Max, Math.abs(finite(curvature, t, "the second derivative of " + what)));
        }
        return new double[] {bMax, 1.05 * b1Max, 1.05 * b2Max};
    }

    private static double finite(Expression e, double t, String what) {
        double v = e.value(t);
        if (!Double.isFinite(v)) {
            throw new OracleException(Reason.DATA_NOT_FINITE, "boundary: " + what + " (from " + e.source() + ") is "
                + v + " at t = " + t + " s");
        }
        return v;
    }

    double level(double t) {
        return level.value(t);
    }

    /** r(t) = b'(t) - sigma(t). */
    double rate(double t) {
        return slope.value(t);
    }

    /**
     * The signed projection (int X_j) / ||X_j||^2 of 1 on mode j of axis i (exactly 0 past the constant
     * on an inactive axis).
     */
    double one(int i, int j) {
        if (!active[i]) {
            return j == 0 ? 1 : 0;
        }
        return axes[i].integral(j) / axes[i].norm[j];
    }

    /**
     * A bound of the sum over modes J outside the box {@code m} of |1_J| / lambda_J^p (p = 2 or 3/2),
     * lambda_J = alpha sum_i mu_i^2: at least one active axis i has j_i >= m_i, and there
     * lambda/alpha >= mu_i^(2 w0) prod_k nu_k^(1/4) by weighted AM-GM (weight w0 = 1 - (A - 1)/8 on axis
     * i, 1/8 on each of the A - 1 other active axes), so the sum splits into one-axis sums.
     */
    double tail(int[] m, double p) {
        int pi = p == 2 ? 0 : 1;
        double w0 = 1 - (activeCount - 1) / 8.0;
        double total = 0;
        for (int i = 0; i < axes.length; i++) {
            if (!active[i]) {
                continue;
            }
            double product = m[i] <= CUTOFF ? suffix[pi][i][m[i]]
                : beyond(normLow[i], axes[i].length / Math.PI, 2 * p * w0, m[i]);
            for (int k = 0; k < axes.length; k++) {
                if (k != i && active[k]) {
                    product *= whole[pi][k];
                }
            }
            total += product;
        }
        return total / Math.pow(alpha, p);
    }

    /**
     * Bound on the particular part's truncation outside box m: {value, each gradient component}; a
     * mode's gradient is at most sum_i mu_i <= sqrt(A lambda / alpha). The modes outside m but inside
     * the explicit region [0, C)^A are summed one by one, those beyond it bounded by {@link #tail}.
     */
    double[] truncation(int[] m, double t) {
        return truncation(m, explicitCutoff(false), t);
    }

    /**
     * As {@link #truncation(int[], double)}, with the explicit region's edge c (c^A terms). A mode outside
     * m has lambda >= lambda_m = alpha min_i mu_(i, m_i)^2, and then
     * |I(t)| <= int_0^t exp(-lambda (t - s)) |b''(s)| ds <= 2 M / lambda with
     * M = max_s |b''(s)| exp(-lambda_m (t - s) / 2): a schedule whose b'' has died down by t costs fewer
     * modes than its largest b'' would.
     */
    double[] truncation(int[] m, int c, double t) {
        double[] explicit = explicitTail(m, c);
        double[] beyond = beyond(c);
        double size = localCurvature(t, edge(m));
        return new double[] {size * (explicit[0] + beyond[0]),
            size * Math.sqrt(activeCount / alpha) * (explicit[1] + beyond[1])};
    }

    /** alpha min over the active axes of mu_(i, m_i)^2: no mode outside box m decays more slowly. */
    private double edge(int[] m) {
        double lowest = Double.POSITIVE_INFINITY;
        for (int i = 0; i < axes.length; i++) {
            if (active[i]) {
                double mu = axes[i].mu[Math.min(m[i], axes[i].mu.length - 1)];
                lowest = Math.min(lowest, alpha * mu * mu);
            }
        }
        return lowest;
    }

    /**
     * min(max |b''|, 2 M), M = max over 2049 samples s of [0, t] of |b''(s)| exp(-lambda (t - s) / 2)
     * with the same 5 % margin as the sizes.
     */
    private double localCurvature(double t, double lambda) {
        return localSize(curvature, curvatureMax, t, lambda);
    }

    /**
     * min(max, 2 M), M = max over 2049 samples s of [0, t] of |f(s)| exp(-lambda (t - s) / 2) with a 5 %
     * margin: |int_0^t exp(-l (t - s)) f(s) ds| <= 2 M / l for every rate l >= lambda.
     */
    static double localSize(Expression f, double max, double t, double lambda) {
        if (!(t > 0) || !(lambda > 0)) {
            return max;
        }
        double m = 0;
        for (int i = 0; i < SAMPLES; i++) {
            double s = t * i / (SAMPLES - 1);
            m = Math.max(m, Math.abs(f.value(s)) * Math.exp(-lambda * (t - s) / 2));
        }
        return Math.min(max, 2 * 1.05 * m);
    }

    /** The explicit region's edge: about 10^6 terms while sizing boxes, about 1.7 10^7 for a final bound. */
    int explicitCutoff(boolean wide) {
        return activeCount == 1 ? CUTOFF : activeCount == 2 ? (wide ? CUTOFF : 1024) : (wide ? 256 : 128);
    }

    /**
     * {p = 2, p = 3/2} sums of |1_J| / lambda_J^p beyond [0, c)^A. With two active axes, split into
     * {m >= c, n < c}, {m < c, n >= c} (lambda >= alpha mu^2 on the long axis, the short one's sum of
     * |1_n| exact) and {m, n >= c} (mu^2 + nu^2 >= 2 mu nu); otherwise by {@link #tail}.
     */
    private double[] beyond(int c) {
        int[] region = new int[axes.length];
        for (int i = 0; i < region.length; i++) {
            region[i] = active[i] ? c : 1;
        }
        if (activeCount != 2 || c > CUTOFF) {
            return new double[] {tail(region, 2), tail(region, 1.5)};
        }
        int i0 = -1;
        int i1 = -1;
        for (int i = 0; i < axes.length; i++) {
            if (active[i]) {
                if (i0 < 0) {
                    i0 = i;
                } else {
                    i1 = i;
                }
            }
        }
        double[] out = new double[2];
        double[] powers = {2, 1.5};
        for (int pi = 0; pi < 2; pi++) {
            double p = powers[pi];
            double r0 = axisSum(i0, c, 2 * p);
            double r1 = axisSum(i1, c, 2 * p);
            double s0 = 0;
            double s1 = 0;
            for (int j = 0; j < c; j++) {
                s0 += Math.abs(one(i0, j));
                s1 += Math.abs(one(i1, j));
            }
            double both = axisSum(i0, c, p) * axisSum(i1, c, p) / Math.pow(2, p);
            out[pi] = (r0 * s1 + r1 * s0 + both) / Math.pow(alpha, p);
        }
        return out;
    }

    /** sum_{j >= from} |1_j| mu_j^-r on active axis i: exact to CUTOFF, bounded beyond. */
    private double axisSum(int i, int from, double r) {
        double sum = 0;
        for (int j = from; j < CUTOFF; j++) {
            sum += Math.abs(one(i, j)) * Math.pow(axes[i].mu[j], -r);
        }
        return sum + beyond(normLow[i], axes[i].length / Math.PI, r, Math.max(from, CUTOFF));
    }

    /** {sum |1_J| / lambda_J^2, sum |1_J| / lambda_J^(3/2)} over J in [0, c)^A outside box m. */
    private double[] explicitTail(int[] m, int c) {
        int[] on = new int[activeCount];
        int a = 0;
        for (int i = 0; i < axes.length; i++) {
            if (active[i]) {
                on[a++] = i;
            }
        }
        double[][] mu2 = new double[activeCount][c];
        double[][] mag = new double[activeCount][c];
        for (int q = 0; q < activeCount; q++) {
            for (int j = 0; j < c; j++) {
                double mu = axes[on[q]].mu[j];
                mu2[q][j] = alpha * mu * mu;
                mag[q][j] = Math.abs(one(on[q], j));
            }
        }
        double two = 0;
        double threeHalves = 0;
        if (activeCount == 1) {
            for (int j = m[on[0]]; j < c; j++) {
                double l = mu2[0][j];
                two += mag[0][j] / (l * l);
                threeHalves += mag[0][j] / (l * Math.sqrt(l));
            }
        } else if (activeCount == 2) {
            int m0 = m[on[0]];
            int m1 = m[on[1]];
            for (int j = 0; j < c; j++) {
                for (int n = j < m0 ? m1 : 0; n < c; n++) {
                    double l = mu2[0][j] + mu2[1][n];
                    double w = mag[0][j] * mag[1][n];
                    two += w / (l * l);
                    threeHalves += w / (l * Math.sqrt(l));
                }
            }
        } else {
            int m0 = m[on[0]];
            int m1 = m[on[1]];
            int m2 = m[on[2]];
            for (int j = 0; j < c; j++) {
                for (int n = 0; n < c; n++) {
                    int from = j < m0 && n < m1 ? m2 : 0;
                    double w0 = mag[0][j] * mag[1][n];
                    double l0 = mu2[0][j] + mu2[1][n];
                    for (int r = from; r < c; r++) {
                        double l = l0 + mu2[2][r];
                        double w = w0 * mag[2][r];
                        two += w / (l * l);
                        threeHalves += w / (l * Math.sqrt(l));
                    }
                }
            }
        }
        return new double[] {two, threeHalves};
    }

    /**
     * The least box, modes in proportion to the axes' lengths, whose truncation of values is within the
     * budget; inactive axes keep their constant mode alone. Gradients report the bound this box gives
     * them (their series converges a power of lambda^(1/2) more slowly).
     *
     * @throws OracleException past {@code cap} modes along an axis
     */
    int[] box(double valueBudget, int cap, double t) {
        return grow(cap, "values", m -> truncation(m, t)[0] <= valueBudget);
    }

    /** The least box whose truncation of gradients is within the budget (see {@link #box}). */
    int[] gradientBox(double gradientBudget, int cap, double t) {
        return grow(cap, "gradients", m -> truncation(m, t)[1] <= gradientBudget);
    }

    private int[] grow(int cap, String what, java.util.function.Predicate<int[]> enough) {
        int d = axes.length;
        int[] m = new int[d];
        if (curvatureMax == 0) {
            java.util.Arrays.fill(m, 1);
            return m;
        }
        double longest = 0;
        for (int i = 0; i < d; i++) {
            longest = Math.max(longest, axes[i].length);
        }
        for (double density = 4; ; density *= 1.25) {
            for (int i = 0; i < d; i++) {
                m[i] = active[i] ? Math.max(2, (int) Math.ceil(density * axes[i].length / longest)) : 1;
            }
            if (enough.test(m)) {
                return m;
            }
            for (int i = 0; i < d; i++) {
                if (m[i] > cap) {
                    throw new OracleException(Reason.TOO_MANY_MODES, "oracle: the " + what + " of the response to the"
                        + " common boundary level's second derivative need more than " + cap + " modes along an axis"
                        + " to reach the tolerance; loosen the tolerance or smooth the schedule");
                }
            }
        }
    }

    /**
     * Adds the particular coefficients (1_J / lambda_J) I_J(t) over box m (row-major, last axis fastest)
     * into {@code into}; returns a bound on the quadrature's share of the sum of their magnitudes.
     */
    double addParticular(double t, int[] m, double[] into) {
        int d = m.length;
        for (int i = 0; i < d; i++) {
            axes[i].ensure(m[i]);
        }
        if (curvatureMax == 0 || t == 0) {
            return 0;
        }
        ScheduleIntegral.At integrals = duhamel.at(t);
        int[] index = new int[d];
        double weightSum = 0;
        double lowest = Double.POSITIVE_INFINITY;
        for (int c = 0; c < into.length; c++) {
            int rest = c;
            for (int i = d - 1; i >= 0; i--) {
                index[i] = rest % m[i];
                rest /= m[i];
            }
            double one = 1;
            double lambda = 0;
            for (int i = 0; i < d; i++) {
                one *= one(i, index[i]);
                double mu = axes[i].mu[index[i]];
                lambda += mu * mu;
            }
            if (one == 0) {
                continue;
            }
            lambda *= alpha;
            lowest = Math.min(lowest, lambda);
            into[c] += one / lambda * integrals.value(lambda);
            weightSum += Math.abs(one) / (lambda * lambda);
        }
        return integrals.relativeError(lowest, curvatureMax) * curvatureMax * weightSum;
    }
}

package eigencheck.oracle.series;

import eigencheck.oracle.OracleException;
import eigencheck.oracle.OracleException.Reason;
import eigencheck.oracle.expr.Expression;
import java.util.function.Function;

/**
 * One term theta(t) phi(x) of the change in time of a rectangle's or box's source,
 * Q(x, t) = Q(x, 0) + sum_k theta_k(t) phi_k(x) with theta_k(0) = 0 (a heater switched on by a
 * schedule, a pulsed spot). Under homogeneous conditions and zero initial data the term's response
 * is, by one integration by parts in time of each mode's Duhamel integral,
 * <pre>
 *   u_k = theta(t) V - sum_J V_J E_J(t) X_J,   E_J(t) = int_0^t exp(-alpha lambda_J (t - s)) theta'(s) ds,
 * </pre>
 * V the steady solution of -k Laplace V = phi under those conditions (a solver of its own, certified
 * as any steady source) and V_J = phi_J / (k lambda_J) its modes. |E_J| <= min(t max|theta'|,
 * C / (alpha lambda_J)), so the series converges like |phi_J| / lambda_J^2: two powers of lambda
 * faster than the plain modal series of the forcing. E_J is Duhamel's integral by quadrature
 * ({@link ScheduleIntegral}) on the slow modes, and on the fast ones (where max|theta''''| / Lambda^4
 * is below 1e-13 of max|theta'| / Lambda) by its expansion in 1/Lambda to three terms, integrating by
 * parts again, whose remainder is at most that bound.
 *
 * <p>Bounds of phi_J: along each axis either |(f, X)| <= ||f||_1 (|X| <= 1) or, integrating by parts
 * once (X'' = -mu^2 X, |X'| <= mu), |(f, X)| <= (|f(0)| + |f(L)| + ||f'||_1) / mu; applied axis after
 * axis, |(phi, X_J)| <= N(a) prod_{i in a} mu_i^-1 for every set a of axes, N(a) a mixed seminorm (the
 * values at the corners, the L1 norms of the mixed derivatives over the edges, faces and the body).
 * Each mode takes the least over a. The L1 norms are measured on Gauss rules (256 nodes per axis in
 * a rectangle, 40 in a box) and doubled: the bound rests on the shape being smooth, as the other
 * integration-by-parts bounds of this package do, and shapes that may be non-smooth are refused.
 * Thread-safe.
 */
final class SourceSchedule {
    private static final String[] NAMES = {"x", "y", "z"};
    /** Modes per axis summed exactly in the whole-axis sums of the far tail. */
    private static final int AXIS_CUT = 4096;

    final Expression theta;
    final Expression slope;
    final double thetaMax;
    final double slopeMax;
    /** The shape phi over the body's coordinates. */
    final Expression shape;
    /** V, the steady solution of -k Laplace V = phi under the homogeneous conditions. */
    final SpatialSolver.Slice steady;
    private final ScheduleIntegral duhamel;
    private final Expression curvature;
    private final Expression third;
    private final Expression fourth;
    private final double fourthMax;
    /** Rates Lambda = alpha lambda_J from which E_J is taken by its expansion (its remainder below 1e-13 of |E|'s size). */
    private final double expandFrom;
    private final AxisModes[] axes;
    private final int d;
    private final double k;
    private final double alpha;
    /** K[c][p] of {@link #seminorms}. */
    private final double[][] seminorm;
    /** The base-3 digits of every choice (or power) index, axis 0 first. */
    private final int[][] digits;
    /** The highest level per axis: 2 in a rectangle, 1 in a box (whose mixed derivatives cost more to sample). */
    private final int top;
    /** Coefficients of phi over a box of modes: {coefficients, {error, L2 norm}}. */
    private final Function<int[], double[][]> projector;
    private Table table;

    private record Table(int[] m, double[] coef, double error) {
    }

    /**
     * @param theta the schedule over the single variable t, theta(0) = 0
     * @param shape phi over the body's coordinates (x, y[, z])
     * @param what the term's name in messages
     */
    SourceSchedule(Expression theta, double horizon, Expression shape, SpatialSolver.Slice steady, AxisModes[] axes,
                   double k, double alpha, Function<int[], double[][]> projector, String what) {
        this.theta = theta;
        this.slope = theta.derivative("t");
        double[] sizes = CommonLevel.sizes(theta, slope, slope, horizon, what);
        this.thetaMax = sizes[0];
        this.slopeMax = sizes[1];
        this.duhamel = new ScheduleIntegral(slope);
        this.curvature = slope.derivative("t");
        this.third = curvature.derivative("t");
        this.fourth = third.derivative("t");
        double m4;
        try {
            m4 = CommonLevel.sizes(curvature, third, fourth, horizon, what)[2];
        } catch (OracleException e) {
            m4 = Double.POSITIVE_INFINITY; // a schedule not smooth enough for the expansion: quadrature throughout
        }
        this.fourthMax = m4;
        this.expandFrom = slopeMax > 0 ? Math.cbrt(fourthMax / (1e-13 * slopeMax)) : Double.POSITIVE_INFINITY;
        this.shape = shape;
        this.steady = steady;
        this.axes = axes;
        this.d = axes.length;
        this.k = k;
        this.alpha = alpha;
        this.projector = projector;
        if (shape.mayBeNonSmooth()) {
            throw new OracleException(Reason.UNSUPPORTED, "source: its change in time has a part (" + what + ") that"
                + " may be non-smooth in space (abs, min, max or a step); this version bounds the modes of such a"
                + " change by integrating by parts, which needs a smooth shape: write it without them, or use a"
                + " manufactured solution");
        }
        double[] len = new double[d];
        for (int i = 0; i < d; i++) {
            len[i] = axes[i].length;
        }
        this.top = d == 2 ? 2 : 1;
        this.digits = new int[(int) Math.pow(3, d)][d];
        for (int c = 0; c < digits.length; c++) {
            unflatten(c, 3, digits[c]);
        }
        this.seminorm = seminorms(shape, len, top);
        for (int i = 0; i < d; i++) {
            axes[i].ensure(AXIS_CUT);
        }
    }

    /**
     * The per-axis pieces of level l (0, 1 or 2): {where (0, 1 an end, 2 the L1 norm over the axis),
     * derivative order, power of 1/mu}. Level 0: ||f||_1; level 1: (|f(0)| + |f(L)| + ||f'||_1) / mu;
     * level 2: (|f(0)| + |f(L)|) / mu + (|f'(0)| + |f'(L)| + ||f''||_1) / mu^2.
     */
    private static final int[][][] PIECES = {
        {{2, 0, 0}},
        {{0, 0, 1}, {1, 0, 1}, {2, 1, 1}},
        {{0, 0, 1}, {1, 0, 1}, {0, 1, 2}, {1, 1, 2}, {2, 2, 2}}};

    /**
     * K[c][p]: for every choice c of a level per axis (base 3, axis 0 slowest), the coefficient of
     * prod_i mu_i^-(p_i) (p base 3 likewise): the sum over the pieces' products of the L1 norm, over the
     * axes whose piece integrates, of the piece's mixed derivative at the pieces' ends; on Gauss rules,
     * doubled. Levels above {@code top} are left infinite.
     */
    private static double[][] seminorms(Expression f, double[] len, int top) {
        int d = len.length;
        int n = d == 2 ? 256 : 40;
        int per = n + 2;
        double[][] x = new double[d][per];
        double[][] w = new double[d][per];
        for (int i = 0; i < d; i++) {
            double[][] rule = GaussLegendre.onInterval(n, len[i]);
            x[i][0] = 0;
            x[i][1] = len[i];
            System.arraycopy(rule[0], 0, x[i], 2, n);
            System.arraycopy(rule[1], 0, w[i], 2, n);
        }
        int total = (int) Math.pow(per, d);
        int orders = (int) Math.pow(top + 1, d);
        double[][] values = new double[orders][total];
        double[] point = new double[d];
        int[] index = new int[d];
        int[] order = new int[d];
        for (int o = 0; o < orders; o++) {
            unflatten(o, top + 1, order);
            Expression e = f;
            for (int i = 0; i < d; i++) {
                for (int r = 0; r < order[i]; r++) {
                    e = e.derivative(NAMES[i]);
                }
            }
            for (int c = 0; c < total; c++) {
                unflatten(c, per, index);
                for (int i = 0; i < d; i++) {
                    point[i] = x[i][index[i]];
                }
                double v = e.value(point);
                if (!Double.isFinite(v)) {
                    throw new OracleException(Reason.DATA_NOT_FINITE, "source: the change in time (" + f.source()
                        + ") or its derivatives is " + v + " at " + java.util.Arrays.toString(point));
                }
                values[o][c] = Math.abs(v);
            }
        }
        int choices = (int) Math.pow(3, d);
        int powers = (int) Math.pow(3, d);
        double[][] out = new double[choices][powers];
        int[] level = new int[d];
        int[] piece = new int[d];
        for (int c = 0; c < choices; c++) {
            unflatten(c, 3, level);
            boolean allowed = true;
            int combos = 1;
            for (int i = 0; i < d; i++) {
                allowed &= level[i] <= top;
                combos *= PIECES[level[i]].length;
            }
            if (!allowed) {
                java.util.Arrays.fill(out[c], Double.POSITIVE_INFINITY);
                continue;
            }
            for (int combo = 0; combo < combos; combo++) {
                int rest = combo;
                int o = 0;
                int power = 0;
                for (int i = d - 1; i >= 0; i--) {
                    int count = PIECES[level[i]].length;
                    piece[i] = rest % count;
                    rest /= count;
                }
                for (int i = 0; i < d; i++) {
                    int[] pc = PIECES[level[i]][piece[i]];
                    o = o * (top + 1) + pc[1];
                    power = power * 3 + pc[2];
                }
                double[] v = values[o];
                double sum = 0;
                for (int q = 0; q < total; q++) {
                    unflatten(q, per, index);
                    double weight = 1;
                    for (int i = 0; i < d && weight != 0; i++) {
                        int where = PIECES[level[i]][piece[i]][0];
                        weight *= where < 2 ? (index[i] == where ? 1 : 0) : w[i][index[i]];
                    }
                    sum += weight * v[q];
                }
                out[c][power] += 2 * sum;
            }
        }
        return out;
    }

    private static void unflatten(int c, int per, int[] index) {
        for (int i = index.length - 1; i >= 0; i--) {
            index[i] = c % per;
            c /= per;
        }
    }

    /**
     * A bound of |phi_J| (the coefficient, divided by ||X_J||^2): the least over the choices of a level
     * per axis (level 0 alone on an axis at its constant mode) of sum_p K[c][p] prod_i mu_i^-(p_i).
     */
    double coefficientBound(int[] j) {
        return coefficientBound(j, new double[d][3]);
    }

    /** As {@link #coefficientBound(int[])}, with {@code inverse} (d x 3) as scratch: the table's loop allocates nothing. */
    private double coefficientBound(int[] j, double[][] inverse) {
        for (int i = 0; i < d; i++) {
            double mu = axes[i].mu[j[i]];
            inverse[i][0] = 1;
            inverse[i][1] = mu == 0 ? Double.POSITIVE_INFINITY : 1 / mu;
            inverse[i][2] = inverse[i][1] * inverse[i][1];
        }
        double best = Double.POSITIVE_INFINITY;
        for (int c = 0; c < seminorm.length; c++) {
            int[] level = digits[c];
            boolean allowed = true;
            for (int i = 0; i < d; i++) {
                allowed &= level[i] <= top && (level[i] == 0 || axes[i].mu[j[i]] > 0);
            }
            if (!allowed) {
                continue;
            }
            double sum = 0;
            double[] k = seminorm[c];
            for (int p = 0; p < k.length && sum < best; p++) {
                if (k[p] == 0) {
                    continue;
                }
                int[] power = digits[p];
                double term = k[p];
                for (int i = 0; i < d; i++) {
                    term *= inverse[i][power[i]];
                }
                sum += term;
            }
            best = Math.min(best, sum);
        }
        for (int i = 0; i < d; i++) {
            best /= axes[i].norm[j[i]];
        }
        return best;
    }

    /** Per-mode bounds over [0, size)^d (row-major): {@link #coefficientBound}. */
    private record Bounds(int size, double[] coefficient) {
    }

    /** The edge of the per-mode bounds' table (at most about 4.2 10^6 entries): 2048 modes per axis in a rectangle, 160 in a box. */
    private static final int[] BOUNDS_CAP = {0, 0, 2048, 160};
    private Bounds bounds;

    /** The per-mode bounds over a cube holding [0, c_i) along every axis, made once per doubling. */
    private synchronized Bounds bounds(int[] c) {
        int need = 0;
        for (int ci : c) {
            need = Math.max(need, ci);
        }
        Bounds current = bounds;
        if (current != null && current.size >= need) {
            return current;
        }
        int size = Math.min(BOUNDS_CAP[d], Math.max(need, current == null ? 64 : 2 * current.size));
        int count = (int) Math.pow(size, d);
        double[] coefficient = new double[count];
        double[][] inverse = new double[d][3];
        int[] index = new int[d];
        int[] sizes = new int[d];
        java.util.Arrays.fill(sizes, size);
        for (int i = 0; i < d; i++) {
            axes[i].ensure(size + 1);
        }
        for (int q = 0; q < count; q++) {
            TensorSolver.unflatten(q, sizes, index);
            coefficient[q] = coefficientBound(index, inverse);
        }
        bounds = new Bounds(size, coefficient);
        return bounds;
    }

    /** alpha min_i mu_(i, m_i)^2: no mode outside box m decays more slowly. */
    private double edge(int[] m) {
        double lowest = Double.POSITIVE_INFINITY;
        for (int i = 0; i < d; i++) {
            double mu = axes[i].mu[m[i]];
            lowest = Math.min(lowest, alpha * mu * mu);
        }
        return lowest;
    }

    /**
     * Bounds of the series' truncation outside box m at time t: {value, each gradient component}. A mode
     * is at most b_J e_J / (k lambda_J), b_J = {@link #coefficientBound}, e_J = min(t max|theta'|,
     * C / (alpha lambda_J)) with C the schedule's local size at the slowest rate outside m
     * ({@link CommonLevel#localSize}); its gradient sqrt(lambda_J) times that. Modes in [0, 4 m_i)^d
     * (at least 32 and at most {@link #BOUNDS_CAP} per axis, from a cached table of per-mode bounds) are
     * summed one by one; beyond, {@link #far}.
     */
    double[] truncation(int[] m, double t) {
        int[] c = new int[d];
        int count = 1;
        for (int i = 0; i < d; i++) {
            c[i] = Math.min(BOUNDS_CAP[d], Math.max(32, 4 * m[i]));
            axes[i].ensure(c[i] + 1);
            count *= c[i];
        }
        double size = CommonLevel.localSize(slope, slopeMax, t, edge(m));
        double early = t * slopeMax;
        double value = 0;
        double gradient = 0;
        Bounds b = bounds(c);
        int[] index = new int[d];
        for (int q = 0; q < count; q++) {
            TensorSolver.unflatten(q, c, index);
            boolean inside = true;
            int at = 0;
            double lambda = 0;
            for (int i = 0; i < d; i++) {
                inside &= index[i] < m[i];
                at = at * b.size + index[i];
                double mu = axes[i].mu[index[i]];
                lambda += mu * mu;
            }
            if (inside) {
                continue;
            }
            double e = Math.min(early, size / (alpha * lambda));
            double term = b.coefficient[at] * e / (k * lambda);
            value += term;
            gradient += term * Math.sqrt(lambda);
        }
        double[] beyond = far(c);
        return new double[] {value + size / (k * alpha) * beyond[0], gradient + size / (k * alpha) * beyond[1]};
    }

    /** The weights the AM-GM split of lambda may give each other axis (the least bound is taken). */
    private static final double[] SHARES = {1 / 8.0, 1 / 16.0, 1 / 32.0, 1 / 64.0, 1 / 128.0};

    /**
     * {sum b_J lambda_J^-2, sum b_J lambda_J^-(3/2)} over the modes with j_i >= c_i for some i. On the part
     * with j_i >= c_i, each other axis either at its constant mode (mu = 0, factor 1/L, not integrated
     * by parts) or above it; b_J <= N(a) prod_a mu^-1 / ||X||^2 with a the axes above their constant mode,
     * and lambda >= mu_i^(2 w0) prod_(a \ i) mu^(2 e) by weighted AM-GM (w0 = 1 - (|a| - 1) e, e one of
     * {@link #SHARES}, the least bound taken), so the sum splits into one-axis sums: beyond c_i by
     * mu_j >= j pi / L and an integral, over a whole axis exactly to 4096 modes and by the same integral
     * beyond.
     */
    private double[] far(int[] c) {
        double[] out = new double[2];
        double[] powers = {2, 1.5};
        int sets = 1 << d;
        for (int i = 0; i < d; i++) {
            double normLow = axes[i].normLowerBound(Math.min(axes[i].mu.length, AXIS_CUT));
            for (int z = 0; z < sets; z++) {
                // z: the axes held at their constant mode; only axes that have one, never i
                boolean valid = (z & (1 << i)) == 0;
                for (int q = 0; q < d && valid; q++) {
                    valid = (z & (1 << q)) == 0 || axes[q].zero;
                }
                if (!valid) {
                    continue;
                }
                int a = (sets - 1) & ~z;
                int count = Integer.bitCount(a);
                for (int pi = 0; pi < 2; pi++) {
                    double p = powers[pi];
                    double best = Double.POSITIVE_INFINITY;
                    for (double share : count == 1 ? new double[] {0} : SHARES) {
                        double w0 = 1 - (count - 1) * share;
                        double product = levelOne(a) * axisBeyond(i, normLow, 1 + 2 * p * w0, c[i]);
                        for (int q = 0; q < d; q++) {
                            if (q != i) {
                                product *= (z & (1 << q)) != 0 ? 1 / axes[q].length : whole(q, 1 + 2 * p * share);
                            }
                        }
                        best = Math.min(best, product);
                    }
                    out[pi] += best;
                }
            }
        }
        return out;
    }

    private final java.util.Map<String, Double> wholeSums = new java.util.concurrent.ConcurrentHashMap<>();

    /** sum over j >= start (1 on an axis with a constant mode, else 0) of mu_j^-r / ||X_j||^2, r > 1. */
    private double whole(int i, double r) {
        return wholeSums.computeIfAbsent(i + ":" + r, key -> {
            double sum = 0;
            for (int j = axes[i].zero ? 1 : 0; j < AXIS_CUT; j++) {
                sum += Math.pow(axes[i].mu[j], -r) / axes[i].norm[j];
            }
            return sum + axisBeyond(i, axes[i].normLowerBound(AXIS_CUT), r, AXIS_CUT);
        });
    }

    /** N(a): level 1 on the axes in the bit set a, level 0 on the others (its one power). */
    private double levelOne(int a) {
        int c = 0;
        for (int i = 0; i < d; i++) {
            c = c * 3 + ((a & (1 << i)) != 0 ? 1 : 0);
        }
        return seminorm[c][c];
    }

    /** sum_{j >= from} mu_j^-r / ||X_j||^2 <= (L/pi)^r (from - 1)^(1 - r) / ((r - 1) normLow), from >= 2. */
    private double axisBeyond(int i, double normLow, double r, int from) {
        double l = axes[i].length / Math.PI;
        return Math.pow(l, r) * Math.pow(from - 1, 1 - r) / ((r - 1) * normLow);
    }

    /**
     * The least box, modes in proportion to the axes' lengths, whose truncation at time t is within
     * {@code target} in values ({@code gradients} false) or in each gradient component.
     *
     * @throws OracleException past {@code cap} modes along an axis
     */
    int[] box(double t, double target, boolean gradients, int cap) {
        int[] m = new int[d];
        if (slopeMax == 0 || !(t > 0)) {
            java.util.Arrays.fill(m, 1);
            return m;
        }
        double longest = 0;
        for (int i = 0; i < d; i++) {
            longest = Math.max(longest, axes[i].length);
        }
        for (double density = 8; ; ) {
            boolean over = false;
            for (int i = 0; i < d; i++) {
                m[i] = Math.max(2, (int) Math.ceil(density * axes[i].length / longest));
                over |= m[i] > cap;
            }
            if (over) {
                throw new OracleException(Reason.TOO_MANY_MODES, "oracle: at t = " + t + " s the response to the"
                    + " source's change in time needs more than " + cap + " modes along an axis for its "
                    + (gradients ? "gradients" : "values") + " to reach the tolerance; loosen the tolerance or"
                    + " smooth the schedule");
            }
            double left = truncation(m, t)[gradients ? 1 : 0];
            if (left <= target) {
                return m;
            }
            // values converge about like m^-4 and gradients like m^-3 (a shape that does not vanish on the sides)
            double jump = Math.pow(left / target, gradients ? 1 / 3.0 : 1 / 4.0);
            density *= Math.max(1.25, Math.min(4, jump));
        }
    }

    /** phi's coefficients over a box at least m, projected once per growth (by half again at least). */
    private synchronized Table table(int[] m) {
        Table current = table;
        if (current != null) {
            boolean enough = true;
            for (int i = 0; i < d; i++) {
                enough &= current.m[i] >= m[i];
            }
            if (enough) {
                return current;
            }
        }
        int[] size = new int[d];
        for (int i = 0; i < d; i++) {
            int have = current == null ? 0 : current.m[i];
            size[i] = Math.max(m[i], have * 3 / 2);
            axes[i].ensure(size[i]);
        }
        double[][] p = projector.apply(size);
        table = new Table(size, p[0], p[1][0]);
        return table;
    }

    /**
     * Subtracts V_J E_J(t) over box m (row-major, last axis fastest) from {@code into}; returns a bound of
     * what the quadratures (Duhamel's integrals and the projections of phi) leave in the sum of their
     * magnitudes.
     */
    double add(double t, int[] m, double[] into) {
        if (slopeMax == 0 || !(t > 0)) {
            return 0;
        }
        Table tb = table(m);
        ScheduleIntegral.At integrals = duhamel.at(t);
        int[] index = new int[d];
        double weightSum = 0;
        double errorSum = 0;
        double expansionSum = 0;
        double lowest = Double.POSITIVE_INFINITY;
        double early = t * slopeMax;
        // E = sum_{j=1..3} (-1)^(j-1) (theta^(j)(t) - theta^(j)(0) exp(-Lambda t)) / Lambda^j + R, |R| <= M4 / Lambda^4
        double[] now = {slope.value(t), curvature.value(t), third.value(t)};
        double[] start = {slope.value(0), curvature.value(0), third.value(0)};
        double m4 = Double.isFinite(expandFrom) ? CommonLevel.localSize(fourth, fourthMax, t, expandFrom) : 0;
        for (int c = 0; c < into.length; c++) {
            TensorSolver.unflatten(c, m, index);
            double lambda = 0;
            int source = 0;
            for (int i = 0; i < d; i++) {
                double mu = axes[i].mu[index[i]];
                lambda += mu * mu;
                source = source * tb.m[i] + index[i];
            }
            double big = alpha * lambda;
            double v = tb.coef[source] / (k * lambda);
            double e;
            if (big >= expandFrom) {
                double decay = Math.exp(-big * t);
                e = (now[0] - start[0] * decay) / big - (now[1] - start[1] * decay) / (big * big)
                    + (now[2] - start[2] * decay) / (big * big * big);
                double b2 = big * big;
                expansionSum += Math.abs(v) * m4 / (b2 * b2);
            } else {
                e = integrals.value(big);
                weightSum += Math.abs(v) / big;
                lowest = Math.min(lowest, big);
            }
            into[c] -= v * e;
            errorSum += Math.min(early, slopeMax / big) / (k * lambda);
        }
        return integrals.relativeError(lowest, slopeMax) * slopeMax * weightSum + tb.error * errorSum
            + 1.01 * expansionSum;
    }
}

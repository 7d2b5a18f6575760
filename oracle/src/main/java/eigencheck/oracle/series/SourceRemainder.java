package eigencheck.oracle.series;

import eigencheck.oracle.expr.Expression;
import org.apache.commons.math3.analysis.differentiation.DerivativeStructure;

/**
 * A rectangle's source that is not a sum of one-coordinate terms, split by a blend on the sides:
 * \(Q = S + Q_r\) with \(Q_r = (I - P_x)(I - P_y) Q\), where \(P_x f = \sum_e \psi_e(x)\, B_e f\) over
 * the two ends e of the x axis, B_e the end's own condition as the modes meet it (the value on a
 * Dirichlet side, \(f' \mp (h/k) f\) on a flux or convective one) and psi_e linear with
 * \(B_{e'} \psi_e = \delta_{e e'}\); likewise P_y. An axis whose two sides are both insulated or
 * flux-driven is not blended (no linear psi meets two flux ends).
 * <ul>
 * <li>S is a sum of products of a linear function and a function of the other coordinate, whose
 * steady solutions are psi(x) beta(y) with beta a slab solution (-k Laplace(psi beta) = psi G, since
 * psi'' = 0), solved by the caller.</li>
 * <li>Q_r meets every blended end's condition, so its modal coefficients decay like \(\mu^{-3}\) or
 * faster along a blended axis; this class gives Q_r, its derivatives, and bounds of its coefficients
 * beyond those computed.</li>
 * </ul>
 *
 * <p>The bounds, per axis, for a smooth f and a mode X (|X| &lt;= 1, |X'| &lt;= mu, X'' = -mu^2 X,
 * \(B_e X = 0\)): integrating by parts twice,
 * \(\langle f, X\rangle = -[f X' - f' X]/\mu^2 + [f'' X' - f''' X]/\mu^4 + \langle f'''', X\rangle/\mu^4\),
 * so \(|\langle f, X\rangle| \le (E_1 + \|f''\|_1)/\mu^2\) (level 1) and
 * \(\le E_1/\mu^2 + E_{2D}/\mu^3 + (E_{2N} + \|f''''\|_1)/\mu^4\) (level 2), with E_1 the sum of
 * |B_e f| over the flux and convective ends (0 on a blended axis; an axis that is not blended has
 * flux ends only), E_2D of |f''| over the Dirichlet ends, E_2N of |B_e f''|
 * over the others; the constant mode (level 0) takes \(\|f\|_1\). In 2D each level of x is applied to
 * \(F(x) = \langle Q_r(x, \cdot), Y\rangle\) and each level of y to every seminorm that leaves, which
 * gives \(|\langle Q_r, X Y\rangle| \le \sum C_{\kappa\tau} \mu^{-p_\kappa} \nu^{-q_\tau}\) with C
 * mixed seminorms of Q_r (corner values, edge and area L1 norms of its derivatives); each mode takes
 * the least of the levels' bounds. The L1 norms are measured on Gauss rules and doubled: the bound rests
 * on the source being smooth (non-smooth sources are refused), as the sides' integration-by-parts
 * bound does.
 */
final class SourceRemainder {
    private static final int ORDER = 4;
    private final double[] len;
    private final double[][] hOverK;
    private final boolean[][] dirichlet;
    private final boolean[] blended;
    /** psi_e {c0, c1} (psi = c0 + c1 x) of each end of a blended axis; [axis][end], null when not blended. */
    private final double[][][] weight;
    /** The source over (x, y), and its symbolic derivatives d^(i+j) Q / dx^i dy^j for i, j <= 1. */
    private final Expression source;
    private final Expression[][] dq = new Expression[2][2];
    /** d^(ox+oy) Q at the corners, [ex][ey][ox][oy] for orders <= 1. */
    private final double[][][][] corners = new double[2][2][2][2];
    /** The end operators, [axis][end], made in the constructor (the per-point paths read them). */
    private final double[][][][] operators = new double[2][2][][];
    /** The plain derivative of each order as an operator {orders, coefficients}. */
    private static final double[][][] PLAIN = new double[ORDER + 1][][];

    static {
        for (int o = 0; o <= ORDER; o++) {
            PLAIN[o] = new double[][] {{o}, {1}};
        }
    }

    /** Per axis, the seminorm kinds and the levels built from them. */
    private final Kind[][] kinds = new Kind[2][];
    private final int[][][] levelKinds = new int[2][3][];
    private final int[][][] levelPowers = new int[2][3][];
    /** C[x kind][y kind]. */
    private final double[][] mixed;

    /**
     * A seminorm of one axis: at the listed ends (or, when {@code integral}, the L1 norm over the axis) of
     * sum_t coef_t f^(order_t).
     */
    private record Kind(boolean integral, double[] at, int[][] orders, double[][] coefs) {
    }

    /**
     * @param q the source over (x, y), W/m^3
     * @param hOverK per axis and side: h/k of a convective side, 0 of a flux side, infinity of a Dirichlet one
     */
    SourceRemainder(Expression q, double[] len, double[][] hOverK) {
        this(q, len, hOverK, null);
    }

    /**
     * As {@link #SourceRemainder(Expression, double[], double[][])} for a source the caller has checked to be
     * one product Q = f(x) g(y) ({@code factors} = {f over x, g over y}), or null.
     */
    SourceRemainder(Expression q, double[] len, double[][] hOverK, Expression[] factors) {
        this.factors = factors == null ? null : factors.clone();
        this.len = len.clone();
        this.hOverK = new double[2][2];
        this.dirichlet = new boolean[2][2];
        this.blended = new boolean[2];
        this.weight = new double[2][][];
        boolean[] pairInsulated = new boolean[2];
        for (int i = 0; i < 2; i++) {
            for (int s = 0; s < 2; s++) {
                this.hOverK[i][s] = hOverK[i][s];
                dirichlet[i][s] = hOverK[i][s] == Double.POSITIVE_INFINITY;
            }
            pairInsulated[i] = hOverK[i][0] == 0 && hOverK[i][1] == 0;
            for (int s = 0; s < 2; s++) {
                operators[i][s] = dirichlet[i][s] ? new double[][] {{0}, {1}}
                    : new double[][] {{1, 0}, {1, (s == 0 ? -1 : 1) * hOverK[i][s]}};
            }
        }
        for (int i = 0; i < 2; i++) {
            blended[i] = !pairInsulated[i];
            if (blended[i]) {
                weight[i] = blendWeights(i);
            }
        }
        this.source = q;
        dq[0][0] = q;
        dq[0][1] = q.derivative("y");
        dq[1][0] = q.derivative("x");
        dq[1][1] = dq[1][0].derivative("y");
        for (int ex = 0; ex < 2; ex++) {
            for (int ey = 0; ey < 2; ey++) {
                for (int ox = 0; ox < 2; ox++) {
                    for (int oy = 0; oy < 2; oy++) {
                        corners[ex][ey][ox][oy] = dq[ox][oy].value(ex == 0 ? 0 : len[0], ey == 0 ? 0 : len[1]);
                    }
                }
            }
        }
        for (int i = 0; i < 2; i++) {
            buildKinds(i);
        }
        mixed = mixedSeminorms();
    }

    /** Q as f(x) g(y), when it is one product (the partials then come from two 1D expansions), or null. */
    private final Expression[] factors;

    /** The factors' derivatives 0..4 by coordinate (the tables revisit each grid line many times). */
    @SuppressWarnings("unchecked")
    private final java.util.Map<Double, double[]>[] factorCache = new java.util.Map[] {
        new java.util.concurrent.ConcurrentHashMap<Double, double[]>(),
        new java.util.concurrent.ConcurrentHashMap<Double, double[]>()};

    private static double[] expansion(Expression f, double at) {
        DerivativeStructure v = f.value(new DerivativeStructure(1, ORDER, 0, at));
        double[] out = new double[ORDER + 1];
        for (int o = 0; o <= ORDER; o++) {
            out[o] = v.getPartialDerivative(o);
        }
        return out;
    }

    /** d^(a+b) Q / dx^a dy^b at (x, y) for a, b <= 4, by forward automatic differentiation of order 8. */
    private double[][] partials(double x, double y) {
        if (factors != null) {
            double[] fx = factorCache[0].computeIfAbsent(x, v -> expansion(factors[0], v));
            double[] gy = factorCache[1].computeIfAbsent(y, v -> expansion(factors[1], v));
            double[][] out = new double[ORDER + 1][ORDER + 1];
            for (int a = 0; a <= ORDER; a++) {
                for (int b = 0; b <= ORDER; b++) {
                    out[a][b] = fx[a] * gy[b];
                }
            }
            return out;
        }
        DerivativeStructure dx = new DerivativeStructure(2, 2 * ORDER, 0, x);
        DerivativeStructure dy = new DerivativeStructure(2, 2 * ORDER, 1, y);
        DerivativeStructure v = source.value(dx, dy);
        double[][] out = new double[ORDER + 1][ORDER + 1];
        for (int a = 0; a <= ORDER; a++) {
            for (int b = 0; b <= ORDER; b++) {
                out[a][b] = v.getPartialDerivative(a, b);
            }
        }
        return out;
    }

    /**
     * The source's derivatives where the blend reads them: ix (iy) -1 at the point's own coordinate, else
     * at that end of the axis; derivative orders ox, oy.
     */
    private interface Lookup {
        double at(int ix, int iy, int ox, int oy);
    }

    private record Point(double x, double y) {
    }

    /** Whether an axis carries the blend. */
    boolean blended(int axis) {
        return blended[axis];
    }

    /** The end operator of an axis's end as {orders, coefficients}: f, or f' -+ (h/k) f (shared, not to be changed). */
    private double[][] endOperator(int axis, int end) {
        return operators[axis][end];
    }

    /** psi_0 and psi_1 of a blended axis: the columns of the inverse of [B_e applied to (1, x)]. */
    private double[][] blendWeights(int axis) {
        double[][] m = new double[2][2];
        for (int e = 0; e < 2; e++) {
            double[][] op = endOperator(axis, e);
            double at = e == 0 ? 0 : len[axis];
            for (int t = 0; t < op[0].length; t++) {
                if (op[0][t] == 0) {
                    m[e][0] += op[1][t];
                    m[e][1] += op[1][t] * at;
                } else {
                    m[e][1] += op[1][t];
                }
            }
        }
        double det = m[0][0] * m[1][1] - m[0][1] * m[1][0];
        // inverse columns: psi_e = (c0, c1) with m psi_e = unit vector e
        return new double[][] {{m[1][1] / det, -m[1][0] / det}, {-m[0][1] / det, m[0][0] / det}};
    }

    /** psi_e of an end of a blended axis as {c0, c1}; null when the axis is not blended. */
    double[] weight(int axis, int end) {
        return blended[axis] ? weight[axis][end].clone() : null;
    }

    /** B_e of an end as {orders, coefficients} (orders of the derivative along the axis). */
    double[][] operator(int axis, int end) {
        return endOperator(axis, end);
    }

    /** The source Q over (x, y). */
    Expression sourceExpression() {
        return source;
    }

    /** d^(a+b) Q / dx^a dy^b over (x, y), a, b <= 1. */
    Expression sourceDerivative(int a, int b) {
        return dq[a][b];
    }

    /**
     * Q_r as a sampler for many points: the source once per point, its values on the sides normal to y
     * kept while x stays the same (tensor rules run y fastest), the corners once.
     */
    Sampler sampler() {
        return new Sampler();
    }

    /** Q_r at points, with what depends on x alone kept between calls. Not for several threads. */
    final class Sampler implements Lookup {
        private double lastX = Double.NaN;
        private double own;
        private final double[][][] yEnds = new double[2][2][2];
        private final double[][][] xEnds = new double[2][2][2];

        double value(double x, double y) {
            if (factors != null) {
                return factoredValue(x, y);
            }
            if (blended[1] && x != lastX) {
                for (int e = 0; e < 2; e++) {
                    for (int ox = 0; ox < 2; ox++) {
                        for (int oy = 0; oy < 2; oy++) {
                            boolean needed = ox == 0 && (oy == 0 || !dirichlet[1][e]);
                            yEnds[e][ox][oy] = needed ? dq[ox][oy].value(x, e == 0 ? 0 : len[1]) : 0;
                        }
                    }
                }
                lastX = x;
            }
            if (blended[0]) {
                for (int e = 0; e < 2; e++) {
                    for (int ox = 0; ox < 2; ox++) {
                        xEnds[e][ox][0] = dirichlet[0][e] && ox == 1 ? 0 : dq[ox][0].value(e == 0 ? 0 : len[0], y);
                    }
                }
            }
            own = source.value(x, y);
            return derivative(0, 0, x, y, this);
        }

        /**
         * The same for Q = f(x) g(y): every value the operator reads is a product of the factors' cached 1D
         * expansions (a tensor Gauss grid revisits each x and y many times), not a 2D evaluation.
         */
        private double factoredValue(double x, double y) {
            double[] fx = factorCache[0].computeIfAbsent(x, v -> expansion(factors[0], v));
            double[] gy = factorCache[1].computeIfAbsent(y, v -> expansion(factors[1], v));
            if (blended[1] && x != lastX) {
                for (int e = 0; e < 2; e++) {
                    double[] end = factorCache[1].computeIfAbsent(e == 0 ? 0.0 : len[1], v -> expansion(factors[1], v));
                    for (int ox = 0; ox < 2; ox++) {
                        for (int oy = 0; oy < 2; oy++) {
                            boolean needed = ox == 0 && (oy == 0 || !dirichlet[1][e]);
                            yEnds[e][ox][oy] = needed ? fx[ox] * end[oy] : 0;
                        }
                    }
                }
                lastX = x;
            }
            if (blended[0]) {
                for (int e = 0; e < 2; e++) {
                    double[] end = factorCache[0].computeIfAbsent(e == 0 ? 0.0 : len[0], v -> expansion(factors[0], v));
                    for (int ox = 0; ox < 2; ox++) {
                        xEnds[e][ox][0] = dirichlet[0][e] && ox == 1 ? 0 : end[ox] * gy[0];
                    }
                }
            }
            own = fx[0] * gy[0];
            return derivative(0, 0, x, y, this);
        }

        @Override
        public double at(int ix, int iy, int ox, int oy) {
            return ix < 0 && iy < 0 ? own : ix < 0 ? yEnds[iy][ox][oy] : iy < 0 ? xEnds[ix][ox][oy] : corners[ix][iy][ox][oy];
        }
    }

    /** Q_r at one point. */
    double value(double x, double y) {
        return new Sampler().value(x, y);
    }

    /** d^(a+b) Q_r / dx^a dy^b at (x, y): (I - P_x)(I - P_y) applied to Q, differentiated. */
    private double derivative(int a, int b, double x, double y, Lookup q) {
        double total = 0;
        for (int ix = -1; ix < 2; ix++) {
            double fx;
            double xi;
            double[][] opx;
            if (ix < 0) {
                fx = 1;
                xi = x;
                opx = PLAIN[a];
            } else {
                if (!blended[0] || a >= 2) {
                    continue;
                }
                double[] w = weight[0][ix];
                fx = -(a == 0 ? w[0] + w[1] * x : w[1]);
                xi = ix == 0 ? 0 : len[0];
                opx = endOperator(0, ix);
            }
            for (int iy = -1; iy < 2; iy++) {
                double fy;
                double yi;
                double[][] opy;
                if (iy < 0) {
                    fy = 1;
                    yi = y;
                    opy = PLAIN[b];
                } else {
                    if (!blended[1] || b >= 2) {
                        continue;
                    }
                    double[] w = weight[1][iy];
                    fy = -(b == 0 ? w[0] + w[1] * y : w[1]);
                    yi = iy == 0 ? 0 : len[1];
                    opy = endOperator(1, iy);
                }
                double f = fx * fy;
                if (f == 0) {
                    continue;
                }
                for (int tx = 0; tx < opx[0].length; tx++) {
                    for (int ty = 0; ty < opy[0].length; ty++) {
                        double c = opx[1][tx] * opy[1][ty];
                        if (c != 0) {
                            total += f * c * q.at(ix, iy, (int) opx[0][tx], (int) opy[0][ty]);
                        }
                    }
                }
            }
        }
        return total;
    }

    /**
     * The seminorm kinds of an axis and its levels: level 0 (the constant mode) ||f||_1; level 1
     * (E_1 + ||f''||_1) / mu^2; level 2 E_1 / mu^2 + E_2D / mu^3 + (E_2N + ||f''''||_1) / mu^4.
     */
    private void buildKinds(int axis) {
        java.util.List<Kind> list = new java.util.ArrayList<>();
        double l = len[axis];
        list.add(new Kind(true, null, new int[][] {{0}}, new double[][] {{1}}));  // 0: ||f||_1
        list.add(new Kind(true, null, new int[][] {{2}}, new double[][] {{1}}));  // 1: ||f''||_1
        list.add(new Kind(true, null, new int[][] {{4}}, new double[][] {{1}}));  // 2: ||f''''||_1
        java.util.List<Double> dEnds = new java.util.ArrayList<>();
        java.util.List<Integer> nEnds = new java.util.ArrayList<>();
        for (int e = 0; e < 2; e++) {
            if (dirichlet[axis][e]) {
                dEnds.add(e == 0 ? 0 : l);
            } else {
                nEnds.add(e);
            }
        }
        int e1 = -1;
        int e2d = -1;
        int e2n = -1;
        if (!nEnds.isEmpty()) {
            double[] at = new double[nEnds.size()];
            int[][] o1 = new int[nEnds.size()][];
            double[][] c1 = new double[nEnds.size()][];
            int[][] o2 = new int[nEnds.size()][];
            double[][] c2 = new double[nEnds.size()][];
            for (int n = 0; n < nEnds.size(); n++) {
                int e = nEnds.get(n);
                at[n] = e == 0 ? 0 : l;
                double s = (e == 0 ? -1 : 1) * hOverK[axis][e];
                o1[n] = new int[] {1, 0};
                c1[n] = new double[] {1, s};
                o2[n] = new int[] {3, 2};
                c2[n] = new double[] {1, s};
            }
            if (!blended[axis]) {
                e1 = list.size();
                list.add(new Kind(false, at, o1, c1));
            }
            e2n = list.size();
            list.add(new Kind(false, at, o2, c2));
        }
        if (!dEnds.isEmpty()) {
            double[] at = new double[dEnds.size()];
            int[][] o = new int[dEnds.size()][];
            double[][] c = new double[dEnds.size()][];
            for (int n = 0; n < at.length; n++) {
                at[n] = dEnds.get(n);
                o[n] = new int[] {2};
                c[n] = new double[] {1};
            }
            e2d = list.size();
            list.add(new Kind(false, at, o, c));
        }
        kinds[axis] = list.toArray(Kind[]::new);
        levelKinds[axis][0] = new int[] {0};
        levelPowers[axis][0] = new int[] {0};
        levelKinds[axis][1] = e1 >= 0 ? new int[] {1, e1} : new int[] {1};
        levelPowers[axis][1] = e1 >= 0 ? new int[] {2, 2} : new int[] {2};
        java.util.List<int[]> two = new java.util.ArrayList<>();
        if (e1 >= 0) {
            two.add(new int[] {e1, 2});
        }
        if (e2d >= 0) {
            two.add(new int[] {e2d, 3});
        }
        if (e2n >= 0) {
            two.add(new int[] {e2n, 4});
        }
        two.add(new int[] {2, 4});
        levelKinds[axis][2] = two.stream().mapToInt(v -> v[0]).toArray();
        levelPowers[axis][2] = two.stream().mapToInt(v -> v[1]).toArray();
    }

    /**
     * Every mixed seminorm of Q_r, C[x kind][y kind]: the x kind applied to the y kind, its L1 norms on
     * Gauss rules (2048 nodes along a side, 192 x 192 over the body) and doubled. The derivatives come
     * from forward automatic differentiation, once per point.
     */
    private double[][] mixedSeminorms() {
        // shared among the rows' tasks: a point's derivatives may be computed twice, never differently
        java.util.Map<Point, double[][]> memo = new java.util.concurrent.ConcurrentHashMap<>();
        double[][] c = new double[kinds[0].length][kinds[1].length];
        for (int a = 0; a < kinds[0].length; a++) {
            for (int b = 0; b < kinds[1].length; b++) {
                double v = mixedSeminorm(kinds[0][a], kinds[1][b], memo);
                c[a][b] = Double.isFinite(v) ? v : Double.POSITIVE_INFINITY;
            }
        }
        return c;
    }

    private double mixedSeminorm(Kind kx, Kind ky, java.util.Map<Point, double[][]> memo) {
        int n1 = 2048;
        int n2 = 192;
        double total = 0;
        if (!kx.integral() && !ky.integral()) {
            for (int a = 0; a < kx.at().length; a++) {
                for (int b = 0; b < ky.at().length; b++) {
                    total += Math.abs(combination(kx, a, ky, b, kx.at()[a], ky.at()[b], memo));
                }
            }
        } else if (!kx.integral()) {
            double[][] r = GaussLegendre.onInterval(n1, len[1]);
            for (int a = 0; a < kx.at().length; a++) {
                int end = a;
                total += 2 * sumOf(n1, q -> r[1][q] * Math.abs(combination(kx, end, ky, 0, kx.at()[end], r[0][q], memo)));
            }
        } else if (!ky.integral()) {
            double[][] r = GaussLegendre.onInterval(n1, len[0]);
            for (int b = 0; b < ky.at().length; b++) {
                int end = b;
                total += 2 * sumOf(n1, q -> r[1][q] * Math.abs(combination(kx, 0, ky, end, r[0][q], ky.at()[end], memo)));
            }
        } else {
            double[][] rx = GaussLegendre.onInterval(n2, len[0]);
            double[][] ry = GaussLegendre.onInterval(n2, len[1]);
            total = 2 * sumOf(n2, i -> {
                double row = 0;
                for (int j = 0; j < n2; j++) {
                    row += ry[1][j] * Math.abs(combination(kx, 0, ky, 0, rx[0][i], ry[0][j], memo));
                }
                return rx[1][i] * row;
            });
        }
        return total;
    }

    /**
     * sum_i term(i) for i = 0..count-1, the terms computed among the cores (each is an expression's
     * derivatives of order 8 at some points, the bulk of a remainder's set-up) and added in index order.
     */
    private static double sumOf(int count, java.util.function.IntToDoubleFunction term) {
        double[] terms = new double[count];
        java.util.stream.IntStream.range(0, count).parallel().forEach(i -> terms[i] = term.applyAsDouble(i));
        double sum = 0;
        for (double t : terms) {
            sum += t;
        }
        return sum;
    }

    private double combination(Kind kx, int a, Kind ky, int b, double x, double y, java.util.Map<Point, double[][]> memo) {
        Lookup q = (ix, iy, ox, oy) -> {
            double px = ix < 0 ? x : ix == 0 ? 0 : len[0];
            double py = iy < 0 ? y : iy == 0 ? 0 : len[1];
            Point key = new Point(px, py);
            double[][] p = memo.get(key);
            if (p == null) {
                p = partials(px, py);
                memo.putIfAbsent(key, p);
            }
            return p[ox][oy];
        };
        double total = 0;
        int[] ox = kx.orders()[a];
        double[] cx = kx.coefs()[a];
        int[] oy = ky.orders()[b];
        double[] cy = ky.coefs()[b];
        for (int i = 0; i < ox.length; i++) {
            for (int j = 0; j < oy.length; j++) {
                double c = cx[i] * cy[j];
                if (c != 0) {
                    total += c * derivative(ox[i], oy[j], x, y, q);
                }
            }
        }
        return total;
    }

    /**
     * A bound of |<Q_r, X_m Y_n>| for eigenvalues mu = mu_m, nu = nu_n: the least over the levels of the
     * two axes (level 0 exactly where a mode is the constant one).
     */
    double coefficientBound(double mu, double nu) {
        double[][] wx = {{1}, {1 / mu}, {Math.pow(mu, -2)}, {Math.pow(mu, -3)}, {Math.pow(mu, -4)}};
        double[][] wy = {{1}, {1 / nu}, {Math.pow(nu, -2)}, {Math.pow(nu, -3)}, {Math.pow(nu, -4)}};
        return coefficientBound(mu == 0, nu == 0, wx, 0, wy, 0);
    }

    /** mu_j^-p for p = 0..4 (row p), j < r. */
    private static double[][] powers(AxisModes modes, int r) {
        double[][] w = new double[5][r];
        for (int j = 0; j < r; j++) {
            double inverse = modes.mu[j] == 0 ? 0 : 1 / modes.mu[j];
            w[0][j] = 1;
            w[1][j] = inverse;
            w[2][j] = inverse * inverse;
            w[3][j] = w[2][j] * inverse;
            w[4][j] = w[2][j] * w[2][j];
        }
        return w;
    }

    private double coefficientBound(boolean zeroX, boolean zeroY, double[][] wx, int a, double[][] wy, int b) {
        double best = Double.POSITIVE_INFINITY;
        for (int lx = zeroX ? 0 : 1; lx <= (zeroX ? 0 : 2); lx++) {
            for (int ly = zeroY ? 0 : 1; ly <= (zeroY ? 0 : 2); ly++) {
                int[] kx = levelKinds[0][lx];
                int[] px = levelPowers[0][lx];
                int[] ky = levelKinds[1][ly];
                int[] py = levelPowers[1][ly];
                double total = 0;
                for (int i = 0; i < kx.length; i++) {
                    double x = wx[px[i]][a];
                    for (int j = 0; j < ky.length; j++) {
                        total += mixed[kx[i]][ky[j]] * x * wy[py[j]][b];
                    }
                }
                best = Math.min(best, total);
            }
        }
        return best;
    }

    /**
     * Bounds {value, gradient} of what the remainder's series W = sum Q_r,J X_J / (k lambda_J) leaves out
     * beyond modes 0..m-1 per axis: the coefficient bounds over the norms' lower bound, summed mode by mode
     * up to 4m per axis, and beyond that by the fixed levels whose closed-form sums are least (lambda >=
     * mu^2 where mu is the far index, 2 mu nu for the other gradient component, mu_j >= j pi/L and
     * sum_{j >= r} j^-s <= (r - 1)^(1 - s)/(s - 1)).
     */
    double[] tails(AxisModes[] axes, int m, double k) {
        int r = 4 * m;
        axes[0].ensure(r);
        axes[1].ensure(r);
        double norms = axes[0].normLowerBound(r) * axes[1].normLowerBound(r);
        double[][] wx = powers(axes[0], r);
        double[][] wy = powers(axes[1], r);
        // (4m)^2 bounds: the rows among the cores, added in row order
        double[][] rowsOf = new double[r][2];
        java.util.stream.IntStream.range(0, r).parallel().forEach(a -> {
            double mu = axes[0].mu[a];
            double v = 0;
            double g = 0;
            for (int b = a < m ? m : 0; b < r; b++) {
                double nu = axes[1].mu[b];
                double c = coefficientBound(mu == 0, nu == 0, wx, a, wy, b) / (k * (mu * mu + nu * nu));
                v += c;
                g += c * (mu + nu);
            }
            rowsOf[a][0] = v;
            rowsOf[a][1] = g;
        });
        double value = 0;
        double gradient = 0;
        for (double[] row : rowsOf) {
            value += row[0];
            gradient += row[1];
        }
        double[] far = farTails(axes, r);
        return new double[] {(value + far[0]) / norms, (gradient + far[1]) / norms};
    }

    /** The part beyond r per axis (either index >= r), unnormalised: {value, gradient}. */
    private double[] farTails(AxisModes[] axes, int r) {
        double[] best = {Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY};
        for (int a = 1; a <= 2; a++) {
            for (int b = 1; b <= 2; b++) {
                double[] t = farTails(axes, r, a, b);
                best[0] = Math.min(best[0], t[0]);
                best[1] = Math.min(best[1], t[1]);
            }
        }
        return best;
    }

    private double[] farTails(AxisModes[] axes, int r, int levelX, int levelY) {
        double value = 0;
        double gradient = 0;
        // region A: x index >= r, every y index (lambda >= mu^2; for d/dy, lambda >= 2 mu nu)
        for (int pass = 0; pass < 2; pass++) {
            int far = pass == 0 ? 0 : 1;
            int near = 1 - far;
            int lf = far == 0 ? levelX : levelY;
            int ln = near == 0 ? levelX : levelY;
            int[] kf = levelKinds[far][lf];
            int[] pf = levelPowers[far][lf];
            int[] kn = levelKinds[near][ln];
            int[] pn = levelPowers[near][ln];
            boolean zeroNear = axes[near].zero;
            for (int i = 0; i < kf.length; i++) {
                double farValue = farSum(far, r, pf[i] + 2);
                double farGradient = farSum(far, r, pf[i] + 1);
                double farCross = farSum(far, r, pf[i] + 1) / 2;
                for (int j = 0; j < kn.length; j++) {
                    double c = far == 0 ? mixed[kf[i]][kn[j]] : mixed[kn[j]][kf[i]];
                    // pass 0: every near index; pass 1: near indices below r only (the rest is in pass 0)
                    double nearSum = nearSum(axes[near], near, pass == 0 ? -1 : r, pn[j]);
                    value += c * farValue * nearSum;
                    gradient += c * (farGradient + farCross) * nearSum;
                }
                if (zeroNear) {
                    int[] k0 = levelKinds[near][0];
                    double c = far == 0 ? mixed[kf[i]][k0[0]] : mixed[k0[0]][kf[i]];
                    value += c * farValue;
                    gradient += c * farGradient;
                }
            }
        }
        return new double[] {value, gradient};
    }

    /** sum over j >= r of mu_j^-s <= (L/pi)^s (r - 1)^(1 - s)/(s - 1), s > 1. */
    private double farSum(int axis, int r, int s) {
        double c = len[axis] / Math.PI;
        return Math.pow(c, s) * Math.pow(r - 1, 1 - s) / (s - 1);
    }

    /**
     * sum of mu_j^-s over the non-constant modes: over all of them when {@code below} < 0 (those below r
     * computed, the rest by {@link #farSum}, which needs s > 1), else over j < below only.
     */
    private double nearSum(AxisModes modes, int axis, int below, int s) {
        int computed = modes.mu.length;
        int upTo = below < 0 ? computed : below;
        double sum = 0;
        for (int j = 0; j < upTo; j++) {
            double mu = modes.mu[j];
            if (mu > 0) {
                sum += Math.pow(mu, -s);
            }
        }
        if (below < 0) {
            sum += s > 1 ? farSum(axis, computed, s) : Double.POSITIVE_INFINITY;
        }
        return sum;
    }

}

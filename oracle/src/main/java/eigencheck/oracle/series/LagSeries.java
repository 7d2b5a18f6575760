package eigencheck.oracle.series;

import eigencheck.oracle.Evaluation;
import eigencheck.oracle.OracleException;
import eigencheck.oracle.OracleException.Reason;

/**
 * P, the solution of -alpha Laplace P = 1 on a rectangle under homogeneous Dirichlet, Neumann or
 * Robin conditions, as one series along an axis: P = sum_j 1_j X_j(x) p_j(y) with
 * p_j = 1_j / (alpha mu_j^2) f_j(y), f_j = 1 + A e^{-mu_j y} + B e^{-mu_j (L - y)} meeting the
 * other axis's conditions (a quadratic for the constant mode of a Neumann-Neumann axis). By the
 * maximum principle 0 <= f_j <= 1, so the tail after M modes is at most
 * sum_{j >= M} |1_j| / (alpha mu_j^2) <= (2 / (N alpha)) (L/pi)^3 / (2 (M - 1)^2) everywhere,
 * on the sides included: what the moving level needs at points on convective sides, where the face
 * series of P's source part cannot reach. Values only (the tangential derivative's series converges
 * like 1/M there). Thread-safe.
 */
final class LagSeries {
    /** Modes beyond this are refused. */
    static final int MAX_MODES = 1 << 17;
    private static final double EPS = Math.ulp(1.0);

    private final double alpha;
    private final AxisModes[] axes;
    // for each axis as the profile's axis: {a0, b0, a1, b1} of a0 f + b0 f' = 0 at 0 and a1 f + b1 f' = 0 at L
    private final double[][] conditions = new double[2][];

    /**
     * @param axes the rectangle's two axes, under the homogeneous conditions
     * @param hOverK h/k per axis and side: +infinity for Dirichlet, 0 for Neumann
     */
    LagSeries(AxisModes[] axes, double alpha, double[][] hOverK) {
        this.axes = axes;
        this.alpha = alpha;
        for (int i = 0; i < 2; i++) {
            conditions[i] = new double[4];
            for (int s = 0; s < 2; s++) {
                double hk = hOverK[i][s];
                double a;
                double b;
                if (hk == Double.POSITIVE_INFINITY) {
                    a = 1;
                    b = 0;
                } else {
                    // at 0 the outward normal is -y: f' = H f; at L: f' = -H f
                    a = s == 0 ? -hk : hk;
                    b = 1;
                }
                conditions[i][2 * s] = a;
                conditions[i][2 * s + 1] = b;
            }
        }
    }

    /**
     * P at the point, expanded along the axis whose sides are farther from it (relative to its
     * length), to within {@code budget}.
     *
     * @throws OracleException (TOO_MANY_MODES) if that needs more than {@link #MAX_MODES} modes
     */
    Evaluation value(double[] p, int o, double budget) {
        double[] rel = new double[2];
        for (int i = 0; i < 2; i++) {
            double x = p[o + i];
            rel[i] = Math.min(x, axes[i].length - x) / axes[i].length;
        }
        // both expansions hold everywhere with the same bound; the profile across the axis the point is
        // near is evaluated where its exponentials are largest, which keeps the sum's rounding small
        return value(p, o, budget, rel[0] >= rel[1] ? 0 : 1);
    }

    /** As {@link #value(double[], int, double)}, with the modes along {@code along} (0: x, 1: y). */
    Evaluation value(double[] p, int o, double budget, int along) {
        int across = 1 - along;
        AxisModes ax = axes[along];
        double normLow = ax.normLowerBound(Math.min(ax.mu.length, 64));
        double l = ax.length / Math.PI;
        int m = 1 + (int) Math.ceil(Math.sqrt(2 / (normLow * alpha) * l * l * l / (2 * budget)));
        if (m > MAX_MODES) {
            throw new OracleException(Reason.TOO_MANY_MODES, "oracle: the lag of a moving level at "
                + java.util.Arrays.toString(new double[] {p[o], p[o + 1]}) + " needs more than " + MAX_MODES
                + " modes to reach the tolerance; loosen the tolerance");
        }
        ax.ensure(m);
        double x = p[o + along];
        double y = p[o + across];
        double len = axes[across].length;
        double[] bc = conditions[across];
        double sum = 0;
        double magnitude = 0;
        for (int j = 0; j < m; j++) {
            double mu = ax.mu[j];
            double one = ax.integral(j) / ax.norm[j];
            double term;
            if (mu == 0) {
                term = one * quadratic(bc, len, y) / alpha * Math.sin(ax.phase[j]);
            } else {
                term = one / (alpha * mu * mu) * profile(bc, len, mu, y) * Math.sin(mu * x + ax.phase[j]);
            }
            sum += term;
            magnitude += Math.abs(term);
        }
        double tail = 2 / (normLow * alpha) * l * l * l / (2.0 * (m - 1) * (m - 1));
        return new Evaluation(sum, tail + 16 * EPS * magnitude);
    }

    /**
     * P and its gradient at a point, from the expansion with its smooth part in closed form: with the
     * modes along axis a (the one whose sides the point is nearer, relative to the lengths) and the
     * profiles across axis c,
     * <pre>
     *   P = q(x_a) + sum_j (1_j / (alpha mu_j^2)) X_j(x_a) (A_j e^{-mu_j x_c} + B_j e^{-mu_j (L_c - x_c)}),
     * </pre>
     * q the one-dimensional solution of -alpha q'' = 1 under axis a's conditions (= sum_j 1_j X_j/(alpha
     * mu_j^2)), so what is summed decays like exp(-mu_j d), d the point's distance from axis c's sides.
     * |A_j|, |B_j| <= 1.01 (checked on every mode summed; |A| = H/(H + mu) and 1/(1 + e^{-mu L}) to
     * leading order), |1_j| <= 2/(mu_j N) and mu_j >= j pi / L_a bound the tail by a geometric sum, and
     * also, whatever d, by the value's algebraic tail. An axis a with insulated sides (Neumann-Neumann)
     * leaves the constant mode alone: P is then the closed-form quadratic across.
     *
     * @param gradient null, or room for {dP/dx, dP/dy}, whose common bound is returned in {@code bounds[1]}
     * @param bounds {value bound, gradient bound}
     * @throws OracleException (TOO_MANY_MODES) if the budget needs more than {@link #MAX_MODES} modes
     */
    double evaluate(double[] p, int o, double budget, double[] gradient, double[] bounds) {
        double[] rel = new double[2];
        double[] dist = new double[2];
        for (int i = 0; i < 2; i++) {
            double x = p[o + i];
            dist[i] = Math.min(x, axes[i].length - x);
            rel[i] = dist[i] / axes[i].length;
        }
        int along = rel[0] <= rel[1] ? 0 : 1;
        int across = 1 - along;
        AxisModes ax = axes[along];
        double xa = p[o + along];
        double xc = p[o + across];
        double lc = axes[across].length;
        if (ax.zero) {
            // 1 projects on the constant mode alone: P = q across, exactly
            double value = quadratic(conditions[across], lc, xc) / alpha;
            if (gradient != null) {
                gradient[along] = 0;
                gradient[across] = quadraticSlope(conditions[across], lc, xc) / alpha;
            }
            bounds[0] = 8 * EPS * Math.abs(value) + 8 * EPS * lc * lc / alpha;
            bounds[1] = 8 * EPS * lc / alpha;
            return value;
        }
        double normLow = ax.normLowerBound(Math.min(ax.mu.length, 64));
        double l = ax.length / Math.PI;
        double[] tails = new double[2];
        int m = modes(across, xc, lc - xc, normLow, l, budget, gradient == null ? Double.NaN : budget / lc, tails);
        if (m < 0) {
            throw new OracleException(Reason.TOO_MANY_MODES, "oracle: the lag of a moving level at "
                + java.util.Arrays.toString(new double[] {p[o], p[o + 1]}) + " needs more than " + MAX_MODES
                + " modes to reach the tolerance" + (gradient != null ? " in its gradient" : "")
                + "; loosen the tolerance or move the point away from the corner");
        }
        double valueTail = tails[0];
        double gradientTail = tails[1];
        ax.ensure(m);
        double[] bc = conditions[across];
        double[] ab = new double[2];
        double[] bcAlong = conditions[along];
        double value = quadratic(bcAlong, ax.length, xa) / alpha;
        double slopeAlong = quadraticSlope(bcAlong, ax.length, xa) / alpha;
        double slopeAcross = 0;
        double magnitude = Math.abs(value);
        double gMagnitude = Math.abs(slopeAlong);
        double e = 0;
        for (int j = 0; j < m; j++) {
            double mu = ax.mu[j];
            double w = ax.integral(j) / ax.norm[j] / (alpha * mu * mu);
            coefficients(bc, lc, mu, ab);
            if (Math.abs(ab[0]) > coefficientBound(across, 0, mu) || Math.abs(ab[1]) > coefficientBound(across, 1, mu)) {
                throw new OracleException(Reason.NOT_CERTIFIED, "oracle: the lag's profile coefficients " + ab[0] + ", "
                    + ab[1] + " of mode " + j + " exceed what its tail bound assumes");
            }
            double near = Math.exp(-mu * xc);
            double far = Math.exp(-mu * (lc - xc));
            double arg = mu * xa + ax.phase[j];
            double shape = ab[0] * near + ab[1] * far;
            double term = w * shape * Math.sin(arg);
            value += term;
            magnitude += Math.abs(term);
            if (gradient != null) {
                double ta = w * shape * mu * Math.cos(arg);
                double tc = w * mu * (-ab[0] * near + ab[1] * far) * Math.sin(arg);
                slopeAlong += ta;
                slopeAcross += tc;
                gMagnitude += Math.abs(ta) + Math.abs(tc);
            }
        }
        if (gradient != null) {
            gradient[along] = slopeAlong;
            gradient[across] = slopeAcross;
        }
        bounds[0] = valueTail + 16 * EPS * magnitude + 8 * EPS * ax.length * ax.length / alpha;
        bounds[1] = gradientTail + 16 * EPS * gMagnitude + 8 * EPS * ax.length / alpha;
        return value;
    }

    /**
     * The exact mean of P over the cell lo < x < hi from the split form of {@link #evaluate}: the
     * quadratic's mean in closed form, each mode's mean along (as the rectangle's cell means) and the
     * exponentials' means across, (e^{-mu c0} - e^{-mu c1}) / (mu (c1 - c0)); the tail is the value's at the
     * cell's points nearest the sides, which bounds every mean over the cell.
     */
    Evaluation average(double[] lo, double[] hi, double budget) {
        double[] rel = new double[2];
        for (int i = 0; i < 2; i++) {
            rel[i] = Math.min(lo[i], axes[i].length - hi[i]) / axes[i].length;
        }
        int along = rel[0] <= rel[1] ? 0 : 1;
        int across = 1 - along;
        AxisModes ax = axes[along];
        double lc = axes[across].length;
        double c0 = lo[across];
        double c1 = hi[across];
        double a0 = lo[along];
        double a1 = hi[along];
        if (ax.zero) {
            double mean = quadraticMean(conditions[across], lc, c0, c1) / alpha;
            return new Evaluation(mean, 8 * EPS * Math.abs(mean) + 8 * EPS * lc * lc / alpha);
        }
        double normLow = ax.normLowerBound(Math.min(ax.mu.length, 64));
        double l = ax.length / Math.PI;
        double[] tails = new double[2];
        int m = modes(across, c0, lc - c1, normLow, l, budget, Double.NaN, tails);
        if (m < 0) {
            throw new OracleException(Reason.TOO_MANY_MODES, "oracle: the lag of a moving level over the cell "
                + java.util.Arrays.toString(lo) + " - " + java.util.Arrays.toString(hi) + " needs more than "
                + MAX_MODES + " modes; loosen the tolerance");
        }
        double tail = tails[0];
        ax.ensure(m);
        double[] bc = conditions[across];
        double[] ab = new double[2];
        double value = quadraticMean(conditions[along], ax.length, a0, a1) / alpha;
        double magnitude = Math.abs(value);
        double width = c1 - c0;
        for (int j = 0; j < m; j++) {
            double mu = ax.mu[j];
            double w = ax.integral(j) / ax.norm[j] / (alpha * mu * mu);
            coefficients(bc, lc, mu, ab);
            double near = (Math.exp(-mu * c0) - Math.exp(-mu * c1)) / (mu * width);
            double far = (Math.exp(-mu * (lc - c1)) - Math.exp(-mu * (lc - c0))) / (mu * width);
            double term = w * (ab[0] * near + ab[1] * far) * TensorSolver.meanOfMode(mu, ax.phase[j], a0, a1);
            value += term;
            magnitude += Math.abs(term);
        }
        return new Evaluation(value, tail + 16 * EPS * magnitude + 8 * EPS * ax.length * ax.length / alpha);
    }

    /**
     * The least number of modes whose tails, at distances d0 and d1 from the profile axis's sides, are
     * within the value budget and (unless NaN) the gradient budget; the tails into {@code tails}, or -1
     * past {@link #MAX_MODES}.
     */
    private int modes(int across, double d0, double d1, double normLow, double l, double valueBudget,
                      double gradientBudget, double[] tails) {
        for (int m = 2; m <= MAX_MODES; m = m < 64 ? m + 8 : m + m / 4) {
            tails[0] = sideTail(m, 3, across, 0, d0, normLow, l) + sideTail(m, 3, across, 1, d1, normLow, l);
            tails[1] = sideTail(m, 2, across, 0, d0, normLow, l) + sideTail(m, 2, across, 1, d1, normLow, l);
            if (tails[0] <= valueBudget && (Double.isNaN(gradientBudget) || tails[1] <= gradientBudget)) {
                return m;
            }
        }
        return -1;
    }

    /** The mean of {@link #quadratic} over a < y < b. */
    static double quadraticMean(double[] bc, double len, double a, double b) {
        double[] q = quadraticTerms(bc, len);
        return -(a * a + a * b + b * b) / 6 + q[0] * (a + b) / 2 + q[1];
    }

    /**
     * A bound of sum_{j >= m} (|1_j| / (alpha mu_j^2)) mu_j^(3 - p) |C_j| e^{-mu_j d}, C = A (side 0 of the
     * profile's axis, d = x_c) or B (side 1, d = L_c - x_c), with |1_j| <= 2/(mu_j N) and mu_j >= j pi / L:
     * |C| <= 1.01 at a Dirichlet side, <= 1.01 H / mu at a convective one (|A| = H/(H + mu) to leading
     * order), <= 2.02 e^{-mu L_c} at an insulated one. The terms g(j) decrease, so the sum is at most
     * g(m) + int_m^infinity g, and there e^{-mu d} <= e^{-m pi d / L}. (p = 3 for values, 2 for each
     * gradient component, which gains one mu.)
     */
    /** The bound of |A| (side 0) or |B| (side 1) at mu that {@link #sideTail} assumes. */
    private double coefficientBound(int axis, int side, double mu) {
        double a = conditions[axis][2 * side];
        double b = conditions[axis][2 * side + 1];
        if (b == 0) {
            return 1.01;
        }
        if (a == 0) {
            return Math.max(2.02 * Math.exp(-mu * axes[axis].length), 1e-300);
        }
        return 1.01 * Math.abs(a) / mu;
    }

    private double sideTail(int m, int p, int axis, int side, double d, double normLow, double l) {
        double a = conditions[axis][2 * side];
        double b = conditions[axis][2 * side + 1];
        int q = 0;
        double c = 1.01;
        double distance = d;
        if (b == 0) {
            q = 0; // Dirichlet
        } else if (a == 0) {
            distance += axes[axis].length; // insulated: e^{-mu L_c} more
            c = 2.02;
        } else {
            q = 1; // convective: H / mu, H = |a|
            c = 1.01 * Math.abs(a) * l;
        }
        double power = p + q;
        double constant = 2 / (normLow * alpha) * Math.pow(l, p) * c;
        double decay = Math.exp(-m * distance / l);
        return constant * decay * (Math.pow(m, -power) + Math.pow(m, 1 - power) / (power - 1));
    }

    /** {A, B} of the profile f = 1 + A e^{-mu y} + B e^{-mu (L - y)} (see {@link #profile}). */
    static double[] coefficients(double[] bc, double len, double mu) {
        double[] ab = new double[2];
        coefficients(bc, len, mu, ab);
        return ab;
    }

    /** As {@link #coefficients(double[], double, double)}, into {@code ab} (no allocation in the mode loops). */
    static void coefficients(double[] bc, double len, double mu, double[] ab) {
        double a0 = bc[0];
        double b0 = bc[1];
        double a1 = bc[2];
        double b1 = bc[3];
        double e = Math.exp(-mu * len);
        // A (a0 - b0 mu) + B e (a0 + b0 mu) = -a0;  A e (a1 - b1 mu) + B (a1 + b1 mu) = -a1
        double p11 = a0 - b0 * mu;
        double p12 = e * (a0 + b0 * mu);
        double p21 = e * (a1 - b1 * mu);
        double p22 = a1 + b1 * mu;
        double det = p11 * p22 - p12 * p21;
        ab[0] = (-a0 * p22 + a1 * p12) / det;
        ab[1] = (-a1 * p11 + a0 * p21) / det;
    }

    /** q' for {@link #quadratic}. */
    static double quadraticSlope(double[] bc, double len, double y) {
        return -y + quadraticTerms(bc, len)[0];
    }

    /** f = 1 + A e^{-mu y} + B e^{-mu (L - y)} under a0 f + b0 f' = 0 at 0 and a1 f + b1 f' = 0 at L. */
    static double profile(double[] bc, double len, double mu, double y) {
        double[] ab = coefficients(bc, len, mu);
        return 1 + ab[0] * Math.exp(-mu * y) + ab[1] * Math.exp(-mu * (len - y));
    }

    /** q = -y^2/2 + a y + b, q'' = -1, under the same conditions: alpha p_0 for the constant mode. */
    static double quadratic(double[] bc, double len, double y) {
        double[] q = quadraticTerms(bc, len);
        return -y * y / 2 + q[0] * y + q[1];
    }

    /** {a, b} of {@link #quadratic}: a0 b + b0 a = 0 and a1 b + (a1 L + b1) a = a1 L^2 / 2 + b1 L. */
    private static double[] quadraticTerms(double[] bc, double len) {
        double a0 = bc[0];
        double b0 = bc[1];
        double a1 = bc[2];
        double b1 = bc[3];
        double det = a0 * (a1 * len + b1) - b0 * a1;
        double rhs = a1 * len * len / 2 + b1 * len;
        return new double[] {a0 * rhs / det, -b0 * rhs / det};
    }
}

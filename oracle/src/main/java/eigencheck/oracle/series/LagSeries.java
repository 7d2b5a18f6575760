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

    /** f = 1 + A e^{-mu y} + B e^{-mu (L - y)} under a0 f + b0 f' = 0 at 0 and a1 f + b1 f' = 0 at L. */
    static double profile(double[] bc, double len, double mu, double y) {
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
        double a = (-a0 * p22 + a1 * p12) / det;
        double b = (-a1 * p11 + a0 * p21) / det;
        return 1 + a * Math.exp(-mu * y) + b * Math.exp(-mu * (len - y));
    }

    /** q = -y^2/2 + a y + b, q'' = -1, under the same conditions: alpha p_0 for the constant mode. */
    static double quadratic(double[] bc, double len, double y) {
        double a0 = bc[0];
        double b0 = bc[1];
        double a1 = bc[2];
        double b1 = bc[3];
        // a0 b + b0 a = 0;  a1 b + (a1 L + b1) a = a1 L^2 / 2 + b1 L
        double det = a0 * (a1 * len + b1) - b0 * a1;
        double rhs = a1 * len * len / 2 + b1 * len;
        double a = a0 * rhs / det;
        double b = -b0 * rhs / det;
        return -y * y / 2 + a * y + b;
    }
}

package eigencheck.oracle.modes;

import java.util.Arrays;

/**
 * Eigenpairs of \(-X'' = \mu^2 X\) on 0 < x < L with homogeneous conditions
 * \(X'(0) = H_0 X(0)\) and \(X'(L) = -H_L X(L)\); H = 0 is Neumann, H = +infinity Dirichlet,
 * 0 < H < infinity Robin with H = h/k (1/m).
 *
 * <p>Every mode is written \(X_n(x) = \sin(\mu_n x + \varphi_0(\mu_n))\) with
 * \(\varphi(\mu) = \operatorname{atan2}(\mu, H) \in [0, \pi/2]\), which satisfies the condition at
 * x = 0 for any \(\mu\); the condition at x = L then reads
 * \(G(\mu) = \mu L + \varphi_0(\mu) + \varphi_L(\mu) = m\pi\). G is strictly increasing
 * (\(G' = L + H_0/(H_0^2+\mu^2) + H_L/(H_L^2+\mu^2) \ge L\)), so the n-th root lies in
 * \([(n-1)\pi/L, n\pi/L]\) and is found by safeguarded Newton iteration on that bracket, in the
 * offset variable \(y = \mu L - (n-1)\pi\) and the complementary phases \(\operatorname{atan2}(HL, \mu L)\)
 * so that no terms of size \(\pi\) cancel; no tangent is evaluated, so Biot numbers from 1e-6 to 1e6
 * and beyond are equally safe. Neumann at both faces
 * has \(\mu_n = n\pi/L\) and the zero mode X_0 = 1, handled apart.
 * For a symmetric plane wall of half-thickness L convecting at x = ±L, the roots are those of
 * \(\zeta\tan\zeta = \mathrm{Bi}\) (Neumann at the centre, Robin at the surface): Carslaw and
 * Jaeger, <i>Conduction of Heat in Solids</i>, 2nd ed., Oxford, 1959, section 3.10.
 *
 * <p>Normalisation in closed form:
 * \(\|X_n\|^2 = \int_0^L X_n^2 = L/2 - \cos(\mu L + 2\varphi_0)\sin(\mu L)/(2\mu)\).
 *
 * @since 0.1
 */
public final class SlabModes {
    private final double length;
    private final double left;
    private final double right;
    private double[] mu = new double[0];
    private double[] phase = new double[0];
    private double[] normSquared = new double[0];

    /**
     * @param length L (m)
     * @param leftH H_0 = h/k at x = 0 (0 Neumann, +infinity Dirichlet)
     * @param rightH H_L at x = L
     */
    public SlabModes(double length, double leftH, double rightH) {
        if (!(length > 0 && length < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("length " + length + " must be finite and > 0");
        }
        if (!(leftH >= 0) || !(rightH >= 0 || (leftH == Double.POSITIVE_INFINITY && rightH * length > -1))) {
            throw new IllegalArgumentException("H = h/k must be >= 0 (0 Neumann, infinity Dirichlet), or at x = L"
                + " in (-1/L, 0) with Dirichlet at x = 0");
        }
        this.length = length;
        this.left = leftH;
        this.right = rightH;
    }

    /** True for Neumann at both faces: the constant X_0 = 1 is a mode with eigenvalue 0. */
    public boolean hasZeroMode() {
        return left == 0 && right == 0;
    }

    /**
     * True when \(\mu_n = (n - \delta)\pi/L\) with a constant phase (no Robin face), so that the
     * modes obey the angle-addition recurrence in n.
     */
    public boolean isUniform() {
        return isClosedForm(left) && isClosedForm(right);
    }

    private static boolean isClosedForm(double h) {
        return h == 0 || h == Double.POSITIVE_INFINITY;
    }

    /** Length L. */
    public double length() {
        return length;
    }

    /** \(\mu_n\) (1/m), n >= 1. */
    public synchronized double mu(int n) {
        ensure(n);
        return mu[n - 1];
    }

    /** Phase \(\varphi_0(\mu_n)\) of \(X_n = \sin(\mu_n x + \varphi_0)\). */
    public synchronized double phase(int n) {
        ensure(n);
        return phase[n - 1];
    }

    /** \(\|X_n\|^2 = \int_0^L X_n^2\,dx\) (m). */
    public synchronized double normSquared(int n) {
        ensure(n);
        return normSquared[n - 1];
    }

    /** Copies of the first n roots, phases and norms: index i holds mode i+1. */
    public synchronized double[][] first(int n) {
        ensure(n);
        return new double[][] {Arrays.copyOf(mu, n), Arrays.copyOf(phase, n), Arrays.copyOf(normSquared, n)};
    }

    private void ensure(int n) {
        if (n < 1) {
            throw new IllegalArgumentException("mode index " + n + " must be >= 1");
        }
        if (n <= mu.length) {
            return;
        }
        int size = Math.max(n, 2 * mu.length);
        double[] m = Arrays.copyOf(mu, size);
        double[] p = Arrays.copyOf(phase, size);
        double[] q = Arrays.copyOf(normSquared, size);
        for (int i = mu.length; i < size; i++) {
            double z = root(i + 1, left * length, right * length);
            double muI = z / length;
            m[i] = muI;
            p[i] = Math.atan2(muI, left);
            if (p[i] == 0 && z < 0.5) {
                // sin modes with a small first root: L/2 - sin(2z)/(4 mu) = (L/2)(1 - sin(2z)/(2z)) by its series
                q[i] = 0.5 * length * RadialModes.sincComplement(2 * z);
            } else {
                q[i] = 0.5 * length - Math.cos(z + 2 * p[i]) * Math.sin(z) / (2 * muI);
            }
        }
        mu = m;
        phase = p;
        normSquared = q;
    }

    /**
     * The n-th positive root z = mu L of \(z + \operatorname{atan2}(z, B_0) + \operatorname{atan2}(z, B_L) =
     * m\pi\), with Biot numbers B = H L (0 Neumann, +infinity Dirichlet), bracketed in
     * [(n-1) pi, n pi] (Neumann-Neumann: z = n pi).
     *
     * @throws IllegalArgumentException if {@code n < 1} or a Biot number is negative or NaN
     */
    public static double root(int n, double biotLeft, double biotRight) {
        if (n < 1) {
            throw new IllegalArgumentException("mode index " + n + " must be >= 1");
        }
        if (!(biotLeft >= 0) || !(biotRight > -1)) {
            throw new IllegalArgumentException("Biot numbers must be >= 0 (at x = L above -1 with Dirichlet at"
                + " x = 0), got " + biotLeft + ", " + biotRight);
        }
        if (biotLeft == 0 && biotRight == 0) {
            return n * Math.PI;
        }
        boolean closedLeft = isClosedForm(biotLeft);
        boolean closedRight = isClosedForm(biotRight);
        if (closedLeft && closedRight) {
            // D-D: n pi; D-N or N-D: (n - 1/2) pi
            return (biotLeft == 0 || biotRight == 0) ? (n - 0.5) * Math.PI : n * Math.PI;
        }
        // Unknown y = z - (n-1) pi in [0, pi]; with psi(z) = atan2(B, z) = pi/2 - phi(z) the condition
        // reads y = psi_0(z) + psi_L(z): no pi-sized terms cancel, so small roots keep full relative
        // accuracy (z ~ sqrt(2 Bi) for tiny Biot numbers).
        double offset = (n - 1) * Math.PI;
        double lo = 0;
        double hi = Math.PI;
        if (biotRight < 0) {
            // Dirichlet at x = 0 and -1 < B < 0 (the sphere's w = r u at Bi = 1 + B < 1): G falls from
            // G(0) = 0 to its minimum at z* = sqrt(-B - B^2), then rises; the root of the first mode lies
            // beyond z*, and every later bracket is monotone already
            if (!(biotLeft == Double.POSITIVE_INFINITY && biotRight > -1)) {
                throw new IllegalArgumentException("a negative Biot number " + biotRight + " needs Dirichlet at x = 0"
                    + " and B > -1");
            }
            if (n == 1) {
                return firstRootNegative(-biotRight);
            }
        }
        double y = 0.5 * (lo + hi);
        for (int iteration = 0; iteration < 200; iteration++) {
            double z = offset + y;
            double g = y - Math.atan2(biotLeft, z) - Math.atan2(biotRight, z);
            if (g > 0) {
                hi = y;
            } else if (g < 0) {
                lo = y;
            } else {
                return z;
            }
            double dg = 1 + derivativeOfPhase(z, biotLeft) + derivativeOfPhase(z, biotRight);
            double next = y - g / dg;
            if (!(next > lo && next < hi)) {
                next = 0.5 * (lo + hi);
            }
            if (Math.abs(next - y) <= 2 * Math.ulp(y) || hi - lo <= 2 * Math.ulp(hi)) {
                return offset + next;
            }
            y = next;
        }
        return offset + y;
    }

    /**
     * First root for Dirichlet at 0 and B = -c, 0 < c < 1: z = atan(z/c), written without cancellation
     * as h(z) = (a - atan a) - z (1 - c)/c = 0 with a = z/c (the sphere's 1 - z cot z = Bi with
     * Bi = 1 - c; for small Bi, z ~ sqrt(3 Bi)), the bracket running from the minimum of h,
     * z* = sqrt(c - c^2), to pi.
     */
    private static double firstRootNegative(double c) {
        double beta = 1 - c;
        double lo = Math.sqrt(c - c * c);
        double hi = Math.PI;
        double z = Math.max(lo, Math.min(Math.sqrt(3 * beta), 0.5 * (lo + hi)));
        for (int iteration = 0; iteration < 200; iteration++) {
            double a = z / c;
            double aMinusAtan;
            if (a < 0.5) {
                // a - atan a = sum_{k>=1} (-1)^(k+1) a^(2k+1)/(2k+1)
                double sum = 0;
                double power = a;
                for (int k = 1; k < 30; k++) {
                    power *= a * a;
                    sum += ((k & 1) == 1 ? 1 : -1) * power / (2 * k + 1);
                }
                aMinusAtan = sum;
            } else {
                aMinusAtan = a - Math.atan(a);
            }
            double h = aMinusAtan - z * beta / c;
            if (h > 0) {
                hi = z;
            } else if (h < 0) {
                lo = z;
            } else {
                return z;
            }
            double dh = (a * a / (1 + a * a) - beta) / c;
            double next = dh > 0 ? z - h / dh : Double.NaN;
            if (!(next > lo && next < hi)) {
                next = 0.5 * (lo + hi);
            }
            if (Math.abs(next - z) <= 2 * Math.ulp(z) || hi - lo <= 2 * Math.ulp(hi)) {
                return next;
            }
            z = next;
        }
        return z;
    }

    private static double derivativeOfPhase(double z, double biot) {
        if (biot == Double.POSITIVE_INFINITY || biot == 0) {
            return 0;
        }
        if (biot < 0) {
            return biot / (biot * biot + z * z);
        }
        // d/dz atan2(z, B) = B/(B^2 + z^2), written to avoid overflow for large B
        double r = z / biot;
        return 1 / (biot * (1 + r * r));
    }

    /**
     * Root \(\zeta_n\) of \(\zeta\tan\zeta = \mathrm{Bi}\) in \(((n-1)\pi, (n-\tfrac12)\pi)\): the plane
     * wall of half-thickness L convecting at both faces, modes \(\cos(\zeta_n x/L)\).
     *
     * @param biot Bi = hL/k, L the half-thickness
     * @throws IllegalArgumentException if {@code n < 1} or {@code biot} is not finite and > 0
     */
    public static double planeWallRoot(int n, double biot) {
        if (!(biot > 0 && biot < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("Bi = " + biot + " must be finite and > 0");
        }
        return root(n, 0, biot);
    }
}

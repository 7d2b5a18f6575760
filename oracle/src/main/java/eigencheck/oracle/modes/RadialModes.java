package eigencheck.oracle.modes;

import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.apache.commons.math3.special.BesselJ;

/**
 * Radial eigenpairs of the solid cylinder (modes \(J_0(\mu r)\), weight r) and the solid sphere
 * (modes \(\sin(\mu r)/(\mu r)\), weight r^2) of radius R, regular at r = 0, with a Dirichlet,
 * Neumann or Robin surface; eigenvalues \(\mu_n^2\), \(z_n = \mu_n R\).
 *
 * <p>Eigenconditions, Bi = hR/k (Incropera et al., <i>Fundamentals of Heat and Mass Transfer</i>,
 * 6th ed., Wiley, 2007, eqs. 5.50c and 5.52c; Carslaw and Jaeger, <i>Conduction of Heat in Solids</i>,
 * 2nd ed., Oxford, 1959, sections 7.4 and 9.3):
 * cylinder \(z J_1(z) = \mathrm{Bi}\,J_0(z)\) (Dirichlet: \(J_0(z) = 0\); Neumann: \(J_1(z) = 0\) and
 * the zero mode); sphere \(1 - z\cot z = \mathrm{Bi}\), written \((1-\mathrm{Bi})\sin z = z\cos z\)
 * (Dirichlet: \(z = n\pi\); Neumann: \(\tan z = z\) and the zero mode). The n-th cylinder root lies
 * between \(j_{1,n-1}\) (\(j_{1,0} = 0\)) and \(j_{0,n}\); the n-th sphere root in \(((n-1)\pi, n\pi)\).
 * Roots by Commons Math's Brent solver on those brackets; zeros of J0 and J1 from McMahon's
 * expansion refined by Newton's method (Abramowitz and Stegun, <i>Handbook of Mathematical
 * Functions</i>, 1964, 9.5.12). For the sphere near z = 0 the difference \(\sin z/z - \cos z\) is
 * summed as its series, so tiny Biot numbers keep their accuracy.
 *
 * <p>Normalisation in closed form: cylinder \(\int_0^R J_0^2(\mu r) r\,dr = \tfrac{R^2}{2}(J_0^2(z) +
 * J_1^2(z))\), \(\int_0^R J_0(\mu r) r\,dr = R J_1(z)/\mu\); sphere \(\int_0^R X^2 r^2 dr =
 * (R/2 - \sin 2z/(4\mu))/\mu^2\), \(\int_0^R X r^2 dr = (\sin z - z\cos z)/\mu^3\).
 *
 * <p>The cylinder's and (for a flux surface or a small Biot number) the sphere's series in
 * {@code RadialSolver} use these modes.
 *
 * @since 0.1
 */
public final class RadialModes {
    /** Which body. */
    public enum Shape { CYLINDER, SPHERE }

    private RadialModes() {
    }

    /**
     * The n-th positive zero of J_order, order 0 or 1.
     *
     * @throws IllegalArgumentException if {@code n < 1} or the order is not 0 or 1
     */
    public static double besselZero(int order, int n) {
        if (n < 1 || (order != 0 && order != 1)) {
            throw new IllegalArgumentException("zero " + n + " of J" + order + ": n >= 1 and order 0 or 1");
        }
        double beta = (n + 0.5 * order - 0.25) * Math.PI;
        double m = 4.0 * order * order;
        double z = beta - (m - 1) / (8 * beta) - 4 * (m - 1) * (7 * m - 31) / (3 * Math.pow(8 * beta, 3));
        for (int i = 0; i < 50; i++) {
            double f = bessel(order, z);
            // d/dz J0 = -J1; d/dz J1 = J0 - J1/z
            double df = order == 0 ? -bessel(1, z) : bessel(0, z) - bessel(1, z) / z;
            double step = f / df;
            z -= step;
            if (Math.abs(step) <= 2 * Math.ulp(z)) {
                break;
            }
        }
        return z;
    }

    /**
     * Root z_n (n >= 1) of the shape's eigencondition for the Biot number (0 Neumann, +infinity
     * Dirichlet); Neumann's zero mode is not counted.
     *
     * @throws IllegalArgumentException if {@code n < 1} or {@code biot} is negative or NaN
     */
    public static double root(Shape shape, int n, double biot) {
        if (n < 1 || !(biot >= 0)) {
            throw new IllegalArgumentException("root " + n + " at Bi = " + biot + ": n >= 1 and Bi >= 0");
        }
        BrentSolver brent = new BrentSolver(1e-15, 1e-16);
        if (shape == Shape.CYLINDER) {
            if (biot == Double.POSITIVE_INFINITY) {
                return besselZero(0, n);
            }
            if (biot == 0) {
                return besselZero(1, n);
            }
            double lo = n == 1 ? 0 : besselZero(1, n - 1);
            double hi = besselZero(0, n);
            return brent.solve(1000, z -> z * bessel(1, z) - biot * bessel(0, z), lo, hi);
        }
        if (biot == Double.POSITIVE_INFINITY) {
            return n * Math.PI;
        }
        // Neumann (Bi = 0): the n-th positive root of tan z = z lies in (n pi, (n + 1/2) pi)
        double lo = biot == 0 ? n * Math.PI + 1e-9 : (n - 1) * Math.PI;
        double hi = biot == 0 ? (n + 0.5) * Math.PI - 1e-9 : n * Math.PI;
        if (n == 1 && biot > 0) {
            lo = Math.min(1e-3, 0.01 * Math.sqrt(3 * biot));
        }
        return brent.solve(1000, z -> sphere(z, biot), lo, hi);
    }

    /**
     * J_order(x), order 0 or 1: Commons Math's BesselJ below x = 5000, the large-argument (Hankel)
     * expansion beyond, whose first neglected term is below 1e-19 there (Abramowitz and Stegun 9.2.5,
     * 9.2.9, 9.2.10). Commons Math refuses x above 10000, which mode 3184 of a cylinder reaches.
     */
    static double bessel(int order, double x) {
        if (x < 5000) {
            return BesselJ.value(order, x);
        }
        double mu = 4.0 * order * order;
        double y = 8 * x;
        double p = 1 - (mu - 1) * (mu - 9) / (2 * y * y) + (mu - 1) * (mu - 9) * (mu - 25) * (mu - 49) / (24 * y * y * y * y);
        double q = (mu - 1) / y - (mu - 1) * (mu - 9) * (mu - 25) / (6 * y * y * y);
        double chi = x - (0.5 * order + 0.25) * Math.PI;
        return Math.sqrt(2 / (Math.PI * x)) * (p * Math.cos(chi) - q * Math.sin(chi));
    }

    /** (sin z/z - cos z) - Bi sin z/z: zero at the sphere roots, accurate for small z. */
    private static double sphere(double z, double biot) {
        return sincMinusCos(z) - biot * Math.sin(z) / z;
    }

    /**
     * sin(z)/z - cos(z), by its series sum_{k>=1} (-1)^(k+1) 2k z^(2k)/(2k+1)! below z = 0.5, where the
     * difference would cancel (z sincMinusCos(z) = sin z - z cos z, the sphere mode's weighted integral).
     */
    public static double sincMinusCos(double z) {
        if (z < 0.5) {
            double term = 1;
            double sum = 0;
            double z2 = z * z;
            double factorial = 1; // (2k+1)!
            for (int k = 1; k < 12; k++) {
                term *= z2;
                factorial *= (2 * k) * (2 * k + 1);
                sum += ((k & 1) == 1 ? 1 : -1) * 2 * k * term / factorial;
            }
            return sum;
        }
        return Math.sin(z) / z - Math.cos(z);
    }

    /** The mode X_n(r) for z_n = mu R (finite at r = 0: J0(0) = 1, sin(x)/x -> 1). */
    public static double mode(Shape shape, double mu, double r) {
        double x = mu * r;
        if (shape == Shape.CYLINDER) {
            return bessel(0, x);
        }
        return x < 1e-4 ? 1 - x * x / 6 : Math.sin(x) / x;
    }

    /** \(\int_0^R X^2 w(r)\,dr\), w = r (cylinder) or r^2 (sphere), in closed form. */
    public static double normSquared(Shape shape, double radius, double mu) {
        double z = mu * radius;
        if (shape == Shape.CYLINDER) {
            double j0 = bessel(0, z);
            double j1 = bessel(1, z);
            return 0.5 * radius * radius * (j0 * j0 + j1 * j1);
        }
        // R/2 - sin(2z)/(4 mu) = (R/2)(1 - sin(2z)/(2z)), a series where it would cancel
        double w = 2 * z;
        double oneMinusSinc = w < 0.5 ? sincComplement(w) : 1 - Math.sin(w) / w;
        return 0.5 * radius * oneMinusSinc / (mu * mu);
    }

    /** 1 - sin(w)/w = sum_{k>=1} (-1)^(k+1) w^(2k)/(2k+1)! for small w (below 0.5). */
    static double sincComplement(double w) {
        double sum = 0;
        double term = 1;
        double factorial = 1;
        for (int k = 1; k < 12; k++) {
            term *= w * w;
            factorial *= (2 * k) * (2 * k + 1);
            sum += ((k & 1) == 1 ? 1 : -1) * term / factorial;
        }
        return sum;
    }

    /** \(\int_0^R X w(r)\,dr\): the projection of a uniform value, in closed form. */
    public static double weightIntegral(Shape shape, double radius, double mu) {
        double z = mu * radius;
        if (shape == Shape.CYLINDER) {
            return radius * bessel(1, z) / mu;
        }
        // sin z - z cos z = z (sin z/z - cos z), a series where it would cancel
        return z * sphere(z, 0) / (mu * mu * mu);
    }

    /**
     * The one-term coefficient C_1 of a body at a uniform initial value cooled by convection: the
     * first mode's share of the constant, \(\int X_1 w / \int X_1^2 w\); cylinder
     * \(2J_1/(z(J_0^2+J_1^2))\), sphere \(4(\sin z - z\cos z)/(2z - \sin 2z)\) (Incropera 2007, Table 5.1).
     */
    public static double oneTermCoefficient(Shape shape, double biot) {
        double z = root(shape, 1, biot);
        return weightIntegral(shape, 1, z) / normSquared(shape, 1, z);
    }
}

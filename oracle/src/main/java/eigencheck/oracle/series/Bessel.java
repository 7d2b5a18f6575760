package eigencheck.oracle.series;

import org.apache.commons.math3.special.BesselJ;

/**
 * Fast J0 and J1 for the cylinder's inner loops: Chebyshev interpolants of Commons Math's
 * {@link BesselJ} on unit panels of [0, 25] (degree 20, below 1e-15 absolute: the Taylor coefficients
 * of J0 and J1 over half a unit are under 0.5^n/n!), and Hankel's asymptotic expansion beyond 25
 * (Abramowitz and Stegun, <i>Handbook of Mathematical Functions</i>, 1964, 9.2.5 to 9.2.10), whose
 * truncation error there is below 1e-17. Checked against BesselJ in BesselTest.
 */
final class Bessel {
    private static final int PANELS = 25;
    private static final int DEGREE = 21;
    private static final double[][][] TABLE = new double[2][PANELS][];

    static {
        for (int order = 0; order < 2; order++) {
            for (int p = 0; p < PANELS; p++) {
                int o = order;
                TABLE[order][p] = Chebyshev.interpolate(x -> BesselJ.value(o, x), p, p + 1.0, DEGREE);
            }
        }
    }

    private Bessel() {
    }

    /** J0(x), x >= 0. */
    static double j0(double x) {
        return value(0, x);
    }

    /** J1(x), x >= 0. */
    static double j1(double x) {
        return value(1, x);
    }

    private static double value(int order, double x) {
        if (x < PANELS) {
            int p = (int) x;
            return Chebyshev.value(TABLE[order][p], 2 * (x - p) - 1);
        }
        // J_n(x) = sqrt(2/(pi x)) (P cos chi - Q sin chi), chi = x - (n/2 + 1/4) pi
        double m = 4.0 * order * order;
        double p = 1;
        double q = 0;
        double term = 1;
        double z = 8 * x;
        for (int k = 1; k <= 24; k++) {
            double odd = 2 * k - 1;
            term *= (m - odd * odd) / (k * z);
            if ((k & 1) == 1) {
                q += ((k / 2) % 2 == 0 ? 1 : -1) * term;
            } else {
                p += ((k / 2) % 2 == 0 ? 1 : -1) * term;
            }
            if (Math.abs(term) < 1e-18) {
                break;
            }
        }
        double chi = x - (0.5 * order + 0.25) * Math.PI;
        return Math.sqrt(2 / (Math.PI * x)) * (p * Math.cos(chi) - q * Math.sin(chi));
    }
}

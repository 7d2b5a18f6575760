package eigencheck.oracle.modes;

import static eigencheck.oracle.testing.NumericAssertions.assertClose;

import eigencheck.oracle.modes.RadialModes.Shape;
import org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator;
import org.apache.commons.math3.special.BesselJ;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;

class RadialModesTest {
    /**
     * sin z - z cos z = int_0^z x sin x dx, by Commons Math's Gauss-Legendre integrator on an integrand
     * that does not cancel (a general-purpose library): the series must keep full relative accuracy at small z,
     * where the difference of sin z and z cos z loses digits like eps/z^2 (a sphere that keeps its heat).
     */
    @ParameterizedTest
    @ValueSource(doubles = {1e-4, 3e-3, 0.05, 0.3, 0.49, 0.51, 2, 7})
    void sphereModeIntegralKeepsItsDigitsAtSmallArguments(double z) {
        IterativeLegendreGaussIntegrator quad = new IterativeLegendreGaussIntegrator(32, 1e-15, 1e-300);
        double exact = quad.integrate(100_000, x -> x * Math.sin(x), 0, z);
        assertClose(exact, z * RadialModes.sincMinusCos(z), 4e-15 * Math.abs(exact), "sin z - z cos z at z = " + z);
    }

    @Test
    void zerosOfJ0AndJ1MatchAbramowitzStegunTable9_5() {
        // Abramowitz and Stegun 1964, Table 9.5 (recalled from memory, 16 digits); tolerance 1e-12
        double[] j0 = {2.404825557695773, 5.520078110286311, 8.653727912911012, 11.79153443901428, 14.93091770848779};
        double[] j1 = {3.831705970207512, 7.015586669815619, 10.17346813506272, 13.32369193631422, 16.47063005087763};
        for (int n = 1; n <= 5; n++) {
            assertClose(j0[n - 1], RadialModes.besselZero(0, n), 1e-12, "j_0," + n);
            assertClose(j1[n - 1], RadialModes.besselZero(1, n), 1e-12, "j_1," + n);
        }
    }

    @Test
    void largeArgumentBesselAgreesWithCommonsMathWhereBothApplyAndRootsGoPastIt() {
        // Commons Math's BesselJ (valid to x = 10000) is the reference between 5000 and 10000
        for (double x = 5000; x < 9999; x += 7.31) {
            for (int order = 0; order <= 1; order++) {
                // the reduction of x - pi/4 in double costs about 1e-15 near x = 5000
                assertClose(BesselJ.value(order, x), RadialModes.bessel(order, x), 1e-14, "J" + order + "(" + x + ")");
            }
        }
        // zeros past 10000: McMahon's expansion (Abramowitz and Stegun 9.5.12) to its first neglected term
        int n = 4000;
        double beta = (n - 0.25) * Math.PI;
        double mcMahon = beta + 1 / (8 * beta) - 124 / (3 * Math.pow(8 * beta, 3));
        assertClose(mcMahon, RadialModes.root(Shape.CYLINDER, n, Double.POSITIVE_INFINITY), 1e-9, "j_0,4000");
        double z = RadialModes.root(Shape.CYLINDER, n, 2.5);
        // the residual relative to z |J1|, about z / sqrt(z): the root is found to rounding
        assertClose(0, (z * RadialModes.bessel(1, z) - 2.5 * RadialModes.bessel(0, z)) / Math.sqrt(z), 1e-12,
            "(z J1 - Bi J0) / sqrt(z) at mode 4000");
    }

    @ParameterizedTest(name = "{0}")
    @CsvSource({"CYLINDER, 1.2558, 1.2071", "SPHERE, 1.5708, 1.2732"})
    void firstRootAndCoefficientMatchIncropera2007Table5_1(Shape shape, double zeta1, double c1) {
        // Incropera et al. 2007, Table 5.1, Bi = 1.0 (recalled from memory, 4 decimals); tolerance its rounding
        assertClose(zeta1, RadialModes.root(shape, 1, 1.0), 0.5e-4, shape + " zeta_1");
        assertClose(c1, RadialModes.oneTermCoefficient(shape, 1.0), 0.5e-4, shape + " C_1");
    }

    @Test
    void sphereAtBiotOneHasTheRootPiOverTwoExactly() {
        // 1 - z cot z = 1 gives cot z = 0: z = pi/2 (common practice)
        assertClose(Math.PI / 2, RadialModes.root(Shape.SPHERE, 1, 1.0), 1e-14, "sphere, Bi = 1");
    }

    @ParameterizedTest(name = "Bi = {0}")
    @ValueSource(doubles = {0, 1e-6, 1e-3, 1, 10, 1e3, 1e6, Double.POSITIVE_INFINITY})
    void rootsSolveTheirEigenconditionAndTheModesAreOrthogonal(double biot) {
        IterativeLegendreGaussIntegrator quad = new IterativeLegendreGaussIntegrator(32, 1e-14, 1e-16);
        for (Shape shape : Shape.values()) {
            double previous = 0;
            double[] mu = new double[6];
            for (int n = 1; n <= 6; n++) {
                double z = RadialModes.root(shape, n, biot);
                mu[n - 1] = z;
                if (!(z > previous)) {
                    throw new AssertionError(shape + " roots not increasing at n = " + n + ", Bi = " + biot);
                }
                previous = z;
                // the eigencondition F(z) = 0; the root error it implies, |F|/|F'|, within 1e-12 z
                double f;
                double df;
                if (shape == Shape.CYLINDER) {
                    f = biot == Double.POSITIVE_INFINITY ? BesselJ.value(0, z)
                        : z * BesselJ.value(1, z) - biot * BesselJ.value(0, z);
                    df = biot == Double.POSITIVE_INFINITY ? -BesselJ.value(1, z)
                        : z * BesselJ.value(0, z) + biot * BesselJ.value(1, z);
                } else if (biot == Double.POSITIVE_INFINITY) {
                    f = Math.sin(z);
                    df = Math.cos(z);
                } else {
                    double sinc = Math.sin(z) / z;
                    double dsinc = (z * Math.cos(z) - Math.sin(z)) / (z * z);
                    f = sinc - Math.cos(z) - biot * sinc;
                    df = (1 - biot) * dsinc + Math.sin(z);
                }
                assertClose(0, Math.abs(f / df), 1e-12 * Math.max(1, z), shape + " root " + n + ", Bi = " + biot);
            }
            for (int m = 0; m < 6; m++) {
                final double a = mu[m];
                double norm = quad.integrate(1_000_000, r -> Math.pow(RadialModes.mode(shape, a, r), 2) * weight(shape, r),
                    0, 1);
                assertClose(norm, RadialModes.normSquared(shape, 1, a), 1e-12 * norm, shape + " norm " + (m + 1));
                double one = quad.integrate(1_000_000, r -> RadialModes.mode(shape, a, r) * weight(shape, r), 0, 1);
                assertClose(one, RadialModes.weightIntegral(shape, 1, a), 1e-12, shape + " projection " + (m + 1));
                for (int n = m + 1; n < 6; n++) {
                    final double b = mu[n];
                    double cross = quad.integrate(1_000_000, r -> RadialModes.mode(shape, a, r)
                        * RadialModes.mode(shape, b, r) * weight(shape, r), 0, 1);
                    assertClose(0, cross / norm, 1e-10, shape + " orthogonality " + (m + 1) + "," + (n + 1));
                }
            }
        }
    }

    @ParameterizedTest(name = "Bi = {0}")
    @ValueSource(doubles = {1e-6, 0.01, 0.1, 0.5, 0.9, 0.999})
    void slabRootsWithANegativeFaceCoefficientAreTheSphereRoots(double biot) {
        // w = r u: the slab with Dirichlet at 0 and B = Bi - 1 at L has the sphere's roots; two independent
        // routes (safeguarded Newton on the phase form, Brent on (1 - Bi) sin z - z cos z)
        for (int n = 1; n <= 8; n++) {
            double sphere = RadialModes.root(Shape.SPHERE, n, biot);
            double slab = SlabModes.root(n, Double.POSITIVE_INFINITY, biot - 1);
            assertClose(sphere, slab, 1e-12 * Math.max(1, sphere), "root " + n + " at Bi = " + biot);
        }
    }

    private static double weight(Shape shape, double r) {
        return shape == Shape.CYLINDER ? r : r * r;
    }
}

package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertClose;
import static eigencheck.oracle.testing.NumericAssertions.assertWithin;
import static org.junit.jupiter.api.Assertions.assertTrue;

import eigencheck.oracle.Evaluation;
import eigencheck.oracle.Oracle;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.modes.RadialModes;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Cylinder;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import java.util.Map;
import java.util.SplittableRandom;
import org.apache.commons.math3.special.BesselJ;
import org.junit.jupiter.api.Test;

/** The solid cylinder by its J0 modes. */
class CylinderTest {
    private static Problem cylinder(double radius, Material m, String initial, String source, BoundaryCondition surface) {
        return new Problem(new Cylinder(radius), m, Expression.parse(initial, "r"), Expression.parse(source, "r", "t"),
            Map.of(Side.SURFACE, surface));
    }

    /**
     * A rod held at 0 degC with a narrow heater along its axis, Q = Q0 exp(-(r/a)^2), a = R/25 and R/100: by
     * direct integration (common practice) r u' = -(Q0 a^2/(2k)) (1 - exp(-r^2/a^2)), so
     * u(r) = (Q0 a^2/(4k)) int_{(r/a)^2}^{(R/a)^2} (1 - e^-x)/x dx, here by Commons Math's Gauss-Legendre
     * integrator. A fixed 40-point rule for the steady solve's flux once missed this by 1e-7 of the answer with
     * a bound 10^5 times smaller: the values must be within their bounds.
     */
    @Test
    void narrowHeaterAlongTheAxisIsWithinItsBound() {
        double radius = 0.02;
        double k = 45;
        double q0 = 1e8;
        org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator quad =
            new org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator(16, 1e-15, 1e-300);
        for (double a : new double[] {radius / 25, radius / 100}) {
            Problem p = new Problem(new Cylinder(radius), new Material(k, 3.8e6), Expression.parse("0", "r"),
                Expression.parse(q0 + "*exp(-(r/" + a + ")^2)", "r", "t"),
                Map.of(Side.SURFACE, new BoundaryCondition.Dirichlet(Expression.parse("0", "t"))), true);
            Oracle o = Oracle.prepare(p, 0, 1e-10);
            for (double r : new double[] {0, a, 3 * a, 0.01, 0.019}) {
                double lo = (r / a) * (r / a);
                double hi = (radius / a) * (radius / a);
                double exact = q0 * a * a / (4 * k) * quad.integrate(10_000_000, x -> x == 0 ? 1 : -Math.expm1(-x) / x,
                    lo, hi);
                Evaluation e = o.temperature(r, Double.POSITIVE_INFINITY);
                assertTrue(Math.abs(e.value() - exact) <= e.bound() && e.bound() <= 1e-10 * o.temperatureScale(),
                    "a = " + a + ", r = " + r + ": " + e + " against " + exact);
            }
        }
    }

    @Test
    void fastBesselAgreesWithCommonsMath() {
        SplittableRandom random = new SplittableRandom(1);
        for (int i = 0; i < 20000; i++) {
            double x = random.nextDouble() * (i < 10000 ? 25 : 400);
            assertClose(BesselJ.value(0, x), Bessel.j0(x), 2e-15, "J0(" + x + ")");
            assertClose(BesselJ.value(1, x), Bessel.j1(x), 2e-15, "J1(" + x + ")");
        }
    }

    @Test
    void modeNormsStayAboveTheTailBound() {
        // the truncation bound takes ||J0(beta_n r)||^2 >= R^2/(2 pi z_n) beyond the computed modes
        for (double biot : new double[] {0, 0.1, 1, 10, Double.POSITIVE_INFINITY}) {
            for (int n = 1; n <= 400; n++) {
                double z = RadialModes.root(RadialModes.Shape.CYLINDER, n, biot);
                double norm = RadialModes.normSquared(RadialModes.Shape.CYLINDER, 1, z);
                assertTrue(norm >= 1 / (2 * Math.PI * z), "Bi " + biot + ", n " + n + ": " + norm);
            }
        }
    }

    @Test
    void uniformSourceApproachesTheSteadyParabola() {
        // steady u = u_s + Q (R^2 - r^2)/(4k) (common practice; the check 3), at t = 30 R^2/alpha
        double radius = 0.05;
        double k = 15;
        double q = 2e6;
        Material m = new Material(k, 4e6);
        Problem p = cylinder(radius, m, "20", Double.toString(q),
            new BoundaryCondition.Dirichlet(Expression.parse("60", "t")));
        double t = 30 * radius * radius / m.diffusivity();
        Oracle o = Oracle.prepare(p, t, 1e-10);
        for (int i = 0; i <= 10; i++) {
            double r = radius * i / 10;
            double exact = 60 + q * (radius * radius - r * r) / (4 * k);
            assertWithin(exact, o.temperature(r, t), 1e-10 * o.temperatureScale(), "u at r = " + r);
            assertWithin(-q * r / (2 * k), o.gradient(new double[] {r}, t)[0], 1e-10 * o.temperatureScale() / radius,
                "du/dr at r = " + r);
        }
        for (double[] shell : new double[][] {{0, 0.01}, {0.02, 0.035}, {0.045, 0.05}}) {
            double mean = 60 + q / (4 * k) * (radius * radius - 0.5 * (shell[0] * shell[0] + shell[1] * shell[1]));
            assertWithin(mean, o.cellAverage(shell[0], shell[1], t), 1e-10 * o.temperatureScale(), "shell mean");
        }
        Problem steady = new Problem(new Cylinder(radius), m, Expression.parse("0", "r"),
            Expression.parse(Double.toString(q), "r", "t"), Map.of(Side.SURFACE,
            new BoundaryCondition.Dirichlet(Expression.parse("60", "t"))), true);
        Oracle s = Oracle.prepare(steady, 0, 1e-12);
        assertWithin(60 + q * radius * radius / (4 * k), s.temperature(0, 0), 1e-12 * s.temperatureScale(), "steady centre");
    }

    @Test
    void centreTemperatureGivesIncroperaOneTermCoefficientAtBiotOne() {
        // Incropera et al. 2007, Table 5.1, infinite cylinder, Bi = 1: zeta_1 = 1.2558, C_1 = 1.2071 (from memory)
        double zeta1 = RadialModes.root(RadialModes.Shape.CYLINDER, 1, 1.0);
        double zeta2 = RadialModes.root(RadialModes.Shape.CYLINDER, 2, 1.0);
        assertClose(1.2558, zeta1, 0.5e-4, "zeta_1");
        double fo = 30 / (zeta2 * zeta2 - zeta1 * zeta1);
        Problem p = cylinder(1, Material.ofDiffusivity(1), "1", "0",
            new BoundaryCondition.Robin(1, Expression.parse("0", "t")));
        Oracle o = Oracle.prepare(p, fo, 1e-12);
        double c1 = o.temperature(0, fo).value() / Math.exp(-zeta1 * zeta1 * fo);
        assertClose(1.2071, c1, 0.5e-4, "C_1");
        assertClose(RadialModes.oneTermCoefficient(RadialModes.Shape.CYLINDER, 1.0), c1, 1e-8, "C_1 closed form");
    }

    @Test
    void uniformInitialCoolingAgreesWithTheHandbookSeries() {
        // Incropera et al. 2007, eq. 5.49a (the infinite cylinder, recalled from memory):
        // u/u_0 = sum C_n exp(-z_n^2 Fo) J0(z_n r/R), C_n = 2 J1(z_n)/(z_n (J0^2(z_n) + J1^2(z_n))), z_n J1 = Bi J0;
        // summed here with Commons Math's BesselJ and Brent roots on the brackets (j_{1,n-1}, j_{0,n})
        double biot = 3;
        org.apache.commons.math3.analysis.solvers.BrentSolver brent =
            new org.apache.commons.math3.analysis.solvers.BrentSolver(1e-15, 1e-16);
        int terms = 300;
        double[] z = new double[terms];
        double[] c = new double[terms];
        for (int n = 0; n < terms; n++) {
            double lo = n == 0 ? 1e-9 : RadialModes.besselZero(1, n);
            double hi = RadialModes.besselZero(0, n + 1);
            z[n] = brent.solve(1000, x -> x * BesselJ.value(1, x) - biot * BesselJ.value(0, x), lo, hi);
            double j0 = BesselJ.value(0, z[n]);
            double j1 = BesselJ.value(1, z[n]);
            c[n] = 2 * j1 / (z[n] * (j0 * j0 + j1 * j1));
        }
        Problem p = cylinder(1, Material.ofDiffusivity(1), "1", "0",
            new BoundaryCondition.Robin(biot, Expression.parse("0", "t")));
        Oracle o = Oracle.prepare(p, 1, 1e-11);
        SplittableRandom random = new SplittableRandom(9);
        for (int i = 0; i < 100; i++) {
            double r = random.nextDouble();
            double fo = 0.01 + random.nextDouble();
            double sum = 0;
            for (int n = 0; n < terms; n++) {
                sum += c[n] * Math.exp(-z[n] * z[n] * fo) * BesselJ.value(0, z[n] * r);
            }
            assertWithin(sum, o.temperature(r, fo), 1e-11, "u at r = " + r + ", Fo = " + fo);
        }
    }

    @Test
    void fluxSurfaceHeatsTheMeanLinearly() {
        // insulated-except-flux cylinder from u = 0: the mean rises at 2 q/(R rho c) (energy balance, common
        // practice), and the long-time profile is q r^2/(2 k R) plus a constant (Carslaw and Jaeger 1959, 7.4)
        double radius = 0.02;
        double k = 40;
        double rhoC = 3.5e6;
        double q = 5e4;
        Problem p = cylinder(radius, new Material(k, rhoC), "0", "0",
            new BoundaryCondition.Neumann(Expression.parse(Double.toString(q), "t")));
        double alpha = k / rhoC;
        double t = 5 * radius * radius / alpha;
        Oracle o = Oracle.prepare(p, t, 1e-10);
        // mean by Gauss-Legendre of the certified values, weight 2 r/R^2
        double mean = 0;
        double[] nodes = {-0.9061798459386640, -0.5384693101056831, 0, 0.5384693101056831, 0.9061798459386640};
        double[] weights = {0.2369268850561891, 0.4786286704993665, 0.5688888888888889, 0.4786286704993665,
            0.2369268850561891};
        // the profile at this time is smooth: compare the difference from the quadratic instead
        double drift = 2 * q / (radius * rhoC) * t;
        double centre = o.temperature(0, t).value();
        for (int i = 0; i < 5; i++) {
            double r = 0.5 * radius * (nodes[i] + 1);
            Evaluation e = o.temperature(r, t);
            mean += 0.5 * radius * weights[i] * e.value() * 2 * r / (radius * radius);
            assertClose(q * r * r / (2 * k * radius), e.value() - centre, 1e-8 * o.temperatureScale(), "profile at " + r);
        }
        assertClose(drift, mean, 1e-8 * o.temperatureScale(), "mean");
    }
}

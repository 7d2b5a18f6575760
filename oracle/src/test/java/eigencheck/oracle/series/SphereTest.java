package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertCertified;
import static eigencheck.oracle.testing.NumericAssertions.assertClose;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import eigencheck.oracle.Oracle;
import eigencheck.oracle.OracleException;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.modes.RadialModes;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Sphere;
import java.util.Map;
import org.junit.jupiter.api.Test;

/** The solid sphere through w = r u (Carslaw and Jaeger 1959, section 9.2). */
class SphereTest {
    private static Problem sphere(double radius, Material m, String initial, String source, BoundaryCondition surface) {
        return new Problem(new Sphere(radius), m, Expression.parse(initial, "r"), Expression.parse(source, "r", "t"),
            Map.of(Side.SURFACE, surface));
    }

    @Test
    void uniformSourceApproachesTheSteadyParabola() {
        // steady u = u_s + Q (R^2 - r^2)/(6k) (common practice; the check 3), at t = 30 R^2/alpha
        double radius = 0.1;
        double k = 2;
        double q = 1e4;
        Material m = new Material(k, 1e6);
        Problem p = sphere(radius, m, "0", Double.toString(q),
            new BoundaryCondition.Dirichlet(Expression.parse("10", "t")));
        double t = 30 * radius * radius / m.diffusivity();
        Oracle o = Oracle.prepare(p, t, 1e-10);
        for (int i = 0; i <= 10; i++) {
            double r = radius * i / 10;
            assertCertified(10 + q * (radius * radius - r * r) / (6 * k), o.temperature(r, t), "u at r = " + r);
        }
        assertCertified(10 + q * radius * radius / (6 * k), o.temperature(1e-7 * radius, t), "u near the centre");
        // gradient -Q r/(3k) and shell means of the same parabola (common practice)
        double limit = 1e-10 * o.temperatureScale();
        for (int i = 1; i <= 10; i++) {
            double r = radius * i / 10;
            eigencheck.oracle.testing.NumericAssertions.assertWithin(-q * r / (3 * k),
                o.gradient(new double[] {r}, t)[0], limit / radius, "du/dr at r = " + r);
        }
        assertEquals(0, o.gradient(new double[] {0}, t)[0].value(), "du/dr at the centre");
        for (double[] shell : new double[][] {{0, 0.03}, {0.03, 0.07}, {0.09, 0.1}}) {
            double a = shell[0];
            double b = shell[1];
            double mean = 10 + q / (6 * k) * (radius * radius - 3 * (Math.pow(b, 5) - Math.pow(a, 5))
                / (5 * (Math.pow(b, 3) - Math.pow(a, 3))));
            eigencheck.oracle.testing.NumericAssertions.assertWithin(mean, o.cellAverage(a, b, t), limit,
                "shell " + a + " to " + b);
        }
    }

    @Test
    void centreTemperatureGivesIncroperaOneTermCoefficientAtBiotOne() {
        // Incropera et al. 2007, Table 5.1, sphere, Bi = 1: zeta_1 = 1.5708, C_1 = 1.2732 (from memory);
        // uniform initial 1, ambient 0; once the second mode has decayed, u(0) = C_1 exp(-zeta_1^2 Fo)
        double zeta1 = RadialModes.root(RadialModes.Shape.SPHERE, 1, 1.0);
        double zeta2 = RadialModes.root(RadialModes.Shape.SPHERE, 2, 1.0);
        assertClose(1.5708, zeta1, 0.5e-4, "zeta_1");
        double fo = 30 / (zeta2 * zeta2 - zeta1 * zeta1);
        Problem p = sphere(1, Material.ofDiffusivity(1), "1", "0",
            new BoundaryCondition.Robin(1, Expression.parse("0", "t")));
        Oracle o = Oracle.prepare(p, fo, 1e-12);
        double c1 = o.temperature(0, fo).value() / Math.exp(-zeta1 * zeta1 * fo);
        assertClose(1.2732, c1, 0.5e-4, "C_1");
        assertClose(RadialModes.oneTermCoefficient(RadialModes.Shape.SPHERE, 1.0), c1, 1e-9, "C_1 closed form");
    }

    @Test
    void manufacturedTransientIsReproducedWithFixedAndConvectiveSurfaces() {
        // u = e^{-t}(1 + r^2): u_t = -u, lap u = 6 e^{-t}; Q = rho c u_t - k lap u; ambient for convection
        // u_a = u + (k/h) u_r at R with u_r = 2 R e^{-t} (method of manufactured solutions)
        double radius = 0.5;
        double k = 2;
        double rhoC = 3;
        Material m = new Material(k, rhoC);
        String source = rhoC + "*(-exp(-t)*(1 + r^2)) - 6*" + k + "*exp(-t)";
        double h = 20; // Bi = 5
        BoundaryCondition[] surfaces = {
            new BoundaryCondition.Dirichlet(Expression.parse("exp(-t)*(1 + " + radius * radius + ")", "t")),
            new BoundaryCondition.Robin(h, Expression.parse("exp(-t)*(1 + " + radius * radius + " + "
                + 2 * k * radius / h + ")", "t"))};
        for (BoundaryCondition surface : surfaces) {
            Oracle o = Oracle.prepare(sphere(radius, m, "1 + r^2", source, surface), 2, 1e-10);
            for (double t : new double[] {0.01, 0.3, 2}) {
                for (double r : new double[] {0, 1e-6, 1e-4, 0.05, 0.2, 0.37, 0.5}) {
                    assertCertified(Math.exp(-t) * (1 + r * r), o.temperature(r, t), surface.getClass().getSimpleName()
                        + " at r = " + r + ", t = " + t);
                }
            }
        }
    }

    @Test
    void lowBiotConvectionMatchesIncroperaAndTheManufacturedSolution() {
        // Incropera et al. 2007, Table 5.1, sphere, Bi = 0.1: zeta_1 = 0.5423, C_1 = 1.0298 (from memory)
        double zeta1 = RadialModes.root(RadialModes.Shape.SPHERE, 1, 0.1);
        assertClose(0.5423, zeta1, 0.5e-4, "zeta_1 at Bi = 0.1");
        double zeta2 = RadialModes.root(RadialModes.Shape.SPHERE, 2, 0.1);
        double fo = 30 / (zeta2 * zeta2 - zeta1 * zeta1);
        Oracle o = Oracle.prepare(sphere(1, Material.ofDiffusivity(1), "1", "0",
            new BoundaryCondition.Robin(0.1, Expression.parse("0", "t"))), fo, 1e-12);
        double c1 = o.temperature(0, fo).value() / Math.exp(-zeta1 * zeta1 * fo);
        assertClose(1.0298, c1, 0.5e-4, "C_1 at Bi = 0.1");
        assertClose(RadialModes.oneTermCoefficient(RadialModes.Shape.SPHERE, 0.1), c1, 1e-9, "C_1 closed form");
        // manufactured u = e^{-t}(1 + r^2) with convection at Bi = hR/k = 0.25 and 0.1
        double radius = 0.5;
        double k = 2;
        String source = "3*(-exp(-t)*(1 + r^2)) - 12*exp(-t)";
        for (double h : new double[] {1, 0.4}) {
            Oracle m = Oracle.prepare(sphere(radius, new Material(k, 3), "1 + r^2", source, new BoundaryCondition.Robin(h,
                Expression.parse("exp(-t)*(1 + " + radius * radius + " + " + 2 * k * radius / h + ")", "t"))), 2,
                1e-10);
            for (double t : new double[] {0.01, 0.3, 2}) {
                for (double r : new double[] {0, 1e-6, 0.05, 0.2, 0.5}) {
                    assertCertified(Math.exp(-t) * (1 + r * r), m.temperature(r, t), "Bi = " + h * radius / k
                        + " at r = " + r + ", t = " + t);
                }
            }
        }
    }

    @Test
    void veryLowBiotNumbersAreRefusedRatherThanAnsweredLoosely() {
        // at Bi = 1e-4 the first eigenvalue is nearly zero (1/lambda = 1250 s); the ambient here moves by 5000 K,
        // and the slow mode's share of the moving level's lags, about r' / lambda^2 = 8e9 K, must cancel against
        // the closed-form lag: its rounding alone (1.4e-5 K) exceeds the budget of 1e-10 x scale = 9e-7 K (the
        // source's uneven change alone is certified to 5e-9): the oracle must refuse (when preparing or when
        // asked), not guess
        double radius = 0.5;
        double h = 4e-4;
        Problem p = sphere(radius, new Material(2, 3), "1 + r^2", "3*(-exp(-t)*(1 + r^2)) - 12*exp(-t)",
            new BoundaryCondition.Robin(h, Expression.parse("exp(-t)*(1 + " + radius * radius + " + " + 4 * radius / h
                + ")", "t")));
        OracleException e = assertThrows(OracleException.class, () -> Oracle.prepare(p, 2, 1e-10).temperature(0.2, 1));
        assertTrue(e.reason() == OracleException.Reason.TOO_MANY_MODES || e.reason() == OracleException.Reason.UNSUPPORTED
            || e.reason() == OracleException.Reason.NOT_CERTIFIED, e.getMessage());
    }

    @Test
    void fluxSurfaceHeatsTheMeanLinearly() {
        // a sphere heated by a uniform surface flux from u = 0: the mean rises at 3 q/(R rho c) (energy balance,
        // common practice) and the long-time profile is q r^2/(2 k R) plus a constant (Carslaw and Jaeger 1959,
        // section 9.3); the zero mode the slab mapping lacks is the radial solver's
        double radius = 0.03;
        double k = 20;
        double rhoC = 3.6e6;
        double q = 8e4;
        Problem p = sphere(radius, new Material(k, rhoC), "0", "0",
            new BoundaryCondition.Neumann(Expression.parse(Double.toString(q), "t")));
        double t = 5 * radius * radius / (k / rhoC);
        Oracle o = Oracle.prepare(p, t, 1e-10);
        double centre = o.temperature(0, t).value();
        for (int i = 1; i <= 5; i++) {
            double r = radius * i / 5;
            assertClose(q * r * r / (2 * k * radius), o.temperature(r, t).value() - centre, 1e-8 * o.temperatureScale(),
                "profile at " + r);
        }
        double mean = o.cellAverage(0, radius, t).value();
        assertClose(3 * q * t / (radius * rhoC), mean, 1e-9 * o.temperatureScale(), "mean");
        eigencheck.oracle.testing.NumericAssertions.assertWithin(q / k * 0.6, o.gradient(new double[] {0.6 * radius}, t)[0],
            1e-8 * o.temperatureScale() / radius, "du/dr = q r/(k R)");
    }

    @Test
    void tinyBiotNumbersFollowTheOneTermSolution() {
        // Bi = 1e-4, uniform initial 1, ambient 0: once the second mode has decayed u(0) = C_1 exp(-zeta_1^2 Fo)
        // with zeta_1 and C_1 from the eigencondition (Incropera et al. 2007, eq. 5.52, from memory), and
        // C_1 -> 1, zeta_1^2 -> 3 Bi as Bi -> 0 (the lumped capacitance limit, common practice)
        double biot = 1e-4;
        double zeta1 = RadialModes.root(RadialModes.Shape.SPHERE, 1, biot);
        double zeta2 = RadialModes.root(RadialModes.Shape.SPHERE, 2, biot);
        assertClose(3 * biot, zeta1 * zeta1, 1e-8, "zeta_1^2 = 3 Bi to first order");
        double fo = 30 / (zeta2 * zeta2 - zeta1 * zeta1);
        Oracle o = Oracle.prepare(sphere(1, Material.ofDiffusivity(1), "1", "0",
            new BoundaryCondition.Robin(biot, Expression.parse("0", "t"))), 10 * fo, 1e-12);
        double c1 = RadialModes.oneTermCoefficient(RadialModes.Shape.SPHERE, biot);
        for (double f : new double[] {fo, 10 * fo}) {
            eigencheck.oracle.testing.NumericAssertions.assertWithin(c1 * Math.exp(-zeta1 * zeta1 * f), o.temperature(0, f),
                1e-12, "u(0) at Fo = " + f);
        }
    }

    @Test
    void aFluxThatChangesInTimeGoesToTheDirectSeriesAndTheMappingRefusesFluxQueries() {
        // the mapping cannot take a flux surface; the direct series takes sin(t): the mean over the ball rises by
        // 3/(R rho c) int_0^t q = 3 (1 - cos t) (energy balance, common practice; R = 1, rho c = 1)
        Material m = Material.ofDiffusivity(1);
        Oracle heated = Oracle.prepare(sphere(1, m, "1", "0", new BoundaryCondition.Neumann(Expression.parse("sin(t)",
            "t"))), 2, 1e-10);
        for (double t : new double[] {0.3, 1, 2}) {
            assertCertified(1 + 3 * (1 - Math.cos(t)), heated.cellAverage(new double[] {0}, new double[] {1}, t),
                "mean at t = " + t);
        }
        Oracle o = Oracle.prepare(sphere(1, m, "1", "0", new BoundaryCondition.Dirichlet(Expression.parse("0", "t"))), 1,
            1e-10);
        assertThrows(OracleException.class, () -> o.heatFlux(0.5, 0.5));
    }
}

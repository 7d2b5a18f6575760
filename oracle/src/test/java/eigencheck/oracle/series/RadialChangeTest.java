package eigencheck.oracle.series;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import eigencheck.oracle.Evaluation;
import eigencheck.oracle.Oracle;
import eigencheck.oracle.OracleException;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Cylinder;
import eigencheck.oracle.problem.Domain;
import eigencheck.oracle.problem.Manufactured;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Sphere;
import java.util.Map;
import org.apache.commons.math3.special.Erf;
import org.junit.jupiter.api.Test;

/** A cylinder's or sphere's source that changes in time other than by the same amount everywhere. */
class RadialChangeTest {
    private static final double RADIUS = 0.5;
    private static final Material MATERIAL = new Material(2, 3);

    /** |exact - e| within e's bound, and that bound within the tolerance's budget. */
    private static void assertCertified(double exact, Evaluation e, double limit, String what) {
        assertTrue(Math.abs(e.value() - exact) <= e.bound(), what + ": error " + Math.abs(e.value() - exact)
            + " above the bound " + e.bound());
        assertTrue(e.bound() <= limit, what + ": bound " + e.bound() + " above " + limit);
    }

    /**
     * Manufactured u = 10 + 5 sin(2 t + 4 r^2) (method of manufactured solutions): by direct
     * differentiation Q = rho c u_t - k (u_rr + n u_r / r) = 10 rho c cos(w) - 5 k (8 (n + 1) cos w - 64 r^2 sin w),
     * w = 2 t + 4 r^2, which changes in time differently at every radius; u_r = 40 r cos w, and the
     * cylinder's shell mean is 10 + 5 (cos w(a) - cos w(b)) / (4 (b^2 - a^2)) (int r sin w dr = -cos w / 8).
     * Every radial route: the cylinder with each surface kind, the sphere with a flux surface (the direct
     * series) and with a fixed temperature (the slab mapping), and both at Bi = 0.0025, where a body keeps its
     * heat and the slowest mode is solved from the source directly.
     */
    @Test
    void nonSeparableChangeInEveryRadialRoute() {
        Expression u = Expression.parse("10 + 5*sin(2*t + 4*r^2)", "r", "t");
        Object[][] routes = {{new Cylinder(RADIUS), Manufactured.Face.dirichlet()},
            {new Cylinder(RADIUS), Manufactured.Face.robin(3)},
            {new Cylinder(RADIUS), Manufactured.Face.neumann()},
            {new Sphere(RADIUS), Manufactured.Face.neumann()},
            {new Sphere(RADIUS), Manufactured.Face.dirichlet()},
            // Bi = 0.0025: the first mode is slow (lambda T = 0.03) and is taken out of the quasi-static steps
            {new Cylinder(RADIUS), Manufactured.Face.robin(0.01)},
            {new Sphere(RADIUS), Manufactured.Face.robin(0.01)}};
        for (Object[] route : routes) {
            Domain domain = (Domain) route[0];
            Problem p = Manufactured.radial(u, domain, MATERIAL, (Manufactured.Face) route[1]);
            Oracle o = Oracle.prepare(p, 2, 1e-10);
            double limit = 1e-10 * o.temperatureScale();
            for (double t : new double[] {0.02, 0.3, 2}) {
                for (double r : new double[] {0, 0.1, 0.3, 0.45, RADIUS}) {
                    String where = domain + " " + route[1] + " at r = " + r + ", t = " + t;
                    assertCertified(u.value(r, t), o.temperature(r, t), limit, "u " + where);
                    double w = 2 * t + 4 * r * r;
                    assertCertified(40 * r * Math.cos(w), o.gradient(new double[] {r}, t)[0], limit / RADIUS,
                        "du/dr " + where);
                }
                if (domain instanceof Cylinder) {
                    double a = 0.1;
                    double b = 0.4;
                    double mean = 10 + 5 * (Math.cos(2 * t + 4 * a * a) - Math.cos(2 * t + 4 * b * b)) / (4 * (b * b - a * a));
                    assertCertified(mean, o.cellAverage(new double[] {a}, new double[] {b}, t), limit,
                        "shell mean " + route[1] + " at t = " + t);
                }
            }
        }
    }

    /**
     * An insulated rod and ball heated by a spot Q0 exp(-(r/a)^2) sin^2(pi t / tau) that pulses, from u = 0:
     * by the energy balance (common practice) the mean temperature is
     * Q0 M (t/2 - tau sin(2 pi t / tau)/(4 pi)) / (rho c), M the spot's mean over the body:
     * (a/R)^2 (1 - exp(-(R/a)^2)) in the cylinder, (3/R^3)(a^3 sqrt(pi) erf(R/a)/4 - a^2 R exp(-(R/a)^2)/2)
     * in the sphere.
     */
    @Test
    void pulsedSpotInInsulatedBodiesKeepsTheEnergyBalance() {
        double q0 = 2e4;
        double a = 0.15;
        double tau = 0.8;
        String spot = q0 + "*exp(-(r/" + a + ")^2)*sin(" + Math.PI / tau + "*t)^2";
        double ra = RADIUS / a;
        double[] means = {a * a / (RADIUS * RADIUS) * (1 - Math.exp(-ra * ra)),
            3 / Math.pow(RADIUS, 3) * (Math.pow(a, 3) * Math.sqrt(Math.PI) * Erf.erf(ra) / 4
                - a * a * RADIUS * Math.exp(-ra * ra) / 2)};
        for (int n = 1; n <= 2; n++) {
            Domain domain = n == 1 ? new Cylinder(RADIUS) : new Sphere(RADIUS);
            Problem p = body(domain, spot, new BoundaryCondition.Neumann(Expression.parse("0", "t")));
            Oracle o = Oracle.prepare(p, 1.5, 1e-10);
            double limit = 1e-10 * o.temperatureScale();
            for (double t : new double[] {0.1, 0.55, 1.5}) {
                double exact = q0 * means[n - 1] * (t / 2 - tau * Math.sin(2 * Math.PI * t / tau) / (4 * Math.PI))
                    / MATERIAL.volumetricHeatCapacity();
                assertCertified(exact, o.cellAverage(new double[] {0}, new double[] {RADIUS}, t), limit,
                    domain + " mean at t = " + t);
            }
        }
    }

    /**
     * The same pulsed spot in a sphere held at 0 degC: the direct radial series and the slab mapping
     * w = r u (the slab's general moving-source series) are two independent routes and must agree within
     * the sum of their bounds, in values and gradients.
     */
    @Test
    void sphereAgreesWithTheSlabMapping() {
        String spot = "2e4*exp(-(r/0.15)^2)*sin(3.9269908169872414*t)^2 + 500*r^2*t";
        Problem p = body(new Sphere(RADIUS), spot, new BoundaryCondition.Dirichlet(Expression.parse("0", "t")));
        Oracle mapping = Oracle.prepare(p, 1.5, 1e-10);
        RadialSolver direct = new RadialSolver(p, 1.5, 1e-10);
        for (double t : new double[] {0.05, 0.4, 1.5}) {
            SpatialSolver.Slice slice = direct.at(t);
            for (double r : new double[] {0, 0.05, 0.2, 0.37, 0.49}) {
                Evaluation a = mapping.temperature(r, t);
                Evaluation b = slice.temperature(new double[] {r}, 0);
                assertTrue(Math.abs(a.value() - b.value()) <= a.bound() + b.bound(), "u at r = " + r + ", t = " + t
                    + ": " + a + " against " + b);
                assertTrue(b.bound() <= 1e-10 * direct.scale(), "bound " + b.bound());
                Evaluation ga = mapping.gradient(new double[] {r}, t)[0];
                double[] out = new double[1];
                double gb = slice.gradient(new double[] {r}, 0, out, 0);
                assertTrue(Math.abs(ga.value() - out[0]) <= ga.bound() + gb, "du/dr at r = " + r + ", t = " + t
                    + ": " + ga + " against " + out[0] + " +- " + gb);
            }
        }
    }

    /**
     * A rod whose slowest mode has lambda_1 = 0.0040 / s: prepared for 200 s it is a slow mode (lambda T = 0.8,
     * solved from the source directly), prepared for 300 s a fast one (through the quasi-static steps). The
     * two splittings must agree within their bounds at t = 60 s and 180 s (two routes, common practice).
     */
    @Test
    void slowAndFastTreatmentsOfTheFirstModeAgree() {
        Problem p = new Problem(new Cylinder(0.02), new Material(45, 3.8e6), Expression.parse("20", "r"),
            Expression.parse("4e7*exp(-(r/0.006)^2)*(1 - exp(-t/20))*(1 + 0.5*sin(t/15))", "r", "t"),
            Map.of(Side.SURFACE, new BoundaryCondition.Robin(150, Expression.parse("20", "t"))));
        Oracle slow = Oracle.prepare(p, 200, 1e-10);
        Oracle fast = Oracle.prepare(p, 300, 1e-10);
        for (double t : new double[] {60, 180}) {
            for (double r : new double[] {0, 0.007, 0.02}) {
                Evaluation a = slow.temperature(r, t);
                Evaluation b = fast.temperature(r, t);
                assertTrue(Math.abs(a.value() - b.value()) <= a.bound() + b.bound(), "u at r = " + r + ", t = " + t
                    + ": " + a + " against " + b);
                assertTrue(a.bound() <= 1e-10 * slow.temperatureScale() && b.bound() <= 1e-10 * fast.temperatureScale());
                Evaluation ga = slow.gradient(new double[] {r}, t)[0];
                Evaluation gb = fast.gradient(new double[] {r}, t)[0];
                assertTrue(Math.abs(ga.value() - gb.value()) <= ga.bound() + gb.bound(), "du/dr at r = " + r
                    + ", t = " + t + ": " + ga + " against " + gb);
            }
        }
    }

    @Test
    void sourceWithAJumpInTimeIsRefusedWithTheReason() {
        Problem p = body(new Cylinder(RADIUS), "1000*r^2*step(t - 0.5)",
            new BoundaryCondition.Dirichlet(Expression.parse("0", "t")));
        OracleException e = assertThrows(OracleException.class, () -> Oracle.prepare(p, 1, 1e-10));
        assertEquals(OracleException.Reason.UNSUPPORTED, e.reason());
        assertTrue(e.getMessage().startsWith("source: ") && e.getMessage().contains("smooth ramp"), e.getMessage());
    }

    private static Problem body(Domain domain, String source, BoundaryCondition surface) {
        return new Problem(domain, MATERIAL, Expression.parse("0", "r"), Expression.parse(source, "r", "t"),
            Map.of(Side.SURFACE, surface));
    }
}

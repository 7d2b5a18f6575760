package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertWithin;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import eigencheck.oracle.Evaluation;
import eigencheck.oracle.Oracle;
import eigencheck.oracle.OracleException;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Manufactured;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Rectangle;
import eigencheck.oracle.problem.Side;
import java.util.EnumMap;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * A rectangle's source that is not a sum of one-coordinate terms: the blend on the sides and the
 * remainder's double series ({@link SourceRemainder}), checked against manufactured solutions (the
 * method of manufactured solutions: choose u, derive the source and the side data exactly; common
 * practice) on every kind of side, in the steady state and in time.
 */
class GeneralSourceTest {
    private static final double LY = 0.8;
    private static final Material MATERIAL = new Material(2, 3);

    static Map<Side, Manufactured.Face> kinds(Manufactured.Face xmin, Manufactured.Face xmax,
                                                      Manufactured.Face ymin, Manufactured.Face ymax) {
        Map<Side, Manufactured.Face> m = new EnumMap<>(Side.class);
        m.put(Side.XMIN, xmin);
        m.put(Side.XMAX, xmax);
        m.put(Side.YMIN, ymin);
        m.put(Side.YMAX, ymax);
        return m;
    }

    private static Problem steadyOf(Problem derived) {
        return new Problem(derived.domain(), derived.material(), derived.initial(), derived.source(),
            derived.boundary(), true);
    }

    /** The mean of u over [x0, x0 + w] x [y0, y0 + w] by a 5 x 5 Gauss rule (exact to 1e-13 for these u). */
    static double cellMean(Expression u, double x0, double y0, double w, double t) {
        double[] nodes = {-0.9061798459386640, -0.5384693101056831, 0, 0.5384693101056831, 0.9061798459386640};
        double[] weights = {0.2369268850561891, 0.4786286704993665, 0.5688888888888889, 0.4786286704993665,
            0.2369268850561891};
        double sum = 0;
        for (int i = 0; i < 5; i++) {
            for (int j = 0; j < 5; j++) {
                sum += weights[i] * weights[j] / 4 * u.value(x0 + 0.5 * w * (nodes[i] + 1), y0 + 0.5 * w * (nodes[j] + 1), t);
            }
        }
        return sum;
    }

    /** Values at 40 points and a cell mean of the steady problem, within the oracle's bound and the tolerance. */
    private static void assertSteadyMatches(Expression exact, Map<Side, Manufactured.Face> sides, double tolerance,
                                            String label) {
        Problem derived = Manufactured.cartesian(exact, new Rectangle(1, LY), MATERIAL, sides);
        assertTrue(derived.source().variables().contains("y"), "the derived source varies along y");
        Oracle o = Oracle.prepare(steadyOf(derived), 0, tolerance);
        double limit = tolerance * o.temperatureScale();
        SplittableRandom random = new SplittableRandom(5);
        for (int i = 0; i < 40; i++) {
            double x = 0.02 + 0.96 * random.nextDouble();
            double y = (0.02 + 0.96 * random.nextDouble()) * LY;
            assertWithin(exact.value(x, y, 0), o.temperature(new double[] {x, y}, 0), limit,
                label + " u at " + x + ", " + y);
        }
        Evaluation mean = o.cellAverage(new double[] {0.3, 0.2}, new double[] {0.4, 0.3}, 0);
        assertWithin(cellMean(exact, 0.3, 0.2, 0.1, 0), mean, limit, label + " cell mean");
    }

    @Test
    void onEverySideAndInTheCornersWhereTheSideDataVanish() {
        // u = x (9/7 - x) cos(pi y / 1.6) (1 + y^2) meets u = 0 at x = 0 and y = 0.8, u' + (h/k) u = 0 at x = 1
        // (h/k = 5/2: (9/7 - 2) + 2.5 (9/7 - 1) = 0) and u' = 0 at y = 0 (calculus): every side's data are zero, so
        // no face series is needed and a mesh's boundary nodes are certified wherever the blend's corrections reach
        Expression exact = Expression.parse("x*(9/7 - x)*cos(pi*y/1.6)*(1 + y^2)", "x", "y", "t");
        Problem derived = Manufactured.cartesian(exact, new Rectangle(1, LY), MATERIAL, kinds(
            Manufactured.Face.dirichlet(), Manufactured.Face.robin(5), Manufactured.Face.neumann(),
            Manufactured.Face.dirichlet()));
        Map<Side, BoundaryCondition> zero = new EnumMap<>(Side.class);
        zero.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("0", "y", "t")));
        zero.put(Side.XMAX, new BoundaryCondition.Robin(5, Expression.parse("0", "y", "t")));
        zero.put(Side.YMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        zero.put(Side.YMAX, new BoundaryCondition.Dirichlet(Expression.parse("0", "x", "t")));
        Problem steady = new Problem(derived.domain(), derived.material(), derived.initial(), derived.source(), zero, true);
        double tolerance = 1e-10;
        Oracle o = Oracle.prepare(steady, 0, tolerance);
        double limit = tolerance * o.temperatureScale();
        for (int i = 0; i <= 16; i++) {
            double s = i / 16.0;
            double[][] onSides = {{0, s * LY}, {1, s * LY}, {s, 0}, {s, LY}, {0.99, s * LY}, {s, 0.004}};
            for (double[] p : onSides) {
                // on the Dirichlet sides u is 0 exactly (the expression leaves cos(pi/2) = 6e-17 there)
                double u = p[0] == 0 || p[1] == LY ? 0 : exact.value(p[0], p[1], 0);
                assertWithin(u, o.temperature(p, 0), limit, "u at " + p[0] + ", " + p[1]);
            }
        }
        Evaluation corner = o.cellAverage(new double[] {0.9, 0}, new double[] {1, 0.1}, 0);
        assertWithin(cellMean(exact, 0.9, 0, 0.1, 0), corner, limit, "the corner cell's mean");
        // the gradient on the convective side, at a tolerance the remainder's gradient series reaches
        Oracle loose = Oracle.prepare(steady, 0, 1e-7);
        Evaluation[] g = loose.gradient(new double[] {1, 0.3}, 0);
        assertWithin(exact.derivative("x").value(1, 0.3, 0), g[0], 1e-7 * loose.temperatureScale(),
            "du/dx on the convective side");
    }

    @Test
    void productSourceWithTemperaturesOnEverySide() {
        // u = sin(2xy) + x y^2: Q = k (4 (x^2 + y^2) sin(2xy) - 2x), not a sum of one-coordinate terms
        assertSteadyMatches(Expression.parse("sin(2*x*y) + x*y*y", "x", "y", "t"), kinds(Manufactured.Face.dirichlet(),
            Manufactured.Face.dirichlet(), Manufactured.Face.dirichlet(), Manufactured.Face.dirichlet()), 1e-10,
            "four temperatures");
    }

    @Test
    void productSourceWithMixedSides() {
        Expression exact = Expression.parse("sin(2*x*y) + x*y*y", "x", "y", "t");
        assertSteadyMatches(exact, kinds(Manufactured.Face.dirichlet(), Manufactured.Face.robin(5),
            Manufactured.Face.neumann(), Manufactured.Face.dirichlet()), 1e-10, "temperature, convection, flux");
        assertSteadyMatches(exact, kinds(Manufactured.Face.robin(3), Manufactured.Face.robin(5),
            Manufactured.Face.neumann(), Manufactured.Face.robin(2)), 1e-10, "no temperature at all");
    }

    @Test
    void clampedEndsWithTheOtherPairInsulatedOrFluxDriven() {
        // temperatures on the x sides, flux sides across: the blend's parts along y take G's mean by a slab along
        // x and its zero-mean rest by a series of the insulated pair's modes; the flux pair is not blended, so
        // the remainder converges like M^-3 there and 1024 modes reach about 3e-11 of the scale (1e-9 is refused)
        assertSteadyMatches(Expression.parse("sin(2*x*y) + x*y*y", "x", "y", "t"), kinds(Manufactured.Face.dirichlet(),
            Manufactured.Face.dirichlet(), Manufactured.Face.neumann(), Manufactured.Face.neumann()), 1e-8,
            "clamped ends, flux sides");
    }

    @Test
    void heatedSpot() {
        // a Gaussian spot, u = exp(-((x - 0.4)^2 + (y - 0.3)^2)/0.02): the source is the spot's Laplacian
        assertSteadyMatches(Expression.parse("exp(-((x-0.4)^2 + (y-0.3)^2)/0.02)", "x", "y", "t"),
            kinds(Manufactured.Face.dirichlet(), Manufactured.Face.robin(5), Manufactured.Face.neumann(),
                Manufactured.Face.dirichlet()), 1e-8, "spot");
    }

    @Test
    void gradientsOfAProductSource() {
        Expression exact = Expression.parse("sin(2*x*y) + x*y*y", "x", "y", "t");
        Problem derived = Manufactured.cartesian(exact, new Rectangle(1, LY), MATERIAL, kinds(
            Manufactured.Face.dirichlet(), Manufactured.Face.robin(5), Manufactured.Face.neumann(),
            Manufactured.Face.dirichlet()));
        double tolerance = 1e-7;
        Oracle o = Oracle.prepare(steadyOf(derived), 0, tolerance);
        Expression ux = exact.derivative("x");
        Expression uy = exact.derivative("y");
        double limit = tolerance * o.temperatureScale();
        SplittableRandom random = new SplittableRandom(8);
        for (int i = 0; i < 20; i++) {
            double x = 0.05 + 0.9 * random.nextDouble();
            double y = (0.05 + 0.9 * random.nextDouble()) * LY;
            Evaluation[] g = o.gradient(new double[] {x, y}, 0);
            assertWithin(ux.value(x, y, 0), g[0], limit, "du/dx at " + x + ", " + y);
            assertWithin(uy.value(x, y, 0), g[1], limit, "du/dy at " + x + ", " + y);
        }
    }

    @Test
    void transientWithAProductSourceAndADecayingMode() {
        // u = sin(2xy) + x y^2 + exp(-alpha lambda t) sin(pi x) sin(pi y / 0.8), lambda = pi^2 (1 + 1/0.64): the
        // mode vanishes on the sides and solves the homogeneous equation, so the source and the side data are
        // the steady part's (separation of variables, common practice)
        double alpha = MATERIAL.diffusivity();
        double lambda = Math.PI * Math.PI * (1 + 1 / (LY * LY));
        Expression exact = Expression.parse("sin(2*x*y) + x*y*y + exp(-" + alpha * lambda + "*t)*sin(pi*x)*sin(pi*y/0.8)",
            "x", "y", "t");
        Problem derived = Manufactured.cartesian(exact, new Rectangle(1, LY), MATERIAL, kinds(
            Manufactured.Face.dirichlet(), Manufactured.Face.dirichlet(), Manufactured.Face.dirichlet(),
            Manufactured.Face.dirichlet()));
        double tolerance = 1e-9;
        Oracle o = Oracle.prepare(derived, 0.5, tolerance);
        double limit = tolerance * o.temperatureScale();
        SplittableRandom random = new SplittableRandom(13);
        for (double t : new double[] {0.01, 0.1, 0.5}) {
            for (int i = 0; i < 15; i++) {
                double x = 0.02 + 0.96 * random.nextDouble();
                double y = (0.02 + 0.96 * random.nextDouble()) * LY;
                assertWithin(exact.value(x, y, t), o.temperature(new double[] {x, y}, t), limit,
                    "u at " + x + ", " + y + ", t = " + t);
            }
            assertWithin(cellMean(exact, 0.3, 0.2, 0.1, t), o.cellAverage(new double[] {0.3, 0.2},
                new double[] {0.4, 0.3}, t), limit, "cell mean at t = " + t);
        }
    }

    @Test
    void aUniformChangeInTimeAddsToAProductSource() {
        // superposition (common practice): with zero side data and a zero start, the plate heated by
        // Q(x, y) + 300 (1 - exp(-2 t)) is the sum of the plate heated by Q alone and by the uniform change alone
        Map<Side, BoundaryCondition> sides = new EnumMap<>(Side.class);
        sides.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("0", "y", "t")));
        sides.put(Side.XMAX, new BoundaryCondition.Robin(5, Expression.parse("0", "y", "t")));
        sides.put(Side.YMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        sides.put(Side.YMAX, new BoundaryCondition.Robin(2, Expression.parse("0", "x", "t")));
        Expression start = Expression.parse("0", "x", "y");
        String spot = "400*exp(-((x - 0.6)^2 + (y - 0.5)^2)/0.05)";
        Problem both = new Problem(new Rectangle(1, LY), MATERIAL, start,
            Expression.parse(spot + " + 300*(1 - exp(-2*t))", "x", "y", "t"), sides);
        Problem spotOnly = new Problem(new Rectangle(1, LY), MATERIAL, start, Expression.parse(spot, "x", "y", "t"), sides);
        Problem change = new Problem(new Rectangle(1, LY), MATERIAL, start,
            Expression.parse("300*(1 - exp(-2*t))", "x", "y", "t"), sides);
        double tolerance = 1e-8;
        Oracle a = Oracle.prepare(both, 1, tolerance);
        Oracle b = Oracle.prepare(spotOnly, 1, tolerance);
        Oracle c = Oracle.prepare(change, 1, tolerance);
        SplittableRandom random = new SplittableRandom(3);
        for (double t : new double[] {0.2, 1}) {
            for (int i = 0; i < 15; i++) {
                double[] p = {random.nextDouble(), random.nextDouble() * LY};
                Evaluation ua = a.temperature(p, t);
                Evaluation ub = b.temperature(p, t);
                Evaluation uc = c.temperature(p, t);
                double gap = Math.abs(ua.value() - ub.value() - uc.value());
                assertTrue(gap <= ua.bound() + ub.bound() + uc.bound(), "at " + p[0] + ", " + p[1] + ", t = " + t
                    + ": the sum misses by " + gap + ", beyond the bounds");
                assertTrue(ua.bound() <= tolerance * a.temperatureScale(), "bound " + ua.bound());
            }
        }
    }

    @Test
    void theRemainderMeetsTheBlendedConditionsAndItsCoefficientBound() {
        // by construction (I - P_x)(I - P_y) Q vanishes on a Dirichlet side and meets k du/dn + h u = 0 on a
        // flux or convective one; and each computed coefficient lies within the integration-by-parts bound
        Expression q = Expression.parse("exp(x*y) * cos(3*x - y) + x*x*y", "x", "y");
        double hk = 5.0 / 2;
        double[][] hOverK = {{Double.POSITIVE_INFINITY, hk}, {0, Double.POSITIVE_INFINITY}};
        SourceRemainder r = new SourceRemainder(q, new double[] {1, LY}, hOverK);
        assertTrue(r.blended(0) && r.blended(1), "both axes blended");
        double step = 1e-5;
        for (int i = 0; i <= 10; i++) {
            double s = i / 10.0;
            assertEquals(0, r.value(0, s * LY), 1e-13, "Dirichlet x = 0");
            assertEquals(0, r.value(s, LY), 1e-13, "Dirichlet y = 0.8");
            // convective x = 1: f' + (h/k) f = 0; flux y = 0: f' = 0 (central differences, error ~1e-10)
            double fx = (r.value(1, s * LY) - r.value(1 - step, s * LY)) / step;
            double fx2 = (r.value(1 - 2 * step, s * LY) - r.value(1 - step, s * LY)) / -step;
            double slope = 1.5 * fx - 0.5 * fx2;
            assertEquals(0, slope + hk * r.value(1, s * LY), 1e-7, "convective x = 1 at y = " + s * LY);
            double fy = (-3 * r.value(s, 0) + 4 * r.value(s, step) - r.value(s, 2 * step)) / (2 * step);
            assertEquals(0, fy, 1e-7, "flux y = 0 at x = " + s);
        }
        AxisModes[] axes = {new AxisModes(1, Double.POSITIVE_INFINITY, hk), new AxisModes(LY, 0, Double.POSITIVE_INFINITY)};
        axes[0].ensure(64);
        axes[1].ensure(64);
        int n = 400;
        double[][] rx = GaussLegendre.onInterval(n, 1);
        double[][] ry = GaussLegendre.onInterval(n, LY);
        double[][] values = new double[n][n];
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                values[i][j] = r.value(rx[0][i], ry[0][j]);
            }
        }
        int[] modes = {0, 1, 3, 10, 30, 63};
        for (int a : modes) {
            for (int b : modes) {
                double sum = 0;
                for (int i = 0; i < n; i++) {
                    double xa = Math.sin(axes[0].mu[a] * rx[0][i] + axes[0].phase[a]);
                    for (int j = 0; j < n; j++) {
                        sum += rx[1][i] * ry[1][j] * values[i][j] * xa * Math.sin(axes[1].mu[b] * ry[0][j] + axes[1].phase[b]);
                    }
                }
                double bound = r.coefficientBound(axes[0].mu[a], axes[1].mu[b]);
                double projection = sum;
                assertTrue(Math.abs(projection) <= bound, "mode (" + a + ", " + b + "): |<Q_r, X Y>| = "
                    + Math.abs(projection) + " above the bound " + bound);
            }
        }
    }

    @Test
    void refusesWhatTheBlendCannotReach() {
        BoundaryCondition zero = new BoundaryCondition.Dirichlet(Expression.parse("0", "x", "y", "t"));
        Map<Side, BoundaryCondition> held = new EnumMap<>(Side.class);
        held.put(Side.XMIN, zero);
        held.put(Side.XMAX, zero);
        held.put(Side.YMIN, zero);
        held.put(Side.YMAX, zero);
        // a kink: the coefficients' bound rests on smoothness
        Problem kinked = new Problem(new Rectangle(1, 1), Material.ofDiffusivity(1), Expression.parse("0", "x", "y"),
            Expression.parse("abs(x - y)", "x", "y", "t"), held, true);
        OracleException e = assertThrows(OracleException.class, () -> Oracle.prepare(kinked, 0, 1e-8));
        assertEquals(OracleException.Reason.UNSUPPORTED, e.reason());
        assertTrue(e.getMessage().contains("may be non-smooth"), e.getMessage());
        // a box: sources that are sums of terms of two coordinates each, or one product, only
        Problem cube = BoxPairSourceTest.heldUnitCube("exp(x*y*z)");
        e = assertThrows(OracleException.class, () -> Oracle.prepare(cube, 0, 1e-8));
        assertEquals(OracleException.Reason.UNSUPPORTED, e.reason());
        assertTrue(e.getMessage().contains("two coordinates each"), e.getMessage());
    }
}

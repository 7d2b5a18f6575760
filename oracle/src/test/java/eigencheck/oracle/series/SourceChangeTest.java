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
import eigencheck.oracle.problem.Box;
import eigencheck.oracle.problem.Manufactured;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Rectangle;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Slab;
import java.util.EnumMap;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/**
 * A rectangle's or box's source that changes in time other than uniformly, as terms theta(t) phi(x)
 * ({@link SourceSchedule}), checked against manufactured solutions (choose u, derive the source and
 * the side data exactly; common practice) and against the slab oracle where the problem is one-dimensional:
 * values, gradients and cell means at times across the horizon, with sources that do not vanish on the
 * sides (so their modes decay slowly). The sources are written out by hand (calculus, in the comments),
 * which keeps their expressions short.
 */
class SourceChangeTest {
    private static final double LY = 0.8;
    /** k = 2 W/(m K), rho c = 3 J/(m^3 K): alpha = 2/3 m^2/s. */
    private static final Material MATERIAL = new Material(2, 3);
    private static final double[] TIMES = {0.03, 0.7, 1.9};

    private static Expression xyt(String text) {
        return Expression.parse(text, "x", "y", "t");
    }

    /** The manufactured problem's sides and start, with the source written out by hand. */
    private static Problem withSource(Problem derived, Expression source) {
        return new Problem(derived.domain(), derived.material(), derived.initial(), source, derived.boundary());
    }

    /** u at 8 points at each of three times, and a cell mean, within the oracle's bound and the tolerance. */
    private static void assertMatches(Expression exact, Oracle o, int seed, String label) {
        double limit = o.tolerance() * o.temperatureScale();
        SplittableRandom random = new SplittableRandom(seed);
        for (double t : TIMES) {
            for (int i = 0; i < 8; i++) {
                double x = 0.02 + 0.96 * random.nextDouble();
                double y = (0.02 + 0.96 * random.nextDouble()) * LY;
                Evaluation u = o.temperature(new double[] {x, y}, t);
                assertTrue(u.bound() <= limit, label + ": the bound " + u.bound() + " is within the tolerance");
                assertWithin(exact.value(x, y, t), u, limit, label + " u at " + x + ", " + y + ", " + t);
            }
        }
        assertWithin(GeneralSourceTest.cellMean(exact, 0.3, 0.2, 0.1, 0.7), o.cellAverage(new double[] {0.3, 0.2},
            new double[] {0.4, 0.3}, 0.7), limit, label + " cell mean");
    }

    @Test
    void heaterSwitchedOnUnderHeldSides() {
        // u = x (1 - x) y (0.8 - y) sin(2t) is 0 on every side; rho c u_t - k Laplace u = 6 cos(2t) x (1 - x) y (0.8 - y)
        // + 4 sin(2t) (y (0.8 - y) + x (1 - x)) (calculus), whose second part does not vanish on the sides
        Expression exact = xyt("x*(1 - x)*y*(0.8 - y)*sin(2*t)");
        Problem derived = Manufactured.cartesian(exact, new Rectangle(1, LY), MATERIAL, GeneralSourceTest.kinds(
            Manufactured.Face.dirichlet(), Manufactured.Face.dirichlet(), Manufactured.Face.dirichlet(),
            Manufactured.Face.dirichlet()));
        Problem p = withSource(derived, xyt("6*cos(2*t)*x*(1 - x)*y*(0.8 - y) + 4*sin(2*t)*(y*(0.8 - y) + x*(1 - x))"));
        assertMatches(exact, Oracle.prepare(p, 2, 1e-8), 3, "held sides");
        // gradients: the change's series converges a power of the mode number more slowly there, and the
        // product part's steady gradient series stops near 1e-8 (GeneralSourceTest)
        Oracle o = Oracle.prepare(p, 2, 1e-6);
        double limit = 1e-6 * o.temperatureScale() / 0.8;
        for (double[] point : new double[][] {{0.37, 0.29}, {0.05, 0.71}}) {
            Evaluation[] g = o.gradient(point, 1.3);
            assertWithin(exact.derivative("x").value(point[0], point[1], 1.3), g[0], limit, "du/dx");
            assertWithin(exact.derivative("y").value(point[0], point[1], 1.3), g[1], limit, "du/dy");
        }
    }

    @Test
    void sourceAndSidesFollowingTheirOwnSchedules() {
        // u = (1 + x y) (1 - exp(-t)) + x (1 - x) y (0.8 - y) t: harmonic first part, so rho c u_t - k Laplace u =
        // 3 (1 + x y) exp(-t) + 3 x (1 - x) y (0.8 - y) + 4 t (y (0.8 - y) + x (1 - x)) (calculus): two shapes
        // with their own schedules, on a held, a convective, an insulated-with-flux and a held side whose data
        // change in time by (shape) x (1 - exp(-t)) and by t
        Expression exact = xyt("(1 + x*y)*(1 - exp(-t)) + x*(1 - x)*y*(0.8 - y)*t");
        Problem derived = Manufactured.cartesian(exact, new Rectangle(1, LY), MATERIAL, GeneralSourceTest.kinds(
            Manufactured.Face.dirichlet(), Manufactured.Face.robin(5), Manufactured.Face.neumann(),
            Manufactured.Face.dirichlet()));
        Problem p = withSource(derived, xyt("3*(1 + x*y)*exp(-t) + 3*x*(1 - x)*y*(0.8 - y) + 4*t*(y*(0.8 - y)"
            + " + x*(1 - x))"));
        assertMatches(exact, Oracle.prepare(p, 2, 1e-9), 7, "own schedules");
    }

    @Test
    void plateWithInsulatedEdgesIsTheSlab() {
        // with both y sides insulated, a source 5 sin(3t) (1 + x) + 2 t^2 x^2 that does not depend on y gives the
        // slab's solution along x: the slab oracle, verified against NAFEMS T3 and closed forms, is the second route
        // (common practice); the y axis then carries its constant mode
        Expression source = xyt("5*sin(3*t)*(1 + x) + 2*t^2*x^2");
        Map<Side, BoundaryCondition> sides = new EnumMap<>(Side.class);
        sides.put(Side.XMIN, new BoundaryCondition.Dirichlet(xyt("0")));
        sides.put(Side.XMAX, new BoundaryCondition.Robin(5, xyt("0")));
        sides.put(Side.YMIN, new BoundaryCondition.Neumann(xyt("0")));
        sides.put(Side.YMAX, new BoundaryCondition.Neumann(xyt("0")));
        Problem plate = new Problem(new Rectangle(1, LY), MATERIAL, Expression.parse("0", "x", "y"), source, sides);
        Map<Side, BoundaryCondition> ends = new EnumMap<>(Side.class);
        ends.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("0", "t")));
        ends.put(Side.XMAX, new BoundaryCondition.Robin(5, Expression.parse("0", "t")));
        Problem slab = new Problem(new Slab(1), MATERIAL, Expression.parse("0", "x"),
            Expression.parse("5*sin(3*t)*(1 + x) + 2*t^2*x^2", "x", "t"), ends);
        Oracle o = Oracle.prepare(plate, 2, 1e-10);
        Oracle line = Oracle.prepare(slab, 2, 1e-10);
        double limit = 1e-10 * Math.max(o.temperatureScale(), line.temperatureScale());
        for (double t : TIMES) {
            for (double x : new double[] {0.1, 0.45, 0.93}) {
                Evaluation reference = line.temperature(x, t);
                Evaluation u = o.temperature(new double[] {x, 0.3}, t);
                assertEquals(reference.value(), u.value(), limit + reference.bound(), "u at x = " + x + ", t = " + t);
            }
        }
    }

    @Test
    void boxWithAnAdditiveShape() {
        // u = (x (1 - x) + y (0.8 - y) / 2) sin(t) + z^2: rho c u_t - k Laplace u = 3 cos(t) (x (1 - x) + y (0.8 - y) / 2)
        // + 6 sin(t) - 4 (calculus), the faces' data change in time by (shape) x sin(t)
        Expression exact = Expression.parse("(x*(1 - x) + y*(0.8 - y)/2)*sin(t) + z^2", "x", "y", "z", "t");
        Map<Side, Manufactured.Face> faces = new EnumMap<>(Side.class);
        for (Side s : new Side[] {Side.XMIN, Side.XMAX, Side.YMIN, Side.YMAX, Side.ZMIN, Side.ZMAX}) {
            faces.put(s, Manufactured.Face.dirichlet());
        }
        faces.put(Side.ZMAX, Manufactured.Face.robin(4));
        Problem derived = Manufactured.cartesian(exact, new Box(1, LY, 0.6), MATERIAL, faces);
        Problem p = new Problem(derived.domain(), derived.material(), derived.initial(),
            Expression.parse("3*cos(t)*(x*(1 - x) + y*(0.8 - y)/2) + 6*sin(t) - 4", "x", "y", "z", "t"),
            derived.boundary());
        // a box's bound of the change's series sums |terms| of modes that decay like 1/(mu nu kappa lambda^2),
        // far above the series' actual error (3e-11 here): certified at 1e-6
        Oracle o = Oracle.prepare(p, 2, 1e-6);
        double limit = 1e-6 * o.temperatureScale();
        SplittableRandom random = new SplittableRandom(11);
        for (double t : new double[] {0.03, 1.3}) {
            for (int i = 0; i < 6; i++) {
                double[] q = {0.1 + 0.8 * random.nextDouble(), (0.1 + 0.8 * random.nextDouble()) * LY,
                    (0.1 + 0.8 * random.nextDouble()) * 0.6};
                assertWithin(exact.value(q[0], q[1], q[2], t), o.temperature(q, t), limit,
                    "box u at " + java.util.Arrays.toString(q) + ", t = " + t);
            }
        }
    }

    @Test
    void shapeCoefficientsWithinTheirBounds() {
        // the integration-by-parts bounds of phi_J (SourceSchedule) against phi_J by a 400 x 400 Gauss rule, on a
        // held, a convective and an insulated pair of axis ends, for a shape that vanishes on no side
        double inf = Double.POSITIVE_INFINITY;
        AxisModes[][] cases = {
            {new AxisModes(1, inf, 2.5), new AxisModes(LY, 0, 0)},
            {new AxisModes(1, inf, inf), new AxisModes(LY, 3, inf)}};
        Expression shape = Expression.parse("y*(0.8 - y) + x*(1 - x) + 0.3*exp(x*y) + cos(3*x)*y", "x", "y");
        int checked = 0;
        for (AxisModes[] axes : cases) {
            SourceSchedule term = new SourceSchedule(Expression.parse("sin(t)", "t"), 1, shape, null, axes, 2, 2.0 / 3,
                m -> null, "the test's term");
            double[][] rx = GaussLegendre.onInterval(400, 1);
            double[][] ry = GaussLegendre.onInterval(400, LY);
            for (int m : new int[] {0, 1, 2, 5, 11, 40}) {
                for (int n : new int[] {0, 1, 3, 8, 30}) {
                    double sum = 0;
                    for (int i = 0; i < 400; i++) {
                        double xm = Math.sin(axes[0].mu[m] * rx[0][i] + axes[0].phase[m]);
                        for (int j = 0; j < 400; j++) {
                            sum += rx[1][i] * ry[1][j] * shape.value(rx[0][i], ry[0][j]) * xm
                                * Math.sin(axes[1].mu[n] * ry[0][j] + axes[1].phase[n]);
                        }
                    }
                    double coefficient = sum / (axes[0].norm[m] * axes[1].norm[n]);
                    double bound = term.coefficientBound(new int[] {m, n});
                    assertTrue(Math.abs(coefficient) <= bound, "phi_" + m + "," + n + " = " + coefficient
                        + " exceeds its bound " + bound);
                    checked++;
                }
            }
        }
        assertEquals(60, checked);
    }

    @Test
    void refusesAMovingHeatSource() {
        // a spot travelling across the plate is not a sum of a few terms (shape) x (schedule)
        Map<Side, BoundaryCondition> sides = new EnumMap<>(Side.class);
        for (Side s : new Side[] {Side.XMIN, Side.XMAX, Side.YMIN, Side.YMAX}) {
            sides.put(s, new BoundaryCondition.Dirichlet(xyt("0")));
        }
        Problem p = new Problem(new Rectangle(1, LY), MATERIAL, Expression.parse("0", "x", "y"),
            xyt("exp(-((x - 0.2 - 0.3*t)^2 + (y - 0.4)^2)/0.01)"), sides);
        OracleException e = assertThrows(OracleException.class, () -> Oracle.prepare(p, 2, 1e-8));
        assertEquals(OracleException.Reason.UNSUPPORTED, e.reason());
        assertTrue(e.getMessage().startsWith("source: changes in time in a way that is not a sum of at most four"),
            e.getMessage());
        assertTrue(e.getMessage().contains("a moving heat source is not one"), e.getMessage());
    }
}

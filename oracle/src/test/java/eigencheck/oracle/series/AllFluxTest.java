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
 * Rectangles and boxes insulated or flux-driven on every face: the constant mode never decays, the
 * faces' constant modes take the quadratic profile (1 - s/D)^2 and the mean drifts with the net input.
 */
class AllFluxTest {
    private static Expression xyt(String text) {
        return Expression.parse(text, "x", "y", "t");
    }

    /**
     * An insulated plate with a hot spot: with zero flux on every face the product of two slab solutions
     * is the plate's (separation of variables, common practice); the slab oracle gives both factors.
     */
    @Test
    void insulatedPlateIsTheProductOfTwoSlabs() {
        Material m = new Material(3, 2);
        String fx = "1 + 4*exp(-20*(x - 0.3)^2)";
        String gy = "2 + y*(0.5 - y)";
        Map<Side, BoundaryCondition> sides = new EnumMap<>(Side.class);
        sides.put(Side.XMIN, new BoundaryCondition.Neumann(Expression.parse("0", "y", "t")));
        sides.put(Side.XMAX, new BoundaryCondition.Neumann(Expression.parse("0", "y", "t")));
        sides.put(Side.YMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        sides.put(Side.YMAX, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        Problem plate = new Problem(new Rectangle(1, 0.5), m, Expression.parse("(" + fx + ")*(" + gy + ")", "x", "y"),
            xyt("0"), sides);
        Oracle o = Oracle.prepare(plate, 1, 1e-10);
        Oracle ox = Oracle.prepare(slab(1, m, fx), 1, 1e-12);
        Oracle oy = Oracle.prepare(slab(0.5, m, gy.replace("y", "x")), 1, 1e-12);
        for (double t : new double[] {0.01, 0.2, 1}) {
            for (double[] q : new double[][] {{0.3, 0.25}, {0, 0}, {0.95, 0.5}, {0.5, 0.1}}) {
                Evaluation a = ox.temperature(q[0], t);
                Evaluation b = oy.temperature(q[1], t);
                Evaluation e = o.temperature(q, t);
                double reference = a.value() * b.value();
                double allowed = e.bound() + Math.abs(a.value()) * b.bound() + Math.abs(b.value()) * a.bound()
                    + a.bound() * b.bound();
                assertTrue(Math.abs(e.value() - reference) <= allowed, "u at " + q[0] + ", " + q[1] + ", t = " + t + ": "
                    + e.value() + " +- " + e.bound() + " against " + reference);
                assertTrue(e.bound() <= 1e-10 * o.temperatureScale());
            }
        }
    }

    private static Problem slab(double length, Material m, String initial) {
        Map<Side, BoundaryCondition> ends = new EnumMap<>(Side.class);
        ends.put(Side.XMIN, new BoundaryCondition.Neumann(Expression.parse("0", "t")));
        ends.put(Side.XMAX, new BoundaryCondition.Neumann(Expression.parse("0", "t")));
        return new Problem(new Slab(length), m, Expression.parse(initial, "x"), Expression.parse("0", "x", "t"), ends);
    }

    /**
     * u = x^3 - 3 x y^2 + x^2 + 2 alpha t + s t (a harmonic cubic, a heat polynomial and a uniform source's
     * rise s = Q / (rho c); common practice) with every side flux-driven: fluxes that vary along the sides,
     * a net input, and the mean rising at 2 alpha + s. Values, gradients and a cell mean to 1e-10 of the
     * scale.
     */
    @Test
    void fluxDrivenPlateWithASourceAgainstAnExactSolution() {
        double k = 2;
        Material material = new Material(k, 5);
        double alpha = material.diffusivity();
        double rise = 0.7;
        Expression exact = xyt("x^3 - 3*x*y^2 + x^2 + " + (2 * alpha + rise) + "*t");
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        for (Side s : new Side[] {Side.XMIN, Side.XMAX, Side.YMIN, Side.YMAX}) {
            kinds.put(s, Manufactured.Face.neumann());
        }
        Problem p = Manufactured.cartesian(exact, new Rectangle(0.8, 0.6), material, kinds);
        assertEquals(rise * 5, p.source().value(0.1, 0.2, 0.3), 1e-12, "the manufactured source is rho c s");
        Oracle o = Oracle.prepare(p, 2, 1e-10);
        double limit = 1e-10 * o.temperatureScale();
        SplittableRandom random = new SplittableRandom(23);
        for (int i = 0; i < 30; i++) {
            double x = (0.03 + 0.94 * random.nextDouble()) * 0.8;
            double y = (0.03 + 0.94 * random.nextDouble()) * 0.6;
            double t = 0.02 + 1.98 * random.nextDouble();
            double[] q = {x, y};
            assertWithin(exact.value(x, y, t), o.temperature(q, t), limit, "u at " + x + ", " + y + ", " + t);
            Evaluation[] g = o.gradient(q, t);
            assertWithin(exact.derivative("x").value(x, y, t), g[0], limit / 0.6, "du/dx");
            assertWithin(exact.derivative("y").value(x, y, t), g[1], limit / 0.6, "du/dy");
        }
        // a cell mean of x^3 - 3 x y^2 + x^2 in closed form, plus the rise (2 alpha + s) t (calculus)
        double x0 = 0.1;
        double x1 = 0.5;
        double y0 = 0.1;
        double y1 = 0.4;
        double mx3 = (Math.pow(x1, 4) - Math.pow(x0, 4)) / (4 * (x1 - x0));
        double mx2 = (Math.pow(x1, 3) - Math.pow(x0, 3)) / (3 * (x1 - x0));
        double mx = (x0 + x1) / 2;
        double my2 = (Math.pow(y1, 3) - Math.pow(y0, 3)) / (3 * (y1 - y0));
        double mean = mx3 - 3 * mx * my2 + mx2 + (2 * alpha + rise) * 1.5;
        assertWithin(mean, o.cellAverage(new double[] {x0, y0}, new double[] {x1, y1}, 1.5), limit, "a cell mean");
    }

    /** An insulated cube with u0 = 1 + cos(pi x) cos(pi y) cos(pi z): u = 1 + exp(-3 pi^2 alpha t) cos cos cos. */
    @Test
    void insulatedCubeDecaysToItsMean() {
        String[] xyzt = {"x", "y", "z", "t"};
        Map<Side, BoundaryCondition> faces = new EnumMap<>(Side.class);
        for (Side s : Side.values()) {
            if (s != Side.SURFACE) {
                faces.put(s, new BoundaryCondition.Neumann(Expression.parse("0", xyzt)));
            }
        }
        Material m = Material.ofDiffusivity(0.1);
        Problem cube = new Problem(new Box(1, 1, 1), m,
            Expression.parse("1 + cos(pi*x)*cos(pi*y)*cos(pi*z)", "x", "y", "z"), Expression.parse("0", xyzt), faces);
        Oracle o = Oracle.prepare(cube, 1, 1e-10);
        for (double t : new double[] {0.05, 1}) {
            for (double[] q : new double[][] {{0.2, 0.3, 0.4}, {0, 1, 0.5}, {0.9, 0.1, 0.7}}) {
                double exact = 1 + Math.exp(-3 * Math.PI * Math.PI * 0.1 * t) * Math.cos(Math.PI * q[0])
                    * Math.cos(Math.PI * q[1]) * Math.cos(Math.PI * q[2]);
                assertWithin(exact, o.temperature(q, t), 1e-10 * o.temperatureScale(), "u at " + q[0] + ", t = " + t);
            }
        }
    }

    /**
     * u = cos(pi x / a) exp(-alpha pi^2 t / a^2) (y^2 + 2 alpha t), a product of two one-dimensional heat
     * solutions (common practice), on a flux-driven plate: the flux into y = b, 2 k b cos(pi x / a)
     * exp(-alpha pi^2 t / a^2), changes in time with a shape along the side (the side terms' lags for modes
     * with kappa > 0 between two flux faces). Values to 1e-10 of the scale.
     */
    @Test
    void decayingShapedFluxAgainstAProductSolution() {
        double k = 2;
        Material material = new Material(k, 4);
        double alpha = material.diffusivity();
        double a = 0.8;
        double decay = alpha * Math.PI * Math.PI / (a * a);
        Expression exact = xyt("cos(pi*x/" + a + ")*exp(-" + decay + "*t)*(y^2 + " + 2 * alpha + "*t)");
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        for (Side s : new Side[] {Side.XMIN, Side.XMAX, Side.YMIN, Side.YMAX}) {
            kinds.put(s, Manufactured.Face.neumann());
        }
        Problem p = Manufactured.cartesian(exact, new Rectangle(a, 0.5), material, kinds);
        Oracle o = Oracle.prepare(p, 1, 1e-10);
        double limit = 1e-10 * o.temperatureScale();
        SplittableRandom random = new SplittableRandom(31);
        for (int i = 0; i < 12; i++) {
            double x = (0.04 + 0.92 * random.nextDouble()) * a;
            double y = (0.04 + 0.92 * random.nextDouble()) * 0.5;
            double t = 0.02 + 0.98 * random.nextDouble();
            assertWithin(exact.value(x, y, t), o.temperature(new double[] {x, y}, t), limit, "u at " + x + ", " + y
                + ", " + t);
        }
    }

    @Test
    void refusesTheSteadyStateAndAnUnevenSource() {
        Map<Side, BoundaryCondition> sides = new EnumMap<>(Side.class);
        sides.put(Side.XMIN, new BoundaryCondition.Neumann(Expression.parse("5", "y", "t")));
        sides.put(Side.XMAX, new BoundaryCondition.Neumann(Expression.parse("0", "y", "t")));
        sides.put(Side.YMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        sides.put(Side.YMAX, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        Problem steady = new Problem(new Rectangle(1, 1), Material.ofDiffusivity(1), Expression.parse("0", "x", "y"),
            xyt("0"), sides, true);
        OracleException e = assertThrows(OracleException.class, () -> Oracle.prepare(steady, 0, 1e-8));
        assertEquals(OracleException.Reason.UNSUPPORTED, e.reason());
        assertTrue(e.getMessage().contains("steady"), e.getMessage());
        Problem uneven = new Problem(new Rectangle(1, 1), Material.ofDiffusivity(1), Expression.parse("0", "x", "y"),
            xyt("5*x*t"), sides);
        e = assertThrows(OracleException.class, () -> Oracle.prepare(uneven, 1, 1e-8));
        assertTrue(e.getMessage().startsWith("source: changes in time other than uniformly"), e.getMessage());
    }

    /**
     * A uniform source switched on as 300 (1 - exp(-2t)) W/m^3 in a plate heated through one side: the
     * source only raises the mean, by its time integral, so u = u_flux + (300 / (rho c)) (t - (1 - exp(-2t))/2)
     * (superposition, common practice), u_flux the same plate without the source.
     */
    @Test
    void uniformSourceSwitchedOnOnlyRaisesTheMean() {
        Material m = new Material(2, 4);
        Map<Side, BoundaryCondition> sides = new EnumMap<>(Side.class);
        sides.put(Side.XMIN, new BoundaryCondition.Neumann(Expression.parse("50*(1 + y)", "y", "t")));
        sides.put(Side.XMAX, new BoundaryCondition.Neumann(Expression.parse("0", "y", "t")));
        sides.put(Side.YMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        sides.put(Side.YMAX, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        Expression initial = Expression.parse("20 + x*y", "x", "y");
        Oracle heated = Oracle.prepare(new Problem(new Rectangle(1, 0.5), m, initial, xyt("300*(1 - exp(-2*t))"), sides),
            2, 1e-10);
        Oracle plain = Oracle.prepare(new Problem(new Rectangle(1, 0.5), m, initial, xyt("0"), sides), 2, 1e-10);
        for (double t : new double[] {0.1, 1, 2}) {
            double rise = 300 / 4.0 * (t - (1 - Math.exp(-2 * t)) / 2);
            for (double[] q : new double[][] {{0.5, 0.25}, {0.9, 0.45}}) {
                Evaluation e = heated.temperature(q, t);
                Evaluation f = plain.temperature(q, t);
                assertTrue(Math.abs(e.value() - f.value() - rise) <= e.bound() + f.bound(), "at t = " + t + ": "
                    + (e.value() - f.value()) + " against " + rise);
            }
        }
    }

    /**
     * The product of two heat polynomials (Rosenbloom and Widder 1959, from memory), u = (x^2 + 2 alpha t)
     * (y^2 + 2 alpha t), on a plate whose four sides are flux-driven: the fluxes 2 k a (y^2 + 2 alpha t) and
     * 2 k b (x^2 + 2 alpha t) on x = a and y = b grow in time (two terms each), the others vanish; the mean
     * rises with their time integral. Values, gradients and a cell mean to 1e-10 of the scale.
     */
    @Test
    void growingFluxesOnEverySideAgainstHeatPolynomials() {
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        for (Side s : new Side[] {Side.XMIN, Side.XMAX, Side.YMIN, Side.YMAX}) {
            kinds.put(s, Manufactured.Face.neumann());
        }
        SideScheduleTest.checkHeatPolynomialProduct(kinds, 29, 20);
    }
}

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
 * Rectangles whose sides change in time each on their own schedule, g(s, t) = g(s, 0) + sum theta_k(t)
 * phi_k(s): the shape series H_k, the lag Pi_k by resonant profiles and the particular modes.
 */
class SideScheduleTest {
    private static Expression xyt(String text) {
        return Expression.parse(text, "x", "y", "t");
    }

    private static void assertAgree(Evaluation e, Evaluation reference, String what) {
        assertTrue(Math.abs(e.value() - reference.value()) <= e.bound() + reference.bound(), what + ": " + e.value()
            + " +- " + e.bound() + " against " + reference.value() + " +- " + reference.bound());
    }

    /**
     * A side heated as theta(t) sin(pi x / a), the other sides at 0: u = sin(pi x / a) w(y, t) with
     * w_t = alpha (w_yy - (pi/a)^2 w), and w = exp(-alpha (pi/a)^2 t) z, z the slab solution with
     * z(0, t) = theta(t) exp(alpha (pi/a)^2 t) (separation of variables and an exponential substitution,
     * common practice): a second route through the certified slab oracle.
     */
    @Test
    void sineHeatedSideAgainstTheSlab() {
        Material m = new Material(1, 2);
        double a = 1;
        double b = 0.5;
        double mu2 = Math.PI * Math.PI / (a * a);
        double alpha = m.diffusivity();
        String theta = "(1 - exp(-4*t))";
        Map<Side, BoundaryCondition> sides = new EnumMap<>(Side.class);
        sides.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("0", "y", "t")));
        sides.put(Side.XMAX, new BoundaryCondition.Dirichlet(Expression.parse("0", "y", "t")));
        sides.put(Side.YMIN, new BoundaryCondition.Dirichlet(Expression.parse(theta + "*sin(pi*x)", "x", "t")));
        sides.put(Side.YMAX, new BoundaryCondition.Robin(3, Expression.parse("0", "x", "t")));
        Problem plate = new Problem(new Rectangle(a, b), m, Expression.parse("0", "x", "y"), xyt("0"), sides);
        Map<Side, BoundaryCondition> ends = new EnumMap<>(Side.class);
        ends.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse(theta + "*exp(" + alpha * mu2 + "*t)", "t")));
        ends.put(Side.XMAX, new BoundaryCondition.Robin(3, Expression.parse("0", "t")));
        Problem line = new Problem(new Slab(b), m, Expression.parse("0", "x"), Expression.parse("0", "x", "t"), ends);
        Oracle o = Oracle.prepare(plate, 1, 1e-10);
        Oracle z = Oracle.prepare(line, 1, 1e-12);
        for (double t : new double[] {0.02, 0.3, 1}) {
            double decay = Math.exp(-alpha * mu2 * t);
            for (double[] q : new double[][] {{0.5, 0.25}, {0.2, 0.05}, {0.9, 0.45}, {0.5, 0.5 - 1e-2}, {0.3, 0}}) {
                Evaluation zy = z.temperature(q[1], t);
                double shape = Math.sin(Math.PI * q[0]);
                Evaluation reference = new Evaluation(shape * decay * zy.value(), shape * decay * zy.bound());
                Evaluation e = o.temperature(q, t);
                assertAgree(e, reference, "u at " + q[0] + ", " + q[1] + ", t = " + t);
                assertTrue(e.bound() <= 1e-10 * o.temperatureScale());
            }
        }
    }

    /**
     * Insulated y sides: the plate is the slab in x, with x = 0 held at 10 + 5 sin 3t and x = a
     * convecting to 10 + 2t (two schedules, the side terms' zero mode and its polynomial lag), against
     * the slab oracle (a second route).
     */
    @Test
    void twoSchedulesOnAnInsulatedPlateAgainstTheSlab() {
        Pair pair = insulatedY(new Material(2, 5), 0.6, 0.3, "10 + 4*x*(0.6 - x)", "0", BoundaryCondition.Dirichlet::new,
            "10 + 5*sin(3*t)", data -> new BoundaryCondition.Robin(7, data), "10 + 2*t");
        assertPlateMatchesSlab(pair, 2, new double[] {0.05, 0.7, 2},
            new double[][] {{0.1, 0.15}, {0.3, 0.01}, {0.55, 0.29}, {0, 0.1}, {0.45, 0.2}});
    }

    /** A condition built from its data (Dirichlet, Neumann or Robin with its h). */
    private interface Condition {
        BoundaryCondition of(Expression data);
    }

    /** A plate insulated on its y sides and the slab along x with the same data: one problem, two routes. */
    private record Pair(Problem plate, Problem slab) {
    }

    private static Pair insulatedY(Material m, double a, double b, String initial, String source, Condition left,
                                   String leftData, Condition right, String rightData) {
        Map<Side, BoundaryCondition> sides = new EnumMap<>(Side.class);
        sides.put(Side.XMIN, left.of(Expression.parse(leftData, "y", "t")));
        sides.put(Side.XMAX, right.of(Expression.parse(rightData, "y", "t")));
        sides.put(Side.YMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        sides.put(Side.YMAX, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        Problem plate = new Problem(new Rectangle(a, b), m, Expression.parse(initial, "x", "y"), xyt(source), sides);
        Map<Side, BoundaryCondition> ends = new EnumMap<>(Side.class);
        ends.put(Side.XMIN, left.of(Expression.parse(leftData, "t")));
        ends.put(Side.XMAX, right.of(Expression.parse(rightData, "t")));
        Problem slab = new Problem(new Slab(a), m, Expression.parse(initial, "x"), Expression.parse(source, "x", "t"), ends);
        return new Pair(plate, slab);
    }

    /**
     * The plate against the slab at the points and times: values within both bounds and 1e-10 of the scale,
     * gradients (du/dx against the slab's flux, du/dy against 0) off x = 0, and one cell mean per time.
     */
    private static void assertPlateMatchesSlab(Pair pair, double horizon, double[] times, double[][] points) {
        Oracle o = Oracle.prepare(pair.plate(), horizon, 1e-10);
        Oracle line = Oracle.prepare(pair.slab(), horizon, 1e-11);
        double k = pair.plate().material().conductivity();
        double a = ((Rectangle) pair.plate().domain()).lengthX();
        double b = ((Rectangle) pair.plate().domain()).lengthY();
        for (double t : times) {
            for (double[] q : points) {
                Evaluation e = o.temperature(q, t);
                assertAgree(e, line.temperature(q[0], t), "u at " + q[0] + ", " + q[1] + ", t = " + t);
                assertTrue(e.bound() <= 1e-10 * o.temperatureScale());
                if (q[0] > 0) {
                    Evaluation[] g = o.gradient(q, t);
                    Evaluation flux = line.heatFlux(q[0], t);
                    assertAgree(g[0], new Evaluation(-flux.value() / k, flux.bound() / k), "du/dx at " + q[0] + ", t = " + t);
                    assertWithin(0, g[1], g[1].bound(), "du/dy");
                }
            }
            assertAgree(o.cellAverage(new double[] {0.2 * a, 0.1 * b}, new double[] {0.6 * a, 0.5 * b}, t),
                line.cellAverage(0.2 * a, 0.6 * a, t), "cell mean at t = " + t);
        }
    }


    /**
     * The product of two heat polynomials (Rosenbloom and Widder, Trans. AMS 92, 1959, from memory),
     * u = (x^2 + 2 alpha t)(y^2 + 2 alpha t), solves u_t = alpha Laplace u with no source; its traces
     * change in time along every side by two or three terms. Dirichlet, flux and convective sides with
     * the data derived from u: values, gradients and a cell mean to 1e-10 of the scale.
     */
    @Test
    void productOfHeatPolynomialsOnMixedSides() {
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.neumann());
        kinds.put(Side.XMAX, Manufactured.Face.robin(4));
        kinds.put(Side.YMIN, Manufactured.Face.dirichlet());
        kinds.put(Side.YMAX, Manufactured.Face.dirichlet());
        Oracle o = checkHeatPolynomialProduct(kinds, 11, 40);
        Expression exact = heatPolynomialProduct(new Material(3, 6).diffusivity());
        assertWithin(exact.value(0.3, 0, 0.9), o.temperature(new double[] {0.3, 0}, 0.9), 1e-10 * o.temperatureScale(),
            "on y = 0");
    }

    /** (x^2 + 2 alpha t)(y^2 + 2 alpha t). */
    static Expression heatPolynomialProduct(double alpha) {
        return xyt("(x^2 + " + 2 * alpha + "*t)*(y^2 + " + 2 * alpha + "*t)");
    }

    /**
     * The product of two heat polynomials on a 0.8 x 0.5 plate (k = 3, rho c = 6) with the given side kinds,
     * the data derived from it: values and gradients at random points 0.04 of the edge inside, and a cell
     * mean in closed form, to 1e-10 of the scale. Returns the oracle.
     */
    static Oracle checkHeatPolynomialProduct(Map<Side, Manufactured.Face> kinds, long seed, int points) {
        Material material = new Material(3, 6);
        double alpha = material.diffusivity();
        Expression exact = heatPolynomialProduct(alpha);
        Problem p = Manufactured.cartesian(exact, new Rectangle(0.8, 0.5), material, kinds);
        Oracle o = Oracle.prepare(p, 1.5, 1e-10);
        double limit = 1e-10 * o.temperatureScale();
        SplittableRandom random = new SplittableRandom(seed);
        for (int i = 0; i < points; i++) {
            double x = (0.04 + 0.92 * random.nextDouble()) * 0.8;
            double y = (0.04 + 0.92 * random.nextDouble()) * 0.5;
            double t = 0.02 + 1.48 * random.nextDouble();
            double[] q = {x, y};
            assertWithin(exact.value(x, y, t), o.temperature(q, t), limit, "u at " + x + ", " + y + ", " + t);
            Evaluation[] g = o.gradient(q, t);
            assertWithin(exact.derivative("x").value(x, y, t), g[0], limit / 0.5, "du/dx at " + x + ", " + y + ", " + t);
            assertWithin(exact.derivative("y").value(x, y, t), g[1], limit / 0.5, "du/dy at " + x + ", " + y + ", " + t);
        }
        // the cell mean of a product of quadratics in closed form
        double c = 2 * alpha * 0.9;
        double mx = (Math.pow(0.5, 3) - Math.pow(0.3, 3)) / (3 * 0.2) + c;
        double my = (Math.pow(0.25, 3) - Math.pow(0.1, 3)) / (3 * 0.15) + c;
        assertWithin(mx * my, o.cellAverage(new double[] {0.3, 0.1}, new double[] {0.5, 0.25}, 0.9), limit, "cell mean");
        return o;
    }

    /**
     * A side schedule together with a uniform source switched on gradually, 400 (1 - exp(-2t)) W/m^3 (the
     * common level's lag with a zero level, added to the side terms): an insulated-y plate against the
     * slab oracle with the same source (a second route).
     */
    @Test
    void sideScheduleWithAUniformSourceChangeAgainstTheSlab() {
        Pair pair = insulatedY(new Material(2, 5), 0.6, 0.3, "10", "400*(1 - exp(-2*t))", BoundaryCondition.Dirichlet::new,
            "10 + 5*sin(3*t)", data -> new BoundaryCondition.Robin(7, data), "10");
        assertPlateMatchesSlab(pair, 2, new double[] {0.05, 0.7, 2}, new double[][] {{0.1, 0.15}, {0.3, 0.01}, {0.55, 0.29}});
    }

    /**
     * A flux side whose input grows, 2 + 3 sin 2t (W/m^2 into the body), on a plate with insulated y sides
     * and x = a held at 5 t: against the slab oracle (a second route), values, gradients and cell means.
     */
    @Test
    void growingFluxAgainstTheSlab() {
        Pair pair = insulatedY(new Material(4, 3), 0.5, 0.4, "1 - 4*x^2", "0", BoundaryCondition.Neumann::new,
            "2 + 3*sin(2*t)", BoundaryCondition.Dirichlet::new, "5*t");
        assertPlateMatchesSlab(pair, 3, new double[] {0.1, 1.3, 3},
            new double[][] {{0.05, 0.2}, {0.25, 0.01}, {0.45, 0.39}, {0.2, 0.3}});
    }

    /**
     * A box face heated as theta(t) sin(pi x / a) sin(pi y / b), the other faces at 0: u = sin sin w(z, t)
     * with w_t = alpha (w_zz - mu^2 w), mu^2 = (pi/a)^2 + (pi/b)^2, against the slab oracle through the same
     * substitution as the rectangle's (common practice), at tolerance 1e-8.
     */
    @Test
    void sineHeatedFaceOfABoxAgainstTheSlab() {
        Material m = new Material(1, 2);
        double a = 1;
        double b = 0.8;
        double c = 0.5;
        double mu2 = Math.PI * Math.PI * (1 / (a * a) + 1 / (b * b));
        double alpha = m.diffusivity();
        String theta = "(1 - exp(-4*t))";
        String[] xyzt = {"x", "y", "z", "t"};
        Map<Side, BoundaryCondition> faces = new EnumMap<>(Side.class);
        for (Side s : new Side[] {Side.XMIN, Side.XMAX, Side.YMIN, Side.YMAX}) {
            faces.put(s, new BoundaryCondition.Dirichlet(Expression.parse("0", xyzt)));
        }
        faces.put(Side.ZMIN, new BoundaryCondition.Dirichlet(Expression.parse(theta + "*sin(pi*x)*sin(pi*y/0.8)", xyzt)));
        faces.put(Side.ZMAX, new BoundaryCondition.Robin(3, Expression.parse("0", xyzt)));
        Problem box = new Problem(new Box(a, b, c), m, Expression.parse("0", "x", "y", "z"),
            Expression.parse("0", xyzt), faces);
        Map<Side, BoundaryCondition> ends = new EnumMap<>(Side.class);
        ends.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse(theta + "*exp(" + alpha * mu2 + "*t)", "t")));
        ends.put(Side.XMAX, new BoundaryCondition.Robin(3, Expression.parse("0", "t")));
        Problem line = new Problem(new Slab(c), m, Expression.parse("0", "x"), Expression.parse("0", "x", "t"), ends);
        Oracle o = Oracle.prepare(box, 0.6, 1e-8);
        Oracle z = Oracle.prepare(line, 0.6, 1e-11);
        for (double t : new double[] {0.1, 0.6}) {
            double decay = Math.exp(-alpha * mu2 * t);
            for (double[] q : new double[][] {{0.5, 0.4, 0.25}, {0.2, 0.3, 0.1}, {0.8, 0.6, 0.45}}) {
                Evaluation zz = z.temperature(q[2], t);
                double shape = Math.sin(Math.PI * q[0]) * Math.sin(Math.PI * q[1] / 0.8);
                Evaluation reference = new Evaluation(shape * decay * zz.value(), shape * decay * zz.bound());
                Evaluation e = o.temperature(q, t);
                assertAgree(e, reference, "u at " + java.util.Arrays.toString(q) + ", t = " + t);
                assertTrue(e.bound() <= 1e-8 * o.temperatureScale());
            }
        }
    }

    /**
     * A box with insulated y and z faces, x = 0 held at 10 + 5 sin 3t and x = a convecting to 10 + 2t:
     * the slab (a second route), values and the gradient along x, at tolerance 1e-8.
     */
    @Test
    void twoSchedulesOnAnInsulatedBoxAgainstTheSlab() {
        Material m = new Material(2, 5);
        String[] xyzt = {"x", "y", "z", "t"};
        Map<Side, BoundaryCondition> faces = new EnumMap<>(Side.class);
        faces.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("10 + 5*sin(3*t)", xyzt)));
        faces.put(Side.XMAX, new BoundaryCondition.Robin(7, Expression.parse("10 + 2*t", xyzt)));
        for (Side s : new Side[] {Side.YMIN, Side.YMAX, Side.ZMIN, Side.ZMAX}) {
            faces.put(s, new BoundaryCondition.Neumann(Expression.parse("0", xyzt)));
        }
        Problem box = new Problem(new Box(0.6, 0.3, 0.2), m, Expression.parse("10 + 4*x*(0.6 - x)", "x", "y", "z"),
            Expression.parse("0", xyzt), faces);
        Map<Side, BoundaryCondition> ends = new EnumMap<>(Side.class);
        ends.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("10 + 5*sin(3*t)", "t")));
        ends.put(Side.XMAX, new BoundaryCondition.Robin(7, Expression.parse("10 + 2*t", "t")));
        Problem slab = new Problem(new Slab(0.6), m, Expression.parse("10 + 4*x*(0.6 - x)", "x"),
            Expression.parse("0", "x", "t"), ends);
        Oracle o = Oracle.prepare(box, 2, 1e-8);
        Oracle line = Oracle.prepare(slab, 2, 1e-11);
        for (double t : new double[] {0.05, 0.7, 2}) {
            for (double[] q : new double[][] {{0.1, 0.15, 0.1}, {0.3, 0.01, 0.19}, {0.55, 0.29, 0.02}}) {
                Evaluation e = o.temperature(q, t);
                assertAgree(e, line.temperature(q[0], t), "u at " + java.util.Arrays.toString(q) + ", t = " + t);
                Evaluation[] g = o.gradient(q, t);
                Evaluation flux = line.heatFlux(q[0], t);
                assertAgree(g[0], new Evaluation(-flux.value() / 2, flux.bound() / 2), "du/dx at " + q[0] + ", t = " + t);
            }
        }
    }

    /**
     * The product of three heat polynomials (Rosenbloom and Widder, from memory), u = (x^2 + 2 alpha t)
     * (y^2 + 2 alpha t)(z^2 + 2 alpha t), with Dirichlet, flux and convective faces: three terms per face.
     * Values at points 0.15 of the edge inside the box to 1e-8 of the scale, gradients to 1e-6.
     */
    @Test
    void productOfHeatPolynomialsInABox() {
        double k = 2;
        Material material = new Material(k, 4);
        double alpha = material.diffusivity();
        String c = Double.toString(2 * alpha);
        Expression exact = Expression.parse("(x^2 + " + c + "*t)*(y^2 + " + c + "*t)*(z^2 + " + c + "*t)",
            "x", "y", "z", "t");
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.neumann());
        kinds.put(Side.XMAX, Manufactured.Face.dirichlet());
        kinds.put(Side.YMIN, Manufactured.Face.dirichlet());
        kinds.put(Side.YMAX, Manufactured.Face.robin(3));
        kinds.put(Side.ZMIN, Manufactured.Face.neumann());
        kinds.put(Side.ZMAX, Manufactured.Face.dirichlet());
        Problem p = Manufactured.cartesian(exact, new Box(1, 0.8, 0.6), material, kinds);
        Oracle o = Oracle.prepare(p, 1, 1e-8);
        double limit = 1e-8 * o.temperatureScale();
        // gradients converge more slowly in a box (its cap is 64 modes per axis): checked at 1e-6
        Oracle coarse = Oracle.prepare(p, 1, 1e-6);
        double gradientLimit = 1e-6 * coarse.temperatureScale() / 0.6;
        SplittableRandom random = new SplittableRandom(17);
        int n = 8;
        double[] points = new double[3 * n];
        double[] times = new double[n];
        for (int i = 0; i < n; i++) {
            points[3 * i] = 0.15 + 0.7 * random.nextDouble();
            points[3 * i + 1] = (0.15 + 0.7 * random.nextDouble()) * 0.8;
            points[3 * i + 2] = (0.15 + 0.7 * random.nextDouble()) * 0.6;
            times[i] = i < n / 2 ? 0.3 : 1;
        }
        double[] value = new double[n];
        double[] bound = new double[n];
        o.evaluatePoints(points, times, value, bound, null, null);
        double[] gradient = new double[3 * n];
        double[] gradientBound = new double[n];
        coarse.evaluatePoints(points, times, new double[n], new double[n], gradient, gradientBound);
        for (int i = 0; i < n; i++) {
            double x = points[3 * i];
            double y = points[3 * i + 1];
            double z = points[3 * i + 2];
            double t = times[i];
            String at = x + ", " + y + ", " + z + ", " + t;
            assertWithin(exact.value(x, y, z, t), new Evaluation(value[i], bound[i]), limit, "u at " + at);
            assertWithin(exact.derivative("x").value(x, y, z, t), new Evaluation(gradient[3 * i], gradientBound[i]),
                gradientLimit, "du/dx at " + at);
            assertWithin(exact.derivative("z").value(x, y, z, t), new Evaluation(gradient[3 * i + 2], gradientBound[i]),
                gradientLimit, "du/dz at " + at);
        }
    }

    @Test
    void refusesChangesThatAreNotFewProducts() {
        Map<Side, BoundaryCondition> sides = new EnumMap<>(Side.class);
        sides.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("10 + sin(5*y*t)", "y", "t")));
        sides.put(Side.XMAX, new BoundaryCondition.Dirichlet(Expression.parse("10", "y", "t")));
        sides.put(Side.YMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        sides.put(Side.YMAX, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        Problem wave = new Problem(new Rectangle(1, 1), Material.ofDiffusivity(1), Expression.parse("10", "x", "y"),
            xyt("0"), sides);
        OracleException e = assertThrows(OracleException.class, () -> Oracle.prepare(wave, 2, 1e-8));
        assertEquals(OracleException.Reason.UNSUPPORTED, e.reason());
        assertTrue(e.getMessage().startsWith("boundary.xmin: changes in time in a way that is not a sum"), e.getMessage());

        String[] xyzt = {"x", "y", "z", "t"};
        Map<Side, BoundaryCondition> faces = new EnumMap<>(Side.class);
        for (Side s : new Side[] {Side.XMIN, Side.XMAX, Side.YMIN, Side.YMAX, Side.ZMIN}) {
            faces.put(s, new BoundaryCondition.Dirichlet(Expression.parse("0", xyzt)));
        }
        faces.put(Side.ZMAX, new BoundaryCondition.Neumann(Expression.parse("exp(-x*y*t)", xyzt)));
        Problem box = new Problem(new Box(1, 1, 1), Material.ofDiffusivity(1), Expression.parse("0", "x", "y", "z"),
            Expression.parse("0", xyzt), faces);
        e = assertThrows(OracleException.class, () -> Oracle.prepare(box, 3, 1e-8));
        assertEquals(OracleException.Reason.UNSUPPORTED, e.reason());
        assertTrue(e.getMessage().startsWith("boundary.zmax: changes in time in a way that is not a sum"), e.getMessage());
    }
}

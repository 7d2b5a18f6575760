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
import eigencheck.oracle.problem.Domain;
import eigencheck.oracle.problem.Manufactured;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Rectangle;
import eigencheck.oracle.problem.Side;
import java.util.EnumMap;
import java.util.Map;
import java.util.SplittableRandom;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegrator;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegratorFactory;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.junit.jupiter.api.Test;

/**
 * Rectangles and boxes whose side temperatures and ambients follow one schedule b(t) on top of data
 * constant in time: the quasi-static subtraction u = b + S - b' P + v.
 */
class MovingLevelTest {
    private static Expression xyt(String text) {
        return Expression.parse(text, "x", "y", "t");
    }

    /**
     * u = c t + c |x|^2 / (2 d alpha) solves u_t = alpha Laplace u with no source (common practice: a
     * uniform heating rate); its traces rise by the common level c t and are constant in time otherwise.
     */
    private static Expression ramp(double c, double alpha, int d) {
        String square = d == 2 ? "(x^2 + y^2)" : "(x^2 + y^2 + z^2)";
        String text = c + "*t + " + c / (2 * d * alpha) + "*" + square;
        return d == 2 ? xyt(text) : Expression.parse(text, "x", "y", "z", "t");
    }

    @Test
    void linearRampOnMixedSidesOfARectangle() {
        double k = 2;
        double heatCapacity = 4;
        Expression exact = ramp(3, k / heatCapacity, 2);
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.dirichlet());
        kinds.put(Side.XMAX, Manufactured.Face.robin(5));
        kinds.put(Side.YMIN, Manufactured.Face.neumann());
        kinds.put(Side.YMAX, Manufactured.Face.dirichlet());
        Problem p = Manufactured.cartesian(exact, new Rectangle(0.8, 0.5), new Material(k, heatCapacity), kinds);
        Oracle o = Oracle.prepare(p, 2, 1e-10);
        double limit = 1e-10 * o.temperatureScale();
        SplittableRandom random = new SplittableRandom(3);
        for (int i = 0; i < 60; i++) {
            double x = (0.03 + 0.94 * random.nextDouble()) * 0.8;
            double y = (0.03 + 0.94 * random.nextDouble()) * 0.5;
            double t = 0.01 + 1.99 * random.nextDouble();
            double[] q = {x, y};
            assertWithin(exact.value(x, y, t), o.temperature(q, t), limit, "u at " + x + ", " + y + ", " + t);
            Evaluation[] g = o.gradient(q, t);
            assertWithin(exact.derivative("x").value(x, y, t), g[0], limit / 0.5, "du/dx");
            assertWithin(exact.derivative("y").value(x, y, t), g[1], limit / 0.5, "du/dy");
        }
        // on the Dirichlet side x = 0 the answer is the data at time t; a cell mean against its closed form
        assertWithin(exact.value(0, 0.2, 1.5), o.temperature(new double[] {0, 0.2}, 1.5), limit, "on x = 0");
        double mean = 3 * 1.5 + 3 / (4 * 0.5) * ((0.5 * 0.5 * 0.5 - 0.3 * 0.3 * 0.3) / 3 / 0.2
            + (0.25 * 0.25 * 0.25 - 0.1 * 0.1 * 0.1) / 3 / 0.15);
        assertWithin(mean, o.cellAverage(new double[] {0.3, 0.1}, new double[] {0.5, 0.25}, 1.5), limit, "cell mean");
    }

    @Test
    void linearRampInABox() {
        double alpha = 0.25;
        Expression exact = ramp(-2, alpha, 3);
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        for (Side s : new Side[] {Side.XMIN, Side.XMAX, Side.YMIN, Side.ZMAX}) {
            kinds.put(s, Manufactured.Face.dirichlet());
        }
        kinds.put(Side.YMAX, Manufactured.Face.robin(3));
        kinds.put(Side.ZMIN, Manufactured.Face.neumann());
        Problem p = Manufactured.cartesian(exact, new Box(0.5, 0.4, 0.3), Material.ofDiffusivity(alpha), kinds);
        Oracle o = Oracle.prepare(p, 1, 1e-9);
        SplittableRandom random = new SplittableRandom(8);
        for (int i = 0; i < 20; i++) {
            double[] q = {(0.2 + 0.6 * random.nextDouble()) * 0.5, (0.2 + 0.6 * random.nextDouble()) * 0.4,
                (0.2 + 0.6 * random.nextDouble()) * 0.3};
            double t = 0.05 + 0.95 * random.nextDouble();
            assertWithin(exact.value(q[0], q[1], q[2], t), o.temperature(q, t), 1e-9 * o.temperatureScale(),
                "u at point " + i + ", t = " + t);
        }
    }

    /**
     * A plate 0.6 m x 0.4 m convecting on all sides (h = 4 W/(m^2 K), k = 1.5 W/(m K), rho c = 3 J/(m^3 K)) to
     * an ambient that rises as b(t) = 50 (1 - exp(-t / 0.2)) from the plate's initial 0. By Duhamel's theorem
     * (Carslaw and Jaeger, Conduction of Heat in Solids, 2nd ed., 1959, section 1.14; recalled from memory)
     * u = b(t) - int_0^t b'(t - s) F_x(x, s) F_y(y, s) ds, F the plane wall cooled from 1 to 0: the full series
     * sum C_n cos(zeta_n xi / l) exp(-zeta_n^2 alpha s / l^2), C_n = 4 sin zeta_n / (2 zeta_n + sin 2 zeta_n),
     * zeta_n tan zeta_n = Bi (Incropera et al., Fundamentals of Heat and Mass Transfer, 6th ed., eq. 5.39a-b),
     * summed to 1500 terms with roots from Commons Math's Brent solver, independently of the oracle's modes.
     */
    @Test
    void risingAmbientMatchesDuhamelsTheoremWithPlaneWallSeries() {
        double lx = 0.6;
        double ly = 0.4;
        double k = 1.5;
        double h = 4;
        double alpha = 0.5;
        Map<Side, BoundaryCondition> faces = new EnumMap<>(Side.class);
        faces.put(Side.XMIN, new BoundaryCondition.Robin(h, Expression.parse("50*(1 - exp(-t/0.2))", "y", "t")));
        faces.put(Side.XMAX, new BoundaryCondition.Robin(h, Expression.parse("50*(1 - exp(-t/0.2))", "y", "t")));
        faces.put(Side.YMIN, new BoundaryCondition.Robin(h, Expression.parse("50*(1 - exp(-t/0.2))", "x", "t")));
        faces.put(Side.YMAX, new BoundaryCondition.Robin(h, Expression.parse("50*(1 - exp(-t/0.2))", "x", "t")));
        Problem p = new Problem(new Rectangle(lx, ly), new Material(k, k / alpha), Expression.parse("0", "x", "y"),
            xyt("0"), faces);
        Oracle o = Oracle.prepare(p, 1, 1e-9);
        PlaneWall fx = new PlaneWall(lx / 2, h * lx / 2 / k, alpha);
        PlaneWall fy = new PlaneWall(ly / 2, h * ly / 2 / k, alpha);
        double[][] points = {{0.3, 0.2}, {0.1, 0.05}, {0.55, 0.3}, {0.2, 0.37}};
        for (double t : new double[] {0.05, 0.3, 1}) {
            for (double[] q : points) {
                double lag = duhamel(s -> 50 / 0.2 * Math.exp(-s / 0.2), fx, fy, q, t);
                double exact = 50 * (1 - Math.exp(-t / 0.2)) - lag;
                Evaluation e = o.temperature(q, t);
                assertWithin(exact, e, 1e-9 * o.temperatureScale(), "u at " + q[0] + ", " + q[1] + ", t = " + t);
            }
        }
        // gradients converge more slowly (a wider box is built for them on the first request)
        double limit = 1e-9 * o.temperatureScale() / 0.4;
        for (double[] q : new double[][] {{0.1, 0.05}, {0.55, 0.3}}) {
            double t = 0.3;
            Evaluation[] g = o.gradient(q, t);
            double dx = -duhamel(s -> 50 / 0.2 * Math.exp(-s / 0.2), fx.derivative(), fy, q, t);
            double dy = -duhamel(s -> 50 / 0.2 * Math.exp(-s / 0.2), fx, fy.derivative(), q, t);
            assertWithin(dx, g[0], limit, "du/dx at " + q[0] + ", " + q[1]);
            assertWithin(dy, g[1], limit, "du/dy at " + q[0] + ", " + q[1]);
        }
    }

    /** int_0^t b'(t - s) F_x(x, s) F_y(y, s) ds by 20-point Gauss-Legendre rules on 200 panels. */
    private static double duhamel(java.util.function.DoubleUnaryOperator rate, PlaneWall fx, PlaneWall fy,
                                  double[] q, double t) {
        int panels = 200;
        double sum = 0;
        for (int i = 0; i < panels; i++) {
            GaussIntegrator rule = new GaussIntegratorFactory().legendre(20, t * i / panels, t * (i + 1) / panels);
            sum += rule.integrate(s -> rate.applyAsDouble(t - s) * fx.value(q[0], s) * fy.value(q[1], s));
        }
        return sum;
    }

    /**
     * The plane wall of half-thickness l (0 < x < 2l), initially 1, convecting to 0 at Biot number bi, or
     * (derivative) its x-derivative, the series differentiated term by term.
     */
    private static final class PlaneWall {
        private final double l;
        private final double alpha;
        private final boolean slope;
        private final double[] zeta = new double[1500];
        private final double[] c = new double[1500];

        PlaneWall(double l, double bi, double alpha) {
            this.l = l;
            this.alpha = alpha;
            this.slope = false;
            BrentSolver solver = new BrentSolver(1e-15, 1e-15);
            for (int n = 0; n < zeta.length; n++) {
                double lo = n * Math.PI;
                zeta[n] = solver.solve(200, z -> z * Math.sin(z) - bi * Math.cos(z), lo + 1e-12, lo + Math.PI / 2);
                c[n] = 4 * Math.sin(zeta[n]) / (2 * zeta[n] + Math.sin(2 * zeta[n]));
            }
        }

        private PlaneWall(PlaneWall of) {
            this.l = of.l;
            this.alpha = of.alpha;
            this.slope = true;
            System.arraycopy(of.zeta, 0, zeta, 0, zeta.length);
            System.arraycopy(of.c, 0, c, 0, c.length);
        }

        PlaneWall derivative() {
            return new PlaneWall(this);
        }

        double value(double x, double s) {
            // below alpha s / l^2 = 4e-5 the points used here (at least 0.15 l from a side) have not felt the
            // sides (1 - F < erfc(11)); 1500 terms reach exp(-40) from there on
            if (alpha * s / (l * l) < 4e-5) {
                return slope ? 0 : 1;
            }
            double xi = (x - l) / l;
            double sum = 0;
            for (int n = 0; n < zeta.length; n++) {
                double decay = Math.exp(-zeta[n] * zeta[n] * alpha * s / (l * l));
                sum += slope ? -c[n] * zeta[n] / l * Math.sin(zeta[n] * xi) * decay : c[n] * Math.cos(zeta[n] * xi) * decay;
            }
            return sum;
        }
    }

    /**
     * u = sin t + c |x|^2 (common practice): the sides move by sin t and the source is
     * rho c (cos t - 2 d c alpha), uniform in space and changing in time: the lag follows r = b' - sigma.
     */
    @Test
    void uniformSourceChangingInTimeInARectangle() {
        double k = 1.5;
        double alpha = 0.3;
        Expression exact = xyt("sin(t) + 2*(x^2 + y^2)");
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.dirichlet());
        kinds.put(Side.XMAX, Manufactured.Face.dirichlet());
        kinds.put(Side.YMIN, Manufactured.Face.neumann());
        kinds.put(Side.YMAX, Manufactured.Face.dirichlet());
        Problem p = Manufactured.cartesian(exact, new Rectangle(0.5, 0.4), new Material(k, k / alpha), kinds);
        Oracle o = Oracle.prepare(p, 3, 1e-10);
        SplittableRandom random = new SplittableRandom(12);
        for (int i = 0; i < 30; i++) {
            double x = (0.05 + 0.9 * random.nextDouble()) * 0.5;
            double y = (0.05 + 0.9 * random.nextDouble()) * 0.4;
            double t = 0.02 + 2.9 * random.nextDouble();
            assertWithin(exact.value(x, y, t), o.temperature(new double[] {x, y}, t), 1e-10 * o.temperatureScale(),
                "u at " + x + ", " + y + ", " + t);
        }
        // a source changing by terms (shape) x (schedule) is taken (SourceChangeTest), a moving spot is not
        Problem spot = new Problem(p.domain(), p.material(), p.initial(), xyt("exp(-(x - 0.1*t)^2/0.01)"),
            p.boundary());
        OracleException e = assertThrows(OracleException.class, () -> Oracle.prepare(spot, 1, 1e-8));
        assertTrue(e.getMessage().startsWith("source: changes in time in a way that is not a sum"), e.getMessage());
    }

    /**
     * With both y sides insulated, a plate whose x sides follow 10 + 5 sin(3 t) (one held there, one convecting
     * to it) from a non-uniform start is the slab's problem along x; the slab oracle, verified against NAFEMS T3
     * and closed forms, is the second route (common practice). The y axis then has the zero mode, so the lag's
     * series reduces to its closed-form quadratic.
     */
    @Test
    void insulatedPairReducesToTheSlab() {
        Material m = new Material(2, 5);
        String level = "10 + 5*sin(3*t)";
        Map<Side, BoundaryCondition> faces = new EnumMap<>(Side.class);
        faces.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse(level, "y", "t")));
        faces.put(Side.XMAX, new BoundaryCondition.Robin(7, Expression.parse(level, "y", "t")));
        faces.put(Side.YMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        faces.put(Side.YMAX, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        Problem plate = new Problem(new Rectangle(0.6, 0.3), m, Expression.parse("10 + 4*x*(0.6 - x)", "x", "y"),
            xyt("0"), faces);
        Map<Side, BoundaryCondition> ends = new EnumMap<>(Side.class);
        ends.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse(level, "t")));
        ends.put(Side.XMAX, new BoundaryCondition.Robin(7, Expression.parse(level, "t")));
        Problem slab = new Problem(new eigencheck.oracle.problem.Slab(0.6), m, Expression.parse("10 + 4*x*(0.6 - x)", "x"),
            Expression.parse("0", "x", "t"), ends);
        Oracle o = Oracle.prepare(plate, 2, 1e-10);
        Oracle line = Oracle.prepare(slab, 2, 1e-10);
        for (double t : new double[] {0.05, 0.7, 2}) {
            for (double[] q : new double[][] {{0.1, 0.15}, {0.3, 0}, {0.55, 0.3}, {0.6, 0.1}, {0.45, 0.2}}) {
                Evaluation e = o.temperature(q, t);
                Evaluation reference = line.temperature(q[0], t);
                assertTrue(Math.abs(e.value() - reference.value()) <= e.bound() + reference.bound(), "u at " + q[0] + ", "
                    + q[1] + ", t = " + t + ": " + e.value() + " +- " + e.bound() + " against the slab's " + reference.value()
                    + " +- " + reference.bound());
            }
        }
    }
}

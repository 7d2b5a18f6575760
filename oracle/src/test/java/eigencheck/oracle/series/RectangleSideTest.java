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
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegrator;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegratorFactory;
import org.junit.jupiter.api.Test;

/**
 * Points on and next to a rectangle's side whose data do not meet the conditions of the side's ends (the
 * lifted form of that side's series): values, gradients and cell means on the side itself, and refusals
 * only next to the corners.
 */
class RectangleSideTest {
    private static final double K = 1;
    private static final double H = 2;

    /**
     * The mean of u over the cell {x0, y0, x1, y1} at t by a 20 x 20 Gauss-Legendre rule (Commons Math; the fields
     * here are smooth, so to rounding).
     */
    private static double gaussMean(Expression u, double[] cell, double t) {
        GaussIntegrator rule = new GaussIntegratorFactory().legendre(20, 0, 1);
        double mean = 0;
        for (int a = 0; a < 20; a++) {
            for (int b = 0; b < 20; b++) {
                mean += rule.getWeight(a) * rule.getWeight(b) * u.value(cell[0] + (cell[2] - cell[0]) * rule.getPoint(a),
                    cell[1] + (cell[3] - cell[1]) * rule.getPoint(b), t);
            }
        }
        return mean;
    }

    /** Unit square, held at 0 on x = 0, insulated on y = 0 and y = 1, convecting (h = 2) to 50 y on x = 1. */
    private static Problem slopingAmbient() {
        Map<Side, BoundaryCondition> faces = new EnumMap<>(Side.class);
        faces.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("0", "y", "t")));
        faces.put(Side.XMAX, new BoundaryCondition.Robin(H, Expression.parse("50*y", "y", "t")));
        faces.put(Side.YMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        faces.put(Side.YMAX, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        return new Problem(new Rectangle(1, 1), Material.ofDiffusivity(K), Expression.parse("0", "x", "y"),
            Expression.parse("0", "x", "y", "t"), faces, true);
    }

    /**
     * The same problem by separation of variables along y (common practice): u = 50 x / (k + h) + sum over odd n of
     * G_n cos(n pi y) sinh(n pi x) / (k n pi cosh(n pi) + h sinh(n pi)), G_n = -400 / (n pi)^2, summed to n = 4e6;
     * what it leaves out is at most sum 400 / (pi^3 k n^3) < 400 / (2 pi^3 k N^2) = 4e-13 here.
     */
    private static double[] seriesAcross(double x, double y) {
        double sum = 50 * x / (K + H);
        int last = 4_000_000;
        for (int n = last - 1; n >= 1; n -= 2) {
            double w = n * Math.PI;
            double g = -400 / (w * w);
            // sinh(w x) / (k w cosh w + h sinh w), without overflow
            double e = Math.exp(-w * (1 - x)) * -Math.expm1(-2 * w * x);
            double ratio = e / (K * w * (1 + Math.exp(-2 * w)) + H * -Math.expm1(-2 * w));
            sum += g * Math.cos(w * y) * ratio;
        }
        double tail = 400 / (2 * Math.pow(Math.PI, 3) * K * (double) last * last);
        return new double[] {sum, tail};
    }

    @Test
    void slopingAmbientOnAConvectiveSideAgainstTheSeriesAcross() {
        Oracle o = Oracle.prepare(slopingAmbient(), 0, 1e-10);
        double limit = 1e-10 * o.temperatureScale();
        double[][] points = {{1, 0.5}, {1, 0.05}, {1, 0.3}, {1, 0.8}, {1, 0.97}, {0.9999, 0.3}, {0.999, 0.62}};
        for (double[] p : points) {
            double[] reference = seriesAcross(p[0], p[1]);
            Evaluation u = o.temperature(p, 0);
            assertTrue(Math.abs(u.value() - reference[0]) <= u.bound() + reference[1],
                "u at " + p[0] + ", " + p[1] + ": " + u + " against " + reference[0]);
            assertTrue(u.bound() <= limit, "bound " + u.bound() + " at " + p[0] + ", " + p[1]);
        }
        // du/dx on the side from its own condition, k du/dx = h (50 y - u), with u from the series
        for (double y : new double[] {0.05, 0.5, 0.9}) {
            double u = seriesAcross(1, y)[0];
            Evaluation[] g = o.gradient(new double[] {1, y}, 0);
            assertWithin(H * (50 * y - u) / K, g[0], limit, "du/dx on the convective side at y = " + y);
        }
    }

    @Test
    void pointsNextToTheCornerAreRefusedWithTheCorner() {
        Oracle o = Oracle.prepare(slopingAmbient(), 0, 1e-10);
        OracleException e = assertThrows(OracleException.class, () -> o.temperature(new double[] {1, 1e-6}, 0));
        assertEquals(OracleException.Reason.TOO_MANY_MODES, e.reason());
        assertTrue(e.getMessage().contains("corner"), e.getMessage());
    }

    /**
     * A manufactured field whose data meet nowhere at the sides' ends as the series' modes do (common practice):
     * u = 2 + exp(x) cos(y) + x y + 3 x (1 - x) + exp(-alpha lambda t) sin(pi x) cos(nu y) on 1 x 0.7, k = 1,
     * temperature on x = 0 and x = 1, flux on y = 0 and convection (h = 4) on y = 0.7, nu the first root of
     * nu tan(0.7 nu) = h/k; the source 6 k is constant. Points on the flux and convective sides and next to the
     * corners, gradients there, and cell means touching the sides against a 20 x 20 Gauss-Legendre rule.
     */
    @Test
    void manufacturedFieldOnItsSides() {
        double h = 4;
        double ly = 0.7;
        double nu = eigencheck.oracle.modes.SlabModes.root(1, 0, h * ly) / ly;
        double lambda = Math.PI * Math.PI + nu * nu;
        Expression exact = Expression.parse("2 + exp(x)*cos(y) + x*y + 3*x*(1-x) + exp(-" + lambda + "*t)*sin(pi*x)*cos("
            + nu + "*y)", "x", "y", "t");
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.dirichlet());
        kinds.put(Side.XMAX, Manufactured.Face.dirichlet());
        kinds.put(Side.YMIN, Manufactured.Face.neumann());
        kinds.put(Side.YMAX, Manufactured.Face.robin(h));
        Problem p = Manufactured.cartesian(exact, new Rectangle(1, ly), Material.ofDiffusivity(1), kinds);
        Oracle o = Oracle.prepare(p, 1, 1e-10);
        double limit = 1e-10 * o.temperatureScale();
        double[][] points = {{0.5, ly}, {0.2, ly}, {0.93, ly}, {0.5, 0}, {0.07, 0}, {0.01, ly}, {0.99, 0.01},
            {0.3, 0.9999 * ly}, {0.6, 1e-4}};
        for (double[] q : points) {
            for (double t : new double[] {0.05, 0.4, 1}) {
                assertWithin(exact.value(q[0], q[1], t), o.temperature(q, t), limit,
                    "u at " + q[0] + ", " + q[1] + ", t = " + t);
            }
        }
        Oracle loose = Oracle.prepare(p, 1, 1e-8);
        double gradientLimit = 1e-8 * loose.temperatureScale() / 0.7;
        for (double[] q : new double[][] {{0.5, ly}, {0.3, ly}, {0.5, 0}, {0.8, 0}}) {
            Evaluation[] g = loose.gradient(q, 0.3);
            assertWithin(exact.derivative("x").value(q[0], q[1], 0.3), g[0], gradientLimit, "du/dx at " + q[0] + ", " + q[1]);
            assertWithin(exact.derivative("y").value(q[0], q[1], 0.3), g[1], gradientLimit, "du/dy at " + q[0] + ", " + q[1]);
        }
        double[][] cells = {{0.4, 0.6, 0.6, ly}, {0.1, 0, 0.25, 0.05}, {0.45, 0.69, 0.55, ly}};
        for (double[] c : cells) {
            assertWithin(gaussMean(exact, c, 0.2), o.cellAverage(new double[] {c[0], c[1]}, new double[] {c[2], c[3]}, 0.2), limit,
                "cell mean from " + c[0] + ", " + c[1]);
        }
    }
    /**
     * Convection on three sides with three different coefficients and a source along y (manufactured, common
     * practice): u = 2 + exp(x) cos(y) + x y + 4 y^2 (1 - y) on 1.2 x 0.9, k = 1.5, so Q = -k (8 - 24 y); held on
     * y = 0.9. The side data meet none of their ends' conditions; values on every side at 1e-10, du/dx and du/dy
     * on the convective sides at 1e-8.
     */
    @Test
    void manufacturedFieldWithASourceAlongTheSides() {
        Expression exact = Expression.parse("2 + exp(x)*cos(y) + x*y + 4*y^2*(1-y)", "x", "y", "t");
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.robin(3));
        kinds.put(Side.XMAX, Manufactured.Face.robin(2));
        kinds.put(Side.YMIN, Manufactured.Face.robin(1));
        kinds.put(Side.YMAX, Manufactured.Face.dirichlet());
        Problem p = Manufactured.cartesian(exact, new Rectangle(1.2, 0.9), Material.ofDiffusivity(1.5), kinds);
        Oracle o = Oracle.prepare(p, 1, 1e-10);
        double limit = 1e-10 * o.temperatureScale();
        for (int i = 0; i <= 8; i++) {
            double s = 0.05 + 0.9 * i / 8;
            double[][] onSides = {{0, 0.9 * s}, {1.2, 0.9 * s}, {1.2 * s, 0}, {1.2 * s, 1e-5}, {1.19999, 0.9 * s}};
            for (double[] q : onSides) {
                assertWithin(exact.value(q[0], q[1], 0), o.temperature(q, 0.5), limit, "u at " + q[0] + ", " + q[1]);
            }
        }
        // the corners where two convective sides meet: their data agree there as a smooth solution's do, and the
        // joint form leaves nothing at the corner
        for (double[] q : new double[][] {{0, 0}, {1.2, 0}, {1e-4, 0}, {1.2, 1e-5}, {0, 1e-3}, {1.1999, 2e-4}}) {
            assertWithin(exact.value(q[0], q[1], 0), o.temperature(q, 0.5), limit, "u at the corner " + q[0] + ", " + q[1]);
        }
        // cells touching two convective sides at their corner, and a cell 1e-4 from the held side y = 0.9
        double[][] cells = {{0, 0, 0.05, 0.04}, {1.15, 0, 1.2, 0.03}, {0.5, 0.85, 0.6, 0.8999}};
        for (double[] c : cells) {
            assertWithin(gaussMean(exact, c, 0), o.cellAverage(new double[] {c[0], c[1]}, new double[] {c[2], c[3]}, 0.5), limit,
                "cell mean from " + c[0] + ", " + c[1]);
        }
        Oracle loose = Oracle.prepare(p, 1, 1e-8);
        double gradientLimit = 1e-8 * loose.temperatureScale() / 0.9;
        for (double[] q : new double[][] {{0, 0.45}, {1.2, 0.3}, {0.6, 0}, {1.2, 0.8}, {1e-4, 1e-4}, {1.1999, 2e-4}}) {
            Evaluation[] g = loose.gradient(q, 0.5);
            assertWithin(exact.derivative("x").value(q[0], q[1], 0), g[0], gradientLimit, "du/dx at " + q[0] + ", " + q[1]);
            assertWithin(exact.derivative("y").value(q[0], q[1], 0), g[1], gradientLimit, "du/dy at " + q[0] + ", " + q[1]);
        }
    }
    /**
     * A source that is not a sum of one-coordinate terms with convection on every side (manufactured, common
     * practice): u = sin(2 x y) + x y^2 on 1 x 0.8, k = 1, h = 3, 5, 1, 2, so Q = k (4 (x^2 + y^2) sin(2 x y) - 2 x);
     * the side data do not vanish at any corner. Values on every side at 1e-9.
     */
    @Test
    void productSourceWithConvectionOnEverySide() {
        Expression exact = Expression.parse("sin(2*x*y) + x*y*y", "x", "y", "t");
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.robin(3));
        kinds.put(Side.XMAX, Manufactured.Face.robin(5));
        kinds.put(Side.YMIN, Manufactured.Face.robin(1));
        kinds.put(Side.YMAX, Manufactured.Face.robin(2));
        Problem derived = Manufactured.cartesian(exact, new Rectangle(1, 0.8), Material.ofDiffusivity(1), kinds);
        Problem steady = new Problem(derived.domain(), derived.material(), derived.initial(), derived.source(),
            derived.boundary(), true);
        Oracle o = Oracle.prepare(steady, 0, 1e-9);
        double limit = 1e-9 * o.temperatureScale();
        for (int i = 0; i <= 8; i++) {
            double s = 0.05 + 0.9 * i / 8;
            double[][] onSides = {{0, 0.8 * s}, {1, 0.8 * s}, {s, 0}, {s, 0.8}, {0.9999, 0.8 * s}};
            for (double[] q : onSides) {
                assertWithin(exact.value(q[0], q[1], 0), o.temperature(q, 0), limit, "u at " + q[0] + ", " + q[1]);
            }
        }
    }
    /**
     * Flux on both sides across (manufactured, common practice): u = 2 + exp(x) cos(y) + x y on 1 x 0.8, k = 1.5,
     * flux on x = 0 and x = 1, convection (h = 2) on y = 0, held on y = 0.8. No line across meets two flux
     * conditions, so the lifting takes the parabola across with its harmonic corrections. Values on the flux sides
     * and at their corners with the convective side at 1e-10, gradients there at 1e-8, a cell mean touching a side.
     */
    @Test
    void fluxOnBothSidesAcross() {
        Expression exact = Expression.parse("2 + exp(x)*cos(y) + x*y", "x", "y", "t");
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.neumann());
        kinds.put(Side.XMAX, Manufactured.Face.neumann());
        kinds.put(Side.YMIN, Manufactured.Face.robin(2));
        kinds.put(Side.YMAX, Manufactured.Face.dirichlet());
        Problem derived = Manufactured.cartesian(exact, new Rectangle(1, 0.8), Material.ofDiffusivity(1.5), kinds);
        Problem steady = new Problem(derived.domain(), derived.material(), derived.initial(), derived.source(),
            derived.boundary(), true);
        Oracle o = Oracle.prepare(steady, 0, 1e-10);
        double limit = 1e-10 * o.temperatureScale();
        for (double[] q : new double[][] {{0, 0.4}, {1, 0.4}, {1, 0.05}, {0, 0.75}, {0.9999, 0.3}, {0, 0}, {1, 0},
            {0.5, 0}}) {
            assertWithin(exact.value(q[0], q[1], 0), o.temperature(q, 0), limit, "u at " + q[0] + ", " + q[1]);
        }
        Oracle loose = Oracle.prepare(steady, 0, 1e-8);
        double gradientLimit = 1e-8 * loose.temperatureScale() / 0.8;
        for (double[] q : new double[][] {{0, 0.4}, {1, 0.2}, {1, 0.6}}) {
            Evaluation[] g = loose.gradient(q, 0);
            assertWithin(exact.derivative("x").value(q[0], q[1], 0), g[0], gradientLimit, "du/dx at " + q[0] + ", " + q[1]);
            assertWithin(exact.derivative("y").value(q[0], q[1], 0), g[1], gradientLimit, "du/dy at " + q[0] + ", " + q[1]);
        }
        assertWithin(gaussMean(exact, new double[] {0.9, 0.3, 1, 0.4}, 0), o.cellAverage(new double[] {0.9, 0.3}, new double[] {1, 0.4}, 0), limit, "cell mean at x = 1");
    }
    /**
     * A clamp whose temperature varies across its face: u = 20 + 30 y on x = 0, 20 on y = 0 and y = 1, convection
     * (h = 5, k = 1) to 20 on x = 1, against its sine series, u - 20 = sum_n b_n sin(n pi y) Z_n(x) with
     * b_n = 60 (-1)^(n+1) / (n pi) and Z_n(0) = 1, k Z_n'(1) + h Z_n(1) = 0 (separation of variables, common
     * practice), summed to n = 2e5; at x >= 1e-3 what it leaves out is below 60/pi sum exp(-n pi x) < 1e-250. Points
     * 1e-5 to 1e-2 from the clamp at 1e-10, where the side's own series is within reach but its projection error,
     * carried by thousands of modes, is not within the tolerance.
     */
    @Test
    void clampWithATemperatureVaryingAcrossItsFace() {
        Map<Side, BoundaryCondition> faces = new EnumMap<>(Side.class);
        faces.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("20 + 30*y", "y", "t")));
        faces.put(Side.XMAX, new BoundaryCondition.Robin(5, Expression.parse("20", "y", "t")));
        faces.put(Side.YMIN, new BoundaryCondition.Dirichlet(Expression.parse("20", "x", "t")));
        faces.put(Side.YMAX, new BoundaryCondition.Dirichlet(Expression.parse("20", "x", "t")));
        Problem p = new Problem(new Rectangle(1, 1), Material.ofDiffusivity(1), Expression.parse("0", "x", "y"),
            Expression.parse("0", "x", "y", "t"), faces, true);
        Oracle o = Oracle.prepare(p, 0, 1e-10);
        double limit = 1e-10 * o.temperatureScale();
        for (double[] q : new double[][] {{1e-3, 0.5}, {2e-3, 0.3}, {1e-2, 0.7}, {1e-3, 0.9}}) {
            double sum = 20;
            for (int n = 200_000; n >= 1; n--) {
                double w = n * Math.PI;
                double e = Math.exp(-2 * w);
                // Z_n(x) = [(k w - h) exp(-w (2 - x)) + (k w + h) exp(-w x)] / [k w (1 + e) + h (1 - e)]
                double z = ((w - 5) * Math.exp(-w * (2 - q[0])) + (w + 5) * Math.exp(-w * q[0])) / (w * (1 + e) + 5 * (1 - e));
                sum += 60 * (n % 2 == 1 ? 1 : -1) / w * Math.sin(w * q[1]) * z;
            }
            assertWithin(sum, o.temperature(q, 0), limit, "u at " + q[0] + ", " + q[1]);
        }
    }
}

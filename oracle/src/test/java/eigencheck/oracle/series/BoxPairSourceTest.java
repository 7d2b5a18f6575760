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
import java.util.EnumMap;
import java.util.Map;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegrator;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegratorFactory;
import org.junit.jupiter.api.Test;

/** Boxes whose source is a sum of terms of two coordinates each (a heater line along an axis, say). */
class BoxPairSourceTest {
    private static final String HEATER = "5000*exp(-((x-0.4)^2+(y-0.3)^2)/0.01)";

    @Test
    void heaterLineWithInsulatedEndsIsTheRectangle() {
        // a heater line along z in a box whose z faces are insulated: the rectangle's solution, extended as constant
        // in z, satisfies every equation and face of the box, so by uniqueness it is the box's (common practice)
        double tol = 1e-6;
        Oracle[] pair = heaterOracles(true, 0, tol);
        Oracle b = pair[0];
        Oracle r = pair[1];
        double[][] points = {{0.4, 0.3}, {0.1, 0.7}, {0.8, 0.2}, {1.0, 0.3}, {0.4, 0.0}, {0.6, 0.5}};
        for (double[] p : points) {
            for (double z : new double[] {0.05, 0.3, 0.55}) {
                assertBoxIsRectangle(b, r, p, z, 0, tol);
            }
        }
        // the gradient's z component vanishes; x and y are the rectangle's
        Evaluation[] g = b.gradient(new double[] {0.6, 0.5, 0.3}, 0);
        // (the rectangle's gradients at 1e-9 would need more than its 1024 modes per axis)
        Evaluation[] gr = Oracle.prepare(heaterRectangle(true), 0, tol).gradient(new double[] {0.6, 0.5}, 0);
        for (int c = 0; c < 2; c++) {
            assertWithin(gr[c].value(), new Evaluation(g[c].value(), g[c].bound() + gr[c].bound()),
                tol * b.temperatureScale() + gr[c].bound(), "grad component " + c);
        }
        assertWithin(0, g[2], tol * b.temperatureScale(), "du/dz");
    }

    @Test
    void heaterLineTransientWithInsulatedEndsIsTheRectangle() {
        // the same uniqueness argument for the transient from a uniform start (common practice)
        double tol = 1e-6;
        Oracle[] pair = heaterOracles(false, 0.2, tol);
        Oracle b = pair[0];
        Oracle r = pair[1];
        for (double t : new double[] {0.01, 0.2}) {
            for (double[] p : new double[][] {{0.4, 0.3}, {0.7, 0.6}}) {
                assertBoxIsRectangle(b, r, p, 0.2, t, tol);
            }
        }
    }

    /** The heater-line box at {@code tol} and its rectangle at 1e-9, steady or from a uniform start: {box, rectangle}. */
    private static Oracle[] heaterOracles(boolean steady, double horizon, double tol) {
        return new Oracle[] {Oracle.prepare(heaterBox(steady), horizon, tol),
            Oracle.prepare(heaterRectangle(steady), horizon, 1e-9)};
    }

    /**
     * The box's temperature at (p, z) against the rectangle's at p: the two values differ by at most the sum
     * of their bounds, and that sum stays within the box's tolerance plus the rectangle's bound.
     */
    private static void assertBoxIsRectangle(Oracle box, Oracle rect, double[] p, double z, double t, double tol) {
        Evaluation reference = rect.temperature(p, t);
        Evaluation e = box.temperature(new double[] {p[0], p[1], z}, t);
        assertWithin(reference.value(), new Evaluation(e.value(), e.bound() + reference.bound()),
            tol * box.temperatureScale() + reference.bound(), "box at " + p[0] + ", " + p[1] + ", " + z + ", t = " + t);
    }

    @Test
    void manufacturedTwoPairSource() {
        // u = sin(2 x y) + cos(y + z)/2 + 0.3 x z: its source -k lap u couples x-y, y-z and x-z; faces derived
        // exactly (method of manufactured solutions, common practice)
        Expression exact = Expression.parse("sin(2*x*y) + 0.5*cos(y + z) + 0.3*x*z", "x", "y", "z", "t");
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.dirichlet());
        kinds.put(Side.XMAX, Manufactured.Face.dirichlet());
        kinds.put(Side.YMIN, Manufactured.Face.neumann());
        kinds.put(Side.YMAX, Manufactured.Face.robin(12));
        kinds.put(Side.ZMIN, Manufactured.Face.dirichlet());
        kinds.put(Side.ZMAX, Manufactured.Face.neumann());
        double lx = 1.0;
        double ly = 0.8;
        double lz = 0.6;
        Problem m = Manufactured.cartesian(exact, new Box(lx, ly, lz), new Material(3, 2), kinds);
        Problem p = new Problem(m.domain(), m.material(), m.initial(), m.source(), m.boundary(), true);
        double tol = 1e-6;
        Oracle o = Oracle.prepare(p, 0, tol);
        double limit = tol * o.temperatureScale();
        String[] names = {"x", "y", "z"};
        double[] f = {0.15, 0.5, 0.85};
        for (double fx : f) {
            for (double fy : f) {
                for (double fz : f) {
                    double x = fx * lx;
                    double y = fy * ly;
                    double z = fz * lz;
                    assertWithin(exact.value(x, y, z, 0), o.temperature(new double[] {x, y, z}, 0), limit,
                        "u at " + x + ", " + y + ", " + z);
                }
            }
        }
        double[] centre = {0.5 * lx, 0.5 * ly, 0.5 * lz};
        Evaluation[] g = o.gradient(centre, 0);
        for (int c = 0; c < 3; c++) {
            double d = exact.derivative(names[c]).value(centre[0], centre[1], centre[2], 0);
            assertWithin(d, g[c], limit, "du/d" + names[c] + " at the centre");
        }
        // a cell mean against a 5-point Gauss-Legendre rule in each direction (Abramowitz and Stegun 25.4.29;
        // its error here is below 1e-12 for this analytic integrand)
        double[] lo = {0.3, 0.2, 0.2};
        double[] hi = {0.5, 0.4, 0.4};
        double mean = BoxPairSourceTest.gaussCellMean(exact, lo, hi, 5);
        assertWithin(mean, o.cellAverage(lo, hi, 0), limit, "mean over the cell");
    }

    @Test
    void productSourceInAHeldCubeAgainstADoubleSeries() {
        // Q = x y in the unit cube held at 0 (k = 1): the term does not vanish at the x-y rectangle's corner (1, 1),
        // where V's bound exceeds its share on the z faces' rule nodes; that excess now enters the z faces'
        // coefficients as an L1 norm instead of refusing the body. Reference: separation of variables in x and y
        // with the exact z profile (common practice), x y = sum 4 (-1)^(j+k)/(j k pi^2) sin(j pi x) sin(k pi y),
        // u = sum c_jk sin sin (1 - cosh(kappa (z - 1/2))/cosh(kappa/2))/kappa^2, kappa = pi sqrt(j^2 + k^2),
        // summed to N = 4000 per axis; what it leaves out is below 8/pi^4 ((1.5 + ln N)/(2 N^2) + 1/(4 N^2))
        // (|profile| <= 1, sum_k 1/(k (j^2 + k^2)) <= (1.5 + ln j)/j^2), 2.5e-8 here
        Problem cube = heldUnitCube("x*y");
        double tol = 1e-6;
        Oracle o = Oracle.prepare(cube, 0, tol);
        int n = 4000;
        double left = 8 / Math.pow(Math.PI, 4) * ((1.5 + Math.log(n)) / (2.0 * n * n) + 1 / (4.0 * n * n));
        double[][] points = {{0.5, 0.5, 0.5}, {0.9, 0.9, 0.5}, {0.99, 0.99, 0.5}, {0.999, 0.999, 0.5}, {0.3, 0.6, 0.1},
            {0.7, 0.2, 0.85}, {0.95, 0.05, 0.3}, {0.01, 0.5, 0.5}};
        for (double[] p : points) {
            double reference = heldCubeProductSeries(p[0], p[1], p[2], n);
            Evaluation e = o.temperature(p, 0);
            assertWithin(reference, new Evaluation(e.value(), e.bound() + left), tol * o.temperatureScale() + left,
                "x y in the held cube at " + java.util.Arrays.toString(p));
        }
        // gradients: the face data's error reaches them as 3 E / r, r the radius of a ball clear of the faces
        // that carry it (reflection across the held x and y faces), so (0.9, 0.9, 0.5) is certified at 1e-6.
        // Reference: separation of variables in y and z with the exact x profile (common practice),
        // du/dx = sum_{k, l odd} 2 (-1)^(k+1)/(k pi) 4/(l pi) (1 - kappa cosh(kappa x)/sinh(kappa))/kappa^2
        // sin(k pi y) sin(l pi z), kappa = pi sqrt(k^2 + l^2), summed to N per axis; beyond that kappa cosh/sinh
        // is below 1e-300 for x <= 0.9 and what is left out is below twice the value series' bound (5.0e-8);
        // du/dy follows by the x-y symmetry of the problem
        double slopeLeft = 2 * left;
        for (double[] p : new double[][] {{0.5, 0.5, 0.5}, {0.9, 0.9, 0.5}, {0.3, 0.6, 0.2}}) {
            Evaluation[] g = o.gradient(p, 0);
            double[] reference = {heldCubeProductSlopeX(p[0], p[1], p[2], n), heldCubeProductSlopeX(p[1], p[0], p[2], n)};
            for (int c = 0; c < 2; c++) {
                assertWithin(reference[c], new Evaluation(g[c].value(), g[c].bound() + slopeLeft),
                    tol * o.temperatureScale() + slopeLeft, "du/d" + "xy".charAt(c) + " at " + java.util.Arrays.toString(p));
            }
        }
    }

    /** du/dx of the held unit cube with source x y and k = 1, by the series in y and z modes 1..n. */
    private static double heldCubeProductSlopeX(double x, double y, double z, int n) {
        double sum = 0;
        for (int k = 1; k <= n; k++) {
            double sk = Math.sin(k * Math.PI * y) * 2 * (k % 2 == 1 ? 1 : -1) / (k * Math.PI);
            double row = 0;
            for (int l = 1; l <= n; l += 2) {
                double kap = Math.PI * Math.sqrt((double) k * k + (double) l * l);
                // kappa cosh(kappa x)/sinh(kappa), written with decaying exponentials
                double r = kap * (Math.exp(-kap * (1 - x)) + Math.exp(-kap * (1 + x))) / (1 - Math.exp(-2 * kap));
                row += 4 / (l * Math.PI) * Math.sin(l * Math.PI * z) * (1 - r) / (kap * kap);
            }
            sum += sk * row;
        }
        return sum;
    }

    /** The unit cube held at 0 on every face, k = rho c = 1, steady, with the given source of x, y, z. */
    /** The mean of u(x, y, z, 0) over the cell [lo, hi] by an n-point Gauss-Legendre rule per axis. */
    static double gaussCellMean(Expression exact, double[] lo, double[] hi, int n) {
        GaussIntegrator[] rule = new GaussIntegrator[3];
        for (int c = 0; c < 3; c++) {
            rule[c] = new GaussIntegratorFactory().legendre(n, lo[c], hi[c]);
        }
        double mean = 0;
        for (int i = 0; i < n; i++) {
            for (int j = 0; j < n; j++) {
                for (int l = 0; l < n; l++) {
                    mean += rule[0].getWeight(i) * rule[1].getWeight(j) * rule[2].getWeight(l)
                        * exact.value(rule[0].getPoint(i), rule[1].getPoint(j), rule[2].getPoint(l), 0);
                }
            }
        }
        return mean / ((hi[0] - lo[0]) * (hi[1] - lo[1]) * (hi[2] - lo[2]));
    }

    static Problem heldUnitCube(String source) {
        Map<Side, BoundaryCondition> held = new EnumMap<>(Side.class);
        BoundaryCondition zero = new BoundaryCondition.Dirichlet(Expression.parse("0", "x", "y", "z", "t"));
        for (Side s : new Side[] {Side.XMIN, Side.XMAX, Side.YMIN, Side.YMAX, Side.ZMIN, Side.ZMAX}) {
            held.put(s, zero);
        }
        return new Problem(new Box(1, 1, 1), Material.ofDiffusivity(1), Expression.parse("0", "x", "y", "z"),
            Expression.parse(source, "x", "y", "z", "t"), held, true);
    }

    /** The double series of the held unit cube with source x y and k = 1, modes 1..n per axis. */
    private static double heldCubeProductSeries(double x, double y, double z, int n) {
        double sum = 0;
        double[] sx = new double[n + 1];
        double[] sy = new double[n + 1];
        for (int j = 1; j <= n; j++) {
            sx[j] = Math.sin(j * Math.PI * x) / j;
            sy[j] = Math.sin(j * Math.PI * y) / j;
        }
        double w = Math.abs(z - 0.5);
        for (int j = 1; j <= n; j++) {
            double row = 0;
            for (int k = 1; k <= n; k++) {
                double kap = Math.PI * Math.sqrt((double) j * j + (double) k * k);
                // 1 - cosh(kap (z - 1/2))/cosh(kap/2), written with decaying exponentials
                double profile = 1 - Math.exp(kap * (w - 0.5)) * (1 + Math.exp(-2 * kap * w)) / (1 + Math.exp(-kap));
                double sign = ((j + k) % 2 == 0) ? 1 : -1;
                row += sign * sy[k] * profile / (kap * kap);
            }
            sum += sx[j] * row;
        }
        return 4 / (Math.PI * Math.PI) * sum;
    }

    @Test
    void refusesSourcesItCannotSplit() {
        Problem coupled = heldUnitCube("exp(x*y*z)");
        Map<Side, BoundaryCondition> held = new EnumMap<>(coupled.boundary());
        BoundaryCondition zero = held.get(Side.ZMIN);
        OracleException e = assertThrows(OracleException.class, () -> Oracle.prepare(coupled, 0, 1e-6));
        assertEquals(OracleException.Reason.UNSUPPORTED, e.reason());
        assertTrue(e.getMessage().contains("two coordinates"), e.getMessage());
        // an x-y term with all four faces across x and y insulated: its solution is fixed only up to a constant
        Map<Side, BoundaryCondition> mixed = new EnumMap<>(held);
        for (Side s : new Side[] {Side.XMIN, Side.XMAX, Side.YMIN, Side.YMAX}) {
            mixed.put(s, new BoundaryCondition.Neumann(Expression.parse("0", s.ordinal() < 2 ? "y" : "x", "z", "t")));
        }
        mixed.put(Side.ZMIN, zero);
        mixed.put(Side.ZMAX, new BoundaryCondition.Dirichlet(Expression.parse("0", "x", "y", "t")));
        Problem flux = new Problem(new Box(1, 1, 1), Material.ofDiffusivity(1), Expression.parse("0", "x", "y", "z"),
            Expression.parse("cos(pi*x)*cos(pi*y)", "x", "y", "z", "t"), mixed, true);
        e = assertThrows(OracleException.class, () -> Oracle.prepare(flux, 0, 1e-6));
        assertEquals(OracleException.Reason.UNSUPPORTED, e.reason());
        assertTrue(e.getMessage().contains("all insulated or flux-driven"), e.getMessage());
    }

    /** A box 1 x 0.8 x 0.6 with a heater line along z at (0.4, 0.3), insulated in z, k = 2, rho c = 3. */
    private static Problem heaterBox(boolean steady) {
        Map<Side, BoundaryCondition> b = new EnumMap<>(Side.class);
        b.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("0", "y", "z", "t")));
        b.put(Side.XMAX, new BoundaryCondition.Robin(30, Expression.parse("0", "y", "z", "t")));
        b.put(Side.YMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "z", "t")));
        b.put(Side.YMAX, new BoundaryCondition.Dirichlet(Expression.parse("0", "x", "z", "t")));
        b.put(Side.ZMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "y", "t")));
        b.put(Side.ZMAX, new BoundaryCondition.Neumann(Expression.parse("0", "x", "y", "t")));
        return new Problem(new Box(1, 0.8, 0.6), new Material(2, 3), Expression.parse("0", "x", "y", "z"),
            Expression.parse(HEATER, "x", "y", "z", "t"), b, steady);
    }

    /** The same cross-section as a rectangle. */
    private static Problem heaterRectangle(boolean steady) {
        Map<Side, BoundaryCondition> b = new EnumMap<>(Side.class);
        b.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("0", "y", "t")));
        b.put(Side.XMAX, new BoundaryCondition.Robin(30, Expression.parse("0", "y", "t")));
        b.put(Side.YMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        b.put(Side.YMAX, new BoundaryCondition.Dirichlet(Expression.parse("0", "x", "t")));
        return new Problem(new Rectangle(1, 0.8), new Material(2, 3), Expression.parse("0", "x", "y"),
            Expression.parse(HEATER, "x", "y", "t"), b, steady);
    }
}

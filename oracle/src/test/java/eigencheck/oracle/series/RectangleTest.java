package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertCertified;
import static eigencheck.oracle.testing.NumericAssertions.assertClose;
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
import eigencheck.oracle.problem.Slab;
import java.util.EnumMap;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/** The rectangle: steady benchmarks, separable products and manufactured solutions. */
class RectangleTest {
    private static Expression xy(String text) {
        return Expression.parse(text, "x", "y", "t");
    }

    private static Map<Side, BoundaryCondition> faces(BoundaryCondition xmin, BoundaryCondition xmax,
                                                      BoundaryCondition ymin, BoundaryCondition ymax) {
        Map<Side, BoundaryCondition> m = new EnumMap<>(Side.class);
        m.put(Side.XMIN, xmin);
        m.put(Side.XMAX, xmax);
        m.put(Side.YMIN, ymin);
        m.put(Side.YMAX, ymax);
        return m;
    }

    /**
     * A rectangle with insulated y sides and a heater narrow in x, exp(-((x - 0.37)/w)^2) with w = 1e-3 of the
     * length: the solution is the slab's (separation of variables, common practice), and the slab's is checked
     * against its closed form in SlabSteadyTest. The 9 x 9 sampling once read this heater as no source at all
     * (u = 20, bound 4e-10, error 4e-4); the scan of the source must find it.
     */
    @Test
    void narrowHeaterInARectangleIsTheSlabsSolution() {
        BoundaryCondition held = new BoundaryCondition.Dirichlet(Expression.parse("20", "y", "t"));
        BoundaryCondition insulated = new BoundaryCondition.Neumann(Expression.parse("0", "x", "t"));
        String heater = "exp(-((x - 0.37)/0.001)^2)";
        Problem rect = new Problem(new Rectangle(1, 0.5), new Material(1, 1e6), Expression.parse("0", "x", "y"),
            Expression.parse(heater, "x", "y", "t"), Map.of(Side.XMIN, held, Side.XMAX, held, Side.YMIN, insulated,
            Side.YMAX, insulated), true);
        Problem slab = new Problem(new eigencheck.oracle.problem.Slab(1), new Material(1, 1e6), Expression.parse("0", "x"),
            Expression.parse(heater, "x", "t"), Map.of(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("20",
            "t")), Side.XMAX, new BoundaryCondition.Dirichlet(Expression.parse("20", "t"))), true);
        Oracle r = Oracle.prepare(rect, 0, 1e-10);
        Oracle s1 = Oracle.prepare(slab, 0, 1e-10);
        for (double x : new double[] {0.2, 0.37, 0.8}) {
            Evaluation a = r.temperature(new double[] {x, 0.25}, Double.POSITIVE_INFINITY);
            Evaluation b = s1.temperature(x, Double.POSITIVE_INFINITY);
            assertTrue(b.value() - 20 > 1e-4, "the heater warms the slab: " + b);
            assertTrue(Math.abs(a.value() - b.value()) <= a.bound() + b.bound(), "x = " + x + ": " + a + " against " + b);
        }
    }

    @Test
    void unitSquarePoissonCentreValue() {
        // -lap u = 1 on the unit square, u = 0 on the sides: u(1/2, 1/2) = 0.0736713532814 (classical
        // double-series result, recalled from memory; the check 4)
        BoundaryCondition zero = new BoundaryCondition.Dirichlet(xy("0"));
        Problem p = new Problem(new Rectangle(1, 1), Material.ofDiffusivity(1), Expression.parse("0", "x", "y"), xy("1"),
            faces(zero, zero, zero, zero), true);
        Oracle o = Oracle.prepare(p, 0, 1e-12);
        Evaluation centre = o.temperature(new double[] {0.5, 0.5}, 0);
        // the recalled value has 13 decimals: agreement to its last digit
        assertClose(0.0736713532814, centre.value(), 1.5e-13, "centre");
        assertTrue(centre.bound() <= 1e-12 * o.temperatureScale(), "bound " + centre.bound());
        // a second route, the classical single series in cosh (common practice):
        // u(1/2, 1/2) = 1/8 - (4/pi^3) sum_{n odd} (-1)^((n-1)/2) / (n^3 cosh(n pi/2))
        double sum = 0;
        for (int n = 1; n < 60; n += 2) {
            sum += ((n / 2) % 2 == 0 ? 1 : -1) / (Math.pow(n, 3) * Math.cosh(n * Math.PI / 2));
        }
        assertCertified(0.125 - 4 / Math.pow(Math.PI, 3) * sum, centre, "single series");
    }

    @Test
    void nafemsT4() {
        // NAFEMS T4 ("The Standard NAFEMS Benchmarks", TNSB Rev. 3, 1990): plate 0.6 m (x) by 1.0 m (y),
        // k = 52 W/(m K), u = 100 degC on y = 0, x = 0 insulated, x = 0.6 and y = 1 convect to 0 degC with
        // h = 750 W/(m^2 K); target u(0.6, 0.2) = 18.25 degC, 18.254 from a converged series (the check 5)
        BoundaryCondition convect = new BoundaryCondition.Robin(750, xy("0"));
        Problem p = new Problem(new Rectangle(0.6, 1.0), new Material(52, 1), Expression.parse("0", "x", "y"),
            xy("0"), faces(new BoundaryCondition.Neumann(xy("0")), convect, new BoundaryCondition.Dirichlet(xy("100")),
            convect), true);
        Oracle o = Oracle.prepare(p, 0, 1e-10);
        Evaluation target = o.temperature(new double[] {0.6, 0.2}, 0);
        assertClose(18.254, target.value(), 0.5e-3, "u(0.6, 0.2)");
        assertEquals(18.25, Math.round(target.value() * 100) / 100.0, 1e-12, "to the benchmark's two decimals");
        assertTrue(target.bound() <= 1e-10 * 100, "bound " + target.bound());
        System.out.printf("NAFEMS T4: u(0.6, 0.2) = %.10f +- %.1e%n", target.value(), target.bound());
    }

    @Test
    void separableProductEqualsTheProductOfTwoSlabOracles() {
        // u = U1(x, t) U2(y, t) solves the rectangle's homogeneous problem when U1 and U2 solve the slabs'
        // (common practice); the check 6, to 1e-12
        double alpha = 2e-5;
        Material m = Material.ofDiffusivity(alpha);
        BoundaryCondition d0 = new BoundaryCondition.Dirichlet(Expression.parse("0", "t"));
        BoundaryCondition r0 = new BoundaryCondition.Robin(3e-4, Expression.parse("0", "t"));
        BoundaryCondition n0 = new BoundaryCondition.Neumann(Expression.parse("0", "t"));
        double lx = 0.08;
        double ly = 0.05;
        String a = "x*(0.08-x)*(1+20*x)";
        String b = "cos(40*y)+2";
        Map<Side, BoundaryCondition> sx = new EnumMap<>(Side.class);
        sx.put(Side.XMIN, d0);
        sx.put(Side.XMAX, r0);
        Map<Side, BoundaryCondition> sy = new EnumMap<>(Side.class);
        sy.put(Side.XMIN, n0);
        sy.put(Side.XMAX, r0);
        double horizon = 100;
        Oracle ox = Oracle.prepare(new Problem(new Slab(lx), m, Expression.parse(a, "x"), Expression.parse("0", "x", "t"),
            sx), horizon, 1e-13);
        Oracle oy = Oracle.prepare(new Problem(new Slab(ly), m, Expression.parse(b.replace("y", "x"), "x"),
            Expression.parse("0", "x", "t"), sy), horizon, 1e-13);
        Problem rect = new Problem(new Rectangle(lx, ly), m, Expression.parse("(" + a + ")*(" + b + ")", "x", "y"),
            xy("0"), faces(new BoundaryCondition.Dirichlet(xy("0")), new BoundaryCondition.Robin(3e-4, xy("0")),
            new BoundaryCondition.Neumann(xy("0")), new BoundaryCondition.Robin(3e-4, xy("0"))));
        Oracle o = Oracle.prepare(rect, horizon, 1e-12);
        SplittableRandom random = new SplittableRandom(5);
        double worst = 0;
        for (int i = 0; i < 200; i++) {
            double x = random.nextDouble() * lx;
            double y = random.nextDouble() * ly;
            double t = 1 + random.nextDouble() * (horizon - 1);
            double product = ox.temperature(x, t).value() * oy.temperature(y, t).value();
            Evaluation e = o.temperature(new double[] {x, y}, t);
            worst = Math.max(worst, Math.abs(e.value() - product));
            assertTrue(Math.abs(e.value() - product) <= 1e-12 * o.temperatureScale(), "product at " + x + ", " + y
                + ", t = " + t + ": " + e.value() + " vs " + product);
        }
        System.out.printf("separable product: worst difference %.2e of scale %.3f%n", worst, o.temperatureScale());
    }

    @Test
    void manufacturedHarmonicPlusDecayingModeWithSourceAlongX() {
        // u = 1 + 3 x (1 - x) + (x^2 - y^2) + exp(-alpha lambda t) sin(pi x) cos(nu y), nu the first root of
        // nu tan(nu Ly) = h/k (Robin at y = Ly, Neumann at y = 0): Q = 6 k, constant; faces derived exactly
        double k = 1;
        double h = 4;
        double ly = 0.7;
        double nu = eigencheck.oracle.modes.SlabModes.root(1, 0, h * ly) / ly;
        double lambda = Math.PI * Math.PI + nu * nu;
        String u = "1 + 3*x*(1-x) + x^2 - y^2 + exp(-" + lambda + "*t)*sin(pi*x)*cos(" + nu + "*y)";
        Expression exact = xy(u);
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.dirichlet());
        kinds.put(Side.XMAX, Manufactured.Face.dirichlet());
        kinds.put(Side.YMIN, Manufactured.Face.neumann());
        kinds.put(Side.YMAX, Manufactured.Face.robin(h));
        Problem p = Manufactured.cartesian(exact, new Rectangle(1, ly), Material.ofDiffusivity(k), kinds);
        Oracle o = Oracle.prepare(p, 2, 1e-10);
        SplittableRandom random = new SplittableRandom(11);
        for (int i = 0; i < 300; i++) {
            double x = 0.02 + 0.96 * random.nextDouble();
            double y = (0.02 + 0.96 * random.nextDouble()) * ly;
            double t = random.nextDouble() < 0.2 ? 0 : 0.002 + 1.998 * random.nextDouble();
            assertWithin(exact.value(x, y, t), o.temperature(new double[] {x, y}, t), 1e-10 * o.temperatureScale(),
                "u at " + x + ", " + y + ", " + t);
        }
        // points 1e-3 and 2e-3 of the edge from the sides with data (the integration-by-parts tails)
        double[][] near = {{1e-3, 0.5}, {0.999, 0.3}, {0.5, 1e-3 * ly}, {0.4, 0.999 * ly}, {2e-3, 0.2}, {0.3, 0.998 * ly}};
        for (double[] q : near) {
            assertWithin(exact.value(q[0], q[1], 0.5), o.temperature(q, 0.5), 1e-10 * o.temperatureScale(),
                "u near a side at " + q[0] + ", " + q[1]);
        }
        // exact cell means against a 20 x 20 Gauss-Legendre rule on the closed form (smooth: machine precision)
        org.apache.commons.math3.analysis.integration.gauss.GaussIntegrator rule =
            new org.apache.commons.math3.analysis.integration.gauss.GaussIntegratorFactory().legendre(20, 0, 1);
        for (int i = 0; i < 40; i++) {
            double x0 = 0.02 + 0.9 * random.nextDouble();
            double y0 = (0.02 + 0.9 * random.nextDouble()) * ly;
            double hx = 0.06 * random.nextDouble() + 1e-3;
            double hy = 0.06 * random.nextDouble() * ly + 1e-3;
            double t = 0.01 + random.nextDouble();
            double mean = 0;
            for (int a = 0; a < 20; a++) {
                for (int b = 0; b < 20; b++) {
                    mean += rule.getWeight(a) * rule.getWeight(b)
                        * exact.value(x0 + hx * rule.getPoint(a), y0 + hy * rule.getPoint(b), t);
                }
            }
            assertWithin(mean, o.cellAverage(new double[] {x0, y0}, new double[] {x0 + hx, y0 + hy}, t),
                1e-10 * o.temperatureScale(), "cell mean at " + x0 + ", " + y0);
        }
        // a cell touching the held side x = 0, whose data 1 - y^2 do not meet the convective end y = 0.7's
        // condition: the side's series in lifted form (RectangleSideTest)
        double touching = 0;
        for (int a = 0; a < 20; a++) {
            for (int b = 0; b < 20; b++) {
                touching += rule.getWeight(a) * rule.getWeight(b) * exact.value(0.1 * rule.getPoint(a),
                    0.1 + 0.1 * rule.getPoint(b), 1);
            }
        }
        assertWithin(touching, o.cellAverage(new double[] {0, 0.1}, new double[] {0.1, 0.2}, 1),
            1e-10 * o.temperatureScale(), "a cell touching a side with data");
    }

    @Test
    void pointsRepeatedAtSeveralTimesShareTheSteadyPartExactly() {
        // the same manufactured problem as above; the bulk call computes the face series once per distinct
        // point and must give what one point at a time gives, including a point on a Dirichlet
        // side (answered from the data) and a point outside the body (refused with its own index)
        double k = 1;
        double h = 4;
        double ly = 0.7;
        double nu = eigencheck.oracle.modes.SlabModes.root(1, 0, h * ly) / ly;
        double lambda = Math.PI * Math.PI + nu * nu;
        Expression exact = xy("1 + 3*x*(1-x) + x^2 - y^2 + exp(-" + lambda + "*t)*sin(pi*x)*cos(" + nu + "*y)");
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.dirichlet());
        kinds.put(Side.XMAX, Manufactured.Face.dirichlet());
        kinds.put(Side.YMIN, Manufactured.Face.neumann());
        kinds.put(Side.YMAX, Manufactured.Face.robin(h));
        Problem p = Manufactured.cartesian(exact, new Rectangle(1, ly), Material.ofDiffusivity(k), kinds);
        Oracle o = Oracle.prepare(p, 2, 1e-10);
        double[][] distinct = {{0.3, 0.2}, {0, 0.4}, {0.71, 0.55}, {0.5, 0.01 * ly}, {0.95, 0.35}};
        double[] times = {1.5, 0.01, 0.4, 0, 2};
        int n = distinct.length * times.length;
        double[] points = new double[2 * n];
        double[] t = new double[n];
        for (int i = 0; i < n; i++) {
            // points and times interleaved out of order, as an eval file may list them
            int q = (i * 3) % distinct.length;
            points[2 * i] = distinct[q][0];
            points[2 * i + 1] = distinct[q][1];
            t[i] = times[(i / distinct.length + q) % times.length];
        }
        double[] value = new double[n];
        double[] bound = new double[n];
        o.evaluatePoints(points, t, value, bound, null, null);
        for (int i = 0; i < n; i++) {
            double[] q = {points[2 * i], points[2 * i + 1]};
            // the face tables grow on demand, so the bounds may differ a little with the order of evaluation
            Evaluation alone = o.temperature(q, t[i]);
            assertEquals(alone.value(), value[i], 1e-13 * o.temperatureScale(), "u at " + q[0] + ", " + q[1] + ", t = " + t[i]);
            assertEquals(alone.bound(), bound[i], 0.01 * alone.bound(), "bound at " + q[0] + ", " + q[1] + ", t = " + t[i]);
            assertWithin(exact.value(q[0], q[1], t[i]), alone, 1e-10 * o.temperatureScale(), "u at point " + i);
        }
        // a point outside the body is refused: the bulk call names it (points next to the sides and corners of
        // this field are certified, RectangleSideTest)
        double[] withNear = java.util.Arrays.copyOf(points, 2 * n + 2);
        withNear[2 * n] = 1.001;
        withNear[2 * n + 1] = 0.3;
        double[] tNear = java.util.Arrays.copyOf(t, n + 1);
        tNear[n] = 0.4;
        OracleException refused = assertThrows(OracleException.class,
            () -> o.evaluatePoints(withNear, tNear, new double[n + 1], new double[n + 1], null, null));
        assertTrue(refused.getMessage().startsWith("point " + n + ":"), refused.getMessage());
    }

    @Test
    void pointsOnConvectiveSidesWithACommonAmbientAreCertified() {
        // u = 20 + 80 exp(-alpha lambda t) X(x) Y(y), X the first Robin-Robin mode and Y the first Dirichlet-Robin
        // mode: one decaying mode over the common ambient 20 (separation of variables, common practice). Every
        // convective side has the ambient 20, so the series solve u - 20 with no side data and points on the
        // convective sides are certified.
        double h = 30;
        double k = 2;
        double lx = 0.4;
        double ly = 0.3;
        double mu = eigencheck.oracle.modes.SlabModes.root(1, h / k * lx, h / k * lx) / lx;
        double nu = eigencheck.oracle.modes.SlabModes.root(1, Double.POSITIVE_INFINITY, h / k * ly) / ly;
        double phase = Math.atan2(mu, h / k);
        double alpha = k / 5.0;
        String u = "20 + 80*exp(-" + alpha * (mu * mu + nu * nu) + "*t)*sin(" + mu + "*x + " + phase + ")*sin(" + nu
            + "*y)";
        Expression exact = xy(u);
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.robin(h));
        kinds.put(Side.XMAX, Manufactured.Face.robin(h));
        kinds.put(Side.YMIN, Manufactured.Face.dirichlet());
        kinds.put(Side.YMAX, Manufactured.Face.robin(h));
        Problem derived = Manufactured.cartesian(exact, new Rectangle(lx, ly), new Material(k, 5), kinds);
        // the derived ambients are 20 up to rounding: state them exactly, as a user would
        Map<Side, BoundaryCondition> faces = new EnumMap<>(Side.class);
        faces.put(Side.XMIN, new BoundaryCondition.Robin(h, xy("20")));
        faces.put(Side.XMAX, new BoundaryCondition.Robin(h, xy("20")));
        faces.put(Side.YMIN, new BoundaryCondition.Dirichlet(xy("20")));
        faces.put(Side.YMAX, new BoundaryCondition.Robin(h, xy("20")));
        Problem p = new Problem(derived.domain(), derived.material(), derived.initial(), xy("0"), faces);
        Oracle o = Oracle.prepare(p, 1, 1e-10);
        for (double[] q : new double[][] {{0, 0.1}, {lx, 0.2}, {0.1, ly}, {0, ly}, {lx, 0.05}, {0.2, 0.15}}) {
            for (double t : new double[] {0.05, 0.5}) {
                assertWithin(exact.value(q[0], q[1], t), o.temperature(q, t), 1e-10 * o.temperatureScale(),
                    "on the side at " + q[0] + ", " + q[1] + ", t = " + t);
            }
        }
    }

    @Test
    void additiveSourceAlongBothAxes() {
        // u = 2 + sin(pi x) + y^3: Q = k (pi^2 sin(pi x) - 6 y), a sum of one-coordinate terms (calculus)
        Expression exact = xy("2 + sin(pi*x) + y^3");
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.dirichlet());
        kinds.put(Side.XMAX, Manufactured.Face.robin(5));
        kinds.put(Side.YMIN, Manufactured.Face.neumann());
        kinds.put(Side.YMAX, Manufactured.Face.dirichlet());
        Problem derived = Manufactured.cartesian(exact, new Rectangle(1, 0.8), new Material(2, 3), kinds);
        Problem steady = new Problem(derived.domain(), derived.material(), derived.initial(), derived.source(),
            derived.boundary(), true);
        Oracle o = Oracle.prepare(steady, 0, 1e-10);
        Oracle transientFromSteady = Oracle.prepare(derived, 1, 1e-10);
        SplittableRandom random = new SplittableRandom(21);
        for (int i = 0; i < 100; i++) {
            double x = 0.02 + 0.96 * random.nextDouble();
            double y = (0.02 + 0.96 * random.nextDouble()) * 0.8;
            double u = exact.value(x, y, 0);
            assertWithin(u, o.temperature(new double[] {x, y}, 0), 1e-10 * o.temperatureScale(), "steady at " + x + ", " + y);
            assertWithin(u, transientFromSteady.temperature(new double[] {x, y}, 0.5), 1e-10
                * transientFromSteady.temperatureScale(), "transient started at the steady state");
            Evaluation[] g = o.gradient(new double[] {x, y}, 0);
            assertWithin(Math.PI * Math.cos(Math.PI * x), g[0], 1e-10 * o.temperatureScale(), "du/dx");
            assertWithin(3 * y * y, g[1], 1e-10 * o.temperatureScale(), "du/dy");
        }
    }

    @Test
    void refusesChangesInTimeThatAreNotFewProductsOrUniform() {
        BoundaryCondition zero = new BoundaryCondition.Dirichlet(xy("0"));
        // x = 0 changes as exp(-y t): not a sum of four terms (shape in y) x (schedule in t) to 1e-12
        Problem timed = new Problem(new Rectangle(1, 1), Material.ofDiffusivity(1), Expression.parse("0", "x", "y"),
            xy("0"), faces(new BoundaryCondition.Dirichlet(xy("1 - exp(-3*y*t)")), zero, zero, zero));
        OracleException e = assertThrows(OracleException.class, () -> Oracle.prepare(timed, 1, 1e-8));
        assertEquals(OracleException.Reason.UNSUPPORTED, e.reason());
        assertTrue(e.getMessage().startsWith("boundary.xmin: changes in time in a way that is not a sum"), e.getMessage());
        // a source that is not a sum of one-coordinate terms is taken (GeneralSourceTest), and one that changes
        // in time by a few terms (shape) x (schedule) (SourceChangeTest); a spot that moves is not
        Problem source = new Problem(new Rectangle(1, 1), Material.ofDiffusivity(1), Expression.parse("0", "x", "y"),
            xy("exp(-((x - 0.3*t)^2 + (y - 0.5)^2)/0.02)"), faces(zero, zero, zero, zero));
        e = assertThrows(OracleException.class, () -> Oracle.prepare(source, 1, 1e-8));
        assertEquals(OracleException.Reason.UNSUPPORTED, e.reason());
        assertTrue(e.getMessage().startsWith("source: changes in time in a way that is not a sum"), e.getMessage());
    }
}

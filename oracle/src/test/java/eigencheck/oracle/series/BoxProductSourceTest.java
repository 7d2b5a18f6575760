package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertWithin;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import eigencheck.oracle.Evaluation;
import eigencheck.oracle.Oracle;
import eigencheck.oracle.OracleException;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.Box;
import eigencheck.oracle.problem.Manufactured;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import java.util.EnumMap;
import java.util.Map;
import org.junit.jupiter.api.Test;

/** Boxes whose source couples x, y and z as one product F(x) G(y) H(z) (a spot heater, say). */
class BoxProductSourceTest {

    @Test
    void tripleProductInAHeldCubeAgainstADoubleSeries() {
        // Q = x y z in the unit cube held at 0 (k = 1). Reference: separation of variables in x and y with the
        // exact z profile (common practice): x y = sum 4 (-1)^(j+k)/(j k pi^2) sin(j pi x) sin(k pi y), and
        // -(w'' - kappa^2 w) = z, w(0) = w(1) = 0 gives w = (z - sinh(kappa z)/sinh(kappa))/kappa^2,
        // kappa = pi sqrt(j^2 + k^2), summed to N = 2000 per axis; |kappa^2 w| <= 1, so what it leaves out is
        // below 8/pi^4 ((1.5 + ln N)/(2 N^2) + 1/(4 N^2)) (sum_k 1/(k (j^2 + k^2)) <= (1.5 + ln j)/j^2), 9.4e-8
        Problem cube = BoxPairSourceTest.heldUnitCube("x*y*z");
        double tol = 1e-6;
        Oracle o = Oracle.prepare(cube, 0, tol);
        int n = 2000;
        double left = 8 / Math.pow(Math.PI, 4) * ((1.5 + Math.log(n)) / (2.0 * n * n) + 1 / (4.0 * n * n));
        for (double[] p : new double[][] {{0.5, 0.5, 0.5}, {0.3, 0.6, 0.8}, {0.8, 0.7, 0.2}, {0.9, 0.9, 0.9}}) {
            double reference = tripleProductSeries(p[0], p[1], p[2], n);
            Evaluation e = o.temperature(p, 0);
            assertWithin(reference, new Evaluation(e.value(), e.bound() + left), tol * o.temperatureScale() + left,
                "x y z in the held cube at " + java.util.Arrays.toString(p));
        }
    }

    /** The held unit cube with source x y z and k = 1, by the series in x and y modes 1..n with the z profile. */
    private static double tripleProductSeries(double x, double y, double z, int n) {
        double[] sx = new double[n + 1];
        double[] sy = new double[n + 1];
        for (int j = 1; j <= n; j++) {
            sx[j] = Math.sin(j * Math.PI * x) / j;
            sy[j] = Math.sin(j * Math.PI * y) / j;
        }
        double sum = 0;
        for (int j = 1; j <= n; j++) {
            double row = 0;
            for (int k = 1; k <= n; k++) {
                double kap = Math.PI * Math.sqrt((double) j * j + (double) k * k);
                // sinh(kappa z)/sinh(kappa), written with decaying exponentials
                double ratio = Math.exp(kap * (z - 1)) * (1 - Math.exp(-2 * kap * z)) / (1 - Math.exp(-2 * kap));
                double sign = ((j + k) % 2 == 0) ? 1 : -1;
                row += sign * sy[k] * (z - ratio) / (kap * kap);
            }
            sum += sx[j] * row;
        }
        return 4 / (Math.PI * Math.PI) * sum;
    }

    @Test
    void manufacturedExponentialWithMixedFaces() {
        // u = exp(0.7 x - 0.5 y + 0.3 z): -k lap u = -k (0.49 + 0.25 + 0.09) u is one product of three factors;
        // faces derived exactly (method of manufactured solutions, common practice)
        Expression exact = Expression.parse("exp(0.7*x - 0.5*y + 0.3*z)", "x", "y", "z", "t");
        Map<Side, Manufactured.Face> kinds = mixedFaces();
        double lx = 1.0;
        double ly = 0.8;
        double lz = 0.6;
        Problem m = Manufactured.cartesian(exact, new Box(lx, ly, lz), new Material(2, 3), kinds);
        Problem p = new Problem(m.domain(), m.material(), m.initial(), m.source(), m.boundary(), true);
        double tol = 1e-8;
        Oracle o = Oracle.prepare(p, 0, tol);
        double limit = tol * o.temperatureScale();
        double[] f = {0.25, 0.5, 0.75};
        for (double fx : f) {
            for (double fy : f) {
                for (double fz : f) {
                    double[] q = {fx * lx, fy * ly, fz * lz};
                    assertWithin(exact.value(q[0], q[1], q[2], 0), o.temperature(q, 0), limit,
                        "u at " + java.util.Arrays.toString(q));
                }
            }
        }
        String[] names = {"x", "y", "z"};
        double[] centre = {0.5 * lx, 0.5 * ly, 0.5 * lz};
        Evaluation[] g = o.gradient(centre, 0);
        for (int c = 0; c < 3; c++) {
            double d = exact.derivative(names[c]).value(centre[0], centre[1], centre[2], 0);
            assertWithin(d, g[c], 100 * limit, "du/d" + names[c] + " at the centre");
        }
        // a cell mean against a 6-point Gauss-Legendre rule in each direction (Abramowitz and Stegun 25.4.29;
        // its error for this exponential over a cell 0.2 wide is below 1e-15)
        double[] lo = {0.3, 0.2, 0.2};
        double[] hi = {0.5, 0.4, 0.4};
        double mean = BoxPairSourceTest.gaussCellMean(exact, lo, hi, 6);
        assertWithin(mean, o.cellAverage(lo, hi, 0), limit, "mean over the cell");
    }

    /** Temperature, flux and convective faces, two of each. */
    private static Map<Side, Manufactured.Face> mixedFaces() {
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.dirichlet());
        kinds.put(Side.XMAX, Manufactured.Face.robin(5));
        kinds.put(Side.YMIN, Manufactured.Face.neumann());
        kinds.put(Side.YMAX, Manufactured.Face.dirichlet());
        kinds.put(Side.ZMIN, Manufactured.Face.robin(2));
        kinds.put(Side.ZMAX, Manufactured.Face.neumann());
        return kinds;
    }

    @Test
    void steadyStartStaysPut() {
        // the exponential above started from its own steady state: u stays exp(0.7 x - 0.5 y + 0.3 z) at every
        // time (uniqueness, common practice), which holds only if the transient subtracts the product's exact
        // modal coefficients and its blend parts' from the initial data's
        Expression exact = Expression.parse("exp(0.7*x - 0.5*y + 0.3*z)", "x", "y", "z", "t");
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        for (Side s : new Side[] {Side.XMIN, Side.YMAX, Side.ZMAX}) {
            kinds.put(s, Manufactured.Face.dirichlet());
        }
        kinds.put(Side.XMAX, Manufactured.Face.robin(5));
        kinds.put(Side.YMIN, Manufactured.Face.neumann());
        kinds.put(Side.ZMIN, Manufactured.Face.robin(2));
        Problem m = Manufactured.cartesian(exact, new Box(1.0, 0.8, 0.6), new Material(2, 3), kinds);
        double tol = 1e-6;
        Oracle o = Oracle.prepare(m, 0.5, tol);
        double limit = tol * o.temperatureScale();
        for (double t : new double[] {0.01, 0.1, 0.5}) {
            for (double[] q : new double[][] {{0.5, 0.4, 0.3}, {0.2, 0.6, 0.45}}) {
                assertWithin(exact.value(q[0], q[1], q[2], t), o.temperature(q, t), limit,
                    "u at " + java.util.Arrays.toString(q) + ", t = " + t);
            }
        }
    }

    @Test
    void centredSpotInAHeldCubeIsSymmetric() {
        // a spot heater at the centre of a cube held at 0: the problem is unchanged by x -> 1 - x and by swapping
        // axes, so its solution is too (uniqueness, common practice). The oracle's split is not symmetric (the x
        // factor is blended first, z's last), so agreement checks the parts against each other
        String spot = "1000*exp(-((x-0.5)^2+(y-0.5)^2+(z-0.5)^2)/0.05)";
        double tol = 1e-8;
        Oracle o = Oracle.prepare(BoxPairSourceTest.heldUnitCube(spot), 0, tol);
        double limit = tol * o.temperatureScale();
        double[] p = {0.2, 0.35, 0.7};
        Evaluation u = o.temperature(p, 0);
        double[][] images = {{0.8, 0.35, 0.7}, {0.35, 0.2, 0.7}, {0.7, 0.2, 0.35}, {0.2, 0.65, 0.3}};
        for (double[] q : images) {
            Evaluation v = o.temperature(q, 0);
            assertWithin(u.value(), new Evaluation(v.value(), v.bound() + u.bound()), 2 * limit,
                "image " + java.util.Arrays.toString(q) + " of " + java.util.Arrays.toString(p));
        }
        // gradients mirror too (d/dx flips sign under x -> 1 - x, d/dx and d/dy swap with the axes); their
        // bounds at 1e-8 exceed the tolerance (the product's series converges one power slower for them), so
        // they are checked at 1e-6
        Oracle loose = Oracle.prepare(BoxPairSourceTest.heldUnitCube(spot), 0, 1e-6);
        double gradientLimit = 1e-6 * loose.temperatureScale();
        Evaluation[] g = loose.gradient(p, 0);
        Evaluation[] mirrored = loose.gradient(new double[] {0.8, 0.35, 0.7}, 0);
        Evaluation[] swapped = loose.gradient(new double[] {0.35, 0.2, 0.7}, 0);
        double[][] expected = {{-g[0].value(), g[1].value(), g[2].value()}, {g[1].value(), g[0].value(), g[2].value()}};
        Evaluation[][] images2 = {mirrored, swapped};
        int[][] from = {{0, 1, 2}, {1, 0, 2}};
        for (int m = 0; m < 2; m++) {
            for (int c = 0; c < 3; c++) {
                Evaluation e = images2[m][c];
                assertWithin(expected[m][c], new Evaluation(e.value(), e.bound() + g[from[m][c]].bound()),
                    2 * gradientLimit, "gradient component " + c + " of image " + m);
            }
        }
        assertTrue(Math.abs(g[0].value()) > 100 * gradientLimit, "the gradient checked is not trivially zero");
        // cell means of a cell and its image under x -> 1 - x with y and z swapped agree
        Evaluation a = o.cellAverage(new double[] {0.1, 0.2, 0.3}, new double[] {0.3, 0.4, 0.5}, 0);
        Evaluation b = o.cellAverage(new double[] {0.7, 0.3, 0.2}, new double[] {0.9, 0.5, 0.4}, 0);
        assertWithin(a.value(), new Evaluation(b.value(), a.bound() + b.bound()), 2 * limit, "mirrored cells");
    }

    @Test
    void manufacturedProductBesideAPairTerm() {
        // u = exp(0.7 x - 0.5 y + 0.3 z) + x^2 y: the source -k (0.83 exp(...) + 2 y) is not one product, but its
        // part that couples x, y and z is, and the rest is terms of two coordinates; faces derived exactly
        // (method of manufactured solutions, common practice)
        Expression exact = Expression.parse("exp(0.7*x - 0.5*y + 0.3*z) + x^2*y", "x", "y", "z", "t");
        Map<Side, Manufactured.Face> kinds = mixedFaces();
        double[] len = {1.0, 0.8, 0.6};
        Problem m = Manufactured.cartesian(exact, new Box(len[0], len[1], len[2]), new Material(2, 3), kinds);
        Problem p = new Problem(m.domain(), m.material(), m.initial(), m.source(), m.boundary(), true);
        double tol = 1e-8;
        Oracle o = Oracle.prepare(p, 0, tol);
        double limit = tol * o.temperatureScale();
        for (double fx : new double[] {0.2, 0.7}) {
            for (double fy : new double[] {0.3, 0.9}) {
                for (double fz : new double[] {0.1, 0.6}) {
                    double[] q = {fx * len[0], fy * len[1], fz * len[2]};
                    assertWithin(exact.value(q[0], q[1], q[2], 0), o.temperature(q, 0), limit,
                        "u at " + java.util.Arrays.toString(q));
                }
            }
        }
        String[] names = {"x", "y", "z"};
        double[] q = {0.4, 0.3, 0.25};
        Evaluation[] g = o.gradient(q, 0);
        for (int c = 0; c < 3; c++) {
            double d = exact.derivative(names[c]).value(q[0], q[1], q[2], 0);
            assertWithin(d, g[c], 100 * limit, "du/d" + names[c] + " at " + java.util.Arrays.toString(q));
        }
    }

    @Test
    void spotOnABackgroundBesideAHeaterLineIsTheSumOfItsParts() {
        // a spot on a uniform background, written as one term, beside a heater line along z in a held cube. The
        // sum takes the coupled-part route (the first term less its values on the planes through the origin is
        // the product), the spot alone the whole-source product, the rest pair terms: three different splits
        String spot = "exp(-((x-0.5)^2+(y-0.4)^2+(z-0.6)^2)/0.05)";
        String line = "30*exp(-((x-0.3)^2+(y-0.7)^2)/0.1)";
        assertSuperposed("0.5*(2000*" + spot + " + 10) + " + line, "1000*" + spot, "5 + " + line,
            new double[][] {{0.5, 0.4, 0.6}, {0.2, 0.3, 0.4}, {0.3, 0.7, 0.9}});
    }

    @Test
    void twoSpotsAreTheSumOfEachAlone() {
        // two spot heaters of different strength and width in a held cube: the source written as a sum is split
        // into its terms, a product each; each spot alone takes the whole-source route
        String one = "1000*exp(-((x-0.3)^2+(y-0.3)^2+(z-0.3)^2)/0.05)";
        String two = "500*exp(-((x-0.7)^2+(y-0.6)^2+(z-0.5)^2)/0.03)";
        assertSuperposed(one + " + " + two, one, two,
            new double[][] {{0.5, 0.4, 0.6}, {0.3, 0.3, 0.3}, {0.7, 0.6, 0.5}});
    }

    /**
     * The held cube's steady problem is linear, so the solution for a source written as {@code sum}, equal to
     * A + B, is the sum of A's alone and B's (superposition, common practice): checked at 1e-6 at the points, within the three summed bounds, with
     * each part far above those bounds (so that dropping either would fail).
     */
    private static void assertSuperposed(String sum, String one, String two, double[][] points) {
        double tol = 1e-6;
        Oracle both = Oracle.prepare(BoxPairSourceTest.heldUnitCube(sum), 0, tol);
        Oracle first = Oracle.prepare(BoxPairSourceTest.heldUnitCube(one), 0, tol);
        Oracle second = Oracle.prepare(BoxPairSourceTest.heldUnitCube(two), 0, tol);
        double limit = tol * (both.temperatureScale() + first.temperatureScale() + second.temperatureScale());
        for (double[] p : points) {
            Evaluation a = first.temperature(p, 0);
            Evaluation b = second.temperature(p, 0);
            Evaluation c = both.temperature(p, 0);
            double bounds = a.bound() + b.bound() + c.bound();
            assertWithin(a.value() + b.value(), new Evaluation(c.value(), bounds), limit,
                sum + " as " + one + " plus " + two + " at " + java.util.Arrays.toString(p));
            assertTrue(Math.min(Math.abs(a.value()), Math.abs(b.value())) > 100 * bounds,
                "both parts far above the bounds at " + java.util.Arrays.toString(p) + ": " + a.value() + ", "
                    + b.value());
        }
    }

    @Test
    void refusesACouplingThatIsNotOneProduct() {
        // a spot beside exp(x y z): the second term couples all three and neither it nor its coupled part is a
        // product; the refusal names it
        Problem mixed = BoxPairSourceTest.heldUnitCube("exp(-((x-0.3)^2+(y-0.3)^2+(z-0.3)^2)/0.05) + exp(x*y*z)");
        OracleException e = assertThrows(OracleException.class, () -> Oracle.prepare(mixed, 0, 1e-6));
        assertEquals(OracleException.Reason.UNSUPPORTED, e.reason());
        assertTrue(e.getMessage().contains("one product F(x) G(y) H(z)"), e.getMessage());
        assertTrue(e.getMessage().contains("exp(((x*y)*z))"), e.getMessage());
    }
}

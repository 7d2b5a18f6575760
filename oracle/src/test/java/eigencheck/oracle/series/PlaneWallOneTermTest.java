package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertClose;

import eigencheck.oracle.Oracle;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.modes.SlabModes;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Slab;
import java.util.Map;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * Plane wall of half-thickness L convecting at both faces: first eigenvalue zeta_1 and one-term
 * coefficient C_1 against Incropera, DeWitt, Bergman and Lavine, <i>Fundamentals of Heat and Mass
 * Transfer</i>, 6th ed., Wiley, 2007, Table 5.1 (values recalled from memory, 4 decimals).
 */
class PlaneWallOneTermTest {

    @ParameterizedTest(name = "Bi = {0}")
    @CsvSource({"0.1, 0.3111, 1.0161", "1.0, 0.8603, 1.1191", "10, 1.4289, 1.2620"})
    void firstRootAndCoefficientMatchIncropera2007Table5_1(double biot, double zeta1, double c1) {
        // Table 5.1 prints 4 decimals: tolerance half a unit in the last place.
        double root = SlabModes.planeWallRoot(1, biot);
        assertClose(zeta1, root, 0.5e-4, "zeta_1 at Bi = " + biot);

        // C_1 through the oracle itself: the half wall 0 < x < L with an insulated centre (x = 0) and
        // convection to 0 at x = L, uniform initial value 1. Once the second mode has decayed below
        // 1e-13, u(0, t) = C_1 exp(-zeta_1^2 Fo) exactly (Fo = alpha t / L^2).
        double length = 1;
        double k = 1;
        Problem p = new Problem(new Slab(length), Material.ofDiffusivity(1), Expression.parse("1", "x"),
            Expression.parse("0", "x", "t"), Map.of(
                Side.XMIN, new BoundaryCondition.Neumann(Expression.parse("0", "t")),
                Side.XMAX, new BoundaryCondition.Robin(biot * k / length, Expression.parse("0", "t"))));
        double zeta2 = SlabModes.planeWallRoot(2, biot);
        double fo = 30 / (zeta2 * zeta2 - root * root);
        Oracle oracle = Oracle.prepare(p, fo, 1e-12);
        double centre = oracle.temperature(0, fo).value();
        double coefficient = centre / Math.exp(-root * root * fo);
        assertClose(c1, coefficient, 0.5e-4, "C_1 at Bi = " + biot);
        // and the textbook's closed form C_1 = 4 sin(z)/(2z + sin 2z) (Incropera 2007, eq. 5.42b) to 1e-9
        assertClose(4 * Math.sin(root) / (2 * root + Math.sin(2 * root)), coefficient, 1e-9, "C_1 closed form");
    }

    @ParameterizedTest(name = "Bi = {0}")
    @ValueSource(doubles = {1, 10})
    void firstSixRootsMatchBrentSolver(double biot) {
        // Reference: Commons Math BrentSolver on z sin z - Bi cos z = 0 (z tan z = Bi without poles) in
        // each bracket ((n-1) pi, (n-1/2) pi), to absolute accuracy 1e-15.
        BrentSolver brent = new BrentSolver(1e-15, 1e-15);
        for (int n = 1; n <= 6; n++) {
            double lo = (n - 1) * Math.PI + 1e-14;
            double hi = (n - 0.5) * Math.PI;
            double reference = brent.solve(1000, z -> z * Math.sin(z) - biot * Math.cos(z), lo, hi);
            assertClose(reference, SlabModes.planeWallRoot(n, biot), 1e-12, "root " + n + " at Bi = " + biot);
        }
    }

    @ParameterizedTest(name = "Bi = {0}")
    @ValueSource(doubles = {1e-6, 1e-3, 1, 1e3, 1e6})
    void rootsAreInTheirBracketsAndSolveTheEigenconditionAcrossBiotNumbers(double biot) {
        for (int n = 1; n <= 200; n++) {
            double z = SlabModes.planeWallRoot(n, biot);
            assertClose((n - 0.75) * Math.PI, z, 0.25 * Math.PI, "bracket of root " + n);
            // z tan z = Bi written without the pole: f(z) = z sin z - Bi cos z = 0. The root error implied by
            // the residual, |f| / |f'|, must be within 8 ulps of z plus the rounding of f itself.
            double residual = z * Math.sin(z) - biot * Math.cos(z);
            double slope = Math.abs(Math.sin(z) + z * Math.cos(z) + biot * Math.sin(z));
            double rounding = 4 * Math.ulp(1.0) * (Math.abs(z * Math.sin(z)) + Math.abs(biot * Math.cos(z)));
            assertClose(0, Math.abs(residual) / slope, 8 * Math.ulp(z) + rounding / slope,
                "implied error of root " + n + " at Bi = " + biot);
        }
        // Robin on both faces (the full wall 0 < x < L): sin(mu x + phi) must satisfy both conditions
        SlabModes modes = new SlabModes(1, biot, biot);
        for (int n = 1; n <= 50; n++) {
            double mu = modes.mu(n);
            double phi = modes.phase(n);
            double atRight = mu * Math.cos(mu + phi) + biot * Math.sin(mu + phi);
            assertClose(0, atRight / (mu + biot), 1e-12, "right condition of mode " + n);
            double atLeft = mu * Math.cos(phi) - biot * Math.sin(phi);
            assertClose(0, atLeft / (mu + biot), 1e-12, "left condition of mode " + n);
        }
    }
}

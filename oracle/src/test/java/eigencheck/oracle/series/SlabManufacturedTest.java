package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertCertified;

import eigencheck.oracle.Evaluation;
import eigencheck.oracle.Oracle;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.Manufactured;
import eigencheck.oracle.problem.Manufactured.Face;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Slab;
import java.util.stream.Stream;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

/**
 * Method of manufactured solutions (common practice; Roache, <i>Verification and Validation in
 * Computational Science and Engineering</i>, Hermosa, 1998, ch. 3): the series, fed with the source,
 * face data and initial value derived from a closed-form u(x, t), must reproduce u to the tolerance,
 * with an honest and tight bound. Each boundary type appears on each face; all nine pairs occur.
 */
class SlabManufacturedTest {
    private static final double TOLERANCE = 1e-10;

    static Stream<Arguments> cases() {
        return Stream.of(
            Arguments.of("D-D polynomial times exponential", "(1 + x^2 - 0.5*x^3) * exp(-0.7*t)",
                Face.dirichlet(), Face.dirichlet(), 1.0),
            Arguments.of("D-N trigonometric", "sin(3*x + 1) * cos(2*t) + 0.2*t", Face.dirichlet(), Face.neumann(), 1.0),
            Arguments.of("N-D polynomial", "x^3 - 2*x*t + t^2", Face.neumann(), Face.dirichlet(), 1.0),
            Arguments.of("N-N mean rising", "cos(x) * exp(-0.5*t) + t * x^2", Face.neumann(), Face.neumann(), 1.0),
            Arguments.of("R-D exponential", "exp(-x) * (1 + 0.5*sin(t))", Face.robin(3.0), Face.dirichlet(), 1.0),
            Arguments.of("D-R polynomial times exponential", "1 + x*(1 - x)*t*exp(-t)", Face.dirichlet(),
                Face.robin(0.7), 1.0),
            Arguments.of("R-R hyperbolic", "cosh(x - 0.3) * (1 + t^2)", Face.robin(5.0), Face.robin(0.2), 1.0),
            Arguments.of("N-R steep boundary layer", "exp(-x/0.05) * (1 + t) + x^2", Face.neumann(), Face.robin(2.0),
                1.0),
            Arguments.of("R-N trigonometric", "sin(2*pi*x) * exp(-t) + cos(t)", Face.robin(1.5), Face.neumann(), 1.0),
            Arguments.of("R-D Biot 1e-6", "1 + 0.3*x^2*exp(-t) - 0.1*t", Face.robin(2e-6), Face.dirichlet(), 1.0),
            Arguments.of("R-R Biot 1e6", "sin(x + 0.5) * exp(-0.2*t)", Face.robin(2e6), Face.robin(2e6), 1.0),
            Arguments.of("D-D thin wall, fast data", "100*sin(0.5*t) * x / 0.02 + 20", Face.dirichlet(),
                Face.dirichlet(), 0.02));
    }

    @ParameterizedTest(name = "{0}")
    @MethodSource("cases")
    void seriesReproducesManufacturedSolution(String name, String formula, Face left, Face right, double length) {
        Material material = new Material(2.0, 3.0); // k = 2 W/(m K), rho c = 3 J/(m^3 K): alpha = 2/3
        Expression u = Expression.parse(formula, "x", "t");
        Problem problem = Manufactured.slab(u, new Slab(length), material, left, right);
        double horizon = 3.0;
        Oracle oracle = Oracle.prepare(problem, horizon, TOLERANCE);
        double scale = oracle.temperatureScale();
        Expression ux = u.derivative("x");
        for (double t : new double[] {0.003, 0.01, 0.1, 0.5, 1, 3}) {
            // the flux at a point is a sum of modal terms as large as the largest flux in the slab (a steep
            // layer's at its face): tightness is asked only above 32 ulps of that
            double fluxPeak = 0;
            for (int i = 0; i <= 10; i++) {
                fluxPeak = Math.max(fluxPeak, Math.abs(material.conductivity() * ux.value(length * i / 10.0, t)));
            }
            double fluxFloor = 32 * Math.ulp(fluxPeak);
            for (int i = 0; i <= 10; i++) {
                double x = length * i / 10.0;
                String where = name + " at x = " + x + ", t = " + t;
                Evaluation e = oracle.temperature(x, t);
                assertCertified(u.value(x, t), e, where);
                if (e.bound() > TOLERANCE * scale) {
                    throw new AssertionError(where + ": bound above the tolerance");
                }
                Evaluation q = oracle.heatFlux(x, t);
                assertCertified(-material.conductivity() * ux.value(x, t), q, fluxFloor, where + " (flux)");
            }
            double x0 = 0.13 * length;
            double x1 = 0.41 * length;
            Evaluation avg = oracle.cellAverage(x0, x1, t);
            assertCertified(average(u, x0, x1, t), avg, name + " cell average at t = " + t);
        }
    }

    /** Mean of u over [x0, x1] by composite 40-point Gauss-Legendre from Commons Math. */
    static double average(Expression u, double x0, double x1, double t) {
        var integrator = new org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator(
            32, 1e-15, 1e-18);
        double integral = integrator.integrate(100000, x -> u.value(x, t), x0, x1);
        return integral / (x1 - x0);
    }
}

package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertCertified;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import eigencheck.oracle.Oracle;
import eigencheck.oracle.OracleException;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Slab;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * Steady slab problems, -k u'' = Q with the face conditions, against closed forms obtained by
 * integrating twice (common practice).
 */
class SlabSteadyTest {
    private static Problem steady(double length, double k, String source, BoundaryCondition left,
                                  BoundaryCondition right) {
        return new Problem(new Slab(length), new Material(k, 1e6), Expression.parse("0", "x"),
            Expression.parse(source, "x", "t"), Map.of(Side.XMIN, left, Side.XMAX, right), true);
    }

    private static BoundaryCondition d(double v) {
        return new BoundaryCondition.Dirichlet(Expression.parse(Double.toString(v), "t"));
    }

    /**
     * A heater far narrower than the fit's first sampling, Q = exp(-((x - 0.37)/w)^2) with w = 3e-3, 1e-3
     * and 3e-4 of a unit slab held at 20 degC (k = 1). Integrating twice (common practice),
     * u = 20 + x (G1(1) - G2(1)) - (x G1(x) - G2(x)) with G1 = int_0^x Q = w sqrt(pi)/2 (erf((x - x0)/w) +
     * erf(x0/w)) and G2 = int_0^x s Q = w^2/2 (exp(-(x0/w)^2) - exp(-((x - x0)/w)^2)) + x0 G1 (Commons Math
     * Erf). Before the fit checked its panels against a uniform scan, the heater fell between the samples
     * and the answer, 20 exactly, came with a bound of 1e-10 for an error of 2e-4.
     */
    @Test
    void narrowHeaterIsSeenAndResolved() {
        double x0 = 0.37;
        for (double w : new double[] {3e-3, 1e-3, 3e-4}) {
            Problem p = new Problem(new Slab(1), new Material(1, 1e6), Expression.parse("0", "x"),
                Expression.parse("exp(-((x - " + x0 + ")/" + w + ")^2)", "x", "t"), Map.of(Side.XMIN, d(20), Side.XMAX,
                d(20)), true);
            Oracle o = Oracle.prepare(p, 0, 1e-10);
            java.util.function.DoubleUnaryOperator g1 = x -> w * Math.sqrt(Math.PI) / 2
                * (org.apache.commons.math3.special.Erf.erf((x - x0) / w) + org.apache.commons.math3.special.Erf.erf(x0 / w));
            java.util.function.DoubleUnaryOperator g2 = x -> w * w / 2 * (Math.exp(-(x0 / w) * (x0 / w))
                - Math.exp(-((x - x0) / w) * ((x - x0) / w))) + x0 * g1.applyAsDouble(x);
            for (double x : new double[] {0.2, x0, x0 + w / 2, 0.8}) {
                double exact = 20 + x * (g1.applyAsDouble(1) - g2.applyAsDouble(1)) - (x * g1.applyAsDouble(x)
                    - g2.applyAsDouble(x));
                assertCertified(exact, o.temperature(x, Double.POSITIVE_INFINITY), "w = " + w + ", x = " + x);
            }
        }
    }

    @Test
    void uniformSourceBetweenTwoFixedTemperatures() {
        // u = T0 + (T1 - T0) x/L + Q x (L - x)/(2k)
        double l = 0.3;
        double k = 2.5;
        double q = 4e4;
        Oracle o = Oracle.prepare(steady(l, k, Double.toString(q), d(20), d(80)), 0, 1e-10);
        assertEquals(0, o.modesUsed(0));
        for (int i = 0; i <= 10; i++) {
            double x = l * i / 10;
            double exact = 20 + 60 * x / l + q * x * (l - x) / (2 * k);
            assertCertified(exact, o.temperature(x, 0), "u at x = " + x);
            assertCertified(-k * (60 / l + q * (l - 2 * x) / (2 * k)), o.heatFlux(x, 0), "flux at x = " + x);
        }
        // mean over the slab: (T0 + T1)/2 + Q L^2/(12 k)
        assertCertified(50 + q * l * l / (12 * k), o.cellAverage(0, l, 0), "mean");
    }

    @Test
    void sineSourceWithZeroFacesGivesTheSineSolution() {
        // -k u'' = Q0 sin(pi x/L): u = Q0 L^2/(k pi^2) sin(pi x/L); the source is not polynomial
        double l = 1;
        double k = 3;
        Oracle o = Oracle.prepare(steady(l, k, "500*sin(pi*x)", d(0), d(0)), 0, 1e-10);
        for (int i = 0; i <= 10; i++) {
            double x = i / 10.0;
            assertCertified(500 / (k * Math.PI * Math.PI) * Math.sin(Math.PI * x), o.temperature(x, 7), "u at " + x);
        }
    }

    @Test
    void fluxInOnOneFaceConvectionOnTheOther() {
        // k du/dn = q at x = 0 (into the body), -k u' = h (u - ua) at x = L, no source:
        // u = ua + q/h + q (L - x)/k
        double l = 0.05;
        double k = 15;
        double h = 40;
        Problem p = steady(l, k, "0", new BoundaryCondition.Neumann(Expression.parse("1200", "t")),
            new BoundaryCondition.Robin(h, Expression.parse("25", "t")));
        Oracle o = Oracle.prepare(p, 0, 1e-10);
        for (int i = 0; i <= 10; i++) {
            double x = l * i / 10;
            assertCertified(25 + 1200 / h + 1200 * (l - x) / k, o.temperature(x, 0), "u at " + x);
        }
    }

    @Test
    void steadyStatesThatDoNotExistOrDependOnTimeAreRefused() {
        BoundaryCondition zero = new BoundaryCondition.Neumann(Expression.parse("0", "t"));
        OracleException e = assertThrows(OracleException.class, () -> Oracle.prepare(steady(1, 1, "0", zero, zero), 0,
            1e-10));
        assertEquals(OracleException.Reason.UNSUPPORTED, e.reason());
        assertTrue(e.getMessage().contains("no unique steady state"), e.getMessage());
        IllegalArgumentException t = assertThrows(IllegalArgumentException.class, () -> steady(1, 1, "sin(t)", d(0),
            d(0)));
        assertTrue(t.getMessage().contains("source: depends on t"), t.getMessage());
    }
}

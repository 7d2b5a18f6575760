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

package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertCertified;
import static eigencheck.oracle.testing.NumericAssertions.assertClose;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import eigencheck.oracle.Evaluation;
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
 * Identity checks (common practice, shared/STYLE.md section 7): energy balance, steady limit, the
 * Neumann-Neumann mean rise, step initial data, incompatible data and refusals.
 */
class SlabIdentitiesTest {
    private static BoundaryCondition dirichlet(String f) {
        return new BoundaryCondition.Dirichlet(Expression.parse(f, "t"));
    }

    private static BoundaryCondition neumann(String f) {
        return new BoundaryCondition.Neumann(Expression.parse(f, "t"));
    }

    private static BoundaryCondition robin(double h, String f) {
        return new BoundaryCondition.Robin(h, Expression.parse(f, "t"));
    }

    private static Problem slab(double length, Material m, String initial, String source, BoundaryCondition left,
                                BoundaryCondition right) {
        return new Problem(new Slab(length), m, Expression.parse(initial, "x"), Expression.parse(source, "x", "t"),
            Map.of(Side.XMIN, left, Side.XMAX, right));
    }

    @Test
    void heatContentChangesByBoundaryHeatFlowPlusSource() {
        // rho c d/dt int u dx = q_in(0) + q_in(L) + int Q dx; q_in(0) = -k u_x(0) = flux(0),
        // q_in(L) = k u_x(L) = -flux(L). A non-separable source and time-varying Robin data.
        Material m = new Material(15, 4e6);
        double length = 0.05;
        Problem p = slab(length, m, "20 + 30*x/0.05", "2e5*exp(-x/0.01)*(1 + sin(0.01*t))",
            robin(40, "20 + 5*sin(0.002*t)"), dirichlet("50 + 0.01*t"));
        Oracle oracle = Oracle.prepare(p, 3000, 1e-11);
        for (double t : new double[] {50, 400, 2000}) {
            double dt = 1.0;
            // fourth-order central difference of the heat content: error ~ dt^4 u'''''
            double[] content = new double[5];
            for (int j = -2; j <= 2; j++) {
                content[j + 2] = m.volumetricHeatCapacity() * length * oracle.cellAverage(0, length, t + j * dt).value();
            }
            double rate = (content[0] - 8 * content[1] + 8 * content[3] - content[4]) / (12 * dt);
            double inflow = oracle.heatFlux(0, t).value() - oracle.heatFlux(length, t).value();
            var integrator = new org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator(
                32, 1e-14, 1e-18);
            Expression q = p.source();
            double source = integrator.integrate(100000, x -> q.value(x, t), 0, length);
            double balance = inflow + source;
            assertClose(balance, rate, 1e-7 * (Math.abs(inflow) + Math.abs(source)), "energy balance at t = " + t);
        }
    }

    @Test
    void largeTimeEqualsSteadySolution() {
        // Robin at x = 0 (h, ambient ua), Dirichlet us at x = L, uniform source Q. Steady state (common
        // practice): u = us + Q (L^2 - x^2)/(2k) + C (L - x) with C from -k u'(0) = h (ua - u(0))...
        double k = 2;
        double h = 10;
        double length = 0.3;
        double q = 5000;
        double ua = 15;
        double us = 60;
        Problem p = slab(length, new Material(k, 1e5), "0", Double.toString(q), robin(h, Double.toString(ua)),
            dirichlet(Double.toString(us)));
        // u = us + q (L^2 - x^2)/(2k) + c (L - x); k u'(0) = h (u(0) - ua) with u'(0) = -c
        double c = (h * (ua - us - q * length * length / (2 * k))) / (k + h * length);
        double tau = length * length / (k / 1e5);
        Oracle oracle = Oracle.prepare(p, 60 * tau, 1e-10);
        for (int i = 0; i <= 6; i++) {
            double x = length * i / 6;
            double steady = us + q * (length * length - x * x) / (2 * k) + c * (length - x);
            assertCertified(steady, oracle.temperature(x, 60 * tau), "steady limit at x = " + x);
        }
    }

    @Test
    void insulatedSlabWithNetInputRaisesTheMeanLinearly() {
        // Neumann at both faces: mean = mean(initial) + (q0 + qL) t / (rho c L) (energy balance).
        Material m = new Material(0.5, 2e6);
        double length = 0.2;
        Problem p = slab(length, m, "10 + 5*cos(pi*x/0.2)", "0", neumann("300"), neumann("-100 + 50*t/1000"));
        Oracle oracle = Oracle.prepare(p, 1000, 1e-10);
        for (double t : new double[] {1, 100, 1000}) {
            double input = 300 * t + (-100 * t + 25 * t * t / 1000);
            double mean = 10 + input / (m.volumetricHeatCapacity() * length);
            assertCertified(mean, oracle.cellAverage(0, length, t), "mean at t = " + t);
        }
    }

    @Test
    void stepInitialDataIsCertifiedForEveryPositiveTimeAndRefusedOnTheJumpAtTimeZero() {
        // u(x,0) = step(x - 0.3) on 0 < x < 1, u = 0 on both faces, alpha = 1:
        // u = sum c_n exp(-n^2 pi^2 t) sin(n pi x), c_n = 2 (cos(0.3 n pi) - cos(n pi)) / (n pi)
        // (common practice: sine series of a step).
        Problem p = slab(1, Material.ofDiffusivity(1), "step(x - 0.3)", "0", dirichlet("0"), dirichlet("0"));
        Oracle oracle = Oracle.prepare(p, 1, 1e-10);
        for (double t : new double[] {1e-4, 1e-3, 0.01, 0.1, 1}) {
            for (int i = 0; i <= 20; i++) {
                double x = i / 20.0;
                double exact = 0;
                for (int n = 1; n < 200000; n++) {
                    double decay = Math.exp(-n * n * Math.PI * Math.PI * t);
                    if (decay < 1e-40) {
                        break;
                    }
                    exact += 2 * (Math.cos(0.3 * n * Math.PI) - Math.cos(n * Math.PI)) / (n * Math.PI) * decay
                        * Math.sin(n * Math.PI * x);
                }
                assertCertified(exact, oracle.temperature(x, t), "step data at x = " + x + ", t = " + t);
            }
        }
        OracleException refused = assertThrows(OracleException.class, () -> oracle.temperature(0.3, 0));
        assertEquals(OracleException.Reason.NOT_CERTIFIED, refused.reason());
        assertTrue(refused.getMessage().contains("jumps"), refused.getMessage());
        assertEquals(1.0, oracle.temperature(0.6, 0).value());
        assertEquals(0.0, oracle.temperature(0.1, 0).value());
    }

    @Test
    void incompatibleDataIsRefusedOnTheFaceAtTimeZeroOnly() {
        Problem p = slab(1, Material.ofDiffusivity(1), "0", "0", dirichlet("1"), robin(2, "0"));
        Oracle oracle = Oracle.prepare(p, 1, 1e-10);
        OracleException refused = assertThrows(OracleException.class, () -> oracle.temperature(0, 0));
        assertTrue(refused.getMessage().contains("incompatible"), refused.getMessage());
        for (double t : new double[] {1e-5, 1e-3, 0.1, 1}) {
            Evaluation e = oracle.temperature(0, t);
            assertClose(1, e.value(), e.bound(), "face value at t = " + t);
            assertTrue(oracle.temperature(0.5, t).bound() <= 1e-10, "certified inside at t = " + t);
        }
    }

    @Test
    void refusesPointsOutsideTheDomainAndTheTimeRange() {
        Problem p = slab(1, Material.ofDiffusivity(1), "0", "0", dirichlet("1"), dirichlet("0"));
        Oracle oracle = Oracle.prepare(p, 1, 1e-10);
        assertEquals(OracleException.Reason.OUTSIDE_DOMAIN,
            assertThrows(OracleException.class, () -> oracle.temperature(1.5, 0.5)).reason());
        assertEquals(OracleException.Reason.OUTSIDE_TIME_RANGE,
            assertThrows(OracleException.class, () -> oracle.temperature(0.5, -1)).reason());
        assertEquals(OracleException.Reason.OUTSIDE_TIME_RANGE,
            assertThrows(OracleException.class, () -> oracle.temperature(0.5, 2)).reason());
        assertEquals(OracleException.Reason.OUTSIDE_TIME_RANGE,
            assertThrows(OracleException.class, () -> oracle.temperature(0.5, Double.NaN)).reason());
        assertEquals(OracleException.Reason.TOO_MANY_MODES,
            assertThrows(OracleException.class, () -> oracle.temperature(0.5, 1e-12)).reason());
    }

    @Test
    void refusesDataThatAreNotFiniteOrNotSmoothInTime() {
        Material m = Material.ofDiffusivity(1);
        OracleException nan = assertThrows(OracleException.class, () -> Oracle.prepare(
            slab(1, m, "log(x - 0.5)", "0", dirichlet("0"), dirichlet("0")), 1, 1e-10));
        assertEquals(OracleException.Reason.DATA_NOT_FINITE, nan.reason());
        assertTrue(nan.getMessage().startsWith("initial:"), nan.getMessage());
        OracleException rough = assertThrows(OracleException.class, () -> Oracle.prepare(
            slab(1, m, "0", "0", dirichlet("step(t - 0.5)"), dirichlet("0")), 1, 1e-10));
        assertEquals(OracleException.Reason.DATA_NOT_RESOLVED, rough.reason());
        assertTrue(rough.getMessage().startsWith("boundary.xmin:"), rough.getMessage());
    }

    @Test
    void bulkEvaluationEqualsPointwiseAndNamesTheFirstRefusedPoint() {
        Problem p = slab(1, Material.ofDiffusivity(0.1), "x*(1-x)", "sin(3*x)*exp(-t)", robin(1, "0"), dirichlet("0"));
        Oracle oracle = Oracle.prepare(p, 2, 1e-10);
        int n = 500;
        double[] x = new double[n];
        double[] t = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = (i * 37 % 101) / 100.0;
            t[i] = 0.5 * (i % 4) + 0.1;
        }
        double[] v = new double[n];
        double[] b = new double[n];
        oracle.evaluate(Oracle.Quantity.TEMPERATURE, x, t, v, b);
        for (int i = 0; i < n; i++) {
            assertEquals(oracle.temperature(x[i], t[i]).value(), v[i], 0.0, "point " + i);
        }
        x[123] = 2;
        x[321] = -1;
        OracleException e = assertThrows(OracleException.class,
            () -> oracle.evaluate(Oracle.Quantity.TEMPERATURE, x, t, v, b));
        assertTrue(e.getMessage().startsWith("point 123: "), e.getMessage());
    }
}

package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertCertified;
import static eigencheck.oracle.testing.NumericAssertions.assertClose;

import eigencheck.oracle.Evaluation;
import eigencheck.oracle.Oracle;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Slab;
import java.util.Map;
import org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator;
import org.apache.commons.math3.complex.Complex;
import org.apache.commons.math3.ode.FirstOrderDifferentialEquations;
import org.apache.commons.math3.ode.nonstiff.DormandPrince853Integrator;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;

/**
 * NAFEMS thermal benchmark T3, one-dimensional transient: "The Standard NAFEMS Benchmarks", TNSB
 * Rev. 3, NAFEMS, 1990. L = 0.1 m, k = 35 W/(m K), rho = 7200 kg/m^3, c = 440.5 J/(kg K);
 * u(0, t) = 0, u(L, t) = 100 sin(pi t / 40) degC, u(x, 0) = 0; target u(0.08 m, 32 s) = 36.60 degC.
 */
class NafemsT3Test {
    private static final double L = 0.1;
    private static final double K = 35;
    private static final double RHO_C = 7200 * 440.5;
    private static final double ALPHA = K / RHO_C;
    private static final double OMEGA = Math.PI / 40;
    private static Oracle oracle;

    @BeforeAll
    static void prepare() {
        Problem p = new Problem(new Slab(L), new Material(K, RHO_C), Expression.parse("0", "x"),
            Expression.parse("0", "x", "t"),
            Map.of(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("0", "t")),
                Side.XMAX, new BoundaryCondition.Dirichlet(Expression.parse("100*sin(pi*t/40)", "t"))));
        oracle = Oracle.prepare(p, 32, 1e-10);
    }

    @Test
    void targetMatchesNafems1990T3ToItsRounding() {
        // NAFEMS TNSB Rev. 3 (1990), test T3: 36.60 degC, printed to 2 decimals; tolerance half a unit.
        Evaluation e = oracle.temperature(0.08, 32);
        assertClose(36.60, e.value(), 0.005 + e.bound(), "T3 u(0.08, 32)");
        // A converged series (the figure, 6 digits): 36.6031
        assertClose(36.6031, e.value(), 0.00005 + e.bound(), "T3 u(0.08, 32), 6 digits");
    }

    /**
     * Independent closed form (common practice: the periodic response plus decaying transient):
     * u = Im[100 e^{i w t} sinh(kx)/sinh(kL)] + sum d_n exp(-lambda_n t) sin(n pi x/L), k^2 = i w/alpha,
     * d_n = -Im[100 (2/L) mu_n (-1)^{n+1}/(k^2 + mu_n^2)], from int_0^L sinh(kx) sin(mu x) dx =
     * -mu (-1)^n sinh(kL)/(k^2 + mu^2). Complex arithmetic from Commons Math.
     */
    static double periodicReference(double x, double t) {
        Complex kappa = new Complex(0, OMEGA / ALPHA).sqrt();
        Complex steady = new Complex(0, OMEGA * t).exp().multiply(100)
            .multiply(kappa.multiply(x).sinh()).divide(kappa.multiply(L).sinh());
        double u = steady.getImaginary();
        Complex k2 = new Complex(0, OMEGA / ALPHA);
        for (int n = 1; n <= 4000; n++) {
            double mu = n * Math.PI / L;
            double decay = Math.exp(-ALPHA * mu * mu * t);
            if (decay < 1e-30) {
                break;
            }
            double sign = (n % 2 == 1) ? 1 : -1;
            double d = -new Complex(100 * 2 / L * mu * sign).divide(k2.add(mu * mu)).getImaginary();
            u += d * decay * Math.sin(mu * x);
        }
        return u;
    }

    @Test
    void seriesAgreesWithPeriodicClosedFormAndBoundsAreHonest() {
        for (double t : new double[] {0.5, 2, 8, 20, 32}) {
            for (int i = 0; i <= 10; i++) {
                double x = L * i / 10;
                // both sides sum terms of the 100 K amplitude: below 32 of its ulps (4.5e-13) the error is rounding
                assertCertified(periodicReference(x, t), oracle.temperature(x, t), 32 * Math.ulp(100.0),
                    "T3 at x = " + x + ", t = " + t);
            }
        }
    }

    /**
     * Check 5, independent integration: Commons Math's DormandPrince853Integrator on the modal
     * equations. Two quasi-static terms are taken out by hand (w = x b/L, S1 = b'(x^3 - L^2 x)/(6 alpha L),
     * S2 = b''(x^5/20 - L^2 x^3/6 + 7 L^4 x/60)/(6 alpha^2 L)), so the remaining modal amplitudes decay
     * like n^-7 and 200 modes suffice; projections by Commons Math's Gauss-Legendre integrator.
     */
    @Test
    void seriesAgreesWithDormandPrince853OnModalEquations() {
        int modes = 200;
        double tEnd = 32;
        double[] amplitude = new double[modes + 1];
        IterativeLegendreGaussIntegrator quad = new IterativeLegendreGaussIntegrator(48, 1e-15, 1e-20);
        for (int n = 1; n <= modes; n++) {
            double mu = n * Math.PI / L;
            // forcing of mode n: -proj(S2_t) = -b'''(t) * proj(P5)/(6 alpha^2 L)
            double p5 = 2 / L * quad.integrate(1_000_000, x -> (Math.pow(x, 5) / 20 - L * L * Math.pow(x, 3) / 6
                + 7 * Math.pow(L, 4) * x / 60) * Math.sin(mu * x), 0, L);
            double p3 = 2 / L * quad.integrate(1_000_000, x -> (Math.pow(x, 3) - L * L * x) * Math.sin(mu * x), 0, L);
            double lambda = ALPHA * mu * mu;
            double forcingScale = p5 / (6 * ALPHA * ALPHA * L);
            // initial: r2(x,0) = -S1(x,0) - S2(x,0); b'(0) = 100 w, b''(0) = 0
            double initial = -(100 * OMEGA) * p3 / (6 * ALPHA * L);
            FirstOrderDifferentialEquations ode = new FirstOrderDifferentialEquations() {
                @Override
                public int getDimension() {
                    return 1;
                }

                @Override
                public void computeDerivatives(double t, double[] y, double[] dy) {
                    double b3 = -100 * OMEGA * OMEGA * OMEGA * Math.cos(OMEGA * t);
                    dy[0] = -lambda * y[0] - b3 * forcingScale;
                }
            };
            DormandPrince853Integrator dp = new DormandPrince853Integrator(1e-12, 1, 1e-22, 1e-13);
            double[] y = {initial};
            dp.integrate(ode, 0, y, tEnd, y);
            amplitude[n] = y[0];
        }
        double b = 100 * Math.sin(OMEGA * tEnd);
        double b1 = 100 * OMEGA * Math.cos(OMEGA * tEnd);
        double b2 = -100 * OMEGA * OMEGA * Math.sin(OMEGA * tEnd);
        for (int i = 1; i < 10; i++) {
            double x = L * i / 10;
            double u = x / L * b + b1 * (x * x * x - L * L * x) / (6 * ALPHA * L)
                + b2 * (Math.pow(x, 5) / 20 - L * L * Math.pow(x, 3) / 6 + 7 * Math.pow(L, 4) * x / 60)
                / (6 * ALPHA * ALPHA * L);
            for (int n = 1; n <= modes; n++) {
                u += amplitude[n] * Math.sin(n * Math.PI * x / L);
            }
            assertClose(u, oracle.temperature(x, tEnd).value(), 1e-9, "T3 series vs DOP853 at x = " + x);
        }
    }
}

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
import org.apache.commons.math3.special.Erf;
import org.junit.jupiter.api.Test;

/**
 * Semi-infinite solid with a step surface temperature: u = erfc(x / (2 sqrt(alpha t))), Carslaw and
 * Jaeger, <i>Conduction of Heat in Solids</i>, 2nd ed., Oxford, 1959, section 2.4. A slab of unit
 * length with the far face held at 0 differs from it by image terms of order
 * erfc((2L - x)/(2 sqrt(alpha t))), below 1e-30 at the points used. The data are incompatible at
 * t = 0 (u = 1 on the face, 0 inside): the oracle must stay certified for every t > 0.
 */
class SemiInfiniteTest {
    @Test
    void slabAgreesWithErfcAtSmallTimesToOneInTenToTheTwelve() {
        Problem p = new Problem(new Slab(1), Material.ofDiffusivity(1), Expression.parse("0", "x"),
            Expression.parse("0", "x", "t"), Map.of(
                Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("1", "t")),
                Side.XMAX, new BoundaryCondition.Dirichlet(Expression.parse("0", "t"))));
        Oracle oracle = Oracle.prepare(p, 0.01, 1e-10);
        for (double t : new double[] {1e-5, 1e-4, 1e-3, 1e-2}) {
            double reach = Math.min(0.5, 2 - 2 * Math.sqrt(t) * 8.5); // keep erfc((2L - x)/(2 sqrt t)) < 1e-33
            for (int i = 0; i <= 20; i++) {
                double x = reach * i / 20;
                double exact = Erf.erfc(x / (2 * Math.sqrt(t)));
                Evaluation e = oracle.temperature(x, t);
                assertClose(exact, e.value(), 1e-12, "erfc at x = " + x + ", t = " + t);
                assertCertified(exact, e, "erfc at x = " + x + ", t = " + t);
                // surface flux into the solid, -k du/dx = k / sqrt(pi alpha t) at x = 0
                if (i == 0) {
                    Evaluation q = oracle.heatFlux(0, t);
                    assertCertified(1 / Math.sqrt(Math.PI * t), q, "surface flux at t = " + t);
                }
            }
        }
    }
}

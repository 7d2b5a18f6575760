package eigencheck.oracle;

import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.*;
import java.util.Map;
import org.junit.jupiter.api.Test;

class ScratchTest {
    @Test
    void t3() {
        Problem p = new Problem(new Slab(0.1), new Material(35, 7200 * 440.5),
            Expression.parse("0", "x"), Expression.parse("0", "x", "t"),
            Map.of(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("0", "t")),
                   Side.XMAX, new BoundaryCondition.Dirichlet(Expression.parse("100*sin(pi*t/40)", "t"))));
        long t0 = System.nanoTime();
        Oracle o = Oracle.prepare(p, 32, 1e-10);
        Evaluation e = o.temperature(0.08, 32);
        System.out.println("T3 " + e + " modes " + o.modesUsed(32) + " J " + o.quasiStaticSubtractions() + " scale " + o.temperatureScale() + " ms " + (System.nanoTime()-t0)/1e6);
        for (double t : new double[]{1e-3, 0.1, 1, 10, 32}) {
            System.out.println(t + " " + o.temperature(0.08, t) + " modes " + o.modesUsed(t) + " flux " + o.heatFlux(0.05, t));
        }
    }
}

package eigencheck.suites.norms;

import static org.junit.jupiter.api.Assertions.assertEquals;

import eigencheck.oracle.expr.Expression;
import org.junit.jupiter.api.Test;

class ManufacturedReferenceTest {
    @Test
    void planarSolutionGivesValuesAndExactGradients() {
        // u = (1 + t)(x^2 y + y^3): u_x = 2 (1 + t) x y, u_y = (1 + t)(x^2 + 3 y^2) (calculus)
        Expression u = Expression.parse("(1 + t)*(x^2*y + y^3)", "x", "y", "t");
        ManufacturedReference r = new ManufacturedReference(u, 0.5, 0);
        double[] v = new double[2];
        double[] g = new double[6];
        r.evaluate(new double[] {0.3, 0.7, 0, 1.0, 0.2, 0}, v, g);
        assertEquals(1.5 * (0.09 * 0.7 + 0.343), v[0], 1e-15);
        assertEquals(1.5 * 2 * 0.3 * 0.7, g[0], 1e-15);
        assertEquals(1.5 * (0.09 + 3 * 0.49), g[1], 1e-15);
        assertEquals(0, g[2]);
        assertEquals(1.5 * (0.2 + 0.008), v[1], 1e-15);
    }

    @Test
    void slabSolutionIsReadAlongItsAxisAndAveragedExactly() {
        // mean of x^2 over [0, 1] = 1/3 (calculus)
        ManufacturedReference r = new ManufacturedReference(Expression.parse("x^2 + 0*t", "x", "t"), 1, 1);
        double[] v = new double[1];
        double[] g = new double[3];
        r.evaluate(new double[] {5, 0.5, 7}, v, g);
        assertEquals(0.25, v[0], 1e-15);
        assertEquals(1.0, g[1], 1e-15);
        assertEquals(1.0 / 3, r.segmentAverage(0, 1), 1e-13);
    }
}

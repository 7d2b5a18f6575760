package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertWithin;

import eigencheck.oracle.Oracle;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.modes.SlabModes;
import eigencheck.oracle.problem.Manufactured;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Rectangle;
import eigencheck.oracle.problem.Side;
import java.util.EnumMap;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.CsvSource;

/**
 * Bound honesty over many points and face combinations: u = a harmonic quadratic plus one decaying
 * product mode whose factors satisfy the homogeneous conditions of their axis (separation of variables,
 * common practice); the side data are derived exactly, so every side with a quadratic trace carries a
 * series, and the Neumann-Neumann pairs exercise the zero mode.
 */
class RectangleSweepTest {
    private static final double LX = 0.9;
    private static final double LY = 0.6;
    private static final double K = 1.5;

    /** H = h/k of a kind: D Dirichlet, N Neumann, R Robin with h = 6. */
    private static double hOverK(char kind) {
        return kind == 'D' ? Double.POSITIVE_INFINITY : kind == 'N' ? 0 : 6 / K;
    }

    private static Manufactured.Face face(char kind) {
        return kind == 'D' ? Manufactured.Face.dirichlet() : kind == 'N' ? Manufactured.Face.neumann()
            : Manufactured.Face.robin(6);
    }

    @ParameterizedTest(name = "sides {0}{1}{2}{3}")
    @CsvSource({"D,D,D,D", "N,N,D,R", "R,R,N,N", "D,R,R,N", "N,D,N,R", "R,N,D,D"})
    void everyPointWithinItsBound(char xmin, char xmax, char ymin, char ymax) {
        SlabModes mx = new SlabModes(LX, hOverK(xmin), hOverK(xmax));
        SlabModes my = new SlabModes(LY, hOverK(ymin), hOverK(ymax));
        // the second mode of each axis (the first non-constant one of a Neumann-Neumann pair)
        double mu = mx.mu(mx.hasZeroMode() ? 1 : 2);
        double phiX = mx.phase(mx.hasZeroMode() ? 1 : 2);
        double nu = my.mu(my.hasZeroMode() ? 1 : 2);
        double phiY = my.phase(my.hasZeroMode() ? 1 : 2);
        double alpha = K / 2;
        String u = "1 + 0.3*x + 0.5*y + 0.7*(x^2 - y^2) + 0.2*x*y + 2*exp(-" + alpha * (mu * mu + nu * nu) + "*t)*sin("
            + mu + "*x + " + phiX + ")*sin(" + nu + "*y + " + phiY + ")";
        Expression exact = Expression.parse(u, "x", "y", "t");
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, face(xmin));
        kinds.put(Side.XMAX, face(xmax));
        kinds.put(Side.YMIN, face(ymin));
        kinds.put(Side.YMAX, face(ymax));
        Problem p = Manufactured.cartesian(exact, new Rectangle(LX, LY), new Material(K, 2), kinds);
        Oracle o = Oracle.prepare(p, 1, 1e-9);
        SplittableRandom random = new SplittableRandom(31 + xmin + 7 * xmax + 13 * ymin + 17 * ymax);
        double limit = 1e-9 * o.temperatureScale();
        int n = 120;
        double[] points = new double[2 * n];
        double[] t = new double[n];
        for (int i = 0; i < n; i++) {
            points[2 * i] = (0.03 + 0.94 * random.nextDouble()) * LX;
            points[2 * i + 1] = (0.03 + 0.94 * random.nextDouble()) * LY;
            t[i] = 0.01 + random.nextDouble() * 0.99;
        }
        double[] value = new double[n];
        double[] bound = new double[n];
        double[] gradient = new double[2 * n];
        double[] gradientBound = new double[n];
        o.evaluatePoints(points, t, value, bound, gradient, gradientBound);
        Expression ux = exact.derivative("x");
        Expression uy = exact.derivative("y");
        for (int i = 0; i < n; i++) {
            double x = points[2 * i];
            double y = points[2 * i + 1];
            String at = "at " + x + ", " + y + ", t = " + t[i];
            assertWithin(exact.value(x, y, t[i]), new eigencheck.oracle.Evaluation(value[i], bound[i]), limit, "u " + at);
            assertWithin(ux.value(x, y, t[i]), new eigencheck.oracle.Evaluation(gradient[2 * i], gradientBound[i]),
                limit / 0.6, "du/dx " + at);
            assertWithin(uy.value(x, y, t[i]), new eigencheck.oracle.Evaluation(gradient[2 * i + 1], gradientBound[i]),
                limit / 0.6, "du/dy " + at);
        }
    }
}

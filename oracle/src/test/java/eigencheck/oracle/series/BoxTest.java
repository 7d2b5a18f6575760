package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertWithin;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import eigencheck.oracle.Evaluation;
import eigencheck.oracle.Oracle;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.modes.SlabModes;
import eigencheck.oracle.problem.Box;
import eigencheck.oracle.problem.Manufactured;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import java.util.EnumMap;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/** The box: manufactured solutions with a harmonic steady part and a decaying product mode. */
class BoxTest {
    @Test
    void manufacturedHarmonicPlusDecayingMode() {
        // u = 2 + x^2 + y^2 - 2 z^2 + x y z (harmonic) + exp(-lambda t) sin(pi x/Lx) cos(nu y) sin(pi z/(2 Lz)):
        // Dirichlet on x, Neumann at y = 0 and Robin at y = Ly (nu from the Robin root), Dirichlet at z = 0 and
        // Neumann at z = Lz; source 0, faces derived exactly (common practice)
        double lx = 1.0;
        double ly = 0.8;
        double lz = 0.6;
        double k = 3;
        double h = 12;
        double nu = SlabModes.root(1, 0, h / k * ly) / ly;
        double lambda = Math.pow(Math.PI / lx, 2) + nu * nu + Math.pow(Math.PI / (2 * lz), 2);
        double alpha = k / 2.0;
        String u = "2 + x^2 + y^2 - 2*z^2 + x*y*z + exp(-" + lambda * alpha + "*t)*sin(pi*x/" + lx + ")*cos(" + nu
            + "*y)*sin(pi*z/" + (2 * lz) + ")";
        Expression exact = Expression.parse(u, "x", "y", "z", "t");
        Map<Side, Manufactured.Face> kinds = new EnumMap<>(Side.class);
        kinds.put(Side.XMIN, Manufactured.Face.dirichlet());
        kinds.put(Side.XMAX, Manufactured.Face.dirichlet());
        kinds.put(Side.YMIN, Manufactured.Face.neumann());
        kinds.put(Side.YMAX, Manufactured.Face.robin(h));
        kinds.put(Side.ZMIN, Manufactured.Face.dirichlet());
        kinds.put(Side.ZMAX, Manufactured.Face.neumann());
        Problem p = Manufactured.cartesian(exact, new Box(lx, ly, lz), new Material(k, 2), kinds);
        Oracle o = Oracle.prepare(p, 1, 1e-9);
        assertEquals(3, o.dimension());
        SplittableRandom random = new SplittableRandom(3);
        double[] out = new double[3];
        for (int i = 0; i < 60; i++) {
            double x = (0.2 + 0.6 * random.nextDouble()) * lx;
            double y = (0.2 + 0.6 * random.nextDouble()) * ly;
            double z = (0.2 + 0.6 * random.nextDouble()) * lz;
            double t = 0.02 + random.nextDouble();
            Evaluation e = o.temperature(new double[] {x, y, z}, t);
            assertWithin(exact.value(x, y, z, t), e, 1e-9 * o.temperatureScale(), "u at " + x + ", " + y + ", " + z);
            Evaluation[] g = o.gradient(new double[] {x, y, z}, t);
            String[] names = {"x", "y", "z"};
            for (int c = 0; c < 3; c++) {
                double d = exact.derivative(names[c]).value(x, y, z, t);
                assertWithin(d, g[c], 1e-9 * o.temperatureScale() / lx, "du/d" + names[c]);
            }
        }
        // on the Dirichlet face x = 0 the value is the data itself; nearer than about 0.07 L to a face with data
        // the face series of the box needs more than its 256 x 256 modes and the oracle refuses (TOO_MANY_MODES)
        double[] near = {0.5 * lx, 0.5 * ly, 0.09 * lz};
        assertWithin(exact.value(near[0], near[1], near[2], 0.5), o.temperature(near, 0.5), 1e-9 * o.temperatureScale(),
            "0.09 of the edge from z = 0");
        eigencheck.oracle.OracleException refused = org.junit.jupiter.api.Assertions.assertThrows(
            eigencheck.oracle.OracleException.class, () -> o.temperature(new double[] {0.5 * lx, 0.5 * ly, 0.001}, 0.5));
        assertEquals(eigencheck.oracle.OracleException.Reason.TOO_MANY_MODES, refused.reason());
        Evaluation face = o.temperature(new double[] {0, 0.3, 0.2}, 0.5);
        assertWithin(exact.value(0, 0.3, 0.2, 0.5), face, 1e-14 * o.temperatureScale(), "on the face");
        assertTrue(o.modesUsed(0.02) > 1);
    }
}

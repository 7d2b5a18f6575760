package eigencheck.suites.norms;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertNull;

import eigencheck.adapters.Field;
import eigencheck.adapters.ReadOptions;
import eigencheck.adapters.Readers;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** A case that rules on nodal norms asks the reference for the nodes alone. */
class NodalOnlyTest {
    @TempDir
    Path dir;

    @Test
    void nodalNormsDoNotEvaluateQuadraturePoints() throws Exception {
        // two triangles on the unit square, u_h = x + y at the nodes
        Path vtk = dir.resolve("two.vtk");
        Files.writeString(vtk, "# vtk DataFile Version 3.0\ntwo\nASCII\nDATASET UNSTRUCTURED_GRID\nPOINTS 4 double\n"
            + "0 0 0\n1 0 0\n1 1 0\n0 1 0\nCELLS 2 8\n3 0 1 2\n3 0 2 3\nCELL_TYPES 2\n5\n5\n"
            + "POINT_DATA 4\nSCALARS T double 1\nLOOKUP_TABLE default\n0\n1\n2\n1\n");
        Field f = Readers.read(vtk, ReadOptions.defaults()).fields().get(0);
        int[] asked = new int[1];
        // the reference x + y + 0.5 x y: 0.5 at (1, 1), 0 at the other nodes (calculus)
        Reference ref = new Reference() {
            @Override
            public void evaluate(double[] xyz, double[] value, double[] gradient) {
                int n = value.length;
                asked[0] += n;
                for (int i = 0; i < n; i++) {
                    double x = xyz[3 * i];
                    double y = xyz[3 * i + 1];
                    value[i] = x + y + 0.5 * x * y;
                    if (gradient != null) {
                        gradient[3 * i] = 1 + 0.5 * y;
                        gradient[3 * i + 1] = 1 + 0.5 * x;
                        gradient[3 * i + 2] = 0;
                    }
                }
            }

            @Override
            public boolean hasGradient() {
                return true;
            }
        };
        ErrorNorms.Result nodal = ErrorNorms.ofPointData(f, f.pointData().get("T"), ref, false);
        assertEquals(4, asked[0], "the four nodes only");
        assertEquals(0.5, nodal.max(), 1e-15);
        assertEquals(0.25, nodal.rms(), 1e-15, "sqrt(0.25 / 4)");
        assertNull(nodal.l2());
        assertNull(nodal.h1semi());
        ErrorNorms.Result full = ErrorNorms.ofPointData(f, f.pointData().get("T"), ref, true);
        assertNotNull(full.l2());
        assertEquals(true, asked[0] > 8, "the quadrature points too");
    }
}

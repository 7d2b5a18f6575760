package eigencheck.suites.files;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import eigencheck.adapters.InputException;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Box;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import eigencheck.suites.Suite;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Manufactured cases on the rectangle, box, cylinder and sphere in suite files. */
class SuiteFileTest {
    @TempDir
    Path dir;

    @Test
    void boxCaseWithFaceKindsDerivesTheProblemForTheSolver() throws IOException, InputException {
        // u = x y z + t: Q = rho c u_t - k lap(u) = 2 (rho c = 2, lap = 0); on xmin (Dirichlet) u = t; on ymax
        // (Neumann) k du/dn = k x z; on zmax (Robin, h = 4) ambient = u + (k/h) x y (calculus)
        Path suite = dir.resolve("suite.yaml");
        Files.writeString(suite, """
            suite: box
            cases:
              - name: box-mms
                manufactured:
                  solution: "x*y*z + t"
                  domain: {shape: box, lengthX: 1, lengthY: 2, lengthZ: 3}
                  material: {conductivity: 3, volumetricHeatCapacity: 2}
                  boundary: {xmin: dirichlet, xmax: dirichlet, ymin: neumann, ymax: neumann, zmin: dirichlet,
                             zmax: {robin: 4}}
                solver: {command: [solve, "{problem}", "{output}"], output: out.vtu}
                levels: {cells: [4, 8]}
                compare: {times: [1], norms: [l2]}
                expect: {norm: l2, order: 2}
            """);
        Suite s = SuiteFile.read(suite);
        Suite.Case c = s.cases().get(0);
        Problem p = c.problem();
        assertTrue(p.domain() instanceof Box);
        assertEquals(2.0, p.source().value(0.3, 0.4, 0.5, 1.0), 1e-12);
        BoundaryCondition xmin = p.condition(Side.XMIN);
        assertEquals(1.5, xmin.data().value(0.7, 0.2, 1.5), 1e-12, "u = t on x = 0");
        BoundaryCondition ymax = p.condition(Side.YMAX);
        assertEquals(3 * 0.5 * 0.25, ymax.data().value(0.5, 0.25, 0), 1e-12, "k x z on y = 2");
        BoundaryCondition.Robin zmax = (BoundaryCondition.Robin) p.condition(Side.ZMAX);
        assertEquals(0.5 * 1.5 * 3 + 1 + 3.0 / 4 * 0.5 * 1.5, zmax.ambient().value(0.5, 1.5, 1), 1e-12);
        // the problem the solver reads back through {problem}
        Problem back = ProblemFile.fromTree(TreeReader.parse(dir.resolve("p.json"), ProblemFile.toJson(p)));
        assertEquals(p.source().value(0.1, 0.2, 0.3, 0.4), back.source().value(0.1, 0.2, 0.3, 0.4), 1e-12);
        assertEquals(1.25, c.manufactured().value(0.5, 1, 0.5, 1), 1e-12);
    }

    @Test
    void rectangleCaseWithoutFaceKindsLeavesTheDataToTheSolver() throws IOException, InputException {
        Path suite = dir.resolve("suite.yaml");
        Files.writeString(suite, """
            suite: plate
            cases:
              - name: plate-mms
                manufactured:
                  solution: "x*y + t"
                  domain: {shape: rectangle, lengthX: 1, lengthY: 2}
                  material: {diffusivity: 1}
                solver: {command: [solve, "{problem}", "{output}"], output: out.vtu}
                levels: {cells: [4, 8]}
                compare: {times: [1], norms: [l2]}
                expect: {norm: l2, order: 2}
            """);
        Suite.Case c = SuiteFile.read(suite).cases().get(0);
        assertNull(c.problem());
        assertEquals(3.0, c.manufactured().value(1, 2, 1), 1e-12);
    }
    @Test
    void cylinderCaseDerivesSourceAndSurfaceAndReadsRFromTheMesh() throws IOException, InputException {
        // u = 1 + t + r^2: Q = rho c - k (u_rr + u_r / r) = 2 - 3 * 4 = -10 everywhere, r = 0 included; the
        // convective surface's ambient is u + (k/h) u_r = 1 + t + 0.25 + (3/6) (2 * 0.5) at R = 0.5 (calculus)
        Path suite = dir.resolve("suite.yaml");
        Files.writeString(suite, """
            suite: rod
            cases:
              - name: rod-mms
                manufactured:
                  solution: "1 + t + r^2"
                  domain: {shape: cylinder, radius: 0.5}
                  material: {conductivity: 3, volumetricHeatCapacity: 2}
                  boundary: {surface: {robin: 6}}
                solver: {command: [solve, "{problem}", "{output}"], output: out.vtu}
                levels: {cells: [4, 8]}
                compare: {times: [1], norms: [l2]}
                expect: {norm: l2, order: 2}
            """);
        Suite.Case c = SuiteFile.read(suite).cases().get(0);
        Problem p = c.problem();
        assertEquals(-10.0, p.source().value(0, 0.3), 1e-12, "Q at the axis");
        assertEquals(-10.0, p.source().value(0.31, 0.3), 1e-12, "Q at r = 0.31");
        BoundaryCondition.Robin surface = (BoundaryCondition.Robin) p.condition(Side.SURFACE);
        assertEquals(1 + 2 + 0.25 + 0.5, surface.ambient().value(2), 1e-12, "ambient at t = 2");
        // the reference reads r = sqrt(x^2 + y^2) for a cylinder (z along the axis), with the radial gradient
        eigencheck.suites.norms.ManufacturedReference ref = new eigencheck.suites.norms.ManufacturedReference(
            c.manufactured(), 1, 0, true);
        double[] value = new double[1];
        double[] gradient = new double[3];
        ref.evaluate(new double[] {0.3, 0.4, 7}, value, gradient);
        assertEquals(1 + 1 + 0.25, value[0], 1e-12);
        assertEquals(2 * 0.3, gradient[0], 1e-12);
        assertEquals(2 * 0.4, gradient[1], 1e-12);
        assertEquals(0, gradient[2], 0);
    }
}

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

/** Manufactured cases on the rectangle and box in suite files. */
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
}

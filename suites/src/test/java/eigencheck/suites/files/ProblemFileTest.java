package eigencheck.suites.files;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertInstanceOf;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import eigencheck.adapters.InputException;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Slab;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;

class ProblemFileTest {
    private static final Path T3 = Path.of("..", "reference-data", "problems", "nafems-t3.yaml");

    @Test
    void readsTheNafemsT3ProblemFile() throws InputException {
        Problem p = ProblemFile.read(T3);
        assertEquals(0.1, ((Slab) p.domain()).length());
        assertEquals(35, p.material().conductivity());
        assertEquals(7200 * 440.5, p.material().volumetricHeatCapacity(), 1e-6);
        BoundaryCondition right = p.condition(Side.XMAX);
        assertInstanceOf(BoundaryCondition.Dirichlet.class, right);
        assertEquals(100 * Math.sin(Math.PI * 32 / 40), right.data().value(32.0), 1e-12);
    }

    private static InputException fail(String name, String text) {
        return assertThrows(InputException.class, () -> ProblemFile.fromTree(TreeReader.parse(Path.of(name), text)));
    }

    @Test
    void unknownBoundaryTypeIsReportedWithItsPlaceAndTheAllowedTypes() {
        InputException e = fail("p.yaml", """
            domain: {shape: slab, length: 0.1}
            material: {diffusivity: 1e-5}
            initial: "0"
            boundary:
              xmin: {dirichlett: "0"}
              xmax: {neumann: "0"}
            """);
        InputException.Problem first = e.problems().get(0);
        assertEquals(InputException.Cause.UNKNOWN_FIELD, first.cause());
        assertEquals(5, first.location().line());
        assertEquals(10, first.location().column());
        assertEquals("boundary.xmin.dirichlett", first.location().path());
        assertTrue(first.message().contains("did you mean \"dirichlet\""), first.message());
    }

    @Test
    void missingMaterialAndEveryOtherProblemAreReportedTogether() {
        InputException e = fail("p.yaml", """
            domain: {shape: slab, length: -1}
            initial: "0"
            boundary:
              xmin: {robin: {h: 0, ambient: "20"}}
            colour: red
            """);
        assertEquals(5, e.problems().size(), e.getMessage());
        assertTrue(e.problems().stream().anyMatch(p -> p.cause() == InputException.Cause.MISSING
            && p.location().path().equals("material")), e.getMessage());
        assertTrue(e.problems().stream().anyMatch(p -> p.location().path().equals("boundary.xmax")), e.getMessage());
        assertTrue(e.problems().stream().anyMatch(p -> p.location().path().equals("colour")), e.getMessage());
        assertTrue(e.problems().stream().anyMatch(p -> p.location().path().equals("domain.length")
            && p.cause() == InputException.Cause.OUT_OF_RANGE), e.getMessage());
        assertTrue(e.problems().stream().anyMatch(p -> p.location().path().equals("boundary.xmin.robin.h")),
            e.getMessage());
    }

    @Test
    void expressionTypoPointsAtTheColumnInsideTheFile() {
        InputException e = fail("p.json", """
            {"domain": {"shape": "slab", "length": 0.1},
             "material": {"conductivity": 35, "volumetricHeatCapacity": 3.17e6},
             "initial": "20 + 5*sni(x)",
             "boundary": {"xmin": {"dirichlet": "0"}, "xmax": {"dirichlet": "0"}}}
            """);
        InputException.Problem p = e.problems().get(0);
        assertEquals(InputException.Cause.BAD_EXPRESSION, p.cause());
        assertEquals(3, p.location().line());
        // the string's content starts at column 14; "sni" is at column 8 of the expression
        assertEquals(14 + 7, p.location().column());
        assertTrue(p.message().contains("unknown function \"sni\""), p.message());
    }

    @Test
    void readsASphere() throws InputException {
        Problem p = ProblemFile.fromTree(TreeReader.parse(Path.of("s.yaml"), """
            domain: {shape: sphere, radius: 0.05}
            material: {diffusivity: 1e-5}
            initial: "20 + 100*r^2"
            boundary: {surface: {robin: {h: 500, ambient: "300"}}}
            """));
        assertEquals(0.05, ((eigencheck.oracle.problem.Sphere) p.domain()).radius());
        assertEquals(20.25, p.initial().value(0.05), 1e-12);
    }

    @Test
    void rectangleBoxAndCylinderAreRead() throws InputException {
        Problem r = ProblemFile.fromTree(TreeReader.parse(Path.of("r.yaml"), """
            domain: {shape: rectangle, lengthX: 0.6, lengthY: 1.0}
            material: {conductivity: 52, volumetricHeatCapacity: 1}
            steady: true
            boundary:
              xmin: {neumann: "0"}
              xmax: {robin: {h: 750, ambient: "0"}}
              ymin: {dirichlet: "100 + 0*x"}
              ymax: {robin: {h: 750, ambient: "0"}}
            """));
        assertEquals(java.util.List.of("x", "y"), r.domain().coordinates());
        assertEquals(java.util.List.of("x", "t"), r.condition(eigencheck.oracle.problem.Side.YMIN).data().variables());
        Problem b = ProblemFile.fromTree(TreeReader.parse(Path.of("b.yaml"), ProblemFile.toJson(new Problem(
            new eigencheck.oracle.problem.Box(1, 2, 3), eigencheck.oracle.problem.Material.ofDiffusivity(1),
            eigencheck.oracle.expr.Expression.parse("x*y*z", "x", "y", "z"),
            eigencheck.oracle.expr.Expression.parse("0", "x", "y", "z", "t"), boxFaces()))));
        assertEquals(3.0, ((eigencheck.oracle.problem.Box) b.domain()).lengthZ());
        assertEquals(java.util.List.of("x", "y", "t"), b.condition(eigencheck.oracle.problem.Side.ZMAX).data().variables());
        Problem c = ProblemFile.fromTree(TreeReader.parse(Path.of("c.yaml"), """
            domain: {shape: cylinder, radius: 0.05}
            material: {diffusivity: 1e-5}
            initial: "20"
            boundary: {surface: {robin: {h: 500, ambient: "300"}}}
            """));
        assertEquals(0.05, ((eigencheck.oracle.problem.Cylinder) c.domain()).radius());
    }

    private static java.util.Map<eigencheck.oracle.problem.Side, eigencheck.oracle.problem.BoundaryCondition> boxFaces() {
        java.util.Map<eigencheck.oracle.problem.Side, eigencheck.oracle.problem.BoundaryCondition> m =
            new java.util.EnumMap<>(eigencheck.oracle.problem.Side.class);
        String[][] vars = {{"y", "z", "t"}, {"y", "z", "t"}, {"x", "z", "t"}, {"x", "z", "t"}, {"x", "y", "t"},
            {"x", "y", "t"}};
        eigencheck.oracle.problem.Side[] sides = eigencheck.oracle.problem.Side.values();
        for (int i = 0; i < 6; i++) {
            m.put(sides[i], new eigencheck.oracle.problem.BoundaryCondition.Dirichlet(
                eigencheck.oracle.expr.Expression.parse("1 + " + vars[i][0], vars[i])));
        }
        return m;
    }

    @Test
    void malformedYamlAndMisplacedFaceVariablesAreReported() {
        assertEquals(InputException.Cause.MALFORMED, fail("p.yaml", "domain: [1\n").cause());
        // a side's data are expressions of the coordinates along it: x on the face x = 0 is an error
        InputException e = fail("p.yaml", """
            domain: {shape: rectangle, lengthX: 1, lengthY: 2}
            material: {diffusivity: 1}
            initial: "0"
            boundary:
              xmin: {dirichlet: "x + y"}
              xmax: {neumann: "0"}
              ymin: {robin: {h: 5, ambient: "20"}}
              ymax: {dirichlet: "0"}
            """);
        assertTrue(e.getMessage().contains("boundary.xmin") && e.getMessage().contains("y, t"), e.getMessage());
        assertTrue(fail("p.yaml", "domain: {shape: slap, length: 1}\n").getMessage().contains("did you mean \"slab\""));
    }
}

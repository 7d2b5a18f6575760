package eigencheck.suites.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class EvalCommandTest {
    private static final String T3 = Path.of("..", "reference-data", "problems", "nafems-t3.yaml").toString();

    @TempDir
    Path dir;

    private static CliRun run(String... args) {
        return CliRun.of(args);
    }

    private Path file(String name, String content) throws IOException {
        Path p = dir.resolve(name);
        Files.writeString(p, content);
        return p;
    }

    @Test
    void answersNafemsT3FromTheReferenceProblemFile() throws IOException {
        // NAFEMS TNSB Rev. 3 (1990), T3: u(0.08 m, 32 s) = 36.60 degC
        Path points = file("p.csv", "x,t\n0.08,32\n0.05,16\n");
        Path out = dir.resolve("out.csv");
        CliRun r = run("eval", T3, "--points", points.toString(), "--out", out.toString());
        assertEquals(0, r.code(), r.err());
        List<String> lines = Files.readAllLines(out);
        assertEquals("x,t,u,bound", lines.get(0));
        String[] cells = lines.get(1).split(",");
        assertEquals(36.60, Double.parseDouble(cells[2]), 0.005);
        assertTrue(Double.parseDouble(cells[3]) <= 1e-10 * 100, lines.get(1));
        assertTrue(r.err().contains("2 points written"), r.err());
    }

    @Test
    void answersNafemsT4OnTheRectangle() throws IOException {
        // NAFEMS TNSB Rev. 3 (1990), T4: u(0.6 m, 0.2 m) = 18.25 degC, 18.254 from a converged series
        Path t4 = Path.of("..", "reference-data", "problems", "nafems-t4.yaml");
        Path points = Path.of("..", "reference-data", "problems", "nafems-t4-points.csv");
        Path out = dir.resolve("t4.csv");
        CliRun r = run("eval", t4.toString(), "--points", points.toString(), "--out", out.toString());
        assertEquals(0, r.code(), r.err());
        List<String> lines = Files.readAllLines(out);
        assertEquals("x,y,u,bound", lines.get(0));
        String[] cells = lines.get(1).split(",");
        assertEquals("0.6", cells[0]);
        assertEquals(18.254, Double.parseDouble(cells[2]), 0.5e-3);
        assertTrue(Double.parseDouble(cells[3]) <= 1e-10 * 100, lines.get(1));
        // the corner on the Dirichlet side is the side's temperature itself
        assertEquals(100, Double.parseDouble(lines.get(3).split(",")[2]), 1e-12);
    }

    @Test
    void nonNumericCellAndNegativeTimeAreOneLineErrorsWithTheirPlace() throws IOException {
        Path points = file("p.csv", "x,t\n0.05,1\n0.02,1.0e-3.5\n0.03,-1\n");
        CliRun r = run("eval", T3, "--points", points.toString());
        assertEquals(2, r.code());
        String[] lines = r.err().trim().split("\n");
        assertEquals(2, lines.length, r.err());
        assertTrue(lines[0].startsWith(points + ":3:2: column \"t\": \"1.0e-3.5\" is not a number"), lines[0]);
        assertTrue(lines[1].startsWith(points + ":4:2: t = -1 s is negative"), lines[1]);
        assertTrue(r.out().isEmpty(), "nothing written on bad input");
    }

    @Test
    void badProblemFilesGetOneLinePerProblemAndExitTwo() throws IOException {
        Path points = file("p.csv", "x,t\n0.05,1\n");
        Path problem = file("bad.yaml", """
            domain: {shape: slab, length: 0.1}
            initial: "0"
            boundary:
              xmin: {dirichlet: "0"}
              xmax: {convection: {h: 3, ambient: "20"}}
            """);
        CliRun r = run("eval", problem.toString(), "--points", points.toString());
        assertEquals(2, r.code());
        assertTrue(r.err().contains("bad.yaml:1:1: material: missing"), r.err());
        assertTrue(r.err().contains("bad.yaml:5:10: boundary.xmax.convection: unknown boundary type"), r.err());
        assertTrue(!r.err().contains("Exception") && !r.err().contains("\tat "), "no stack trace: " + r.err());
    }

    @Test
    void pointOutsideTheSlabNamesItsLineAndMissingColumnsAreNamed() throws IOException {
        CliRun outside = run("eval", T3, "--points", file("a.csv", "x,t\n0.05,1\n0.5,1\n").toString());
        assertEquals(2, outside.code());
        assertTrue(outside.err().contains("a.csv:3: oracle: x = 0.5 m is outside the slab"), outside.err());
        CliRun missing = run("eval", T3, "--points", file("b.csv", "x,time\n0.05,1\n").toString());
        assertEquals(2, missing.code());
        assertTrue(missing.err().contains("no column \"t\""), missing.err());
        CliRun usage = run("eval", T3);
        assertEquals(2, usage.code());
        assertTrue(usage.err().contains("--points"), usage.err());
    }

    @Test
    void steadyProblemsNeedNoTimeColumn() throws IOException {
        // -k u'' = Q, u = 0 at both faces: u(L/2) = Q L^2/(8k) (common practice) = 1000 * 0.04 / 16 = 2.5
        Path problem = file("steady.yaml", """
            domain: {shape: slab, length: 0.2}
            material: {conductivity: 2, volumetricHeatCapacity: 1e6}
            steady: true
            source: "1000"
            boundary: {xmin: {dirichlet: "0"}, xmax: {dirichlet: "0"}}
            """);
        CliRun r = run("eval", problem.toString(), "--points", file("s.csv", "x\n0.1\n0.05\n").toString());
        assertEquals(0, r.code(), r.err());
        String[] lines = r.out().split("\n");
        assertEquals("x,u,bound", lines[0]);
        assertEquals(2.5, Double.parseDouble(lines[1].split(",")[1]), 1e-12);
        Path timeDependent = file("bad-steady.yaml", """
            domain: {shape: slab, length: 0.2}
            material: {conductivity: 2, volumetricHeatCapacity: 1e6}
            steady: true
            source: "1000*t"
            boundary: {xmin: {dirichlet: "0"}, xmax: {dirichlet: "0"}}
            """);
        CliRun bad = run("eval", timeDependent.toString(), "--points", file("t.csv", "x\n0.1\n").toString());
        assertEquals(2, bad.code());
        assertTrue(bad.err().contains("source: depends on t, but the problem is steady"), bad.err());
    }

    @Test
    void fluxQuantityWritesTheFluxColumn() throws IOException {
        CliRun r = run("eval", T3, "--points", file("c.csv", "x,t\n0.05,20\n").toString(), "--quantity", "flux");
        assertEquals(0, r.code(), r.err());
        assertTrue(r.out().startsWith("x,t,flux,bound\n"), r.out());
    }
    @Test
    void fluxOfARectangleIsMinusKGradU() throws IOException {
        // NAFEMS T4 (TNSB Rev. 3, 1990): on the convective side x = 0.6 the condition -k du/dn = h (u - 0) makes
        // qx = h u there (the boundary condition itself, common practice), and on the insulated side x = 0, qx = 0
        Path t4 = Path.of("..", "reference-data", "problems", "nafems-t4.yaml");
        CliRun r = run("eval", t4.toString(), "--points", file("q.csv", "x,y\n0.6,0.2\n0,0.5\n").toString(), "--quantity",
            "flux", "--tolerance", "1e-8");
        assertEquals(0, r.code(), r.err());
        String[] lines = r.out().split("\n");
        assertEquals("x,y,qx,qy,bound", lines[0]);
        String[] side = lines[1].split(",");
        double qx = Double.parseDouble(side[2]);
        double bound = Double.parseDouble(side[4]);
        double u = 18.2537565371; // this oracle's certified u(0.6, 0.2), within 1e-9 (see above)
        assertTrue(Math.abs(qx - 750 * u) <= bound + 750 * 1e-9, "qx = " + qx + " +- " + bound + ", h u = " + 750 * u);
        String[] insulated = lines[2].split(",");
        assertTrue(Math.abs(Double.parseDouble(insulated[2])) <= Double.parseDouble(insulated[4]), lines[2]);
    }
}

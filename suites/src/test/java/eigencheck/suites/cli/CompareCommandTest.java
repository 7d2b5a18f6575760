package eigencheck.suites.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.BeforeEach;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * compare against cases with closed-form norms (common practice, the interpolation error of a
 * quadratic): the problem u_t = u_xx + 2 on 0 < x < 1 with u = 0 at both faces and u(x,0) = x(1-x)
 * is at its steady state, u = x(1-x), for all t. The P1 interpolant on a uniform mesh of spacing h
 * is exact at the nodes, and its error e = (x-a)(b-x) on each element gives
 * ||e||_L2 = h^2/sqrt(30) and |e|_H1 = h/sqrt(3) on the unit interval.
 */
class CompareCommandTest {
    @TempDir
    Path dir;
    Path problem;

    @BeforeEach
    void writeProblem() throws IOException {
        problem = dir.resolve("steady.yaml");
        Files.writeString(problem, """
            domain: {shape: slab, length: 1}
            material: {diffusivity: 1}
            initial: "x*(1-x)"
            source: "2"
            boundary: {xmin: {dirichlet: "0"}, xmax: {dirichlet: "0"}}
            """);
    }

    private static CliRun run(String... args) {
        return CliRun.of(args);
    }

    private static double u(double x) {
        return x * (1 - x);
    }

    private JsonNode json(Path output, String... more) throws IOException {
        String[] args = new String[5 + more.length];
        args[0] = "compare";
        args[1] = problem.toString();
        args[2] = output.toString();
        args[3] = "--json";
        args[4] = "--time=0.5";
        System.arraycopy(more, 0, args, 5, more.length);
        CliRun r = run(args);
        assertEquals(0, r.code(), r.err());
        return new ObjectMapper().readTree(r.out());
    }

    @Test
    void linearElementsOnALineGiveTheClosedFormNorms() throws IOException {
        int n = 8;
        double h = 1.0 / n;
        StringBuilder vtk = new StringBuilder("# vtk DataFile Version 3.0\nline\nASCII\nDATASET UNSTRUCTURED_GRID\nPOINTS "
            + (n + 1) + " double\n");
        for (int i = 0; i <= n; i++) {
            vtk.append(i * h).append(" 0 0\n");
        }
        vtk.append("CELLS ").append(n).append(' ').append(3 * n).append('\n');
        for (int i = 0; i < n; i++) {
            vtk.append("2 ").append(i).append(' ').append(i + 1).append('\n');
        }
        vtk.append("CELL_TYPES ").append(n).append('\n');
        vtk.append("3\n".repeat(n));
        vtk.append("POINT_DATA ").append(n + 1).append("\nSCALARS T double 1\nLOOKUP_TABLE default\n");
        for (int i = 0; i <= n; i++) {
            vtk.append(u(i * h)).append('\n');
        }
        Path out = dir.resolve("p1.vtk");
        Files.writeString(out, vtk);
        JsonNode r = json(out);
        assertEquals(n + 1, r.get("points").asInt());
        assertTrue(r.get("max").asDouble() < 1e-14, "nodal values are exact: the nodal error hides the error");
        // tolerance: the oracle's bound (1e-10 of the scale 0.25) plus quadrature rounding
        assertEquals(h * h / Math.sqrt(30), r.get("l2").asDouble(), 1e-10);
        assertEquals(h / Math.sqrt(3), r.get("h1semi").asDouble(), 1e-10);
        CliRun text = run("compare", problem.toString(), out.toString(), "--time", "0.5");
        assertTrue(text.out().contains("l2      " + String.format(java.util.Locale.ROOT, "%.6e", h * h / Math.sqrt(30))),
            text.out());
    }

    @Test
    void triangleMeshOfABlockGivesTheOneDimensionalNormsTimesTheHeight() throws IOException {
        // P1 on triangles whose vertices lie on the lines x = ih interpolates u(x) linearly in x on
        // each triangle, so ||e||^2 = H * h^4/30 and |e|_H1^2 = H * h^2/3 for a block of height H.
        int nx = 6;
        int ny = 3;
        double h = 1.0 / nx;
        double height = 0.5;
        JsonNode r = json(triangles(nx, ny, height, false));
        assertEquals(Math.sqrt(height) * h * h / Math.sqrt(30), r.get("l2").asDouble(), 1e-10);
        assertEquals(Math.sqrt(height) * h / Math.sqrt(3), r.get("h1semi").asDouble(), 1e-10);
        // quadratic triangles reproduce a quadratic exactly: the norms vanish to rounding
        JsonNode p2 = json(triangles(nx, ny, height, true));
        assertTrue(p2.get("l2").asDouble() < 1e-11, p2.toString());
        assertTrue(p2.get("h1semi").asDouble() < 1e-10, p2.toString());
    }

    /** A structured triangle mesh written as JSON in eigencheck's own layout, P1 or P2 (six nodes). */
    private Path triangles(int nx, int ny, double height, boolean quadratic) throws IOException {
        int px = quadratic ? 2 * nx + 1 : nx + 1;
        int py = quadratic ? 2 * ny + 1 : ny + 1;
        StringBuilder pts = new StringBuilder();
        StringBuilder vals = new StringBuilder();
        for (int j = 0; j < py; j++) {
            for (int i = 0; i < px; i++) {
                double x = (double) i / (px - 1);
                double y = height * j / (py - 1);
                pts.append(pts.length() == 0 ? "" : ",").append('[').append(x).append(',').append(y).append(']');
                vals.append(vals.length() == 0 ? "" : ",").append(u(x));
            }
        }
        StringBuilder types = new StringBuilder();
        StringBuilder conn = new StringBuilder();
        int s = quadratic ? 2 : 1;
        for (int j = 0; j < ny; j++) {
            for (int i = 0; i < nx; i++) {
                int a = (s * j) * px + s * i;
                int b = a + s;
                int c = a + s * px + s;
                int d = a + s * px;
                int[][] tris = {{a, b, c}, {a, c, d}};
                for (int[] t : tris) {
                    types.append(types.length() == 0 ? "" : ",").append(quadratic ? 22 : 5);
                    conn.append(conn.length() == 0 ? "" : ",").append('[').append(t[0]).append(',').append(t[1])
                        .append(',').append(t[2]);
                    if (quadratic) {
                        conn.append(',').append(mid(t[0], t[1], px)).append(',').append(mid(t[1], t[2], px)).append(',')
                            .append(mid(t[2], t[0], px));
                    }
                    conn.append(']');
                }
            }
        }
        Path out = dir.resolve(quadratic ? "p2.json" : "p1.json");
        Files.writeString(out, "{\"points\": [" + pts + "], \"cells\": {\"types\": [" + types + "], \"connectivity\": ["
            + conn + "]}, \"pointData\": {\"T\": [" + vals + "]}}");
        return out;
    }

    private static int mid(int p, int q, int px) {
        int ip = p % px;
        int jp = p / px;
        int iq = q % px;
        int jq = q / px;
        return ((jp + jq) / 2) * px + (ip + iq) / 2;
    }

    @Test
    void quadCellDataOfARectangleAreComparedWithExactBoxMeans() throws IOException {
        // steady rectangle, -lap u = 2 with u = 0 at x = 0, 1 and insulated y sides: u = x (1 - x);
        // the mean over [a, b] x [c, d] is that of x (1 - x) over [a, b] (calculus)
        Path rect = dir.resolve("rect.yaml");
        Files.writeString(rect, """
            domain: {shape: rectangle, lengthX: 1, lengthY: 0.5}
            material: {diffusivity: 1}
            steady: true
            source: "2"
            boundary:
              xmin: {dirichlet: "0"}
              xmax: {dirichlet: "0"}
              ymin: {neumann: "0"}
              ymax: {neumann: "0"}
            """);
        int nx = 4;
        int ny = 2;
        StringBuilder pts = new StringBuilder();
        for (int j = 0; j <= ny; j++) {
            for (int i = 0; i <= nx; i++) {
                pts.append(pts.length() == 0 ? "" : ",").append('[').append((double) i / nx).append(',')
                    .append(0.5 * j / ny).append(']');
            }
        }
        StringBuilder conn = new StringBuilder();
        StringBuilder types = new StringBuilder();
        StringBuilder values = new StringBuilder();
        double planted = 2e-3;
        for (int j = 0; j < ny; j++) {
            for (int i = 0; i < nx; i++) {
                int a = j * (nx + 1) + i;
                conn.append(conn.length() == 0 ? "" : ",").append('[').append(a).append(',').append(a + 1).append(',')
                    .append(a + nx + 2).append(',').append(a + nx + 1).append(']');
                types.append(types.length() == 0 ? "" : ",").append(9);
                double x0 = (double) i / nx;
                double x1 = (double) (i + 1) / nx;
                double mean = ((x1 * x1 - x0 * x0) / 2 - (x1 * x1 * x1 - x0 * x0 * x0) / 3) / (x1 - x0);
                values.append(values.length() == 0 ? "" : ",").append(mean + (i == 1 && j == 1 ? planted : 0));
            }
        }
        Path out = dir.resolve("quads.json");
        Files.writeString(out, "{\"points\": [" + pts + "], \"cells\": {\"types\": [" + types
            + "], \"connectivity\": [" + conn + "]}, \"cellData\": {\"T\": [" + values + "]}}");
        CliRun r = CliRun.of("compare", rect.toString(), out.toString(), "--json", "--time", "0");
        assertEquals(0, r.code(), r.err());
        JsonNode j = new ObjectMapper().readTree(r.out());
        assertEquals(planted, j.get("max").asDouble(), 1e-12);
        // one planted cell of area 1/16 in a body of area 1/2: L2 = planted * sqrt(1/16)
        assertEquals(planted * 0.25, j.get("l2").asDouble(), 1e-12);
    }

    @Test
    void cellDataAreComparedWithExactCellAverages() throws IOException {
        // mean of x(1-x) over [a, b]: (b^2 - a^2)/2 - (b^3 - a^3)/3, divided by (b - a) (calculus)
        int n = 5;
        StringBuilder csvPoints = new StringBuilder();
        StringBuilder conn = new StringBuilder();
        StringBuilder types = new StringBuilder();
        StringBuilder values = new StringBuilder();
        for (int i = 0; i <= n; i++) {
            csvPoints.append(i == 0 ? "" : ",").append((double) i / n);
        }
        double planted = 1e-3;
        for (int i = 0; i < n; i++) {
            double a = (double) i / n;
            double b = (double) (i + 1) / n;
            double mean = ((b * b - a * a) / 2 - (b * b * b - a * a * a) / 3) / (b - a);
            conn.append(i == 0 ? "" : ",").append('[').append(i).append(',').append(i + 1).append(']');
            types.append(i == 0 ? "" : ",").append(3);
            values.append(i == 0 ? "" : ",").append(mean + (i == 2 ? planted : 0));
        }
        Path out = dir.resolve("fv.json");
        Files.writeString(out, "{\"x\": [" + csvPoints + "], \"cells\": {\"types\": [" + types + "], \"connectivity\": ["
            + conn + "]}, \"cellData\": {\"T\": [" + values + "]}}");
        JsonNode r = json(out);
        assertEquals(n, r.get("points").asInt());
        assertEquals(planted, r.get("max").asDouble(), 1e-12);
        assertEquals(planted * Math.sqrt(1.0 / n), r.get("l2").asDouble(), 1e-12, "sqrt(|K|) times the planted error");
        assertTrue(r.get("h1semi").isNull());
    }

    @Test
    void sphereOutputsAreReadAtTheirDistanceFromTheCentre() throws IOException {
        // steady sphere, uniform source, fixed surface: u = 10 + Q (R^2 - r^2)/(6k) (common practice)
        Path sphere = dir.resolve("sphere.yaml");
        Files.writeString(sphere, """
            domain: {shape: sphere, radius: 0.1}
            material: {conductivity: 2, volumetricHeatCapacity: 1e6}
            steady: true
            source: "12000"
            boundary: {surface: {dirichlet: "10"}}
            """);
        StringBuilder radial = new StringBuilder("r,T\n");
        StringBuilder ray = new StringBuilder("{\"points\": [");
        StringBuilder values = new StringBuilder();
        for (int i = 0; i <= 4; i++) {
            double r = 0.025 * i;
            double u = 10 + 12000 * (0.01 - r * r) / 12 + (i == 2 ? 1e-3 : 0);
            radial.append(r).append(',').append(u).append('\n');
            // the same radii along the direction (2, 3, 6)/7
            ray.append(i == 0 ? "" : ",").append('[').append(2 * r / 7).append(',').append(3 * r / 7).append(',')
                .append(6 * r / 7).append(']');
            values.append(i == 0 ? "" : ",").append(u);
        }
        Path csv = dir.resolve("radial.csv");
        Files.writeString(csv, radial);
        Path json = dir.resolve("ray.json");
        Files.writeString(json, ray + "], \"pointData\": {\"T\": [" + values + "]}}");
        for (Path out : new Path[] {csv, json}) {
            CliRun r = CliRun.of("compare", sphere.toString(), out.toString(), "--json", "--time", "0");
            assertEquals(0, r.code(), r.err());
            JsonNode j = new ObjectMapper().readTree(r.out());
            assertEquals(1e-3, j.get("max").asDouble(), 1e-9, out.getFileName().toString());
            assertTrue(j.get("h1semi").isNull());
        }
    }

    @Test
    void cylinderAndRectangleOutputsAreReadInTheirOwnCoordinates() throws IOException {
        // steady cylinder, uniform source, fixed surface: u = 10 + Q (R^2 - r^2)/(4k) (common practice),
        // read at the distance from the z axis of 3D points; and NAFEMS T4 (TNSB Rev. 3, 1990) at the
        // target point 0.6, 0.2 with 18.254 written for the converged 18.2537565
        Path cylinder = dir.resolve("cylinder.yaml");
        Files.writeString(cylinder, """
            domain: {shape: cylinder, radius: 0.1}
            material: {conductivity: 2, volumetricHeatCapacity: 1e6}
            steady: true
            source: "8000"
            boundary: {surface: {dirichlet: "10"}}
            """);
        StringBuilder csv = new StringBuilder("x,y,z,T\n");
        for (int i = 0; i <= 4; i++) {
            double r = 0.025 * i;
            double u = 10 + 8000 * (0.01 - r * r) / 8 + (i == 3 ? 2e-3 : 0);
            csv.append(0.6 * r).append(',').append(0.8 * r).append(',').append(5.0 * i).append(',').append(u).append('\n');
        }
        Path out = dir.resolve("cyl.csv");
        Files.writeString(out, csv);
        CliRun r = CliRun.of("compare", cylinder.toString(), out.toString(), "--json", "--time", "0");
        assertEquals(0, r.code(), r.err());
        assertEquals(2e-3, new ObjectMapper().readTree(r.out()).get("max").asDouble(), 1e-9);
        Path t4 = Path.of("..", "reference-data", "problems", "nafems-t4.yaml");
        Path plate = dir.resolve("plate.csv");
        Files.writeString(plate, "x,y,T\n0.6,0.2,18.254\n0.0,0.0,100\n");
        CliRun p = CliRun.of("compare", t4.toString(), plate.toString(), "--json", "--time", "0");
        assertEquals(0, p.code(), p.err());
        assertEquals(18.254 - 18.2537565371, new ObjectMapper().readTree(p.out()).get("max").asDouble(), 1e-8);
    }

    @Test
    void pointsWithoutCellsGiveNodalNormsOnlyAndBadOutputsAreNamed() throws IOException {
        Path csv = dir.resolve("nodes.csv");
        Files.writeString(csv, "x,T\n0,0\n500,0.26\n1000,0\n");
        JsonNode r = json(csv, "--unit", "x=mm");
        assertEquals(3, r.get("points").asInt());
        assertEquals(0.01, r.get("max").asDouble(), 1e-12);
        assertTrue(r.get("l2").isNull());
        CliRun outside = run("compare", problem.toString(), csv.toString(), "--time", "0.5");
        assertEquals(2, outside.code());
        assertTrue(outside.err().contains("outside the slab") && outside.err().contains("--unit x=mm"), outside.err());
        Path noTime = dir.resolve("n.csv");
        Files.writeString(noTime, "x,T\n0,0\n1,0\n");
        CliRun missing = run("compare", problem.toString(), noTime.toString());
        assertEquals(2, missing.code());
        assertTrue(missing.err().contains("--time"), missing.err());
    }
}

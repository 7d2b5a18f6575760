package eigencheck.adapters;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.net.URISyntaxException;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import org.junit.jupiter.api.Test;

/**
 * Small sample files in each format, laid out after the formats' published descriptions ("VTK File
 * Formats", VTK User's Guide, Kitware, 11th ed., 2010, ch. 19; RFC 4180 for CSV; RFC 8259 for JSON),
 * with their contents asserted value by value.
 */
class SampleFilesTest {
    static Path sample(String name) {
        try {
            return Path.of(SampleFilesTest.class.getResource("/eigencheck/adapters/samples/" + name).toURI());
        } catch (URISyntaxException e) {
            throw new IllegalStateException(e);
        }
    }

    private static FieldSeries read(String name, ReadOptions o) throws InputException {
        return Readers.read(sample(name), o);
    }

    @Test
    void csvWithCommentsTwoTimeLevelsAndUnits() throws InputException {
        FieldSeries s = read("slab-two-times.csv", ReadOptions.defaults().withUnits(Map.of("x", "mm", "T", "degC->K")));
        assertArrayEquals(new double[] {10, 20}, s.times());
        Field f = s.fields().get(1);
        assertEquals(1, f.dimension());
        assertArrayEquals(new double[] {0.5e-3, 1.5e-3, 2.5e-3}, f.coordinates(), 1e-18);
        assertArrayEquals(new double[] {303.65, 304.4, 305.15}, f.pointData().get("T").values(), 1e-12);
        assertArrayEquals(new double[] {-4.5, -5.5, -6.5}, f.pointData().get("q").values());
        assertNull(f.cells());
    }

    @Test
    void jsonOwnLayoutWithCellsAndVectors() throws InputException {
        Field f = read("plate.json", ReadOptions.defaults()).fields().get(0);
        assertEquals(0.25, f.time());
        assertEquals(2, f.dimension());
        assertArrayEquals(new double[] {0, 0, 1, 0, 1, 1, 0, 1}, f.coordinates());
        assertEquals(2, f.cells().size());
        assertEquals(CellType.TRIANGLE.id(), f.cells().type(1));
        assertEquals(3, f.cells().node(1, 2));
        assertArrayEquals(new double[] {1.0, 2.0, 3.5, 4.25}, f.pointData().get("T").values());
        assertEquals(2, f.pointData().get("grad").components());
        assertEquals(1.5, f.pointData().get("grad").value(1, 1));
        assertArrayEquals(new double[] {0.5, 0.5}, f.cellData().get("area").values());
    }

    @Test
    void jsonOtherLayoutByJsonPointers() throws InputException {
        ReadOptions o = ReadOptions.defaults().withField("temp").withPointers(Map.of("x", "/mesh/nodes/x",
            "values", "/solution/fields/0/data", "time", "/meta/t"));
        Field f = read("other-layout.json", o).fields().get(0);
        assertEquals(3.5, f.time());
        assertArrayEquals(new double[] {0.0, 0.25, 0.5}, f.coordinates());
        assertArrayEquals(new double[] {10.0, 11.0, 12.5}, f.pointData().get("temp").values());
        InputException bad = assertThrows(InputException.class, () -> read("other-layout.json",
            ReadOptions.defaults().withPointers(Map.of("x", "/mesh/x", "values", "/solution/fields/0/data"))));
        assertEquals("/mesh/x", bad.problems().get(0).location().path());
    }

    @Test
    void legacyUnstructuredGridAscii() throws InputException {
        Field f = read("unstructured-ascii.vtk", ReadOptions.defaults()).fields().get(0);
        assertEquals(3, f.dimension());
        assertEquals(4, f.size());
        assertArrayEquals(new double[] {0, 0, 0, 1, 0, 0, 1, 1, 0, 0, 1, 0}, f.coordinates());
        Cells c = f.cells();
        assertArrayEquals(new int[] {0, 3, 6, 8}, c.offsets());
        assertArrayEquals(new int[] {0, 1, 2, 0, 2, 3, 0, 1}, c.connectivity());
        assertArrayEquals(new byte[] {5, 5, 3}, c.types());
        assertArrayEquals(new double[] {1.0, 2.0, 3.5, 4.25}, f.pointData().get("T").values());
        assertEquals(3, f.pointData().get("flux").components());
        assertArrayEquals(new double[] {0.5, 0.5, 1.0}, f.cellData().get("area").values());
        assertEquals(7.5, f.time(), "a FIELD array named TIME gives the time");
    }

    @Test
    void legacyStructuredPointsGetImplicitQuads() throws InputException {
        Field f = read("structured-points.vtk", ReadOptions.defaults()).fields().get(0);
        assertEquals(6, f.size());
        assertArrayEquals(new double[] {0, 0, 0, 0.5, 0, 0, 1, 0, 0, 0, 2, 0, 0.5, 2, 0, 1, 2, 0}, f.coordinates());
        assertEquals(2, f.cells().size());
        assertEquals(CellType.QUAD.id(), f.cells().type(0));
        assertArrayEquals(new int[] {0, 1, 4, 3, 1, 2, 5, 4}, f.cells().connectivity());
        assertArrayEquals(new double[] {0, 1, 2, 3, 4, 5}, f.pointData().get("u").values());
    }

    @Test
    void legacyRectilinearGridIsALine() throws InputException {
        Field f = read("rectilinear.vtk", ReadOptions.defaults()).fields().get(0);
        assertArrayEquals(new double[] {0.0, 0.1, 0.3, 0.6}, f.axis(0));
        assertEquals(3, f.cells().size());
        assertEquals(CellType.LINE.id(), f.cells().type(2));
        assertArrayEquals(new int[] {0, 1, 1, 2, 2, 3}, f.cells().connectivity());
        assertArrayEquals(new double[] {20, 21, 23, 26}, f.pointData().get("T").values());
    }

    @Test
    void legacyStructuredGridAndPolydata() throws InputException {
        Field g = read("structured-grid.vtk", ReadOptions.defaults()).fields().get(0);
        assertEquals(1.5, g.coordinate(3, 0));
        assertArrayEquals(new double[] {9.5}, g.cellData().get("q").values());
        Field p = read("polydata.vtk", ReadOptions.defaults()).fields().get(0);
        assertArrayEquals(new byte[] {(byte) CellType.LINE.id(), (byte) CellType.QUAD.id()}, p.cells().types());
        assertArrayEquals(new int[] {0, 1, 0, 1, 2, 3}, p.cells().connectivity());
    }

    @Test
    void vtuAsciiWithTimeValueAndCellData() throws InputException {
        Field f = read("line.vtu", ReadOptions.defaults()).fields().get(0);
        assertEquals(2.5, f.time());
        assertArrayEquals(new double[] {0, 0.05, 0.1}, f.axis(0));
        assertArrayEquals(new int[] {0, 2, 4}, f.cells().offsets());
        assertArrayEquals(new double[] {20.0, 25.5, 31.0}, f.pointData().get("T").values());
        assertArrayEquals(new double[] {1.5, 2.5}, f.cellData().get("k").values());
    }

    @Test
    void pvdCollectionGivesEachFileItsTime() throws InputException {
        FieldSeries s = read("series.pvd", ReadOptions.defaults());
        assertArrayEquals(new double[] {0.5, 1.5}, s.times());
        assertEquals(3, s.at(0.5).size());
        assertEquals(4, s.at(1.5).size());
    }

    @Test
    void errorsNameTheFileLineAndWhatWasFound() {
        InputException e = assertThrows(InputException.class, () -> Readers.read(Path.of("out.csv"),
            "x,T\n0.1,20\n0.2,2O.5\n".getBytes(), ReadOptions.defaults()));
        assertEquals(InputException.Cause.NOT_A_NUMBER, e.cause());
        assertEquals("out.csv:3:2: column \"T\": \"2O.5\" is not a number; fix the solver's number format",
            e.getMessage());
        InputException dup = assertThrows(InputException.class, () -> Readers.read(Path.of("d.csv"),
            "x,T\n0.1,20\n0.2,21\n0.1,22\n".getBytes(), ReadOptions.defaults()));
        assertTrue(dup.getMessage().startsWith("d.csv:4: this row repeats the point of line 2"), dup.getMessage());
        InputException nan = assertThrows(InputException.class, () -> Readers.read(Path.of("n.vtk"),
            ("# vtk DataFile Version 3.0\nx\nASCII\nDATASET POLYDATA\nPOINTS 2 float\n0 0 0 1 0 0\n"
                + "POINT_DATA 2\nSCALARS T float\nLOOKUP_TABLE default\n1 nan\n").getBytes(), ReadOptions.defaults()));
        assertEquals(InputException.Cause.NOT_A_NUMBER, nan.cause());
        assertEquals(10, nan.problems().get(0).location().line());
        InputException count = assertThrows(InputException.class, () -> Readers.read(Path.of("c.vtk"),
            ("# vtk DataFile Version 3.0\nx\nASCII\nDATASET POLYDATA\nPOINTS 3 float\n0 0 0 1 0 0\n").getBytes(),
            ReadOptions.defaults()));
        assertTrue(count.getMessage().contains("truncated"), count.getMessage());
        InputException format = assertThrows(InputException.class, () -> Readers.read(Path.of("a.xyz"),
            ReadOptions.defaults()));
        assertTrue(format.getMessage().contains("cannot tell the format"), format.getMessage());
        assertEquals(List.of("csv", "json", "vtk", "vtu", "pvd"), Readers.formats());
    }

    @Test
    void setOfFilesByPatternWithTimesFromTheirNames(@org.junit.jupiter.api.io.TempDir Path dir) throws Exception {
        java.nio.file.Files.writeString(dir.resolve("out_010.csv"), "x,T\n0,1\n1,2\n");
        java.nio.file.Files.writeString(dir.resolve("out_020.csv"), "x,T\n0,3\n1,4\n");
        FieldSeries s = Readers.read(dir.resolve("out_*.csv"), ReadOptions.defaults().withTimeFromName("out_(\\d+)", 0.1));
        assertArrayEquals(new double[] {1.0, 2.0}, s.times(), 1e-15);
        assertArrayEquals(new double[] {3, 4}, s.at(2.0).pointData().get("T").values());
    }
}

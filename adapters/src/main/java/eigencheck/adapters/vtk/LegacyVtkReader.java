package eigencheck.adapters.vtk;

import eigencheck.adapters.CellType;
import eigencheck.adapters.Field;
import eigencheck.adapters.FieldReader;
import eigencheck.adapters.FieldSeries;
import eigencheck.adapters.InputException;
import eigencheck.adapters.InputException.Cause;
import eigencheck.adapters.InputLocation;
import eigencheck.adapters.ReadOptions;
import eigencheck.adapters.internal.Duplicates;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Legacy VTK files ("VTK File Formats", VTK User's Guide, Kitware, 11th ed., 2010, ch. 19, "Simple
 * Legacy Formats"), ASCII and BINARY (big-endian): STRUCTURED_POINTS, STRUCTURED_GRID,
 * RECTILINEAR_GRID, UNSTRUCTURED_GRID (the classic CELLS layout and the OFFSETS/CONNECTIVITY layout
 * of version 5.1) and POLYDATA, with POINT_DATA and CELL_DATA (SCALARS, VECTORS, NORMALS, TENSORS,
 * TEXTURE_COORDINATES and FIELD arrays; LOOKUP_TABLE and COLOR_SCALARS are skipped). Structured
 * datasets get their implicit cells (lines, quads, hexahedra) so that norms can use them.
 */
public final class LegacyVtkReader implements FieldReader {
    @Override
    public String format() {
        return "vtk";
    }

    @Override
    public List<String> extensions() {
        return List.of("vtk");
    }

    @Override
    public FieldSeries read(Path file, byte[] content, ReadOptions options) throws InputException {
        return FieldSeries.of(new Parse(file, content).run());
    }

    private static final class Parse {
        private final Path file;
        private final byte[] b;
        private int pos;
        private int line = 1;
        private boolean binary;
        private double[] points;
        private byte[] types;
        private int[] offsets;
        private int[] connectivity;
        private int pointCount;
        private final List<Object[]> pointArrays = new ArrayList<>();
        private final List<Object[]> cellArrays = new ArrayList<>();
        private double time = Double.NaN;

        Parse(Path file, byte[] content) {
            this.file = file;
            this.b = content;
        }

        Field run() throws InputException {
            String first = readLine();
            if (!first.startsWith("# vtk DataFile Version")) {
                throw error(1, "expected \"# vtk DataFile Version x.x\" on line 1, found \"" + clip(first)
                    + "\"; is this a legacy VTK file?");
            }
            readLine(); // title
            String mode = readLine().trim().toUpperCase(Locale.ROOT);
            if (mode.equals("BINARY")) {
                binary = true;
            } else if (!mode.equals("ASCII")) {
                throw error(line - 1, "expected ASCII or BINARY on line 3, found \"" + clip(mode) + "\"");
            }
            expectWord("DATASET");
            String dataset = word("the dataset type").toUpperCase(Locale.ROOT);
            switch (dataset) {
                case "STRUCTURED_POINTS" -> structuredPoints();
                case "STRUCTURED_GRID" -> structuredGrid();
                case "RECTILINEAR_GRID" -> rectilinearGrid();
                case "UNSTRUCTURED_GRID" -> unstructuredGrid();
                case "POLYDATA" -> polyData();
                default -> throw error(line, "unknown DATASET " + clip(dataset) + "; expected STRUCTURED_POINTS,"
                    + " STRUCTURED_GRID, RECTILINEAR_GRID, UNSTRUCTURED_GRID or POLYDATA");
            }
            attributes();
            if (points == null) {
                throw error(line, "the file has no points");
            }
            int[] dup = Duplicates.find(points, 3);
            if (dup != null) {
                throw error(0, "points " + dup[0] + " and " + dup[1] + " have the same coordinates; each point once");
            }
            Field.Builder fb = new Field.Builder(3, points).time(time);
            try {
                if (types != null) {
                    fb.cells(types, offsets, connectivity);
                }
                for (Object[] a : pointArrays) {
                    fb.pointData((String) a[0], (Integer) a[1], (double[]) a[2]);
                }
                for (Object[] a : cellArrays) {
                    fb.cellData((String) a[0], (Integer) a[1], (double[]) a[2]);
                }
            } catch (IllegalArgumentException e) {
                throw error(0, e.getMessage());
            }
            return fb.build();
        }

        // ------------------------------------------------------------- datasets

        private int[] dimensions() throws InputException {
            expectWord("DIMENSIONS");
            int[] d = {count("nx"), count("ny"), count("nz")};
            for (int v : d) {
                if (v < 1) {
                    throw error(line, "DIMENSIONS must be >= 1, found " + v);
                }
            }
            long n = (long) d[0] * d[1] * d[2];
            if (n > b.length) {
                throw error(line, "DIMENSIONS " + d[0] + " " + d[1] + " " + d[2] + " give more points than the file could"
                    + " hold; a damaged header?");
            }
            return d;
        }

        private void structuredPoints() throws InputException {
            int[] d = dimensions();
            double[] origin = {0, 0, 0};
            double[] spacing = {1, 1, 1};
            for (int k = 0; k < 2; k++) {
                String w = peekWord();
                if (w.equalsIgnoreCase("ORIGIN")) {
                    word("ORIGIN");
                    origin = new double[] {real(), real(), real()};
                } else if (w.equalsIgnoreCase("SPACING") || w.equalsIgnoreCase("ASPECT_RATIO")) {
                    word("SPACING");
                    spacing = new double[] {real(), real(), real()};
                }
            }
            double[][] axes = new double[3][];
            for (int a = 0; a < 3; a++) {
                axes[a] = new double[d[a]];
                for (int k = 0; k < d[a]; k++) {
                    axes[a][k] = origin[a] + k * spacing[a];
                }
            }
            gridPoints(d, axes);
            implicitCells(d);
        }

        private void structuredGrid() throws InputException {
            int[] d = dimensions();
            readPoints();
            if (pointCount != d[0] * d[1] * d[2]) {
                throw error(line, "POINTS has " + pointCount + " points, DIMENSIONS " + d[0] + "x" + d[1] + "x" + d[2]
                    + " need " + d[0] * d[1] * d[2]);
            }
            implicitCells(d);
        }

        private void rectilinearGrid() throws InputException {
            int[] d = dimensions();
            double[][] axes = new double[3][];
            String[] names = {"X_COORDINATES", "Y_COORDINATES", "Z_COORDINATES"};
            for (int a = 0; a < 3; a++) {
                expectWord(names[a]);
                int n = count(names[a] + " count");
                if (n != d[a]) {
                    throw error(line, names[a] + " has " + n + " values, DIMENSIONS says " + d[a]);
                }
                String type = word("the data type");
                axes[a] = values(n, type, names[a]);
            }
            gridPoints(d, axes);
            implicitCells(d);
        }

        /** The points of a structured block with the given axis coordinates, x fastest. */
        private void gridPoints(int[] d, double[][] axes) {
            pointCount = d[0] * d[1] * d[2];
            points = new double[3 * pointCount];
            int i = 0;
            for (int kz = 0; kz < d[2]; kz++) {
                for (int ky = 0; ky < d[1]; ky++) {
                    for (int kx = 0; kx < d[0]; kx++) {
                        points[3 * i] = axes[0][kx];
                        points[3 * i + 1] = axes[1][ky];
                        points[3 * i + 2] = axes[2][kz];
                        i++;
                    }
                }
            }
        }

        /** Lines, quads (counter-clockwise) or hexahedra of a structured block, x fastest. */
        private void implicitCells(int[] d) {
            List<Integer> dims = new ArrayList<>();
            for (int a = 0; a < 3; a++) {
                if (d[a] > 1) {
                    dims.add(a);
                }
            }
            int nx = d[0];
            int ny = d[1];
            int[] stride = {1, nx, nx * ny};
            if (dims.isEmpty()) {
                return;
            }
            if (dims.size() == 1) {
                int a = dims.get(0);
                int n = d[a] - 1;
                setCells(n, 2, (byte) CellType.LINE.id(), (c, k) -> (c + k) * stride[a]);
            } else if (dims.size() == 2) {
                int a = dims.get(0);
                int bb = dims.get(1);
                int na = d[a] - 1;
                int nb = d[bb] - 1;
                int[][] corner = {{0, 0}, {1, 0}, {1, 1}, {0, 1}};
                setCells(na * nb, 4, (byte) CellType.QUAD.id(), (c, k) -> {
                    int ia = c % na + corner[k][0];
                    int ib = c / na + corner[k][1];
                    return ia * stride[a] + ib * stride[bb];
                });
            } else {
                int cx = d[0] - 1;
                int cy = d[1] - 1;
                int cz = d[2] - 1;
                int[][] corner = {{0, 0, 0}, {1, 0, 0}, {1, 1, 0}, {0, 1, 0}, {0, 0, 1}, {1, 0, 1}, {1, 1, 1}, {0, 1, 1}};
                setCells(cx * cy * cz, 8, (byte) CellType.HEXAHEDRON.id(), (c, k) -> {
                    int ix = c % cx + corner[k][0];
                    int iy = (c / cx) % cy + corner[k][1];
                    int iz = c / (cx * cy) + corner[k][2];
                    return ix + iy * nx + iz * nx * ny;
                });
            }
        }

        private interface NodeOf {
            int node(int cell, int k);
        }

        private void setCells(int n, int per, byte type, NodeOf f) {
            types = new byte[n];
            offsets = new int[n + 1];
            connectivity = new int[n * per];
            for (int c = 0; c < n; c++) {
                types[c] = type;
                offsets[c + 1] = (c + 1) * per;
                for (int k = 0; k < per; k++) {
                    connectivity[c * per + k] = f.node(c, k);
                }
            }
        }

        private void readPoints() throws InputException {
            expectWord("POINTS");
            pointCount = count("the number of points");
            String type = word("the data type");
            points = values(3L * pointCount, type, "POINTS");
            skipMetadata();
        }

        private void unstructuredGrid() throws InputException {
            readPoints();
            String w = peekWord();
            if (!w.equalsIgnoreCase("CELLS")) {
                return; // points only
            }
            word("CELLS");
            int n = count("the number of cells");
            int size = count("the CELLS size");
            if (peekWord().equalsIgnoreCase("OFFSETS")) {
                // version 5.1: CELLS nOffsets nConnectivity, OFFSETS type ..., CONNECTIVITY type ...
                word("OFFSETS");
                double[] off = values(n, word("the data type"), "OFFSETS");
                expectWord("CONNECTIVITY");
                double[] conn = values(size, word("the data type"), "CONNECTIVITY");
                int cells = n - 1;
                offsets = new int[cells + 1];
                for (int i = 0; i <= cells; i++) {
                    offsets[i] = index(off[i], "OFFSETS", conn.length + 1);
                }
                connectivity = new int[conn.length];
                for (int i = 0; i < conn.length; i++) {
                    connectivity[i] = index(conn[i], "CONNECTIVITY", pointCount);
                }
                n = cells;
            } else {
                classicCells(n, size, "CELLS");
            }
            skipMetadata();
            expectWord("CELL_TYPES");
            int nt = count("the number of cell types");
            if (nt != n) {
                throw error(line, "CELL_TYPES has " + nt + " entries for " + n + " cells");
            }
            double[] t = values(nt, "int", "CELL_TYPES");
            types = new byte[nt];
            for (int i = 0; i < nt; i++) {
                int id = index(t[i], "CELL_TYPES", 256);
                types[i] = (byte) id;
            }
            checkOffsets();
        }

        private void checkOffsets() throws InputException {
            if (offsets[0] != 0 || offsets[offsets.length - 1] != connectivity.length) {
                throw error(line, "cell offsets run from " + offsets[0] + " to " + offsets[offsets.length - 1]
                    + ", the connectivity has " + connectivity.length + " entries");
            }
            for (int i = 0; i + 1 < offsets.length; i++) {
                if (offsets[i + 1] <= offsets[i]) {
                    throw error(line, "cell " + i + " has no nodes (offsets not increasing)");
                }
            }
        }

        /** The classic "k i1 ... ik" cell lists of UNSTRUCTURED_GRID and POLYDATA. */
        private int[][] classicCells(int n, int size, String what) throws InputException {
            if ((long) n > size || size > b.length) {
                throw error(line, what + " " + n + " " + size + " does not fit the file; a damaged header?");
            }
            double[] raw = values(size, "int", what);
            offsets = new int[n + 1];
            List<Integer> conn = new ArrayList<>();
            int k = 0;
            for (int c = 0; c < n; c++) {
                if (k >= raw.length) {
                    throw error(line, what + ": the lists end after " + c + " of " + n + " cells");
                }
                int m = index(raw[k++], what + " node count", raw.length);
                if (m < 1 || k + m > raw.length) {
                    throw error(line, what + ": cell " + c + " claims " + m + " nodes, more than the list holds");
                }
                for (int j = 0; j < m; j++) {
                    conn.add(index(raw[k++], what, pointCount));
                }
                offsets[c + 1] = conn.size();
            }
            if (k != raw.length) {
                throw error(line, what + ": size " + size + " but the " + n + " cells use " + k + " numbers");
            }
            connectivity = conn.stream().mapToInt(Integer::intValue).toArray();
            return null;
        }

        private void polyData() throws InputException {
            readPoints();
            List<Byte> t = new ArrayList<>();
            List<int[]> lists = new ArrayList<>();
            while (true) {
                String w = peekWord().toUpperCase(Locale.ROOT);
                byte single;
                byte multi;
                switch (w) {
                    case "VERTICES" -> {
                        single = (byte) CellType.VERTEX.id();
                        multi = (byte) CellType.POLY_VERTEX.id();
                    }
                    case "LINES" -> {
                        single = (byte) CellType.LINE.id();
                        multi = (byte) CellType.POLY_LINE.id();
                    }
                    case "POLYGONS" -> {
                        single = 0;
                        multi = (byte) CellType.POLYGON.id();
                    }
                    case "TRIANGLE_STRIPS" -> {
                        single = (byte) CellType.TRIANGLE_STRIP.id();
                        multi = single;
                    }
                    default -> {
                        single = -1;
                        multi = -1;
                    }
                }
                if (single == -1) {
                    break;
                }
                word(w);
                int n = count(w + " count");
                int size = count(w + " size");
                classicCells(n, size, w);
                for (int c = 0; c < n; c++) {
                    int m = offsets[c + 1] - offsets[c];
                    byte type = w.equals("POLYGONS") ? (byte) (m == 3 ? CellType.TRIANGLE.id() : m == 4
                        ? CellType.QUAD.id() : CellType.POLYGON.id()) : (w.equals("TRIANGLE_STRIPS") ? single
                        : m == (w.equals("LINES") ? 2 : 1) ? single : multi);
                    t.add(type);
                    lists.add(java.util.Arrays.copyOfRange(connectivity, offsets[c], offsets[c + 1]));
                }
            }
            if (t.isEmpty()) {
                types = null;
                offsets = null;
                connectivity = null;
                return;
            }
            types = new byte[t.size()];
            offsets = new int[t.size() + 1];
            int total = 0;
            for (int[] l : lists) {
                total += l.length;
            }
            connectivity = new int[total];
            int k = 0;
            for (int c = 0; c < t.size(); c++) {
                types[c] = t.get(c);
                int[] l = lists.get(c);
                System.arraycopy(l, 0, connectivity, k, l.length);
                k += l.length;
                offsets[c + 1] = k;
            }
        }

        // ------------------------------------------------------------- attributes

        private void attributes() throws InputException {
            List<Object[]> target = null;
            int count = 0;
            while (true) {
                skipSpace();
                if (pos >= b.length) {
                    return;
                }
                String w = word("a section keyword").toUpperCase(Locale.ROOT);
                switch (w) {
                    case "POINT_DATA", "CELL_DATA" -> {
                        count = count(w + " count");
                        boolean isPoint = w.equals("POINT_DATA");
                        int expected = isPoint ? pointCount : types == null ? 0 : types.length;
                        if (count != expected) {
                            throw error(line, w + " " + count + " does not match the " + expected + " "
                                + (isPoint ? "points" : "cells"));
                        }
                        target = isPoint ? pointArrays : cellArrays;
                    }
                    case "SCALARS" -> {
                        need(target, w);
                        String name = word("the array name");
                        String type = word("the data type");
                        int comps = 1;
                        String next = peekWord();
                        if (!next.equalsIgnoreCase("LOOKUP_TABLE") && isInteger(next)) {
                            comps = count("the component count");
                        }
                        if (peekWord().equalsIgnoreCase("LOOKUP_TABLE")) {
                            word("LOOKUP_TABLE");
                            word("the table name");
                        }
                        target.add(new Object[] {name, comps, values((long) count * comps, type, "SCALARS " + name)});
                    }
                    case "VECTORS", "NORMALS" -> {
                        need(target, w);
                        String name = word("the array name");
                        target.add(new Object[] {name, 3, values(3L * count, word("the data type"), w + " " + name)});
                    }
                    case "TENSORS" -> {
                        need(target, w);
                        String name = word("the array name");
                        target.add(new Object[] {name, 9, values(9L * count, word("the data type"), w + " " + name)});
                    }
                    case "TEXTURE_COORDINATES" -> {
                        need(target, w);
                        String name = word("the array name");
                        int dim = count("the dimension");
                        target.add(new Object[] {name, Math.max(1, dim),
                            values((long) count * dim, word("the data type"), w + " " + name)});
                    }
                    case "LOOKUP_TABLE" -> {
                        word("the table name");
                        int size = count("the table size");
                        values(4L * size, binary ? "unsigned_char" : "float", "LOOKUP_TABLE");
                    }
                    case "COLOR_SCALARS" -> {
                        need(target, w);
                        word("the array name");
                        int m = count("the value count");
                        values((long) count * m, binary ? "unsigned_char" : "float", "COLOR_SCALARS");
                    }
                    case "FIELD" -> {
                        word("the field name");
                        int arrays = count("the array count");
                        for (int k = 0; k < arrays; k++) {
                            String name = word("the array name");
                            int comps = count("the component count");
                            int tuples = count("the tuple count");
                            String type = word("the data type");
                            double[] v = values((long) comps * tuples, type, "FIELD array " + name);
                            if (name.equalsIgnoreCase("TIME") && comps * tuples == 1) {
                                time = v[0];
                            } else if (target != null && tuples == count && comps >= 1) {
                                target.add(new Object[] {name, comps, v});
                            }
                            skipMetadata();
                        }
                    }
                    case "METADATA" -> {
                        pos -= "METADATA".length();
                        skipMetadata();
                    }
                    default -> throw error(line, "unknown section \"" + clip(w) + "\"; expected POINT_DATA, CELL_DATA,"
                        + " SCALARS, VECTORS, FIELD, ...");
                }
                skipMetadata();
            }
        }

        private void need(List<Object[]> target, String w) throws InputException {
            if (target == null) {
                throw error(line, w + " before POINT_DATA or CELL_DATA; say which the array belongs to");
            }
        }

        /** Skips an optional METADATA block, which ends at an empty line. */
        private void skipMetadata() {
            int save = pos;
            int saveLine = line;
            skipSpace();
            if (!startsWithWord("METADATA")) {
                pos = save;
                line = saveLine;
                return;
            }
            readLine();
            while (pos < b.length) {
                if (readLine().isBlank()) {
                    return;
                }
            }
        }

        private boolean startsWithWord(String w) {
            if (pos + w.length() > b.length) {
                return false;
            }
            for (int i = 0; i < w.length(); i++) {
                if (b[pos + i] != w.charAt(i)) {
                    return false;
                }
            }
            return pos + w.length() == b.length || isSpace(b[pos + w.length()]);
        }

        // ------------------------------------------------------------- values

        /** n values of a VTK data type, ASCII tokens or big-endian binary. */
        private double[] values(long n, String type, String what) throws InputException {
            String t = type.toLowerCase(Locale.ROOT);
            int size = switch (t) {
                case "bit" -> throw error(line, what + ": bit arrays are not supported; write the data as int or float");
                case "unsigned_char", "char" -> 1;
                case "unsigned_short", "short" -> 2;
                case "unsigned_int", "int", "vtkidtype" -> 4;
                case "unsigned_long", "long", "vtktypeint64", "vtktypeuint64" -> 8;
                case "float" -> 4;
                case "double" -> 8;
                default -> throw error(line, what + ": unknown data type \"" + clip(type) + "\"; expected one of"
                    + " unsigned_char char unsigned_short short unsigned_int int unsigned_long long float double"
                    + " vtktypeint64");
            };
            if (n < 0 || n > Integer.MAX_VALUE - 8) {
                throw error(line, what + ": " + n + " values are more than eigencheck reads");
            }
            if (binary) {
                // the data start after the end of the header line
                while (pos < b.length && b[pos] != '\n') {
                    if (!isSpace(b[pos])) {
                        throw error(line, what + ": unexpected text after the header line; binary data follow it");
                    }
                    pos++;
                }
                pos++;
                line++;
                long bytes = n * size;
                if (pos + bytes > b.length) {
                    throw new InputException(Cause.MALFORMED, new InputLocation(file, 0, 0, pos, ""), what + ": expected "
                        + bytes + " bytes of binary " + type + " data, the file ends after " + Math.max(0, b.length - pos)
                        + " (truncated?)");
                }
                double[] v = new double[(int) n];
                java.nio.ByteBuffer buf = java.nio.ByteBuffer.wrap(b, pos, (int) bytes).order(java.nio.ByteOrder.BIG_ENDIAN);
                for (int i = 0; i < n; i++) {
                    v[i] = switch (t) {
                        case "unsigned_char" -> buf.get() & 0xff;
                        case "char" -> buf.get();
                        case "unsigned_short" -> buf.getShort() & 0xffff;
                        case "short" -> buf.getShort();
                        case "unsigned_int" -> buf.getInt() & 0xffffffffL;
                        case "int", "vtkidtype" -> buf.getInt();
                        case "float" -> buf.getFloat();
                        case "double" -> buf.getDouble();
                        default -> buf.getLong();
                    };
                    if (!Double.isFinite(v[i])) {
                        throw new InputException(Cause.NOT_A_NUMBER, new InputLocation(file, 0, 0, pos + (long) i * size,
                            ""), what + ": value " + i + " is " + v[i] + "; the solver diverged or wrote a placeholder");
                    }
                }
                pos += (int) bytes;
                return v;
            }
            if (n > (b.length - pos + 1) / 2 + 1) {
                throw error(line, what + ": expected " + n + " values, the file is too short to hold them (truncated?)");
            }
            double[] v = new double[(int) n];
            for (int i = 0; i < n; i++) {
                skipSpace();
                if (pos >= b.length) {
                    throw error(line, what + ": expected " + n + " values, the file ends after " + i + " (truncated?)");
                }
                int start = pos;
                int startLine = line;
                while (pos < b.length && !isSpace(b[pos])) {
                    pos++;
                }
                String token = new String(b, start, pos - start, java.nio.charset.StandardCharsets.ISO_8859_1);
                double d;
                try {
                    d = Double.parseDouble(token);
                } catch (NumberFormatException e) {
                    throw new InputException(Cause.NOT_A_NUMBER, InputLocation.at(file, startLine, column(start), ""),
                        what + ": value " + i + " \"" + clip(token) + "\" is not a number (" + n + " expected)");
                }
                if (!Double.isFinite(d)) {
                    throw new InputException(Cause.NOT_A_NUMBER, InputLocation.at(file, startLine, column(start), ""),
                        what + ": value " + i + " is " + token + "; the solver diverged or wrote a placeholder");
                }
                v[i] = d;
            }
            return v;
        }

        private int index(double v, String what, int limit) throws InputException {
            if (v != Math.rint(v) || v < 0 || v >= limit) {
                throw error(line, what + ": " + v + " is not an index in [0, " + limit + ")");
            }
            return (int) v;
        }

        // ------------------------------------------------------------- tokens

        private static boolean isSpace(byte c) {
            return c == ' ' || c == '\n' || c == '\r' || c == '\t' || c == '\f';
        }

        private void skipSpace() {
            while (pos < b.length && isSpace(b[pos])) {
                if (b[pos] == '\n') {
                    line++;
                }
                pos++;
            }
        }

        private String readLine() {
            int start = pos;
            while (pos < b.length && b[pos] != '\n') {
                pos++;
            }
            String s = new String(b, start, pos - start, java.nio.charset.StandardCharsets.ISO_8859_1);
            if (pos < b.length) {
                pos++;
                line++;
            }
            return s.endsWith("\r") ? s.substring(0, s.length() - 1) : s;
        }

        private String word(String what) throws InputException {
            skipSpace();
            if (pos >= b.length) {
                throw error(line, "expected " + what + ", the file ends (truncated?)");
            }
            int start = pos;
            while (pos < b.length && !isSpace(b[pos])) {
                pos++;
            }
            return new String(b, start, pos - start, java.nio.charset.StandardCharsets.ISO_8859_1);
        }

        private String peekWord() {
            int save = pos;
            int saveLine = line;
            skipSpace();
            int start = pos;
            while (pos < b.length && !isSpace(b[pos])) {
                pos++;
            }
            String w = new String(b, start, pos - start, java.nio.charset.StandardCharsets.ISO_8859_1);
            pos = save;
            line = saveLine;
            return w;
        }

        private void expectWord(String expected) throws InputException {
            String w = word(expected);
            if (!w.equalsIgnoreCase(expected)) {
                throw error(line, "expected " + expected + ", found \"" + clip(w) + "\"");
            }
        }

        private int count(String what) throws InputException {
            String w = word(what);
            try {
                long v = Long.parseLong(w);
                if (v < 0 || v > Integer.MAX_VALUE) {
                    throw error(line, what + " " + v + " is out of range");
                }
                return (int) v;
            } catch (NumberFormatException e) {
                throw error(line, "expected " + what + " (a whole number), found \"" + clip(w) + "\"");
            }
        }

        private double real() throws InputException {
            String w = word("a number");
            try {
                double d = Double.parseDouble(w);
                if (!Double.isFinite(d)) {
                    throw error(line, "expected a finite number, found " + w);
                }
                return d;
            } catch (NumberFormatException e) {
                throw error(line, "expected a number, found \"" + clip(w) + "\"");
            }
        }

        private static boolean isInteger(String w) {
            if (w.isEmpty()) {
                return false;
            }
            for (int i = 0; i < w.length(); i++) {
                if (!Character.isDigit(w.charAt(i))) {
                    return false;
                }
            }
            return true;
        }

        private int column(int at) {
            int c = at;
            while (c > 0 && b[c - 1] != '\n') {
                c--;
            }
            return at - c + 1;
        }

        private static String clip(String s) {
            StringBuilder r = new StringBuilder();
            for (int i = 0; i < s.length() && i < 40; i++) {
                char c = s.charAt(i);
                r.append(c >= 32 && c < 127 ? c : '?');
            }
            return s.length() > 40 ? r + "..." : r.toString();
        }

        private InputException error(int atLine, String message) {
            return new InputException(Cause.MALFORMED, atLine > 0 ? InputLocation.at(file, atLine, 0, "")
                : InputLocation.of(file), message);
        }
    }
}

package eigencheck.adapters;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonGenerator;
import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.OutputStreamWriter;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.Base64;
import java.util.SplittableRandom;
import java.util.zip.Deflater;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVPrinter;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;
import org.junit.jupiter.api.Test;

/**
 * A field written by an independent writer reads back bit for bit: Jackson's own generator, Commons
 * CSV's printer, a plain-XML VTU writer here (ascii, inline base64 with UInt32 and UInt64 headers,
 * zlib blocks, raw appended data) and a big-endian legacy VTK writer here.
 */
class RoundTripTest {
    private static final int N = 257;
    private final double[] x = new double[N];
    private final double[] y = new double[N];
    private final double[] t = new double[N];

    RoundTripTest() {
        SplittableRandom r = new SplittableRandom(99);
        for (int i = 0; i < N; i++) {
            x[i] = i / 256.0 + r.nextDouble() * 1e-5; // distinct points
            y[i] = r.nextDouble() * 0.3;
            t[i] = 20 + 80 * r.nextDouble() - (i == 7 ? 1e-310 : 0); // one subnormal-sized difference
        }
    }

    @Test
    void jacksonGeneratorRoundTrip() throws IOException, InputException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try (JsonGenerator g = new JsonFactory().createGenerator(out)) {
            g.writeStartObject();
            g.writeNumberField("time", 0.125);
            g.writeArrayFieldStart("points");
            for (int i = 0; i < N; i++) {
                g.writeArray(new double[] {x[i], y[i]}, 0, 2);
            }
            g.writeEndArray();
            g.writeObjectFieldStart("pointData");
            g.writeArrayFieldStart("T");
            for (double v : t) {
                g.writeNumber(v);
            }
            g.writeEndArray();
            g.writeEndObject();
            g.writeEndObject();
        }
        Field f = Readers.read(Path.of("rt.json"), out.toByteArray(), ReadOptions.defaults()).fields().get(0);
        assertArrayEquals(x, f.axis(0));
        assertArrayEquals(y, f.axis(1));
        assertArrayEquals(t, f.pointData().get("T").values());
        assertEquals(0.125, f.time());
    }

    @Test
    void commonsCsvPrinterRoundTrip() throws IOException, InputException {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        try (CSVPrinter p = new CSVPrinter(new OutputStreamWriter(out, StandardCharsets.UTF_8),
            CSVFormat.DEFAULT.builder().setHeader("x", "y", "T").get())) {
            for (int i = 0; i < N; i++) {
                p.printRecord(x[i], y[i], t[i]);
            }
        }
        Field f = Readers.read(Path.of("rt.csv"), out.toByteArray(), ReadOptions.defaults()).fields().get(0);
        assertArrayEquals(x, f.axis(0));
        assertArrayEquals(y, f.axis(1));
        assertArrayEquals(t, f.pointData().get("T").values());
    }

    // ----------------------------------------------------------- VTU writer, plain XML

    enum Encoding { ASCII, BASE64_UINT32, BASE64_UINT64, ZLIB_UINT32, ZLIB_UINT64, APPENDED_RAW, APPENDED_ZLIB }

    @ParameterizedTest
    @ValueSource(strings = {"ASCII", "BASE64_UINT32", "BASE64_UINT64", "ZLIB_UINT32", "ZLIB_UINT64", "APPENDED_RAW",
        "APPENDED_ZLIB"})
    void plainXmlVtuRoundTrip(String name) throws InputException {
        Encoding e = Encoding.valueOf(name);
        byte[] file = vtu(e);
        Field f = Readers.read(Path.of("rt.vtu"), file, ReadOptions.defaults()).fields().get(0);
        assertArrayEquals(x, f.axis(0));
        assertArrayEquals(y, f.axis(1));
        assertArrayEquals(t, f.pointData().get("T").values());
        assertEquals(N - 1, f.cells().size());
        assertEquals(N - 2, f.cells().node(N - 2, 0));
    }

    byte[] vtu(Encoding e) {
        double[] xyz = new double[3 * N];
        for (int i = 0; i < N; i++) {
            xyz[3 * i] = x[i];
            xyz[3 * i + 1] = y[i];
        }
        int cells = N - 1;
        long[] conn = new long[2 * cells];
        long[] off = new long[cells];
        for (int c = 0; c < cells; c++) {
            conn[2 * c] = c;
            conn[2 * c + 1] = c + 1;
            off[c] = 2L * (c + 1);
        }
        byte[] types = new byte[cells];
        java.util.Arrays.fill(types, (byte) 3);
        boolean wide = e == Encoding.BASE64_UINT64 || e == Encoding.ZLIB_UINT64 || e == Encoding.APPENDED_ZLIB;
        boolean zlib = e == Encoding.ZLIB_UINT32 || e == Encoding.ZLIB_UINT64 || e == Encoding.APPENDED_ZLIB;
        boolean appended = e == Encoding.APPENDED_RAW || e == Encoding.APPENDED_ZLIB;
        StringBuilder xml = new StringBuilder();
        xml.append("<?xml version=\"1.0\"?>\n<VTKFile type=\"UnstructuredGrid\" version=\"1.0\" byte_order=\"LittleEndian\"")
            .append(" header_type=\"").append(wide ? "UInt64" : "UInt32").append('"')
            .append(zlib ? " compressor=\"vtkZLibDataCompressor\"" : "").append(">\n<UnstructuredGrid>\n")
            .append("<Piece NumberOfPoints=\"").append(N).append("\" NumberOfCells=\"").append(cells).append("\">\n");
        ByteArrayOutputStream app = new ByteArrayOutputStream();
        byte[][] raw = {doubles(t), doubles(xyz), longs(conn), longs(off), types};
        String[] tags = {"<PointData><DataArray type=\"Float64\" Name=\"T\"",
            "</PointData><Points><DataArray type=\"Float64\" NumberOfComponents=\"3\"",
            "</Points><Cells><DataArray type=\"Int64\" Name=\"connectivity\"", "<DataArray type=\"Int64\" Name=\"offsets\"",
            "<DataArray type=\"UInt8\" Name=\"types\""};
        for (int k = 0; k < raw.length; k++) {
            xml.append(tags[k]);
            if (e == Encoding.ASCII) {
                xml.append(" format=\"ascii\">").append(asciiOf(k, xyz, conn, off, types)).append("</DataArray>\n");
            } else if (appended) {
                xml.append(" format=\"appended\" offset=\"").append(app.size()).append("\"/>\n");
                byte[] block = zlib ? compressed(raw[k], wide) : withHeader(raw[k], wide);
                app.writeBytes(block);
            } else if (zlib) {
                byte[] c = compressed(raw[k], wide);
                int headerBytes = (int) ((3 + blocks(raw[k])) * (wide ? 8 : 4));
                xml.append(" format=\"binary\">")
                    .append(Base64.getEncoder().encodeToString(java.util.Arrays.copyOf(c, headerBytes)))
                    .append(Base64.getEncoder().encodeToString(java.util.Arrays.copyOfRange(c, headerBytes, c.length)))
                    .append("</DataArray>\n");
            } else {
                xml.append(" format=\"binary\">").append(Base64.getEncoder().encodeToString(withHeader(raw[k], wide)))
                    .append("</DataArray>\n");
            }
        }
        xml.append("</Cells>\n</Piece>\n</UnstructuredGrid>\n");
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        out.writeBytes(xml.toString().getBytes(StandardCharsets.US_ASCII));
        if (appended) {
            out.writeBytes("<AppendedData encoding=\"raw\">\n_".getBytes(StandardCharsets.US_ASCII));
            out.writeBytes(app.toByteArray());
            out.writeBytes("\n</AppendedData>\n".getBytes(StandardCharsets.US_ASCII));
        }
        out.writeBytes("</VTKFile>\n".getBytes(StandardCharsets.US_ASCII));
        return out.toByteArray();
    }

    private String asciiOf(int k, double[] xyz, long[] conn, long[] off, byte[] types) {
        StringBuilder b = new StringBuilder();
        switch (k) {
            case 0 -> {
                for (double v : t) {
                    b.append(v).append(' ');
                }
            }
            case 1 -> {
                for (double v : xyz) {
                    b.append(v).append(' ');
                }
            }
            case 2 -> {
                for (long v : conn) {
                    b.append(v).append(' ');
                }
            }
            case 3 -> {
                for (long v : off) {
                    b.append(v).append(' ');
                }
            }
            default -> {
                for (byte v : types) {
                    b.append(v).append(' ');
                }
            }
        }
        return b.toString();
    }

    private static byte[] doubles(double[] v) {
        ByteBuffer b = ByteBuffer.allocate(8 * v.length).order(ByteOrder.LITTLE_ENDIAN);
        b.asDoubleBuffer().put(v);
        return b.array();
    }

    private static byte[] longs(long[] v) {
        ByteBuffer b = ByteBuffer.allocate(8 * v.length).order(ByteOrder.LITTLE_ENDIAN);
        b.asLongBuffer().put(v);
        return b.array();
    }

    private static byte[] withHeader(byte[] data, boolean wide) {
        ByteBuffer b = ByteBuffer.allocate((wide ? 8 : 4) + data.length).order(ByteOrder.LITTLE_ENDIAN);
        if (wide) {
            b.putLong(data.length);
        } else {
            b.putInt(data.length);
        }
        b.put(data);
        return b.array();
    }

    private static final int BLOCK = 1024;

    private static long blocks(byte[] data) {
        return Math.max(1, (data.length + BLOCK - 1) / BLOCK);
    }

    /** vtkZLibDataCompressor layout: [blocks, blockSize, lastBlockSize, sizes...] then the zlib blocks. */
    private static byte[] compressed(byte[] data, boolean wide) {
        int nb = (int) blocks(data);
        byte[][] parts = new byte[nb][];
        for (int k = 0; k < nb; k++) {
            int from = k * BLOCK;
            int to = Math.min(data.length, from + BLOCK);
            Deflater d = new Deflater();
            d.setInput(data, from, to - from);
            d.finish();
            byte[] buf = new byte[2 * BLOCK + 64];
            int len = d.deflate(buf);
            d.end();
            parts[k] = java.util.Arrays.copyOf(buf, len);
        }
        int hs = wide ? 8 : 4;
        int total = (3 + nb) * hs;
        for (byte[] p : parts) {
            total += p.length;
        }
        ByteBuffer b = ByteBuffer.allocate(total).order(ByteOrder.LITTLE_ENDIAN);
        long last = data.length - (long) (nb - 1) * BLOCK;
        long[] header = new long[3 + nb];
        header[0] = nb;
        header[1] = BLOCK;
        header[2] = last == BLOCK ? 0 : last;
        for (int k = 0; k < nb; k++) {
            header[3 + k] = parts[k].length;
        }
        for (long h : header) {
            if (wide) {
                b.putLong(h);
            } else {
                b.putInt((int) h);
            }
        }
        for (byte[] p : parts) {
            b.put(p);
        }
        return b.array();
    }

    // ----------------------------------------------------------- legacy binary writer

    @Test
    void bigEndianLegacyBinaryRoundTrip() throws InputException {
        byte[] file = legacyBinary();
        Field f = Readers.read(Path.of("rt.vtk"), file, ReadOptions.defaults()).fields().get(0);
        assertArrayEquals(x, f.axis(0));
        assertArrayEquals(y, f.axis(1));
        assertArrayEquals(t, f.pointData().get("T").values());
        assertEquals(N - 1, f.cells().size());
    }

    byte[] legacyBinary() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        out.writeBytes(("# vtk DataFile Version 3.0\nbinary line\nBINARY\nDATASET UNSTRUCTURED_GRID\nPOINTS " + N
            + " double\n").getBytes(StandardCharsets.US_ASCII));
        ByteBuffer p = ByteBuffer.allocate(24 * N).order(ByteOrder.BIG_ENDIAN);
        for (int i = 0; i < N; i++) {
            p.putDouble(x[i]).putDouble(y[i]).putDouble(0);
        }
        out.writeBytes(p.array());
        int cells = N - 1;
        out.writeBytes(("\nCELLS " + cells + " " + 3 * cells + "\n").getBytes(StandardCharsets.US_ASCII));
        ByteBuffer c = ByteBuffer.allocate(12 * cells).order(ByteOrder.BIG_ENDIAN);
        for (int k = 0; k < cells; k++) {
            c.putInt(2).putInt(k).putInt(k + 1);
        }
        out.writeBytes(c.array());
        out.writeBytes(("\nCELL_TYPES " + cells + "\n").getBytes(StandardCharsets.US_ASCII));
        ByteBuffer ty = ByteBuffer.allocate(4 * cells).order(ByteOrder.BIG_ENDIAN);
        for (int k = 0; k < cells; k++) {
            ty.putInt(3);
        }
        out.writeBytes(ty.array());
        out.writeBytes(("\nPOINT_DATA " + N + "\nSCALARS T double 1\nLOOKUP_TABLE default\n")
            .getBytes(StandardCharsets.US_ASCII));
        ByteBuffer d = ByteBuffer.allocate(8 * N).order(ByteOrder.BIG_ENDIAN);
        for (double v : t) {
            d.putDouble(v);
        }
        out.writeBytes(d.array());
        out.writeBytes("\n".getBytes(StandardCharsets.US_ASCII));
        return out.toByteArray();
    }
}

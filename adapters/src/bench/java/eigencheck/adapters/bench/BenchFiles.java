package eigencheck.adapters.bench;

import java.io.BufferedWriter;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

/** Writes the 10^6-point benchmark files: CSV (x,y,z,T) and a VTU with raw appended Float64 data. */
final class BenchFiles {
    static final int N = 1_000_000;
    /** Raw size of the arrays read: 3 coordinates and one field, 8 bytes each. */
    static final long RAW_BYTES = 4L * 8 * N;

    private BenchFiles() {
    }

    static double x(int i) {
        return i * 1e-6;
    }

    static double t(int i) {
        return 20 + 30 * Math.sin(i * 1e-5);
    }

    static Path csv(Path dir) throws IOException {
        Path p = dir.resolve("field.csv");
        try (BufferedWriter w = Files.newBufferedWriter(p, StandardCharsets.UTF_8)) {
            w.write("x,y,z,T\n");
            for (int i = 0; i < N; i++) {
                w.write(Double.toString(x(i)));
                w.write(",0.5,0.0,");
                w.write(Double.toString(t(i)));
                w.write('\n');
            }
        }
        return p;
    }

    static Path vtu(Path dir) throws IOException {
        Path p = dir.resolve("field.vtu");
        long pointsBytes = 24L * N;
        long tBytes = 8L * N;
        String head = "<?xml version=\"1.0\"?>\n<VTKFile type=\"UnstructuredGrid\" version=\"1.0\" byte_order=\"LittleEndian\""
            + " header_type=\"UInt64\">\n<UnstructuredGrid>\n<Piece NumberOfPoints=\"" + N + "\" NumberOfCells=\"0\">\n"
            + "<PointData><DataArray type=\"Float64\" Name=\"T\" format=\"appended\" offset=\"0\"/></PointData>\n"
            + "<Points><DataArray type=\"Float64\" NumberOfComponents=\"3\" format=\"appended\" offset=\"" + (8 + tBytes)
            + "\"/></Points>\n<Cells><DataArray type=\"Int64\" Name=\"connectivity\" format=\"ascii\"></DataArray>"
            + "<DataArray type=\"Int64\" Name=\"offsets\" format=\"ascii\"></DataArray>"
            + "<DataArray type=\"UInt8\" Name=\"types\" format=\"ascii\"></DataArray></Cells>\n"
            + "</Piece>\n</UnstructuredGrid>\n<AppendedData encoding=\"raw\">\n_";
        try (OutputStream o = Files.newOutputStream(p)) {
            o.write(head.getBytes(StandardCharsets.US_ASCII));
            ByteBuffer b = ByteBuffer.allocate((int) (8 + tBytes)).order(ByteOrder.LITTLE_ENDIAN);
            b.putLong(tBytes);
            for (int i = 0; i < N; i++) {
                b.putDouble(t(i));
            }
            o.write(b.array());
            ByteBuffer c = ByteBuffer.allocate((int) (8 + pointsBytes)).order(ByteOrder.LITTLE_ENDIAN);
            c.putLong(pointsBytes);
            for (int i = 0; i < N; i++) {
                c.putDouble(x(i)).putDouble(0.5).putDouble(0.0);
            }
            o.write(c.array());
            o.write("\n</AppendedData>\n</VTKFile>\n".getBytes(StandardCharsets.US_ASCII));
        }
        return p;
    }
}

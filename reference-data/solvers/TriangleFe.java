// Stand-alone demo solver, not part of eigencheck: linear (P1) finite elements on a structured
// triangle mesh of the rectangle 0 < x < 0.2, 0 < y < 0.05 for the kiln-wall scenario of
// reference-data/demo (our own invention): rho c u_t = k lap(u) + Q(x,t), convection at x = 0,
// a prescribed temperature at x = 0.2, insulated y faces, u = 20 at t = 0. Backward Euler or
// Crank-Nicolson; the system matrix is constant and factored once (banded Cholesky). Writes a VTU
// file (ascii) with the triangles and the nodal temperatures at t = 20000 s.
//
//   java TriangleFe.java --nx NX --ny NY --dt DT --scheme be|cn --out OUT.vtu
//                        [--defect mass-boundary-row|source-old-time]
//
// Defects, for suites that must catch them:
//   mass-boundary-row  the mass-matrix rows of the nodes on the convective face are halved
//   source-old-time    the source is taken at the old time level in Crank-Nicolson
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;

public class TriangleFe {
    static final double LX = 0.2;
    static final double LY = 0.05;
    static final double K = 1.2;
    static final double RHO_C = 2.0e6;
    static final double H = 15;
    static final double T_END = 20000;

    static double ambient(double t) {
        return 20 + 180 * (1 - Math.exp(-t / 3000));
    }

    static double coldFace(double t) {
        return 20 + 5 * Math.sin(t / 4000);
    }

    static double source(double x, double t) {
        return 2000 * Math.exp(-Math.pow((x - 0.1) / 0.04, 2)) * (1 + 0.5 * Math.sin(2 * Math.PI * t / 20000));
    }

    static int nx;
    static int ny;
    static int bw; // half bandwidth

    static int id(int i, int j) {
        return j + i * (ny + 1);
    }

    public static void main(String[] args) throws IOException {
        double dt = 0;
        String scheme = "cn";
        String out = null;
        String defect = "none";
        for (int a = 0; a < args.length; a += 2) {
            switch (args[a]) {
                case "--nx" -> nx = Integer.parseInt(args[a + 1]);
                case "--ny" -> ny = Integer.parseInt(args[a + 1]);
                case "--dt" -> dt = Double.parseDouble(args[a + 1]);
                case "--scheme" -> scheme = args[a + 1];
                case "--out" -> out = args[a + 1];
                case "--defect" -> defect = args[a + 1];
                default -> throw new IllegalArgumentException("unknown option " + args[a]);
            }
        }
        if (nx < 1 || ny < 1 || !(dt > 0) || out == null) {
            System.err.println("usage: java TriangleFe.java --nx NX --ny NY --dt DT --scheme be|cn --out OUT.vtu");
            System.exit(2);
        }
        double theta = scheme.equals("be") ? 1.0 : 0.5;
        int n = (nx + 1) * (ny + 1);
        bw = ny + 2;
        double hx = LX / nx;
        double hy = LY / ny;
        double[] px = new double[n];
        double[] py = new double[n];
        for (int i = 0; i <= nx; i++) {
            for (int j = 0; j <= ny; j++) {
                px[id(i, j)] = i * hx;
                py[id(i, j)] = j * hy;
            }
        }
        int[][] tris = new int[2 * nx * ny][];
        int t = 0;
        for (int i = 0; i < nx; i++) {
            for (int j = 0; j < ny; j++) {
                int a = id(i, j);
                int b = id(i + 1, j);
                int c = id(i + 1, j + 1);
                int d = id(i, j + 1);
                tris[t++] = new int[] {a, b, c};
                tris[t++] = new int[] {a, c, d};
            }
        }
        // banded symmetric storage: m[row][k] holds entry (row, row - bw + k), k = 0 .. bw
        double[][] mass = new double[n][bw + 1];
        double[][] stiff = new double[n][bw + 1];
        for (int[] tri : tris) {
            double x0 = px[tri[0]], y0 = py[tri[0]], x1 = px[tri[1]], y1 = py[tri[1]], x2 = px[tri[2]], y2 = py[tri[2]];
            double area = 0.5 * Math.abs((x1 - x0) * (y2 - y0) - (x2 - x0) * (y1 - y0));
            double[] bx = {y1 - y2, y2 - y0, y0 - y1};
            double[] by = {x2 - x1, x0 - x2, x1 - x0};
            for (int p = 0; p < 3; p++) {
                for (int q = 0; q < 3; q++) {
                    int r = tri[p];
                    int c = tri[q];
                    if (c > r) {
                        continue;
                    }
                    add(mass, r, c, area / 12.0 * (p == q ? 2 : 1));
                    add(stiff, r, c, K * (bx[p] * bx[q] + by[p] * by[q]) / (4 * area));
                }
            }
        }
        // convection on x = 0: h int phi_i phi_j ds (1D mass of the edge) and the load h u_amb int phi_i
        double[] robinLoad = new double[n];
        for (int j = 0; j < ny; j++) {
            int a = id(0, j);
            int b = id(0, j + 1);
            add(stiff, a, a, H * hy / 3);
            add(stiff, b, b, H * hy / 3);
            add(stiff, b, a, H * hy / 6);
            robinLoad[a] += H * hy / 2;
            robinLoad[b] += H * hy / 2;
        }
        if (defect.equals("mass-boundary-row")) {
            for (int j = 0; j <= ny; j++) {
                int r = id(0, j);
                for (int k = 0; k <= bw; k++) {
                    mass[r][k] *= 0.5;
                }
            }
        }
        boolean[] fixed = new boolean[n];
        for (int j = 0; j <= ny; j++) {
            fixed[id(nx, j)] = true;
        }
        // system S = rho c M + theta dt A, right side (rho c M - (1 - theta) dt A) u0 + loads
        double[][] system = new double[n][bw + 1];
        for (int r = 0; r < n; r++) {
            for (int k = 0; k <= bw; k++) {
                system[r][k] = RHO_C * mass[r][k] + theta * dt * stiff[r][k];
            }
        }
        // symmetric elimination of the Dirichlet nodes: keep the coupling to move known values right
        double[][] coupling = new double[n][];
        for (int r = 0; r < n; r++) {
            coupling[r] = system[r].clone();
        }
        for (int r = 0; r < n; r++) {
            for (int k = 0; k <= bw; k++) {
                int c = r - bw + k;
                if (c < 0) {
                    continue;
                }
                if (fixed[r] || fixed[c]) {
                    system[r][k] = (r == c) ? 1 : 0;
                }
            }
        }
        cholesky(system);
        double[] u = new double[n];
        java.util.Arrays.fill(u, 20.0);
        int steps = (int) Math.round(T_END / dt);
        dt = T_END / steps;
        double[] rhs = new double[n];
        double[] q0 = new double[n];
        double[] q1 = new double[n];
        for (int s = 0; s < steps; s++) {
            double t0 = s * dt;
            double t1 = t0 + dt;
            // rho c M u0 - (1 - theta) dt A u0
            java.util.Arrays.fill(rhs, 0);
            multiply(mass, u, rhs, RHO_C);
            multiply(stiff, u, rhs, -(1 - theta) * dt);
            for (int i = 0; i < n; i++) {
                q0[i] = source(px[i], t0);
                q1[i] = source(px[i], defect.equals("source-old-time") ? t0 : t1);
            }
            multiply(mass, q1, rhs, theta * dt);
            multiply(mass, q0, rhs, (1 - theta) * dt);
            for (int i = 0; i < n; i++) {
                rhs[i] += dt * robinLoad[i] * (theta * ambient(t1) + (1 - theta) * ambient(t0));
            }
            double[] known = new double[n];
            for (int i = 0; i < n; i++) {
                if (fixed[i]) {
                    known[i] = coldFace(t1);
                }
            }
            double[] shift = new double[n];
            multiply(coupling, known, shift, 1);
            for (int i = 0; i < n; i++) {
                rhs[i] = fixed[i] ? known[i] : rhs[i] - shift[i];
            }
            solve(system, rhs);
            System.arraycopy(rhs, 0, u, 0, n);
        }
        write(Path.of(out), px, py, tris, u);
    }

    static void add(double[][] m, int r, int c, double v) {
        m[r][c - r + bw] += v;
    }

    /** y += s M x for symmetric banded M stored by lower rows. */
    static void multiply(double[][] m, double[] x, double[] y, double s) {
        int n = x.length;
        for (int r = 0; r < n; r++) {
            for (int k = 0; k <= bw; k++) {
                int c = r - bw + k;
                if (c < 0) {
                    continue;
                }
                double v = m[r][k] * s;
                y[r] += v * x[c];
                if (c != r) {
                    y[c] += v * x[r];
                }
            }
        }
    }

    /** In-place banded Cholesky: m becomes L with S = L L^T. */
    static void cholesky(double[][] m) {
        int n = m.length;
        for (int r = 0; r < n; r++) {
            for (int k = 0; k <= bw; k++) {
                int c = r - bw + k;
                if (c < 0) {
                    continue;
                }
                double s = m[r][k];
                for (int j = Math.max(0, r - bw); j < c; j++) {
                    s -= m[r][j - r + bw] * m[c][j - c + bw];
                }
                if (c == r) {
                    m[r][bw] = Math.sqrt(s);
                } else {
                    m[r][k] = s / m[c][bw];
                }
            }
        }
    }

    static void solve(double[][] l, double[] b) {
        int n = b.length;
        for (int r = 0; r < n; r++) {
            double s = b[r];
            for (int c = Math.max(0, r - bw); c < r; c++) {
                s -= l[r][c - r + bw] * b[c];
            }
            b[r] = s / l[r][bw];
        }
        for (int r = n - 1; r >= 0; r--) {
            double s = b[r];
            for (int j = r + 1; j <= Math.min(n - 1, r + bw); j++) {
                s -= l[j][r - j + bw] * b[j];
            }
            b[r] = s / l[r][bw];
        }
    }

    static void write(Path out, double[] px, double[] py, int[][] tris, double[] u) throws IOException {
        try (PrintWriter w = new PrintWriter(Files.newBufferedWriter(out))) {
            w.println("<?xml version=\"1.0\"?>");
            w.println("<VTKFile type=\"UnstructuredGrid\" version=\"1.0\" byte_order=\"LittleEndian\">");
            w.println("<UnstructuredGrid>");
            w.printf(Locale.ROOT, "<FieldData><DataArray type=\"Float64\" Name=\"TimeValue\" NumberOfTuples=\"1\""
                + " format=\"ascii\">%.17g</DataArray></FieldData>%n", T_END);
            w.printf("<Piece NumberOfPoints=\"%d\" NumberOfCells=\"%d\">%n", px.length, tris.length);
            w.println("<PointData Scalars=\"T\"><DataArray type=\"Float64\" Name=\"T\" format=\"ascii\">");
            for (double v : u) {
                w.printf(Locale.ROOT, "%.17g%n", v);
            }
            w.println("</DataArray></PointData>");
            w.println("<Points><DataArray type=\"Float64\" NumberOfComponents=\"3\" format=\"ascii\">");
            for (int i = 0; i < px.length; i++) {
                w.printf(Locale.ROOT, "%.17g %.17g 0%n", px[i], py[i]);
            }
            w.println("</DataArray></Points>");
            w.println("<Cells><DataArray type=\"Int32\" Name=\"connectivity\" format=\"ascii\">");
            for (int[] t : tris) {
                w.printf("%d %d %d%n", t[0], t[1], t[2]);
            }
            w.println("</DataArray><DataArray type=\"Int32\" Name=\"offsets\" format=\"ascii\">");
            for (int i = 1; i <= tris.length; i++) {
                w.println(3 * i);
            }
            w.println("</DataArray><DataArray type=\"UInt8\" Name=\"types\" format=\"ascii\">");
            for (int i = 0; i < tris.length; i++) {
                w.println(5);
            }
            w.println("</DataArray></Cells></Piece></UnstructuredGrid></VTKFile>");
        }
    }
}

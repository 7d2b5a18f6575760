// Stand-alone demo solver, not part of eigencheck: a 1D cell-centred finite-volume Crank-Nicolson
// solver for rho c u_t = k u_xx + Q(x,t) on 0 < x < L, for the kiln-wall scenario of
// reference-data/demo (our own invention). Writes the cell values (cell averages) as CSV.
//
//   java SlabFv.java --cells N --dt DT --out OUT.csv [--left robin|dirichlet|neumann]
//                    [--right dirichlet|robin|neumann] [--defect robin-first-order|source-old-time]
//
// Defects, for suites that must catch them:
//   robin-first-order  the Robin face flux uses the first cell's value instead of the face value
//   source-old-time    the source is taken at the old time level instead of the half step
import java.io.IOException;
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;

public class SlabFv {
    static final double L = 0.2;          // m, wall thickness
    static final double K = 1.2;          // W/(m K)
    static final double RHO_C = 2.0e6;    // J/(m^3 K)
    static final double H = 15;           // W/(m^2 K), hot-side convection
    static final double T_END = 20000;    // s

    static double ambient(double t) {      // furnace gas, heating up
        return 20 + 180 * (1 - Math.exp(-t / 3000));
    }

    static double coldFace(double t) {     // Dirichlet value on the cold side
        return 20 + 5 * Math.sin(t / 4000);
    }

    static double coldFlux(double t) {     // Neumann flux into the body on the cold side
        return -150 * (1 - Math.exp(-t / 5000));
    }

    static double source(double x, double t) { // embedded heating element, W/m^3
        return 2000 * Math.exp(-Math.pow((x - 0.1) / 0.04, 2)) * (1 + 0.5 * Math.sin(2 * Math.PI * t / 20000));
    }

    public static void main(String[] args) throws IOException {
        int n = 0;
        double dt = 0;
        String out = null;
        String left = "robin";
        String right = "dirichlet";
        String defect = "none";
        for (int i = 0; i < args.length; i += 2) {
            switch (args[i]) {
                case "--cells" -> n = Integer.parseInt(args[i + 1]);
                case "--dt" -> dt = Double.parseDouble(args[i + 1]);
                case "--out" -> out = args[i + 1];
                case "--left" -> left = args[i + 1];
                case "--right" -> right = args[i + 1];
                case "--defect" -> defect = args[i + 1];
                default -> throw new IllegalArgumentException("unknown option " + args[i]);
            }
        }
        if (n < 2 || !(dt > 0) || out == null) {
            System.err.println("usage: java SlabFv.java --cells N --dt DT --out OUT.csv");
            System.exit(2);
        }
        double dx = L / n;
        double[] u = new double[n];
        java.util.Arrays.fill(u, 20.0);
        int steps = (int) Math.round(T_END / dt);
        dt = T_END / steps;
        double[] a = new double[n];
        double[] b = new double[n];
        double[] c = new double[n];
        double[] r = new double[n];
        for (int s = 0; s < steps; s++) {
            double t0 = s * dt;
            double t1 = t0 + dt;
            // theta = 1/2: (rho c dx/dt) (u1 - u0) = 1/2 (F(u1, t1) + F(u0, t0)) + dx Q
            double m = RHO_C * dx / dt;
            for (int i = 0; i < n; i++) {
                a[i] = 0;
                b[i] = m;
                c[i] = 0;
                double tq = defect.equals("source-old-time") ? t0 : 0.5 * (t0 + t1);
                r[i] = m * u[i] + dx * source((i + 0.5) * dx, tq);
            }
            double g = K / dx;
            for (int i = 0; i + 1 < n; i++) {
                // interior face between i and i+1: flux g (u_{i+1} - u_i) into i
                b[i] += 0.5 * g;
                c[i] -= 0.5 * g;
                b[i + 1] += 0.5 * g;
                a[i + 1] -= 0.5 * g;
                double f0 = g * (u[i + 1] - u[i]);
                r[i] += 0.5 * f0;
                r[i + 1] -= 0.5 * f0;
            }
            face(left, 0, t0, t1, u, b, r, dx, defect);
            face(right, n - 1, t0, t1, u, b, r, dx, defect);
            solve(a, b, c, r, u);
        }
        try (PrintWriter w = new PrintWriter(Files.newBufferedWriter(Path.of(out)))) {
            w.println("# SlabFv demo solver: cell values (cell averages) at t = " + T_END + " s");
            w.println("x,t,T");
            for (int i = 0; i < n; i++) {
                w.printf(Locale.ROOT, "%.17g,%.17g,%.17g%n", (i + 0.5) * dx, T_END, u[i]);
            }
        }
    }

    /**
     * Boundary face of cell i: Dirichlet and Robin through the face value of a linear profile over
     * the half cell (second order), Neumann as the given flux; Crank-Nicolson average of both levels.
     */
    static void face(String kind, int i, double t0, double t1, double[] u, double[] b, double[] r, double dx,
                     String defect) {
        double g = 2 * K / dx; // conductance of the half cell
        switch (kind) {
            case "dirichlet" -> {
                // flux into the cell g (uD - u_i)
                b[i] += 0.5 * g;
                r[i] += 0.5 * g * (i == 0 ? coldFace(t1) : coldFace(t1)) + 0.5 * g * (coldFace(t0) - u[i]);
            }
            case "neumann" -> r[i] += 0.5 * (coldFlux(t0) + coldFlux(t1));
            default -> {
                // series conductance of convection and the half cell; first-order defect drops the half cell
                double ge = defect.equals("robin-first-order") ? H : H * g / (H + g);
                b[i] += 0.5 * ge;
                r[i] += 0.5 * ge * ambient(t1) + 0.5 * ge * (ambient(t0) - u[i]);
            }
        }
    }

    /** Thomas algorithm for a tridiagonal system (a below, b on, c above the diagonal). */
    static void solve(double[] a, double[] b, double[] c, double[] r, double[] x) {
        int n = b.length;
        double[] cp = new double[n];
        double[] rp = new double[n];
        cp[0] = c[0] / b[0];
        rp[0] = r[0] / b[0];
        for (int i = 1; i < n; i++) {
            double d = b[i] - a[i] * cp[i - 1];
            cp[i] = c[i] / d;
            rp[i] = (r[i] - a[i] * rp[i - 1]) / d;
        }
        x[n - 1] = rp[n - 1];
        for (int i = n - 2; i >= 0; i--) {
            x[i] = rp[i] - cp[i] * x[i + 1];
        }
    }
}

// Test double of a solver: writes the steady solution x(1-x) of steady.yaml at the nodes of a uniform
// mesh, plus a planted error 0.3 h^2 sin(pi x), or misbehaves on purpose.
//   java FakeSolver.java --cells N --mode ok|crash|hang|empty|garbage --out OUT.csv
import java.io.PrintWriter;
import java.nio.file.Files;
import java.nio.file.Path;

public class FakeSolver {
    public static void main(String[] a) throws Exception {
        int n = 0;
        String mode = "ok";
        String out = null;
        for (int i = 0; i < a.length; i += 2) {
            switch (a[i]) {
                case "--cells" -> n = Integer.parseInt(a[i + 1]);
                case "--mode" -> mode = a[i + 1];
                case "--out" -> out = a[i + 1];
                case "--problem" -> {
                    String text = Files.readString(Path.of(a[i + 1]));
                    if (!text.contains("\"source\"") || !text.contains("\"robin\"")) {
                        System.err.println("fake solver: the derived problem lacks its source or robin face");
                        System.exit(4);
                    }
                }
                default -> throw new IllegalArgumentException(a[i]);
            }
        }
        switch (mode) {
            case "crash" -> {
                System.err.println("fake solver: matrix is singular at row 7");
                System.exit(3);
            }
            case "hang" -> Thread.sleep(600_000);
            case "empty" -> {
                System.out.println("fake solver: done (but wrote nothing)");
                return;
            }
            case "garbage" -> {
                Files.writeString(Path.of(out), "x,T\n0,0\n0.5,NaN\n1,0\n");
                return;
            }
            default -> {
            }
        }
        double h = 1.0 / n;
        try (PrintWriter w = new PrintWriter(Files.newBufferedWriter(Path.of(out)))) {
            w.println("x,T");
            for (int i = 0; i <= n; i++) {
                double x = i * h;
                w.println(x + "," + (x * (1 - x) + 0.3 * h * h * Math.sin(Math.PI * x)));
            }
        }
    }
}

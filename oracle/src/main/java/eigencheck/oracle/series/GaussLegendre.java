package eigencheck.oracle.series;

import java.util.concurrent.ConcurrentHashMap;

/**
 * Gauss-Legendre rules on [-1, 1], nodes by Newton's method on the three-term recurrence from the
 * Tricomi initial guess; accurate to a few ulps for the orders used here (up to some tens of thousands;
 * above 1000 nodes Newton stops at 2 ulps, where the absolute test 1e-17 may never be met).
 * Abramowitz and Stegun, <i>Handbook of Mathematical Functions</i>, 1964, 25.4.29 (weights
 * \(w_i = 2/((1-x_i^2) P_n'(x_i)^2)\)). Rules are cached, immutable and shared between threads.
 */
final class GaussLegendre {
    private static final ConcurrentHashMap<Integer, GaussLegendre> CACHE = new ConcurrentHashMap<>();

    final double[] nodes;
    final double[] weights;

    private GaussLegendre(int n) {
        nodes = new double[n];
        weights = new double[n];
        for (int i = 0; i < (n + 1) / 2; i++) {
            double x = Math.cos(Math.PI * (i + 0.75) / (n + 0.5));
            double dp = 0;
            for (int iteration = 0; iteration < 100; iteration++) {
                double p0 = 1;
                double p1 = x;
                for (int k = 2; k <= n; k++) {
                    double p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
                    p0 = p1;
                    p1 = p2;
                }
                double pn = n == 1 ? x : p1;
                double pnm1 = n == 1 ? 1 : p0;
                dp = n * (x * pn - pnm1) / (x * x - 1);
                double dx = pn / dp;
                x -= dx;
                if (Math.abs(dx) < 1e-17 || (n > 1000 && Math.abs(dx) <= 2 * Math.ulp(x))) {
                    break;
                }
            }
            // one more evaluation for the derivative at the converged node
            double p0 = 1;
            double p1 = x;
            for (int k = 2; k <= n; k++) {
                double p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
                p0 = p1;
                p1 = p2;
            }
            double pn = n == 1 ? x : p1;
            double pnm1 = n == 1 ? 1 : p0;
            dp = n * (x * pn - pnm1) / (x * x - 1);
            nodes[i] = x;
            nodes[n - 1 - i] = -x;
            double w = 2 / ((1 - x * x) * dp * dp);
            weights[i] = w;
            weights[n - 1 - i] = w;
        }
        if (n % 2 == 1) {
            nodes[n / 2] = 0;
        }
    }

    /** Nodes and weights of the n-point rule on [0, L], as {nodes, weights}. */
    static double[][] onInterval(int n, double length) {
        GaussLegendre g = of(n);
        double[] x = new double[n];
        double[] w = new double[n];
        for (int q = 0; q < n; q++) {
            x[q] = 0.5 * length * (g.nodes[q] + 1);
            w[q] = 0.5 * length * g.weights[q];
        }
        return new double[][] {x, w};
    }

    static GaussLegendre of(int n) {
        if (n < 1) {
            throw new IllegalArgumentException("Gauss-Legendre order " + n + " must be >= 1");
        }
        return CACHE.computeIfAbsent(n, GaussLegendre::new);
    }
}

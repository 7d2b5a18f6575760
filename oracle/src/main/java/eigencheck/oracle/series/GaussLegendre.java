package eigencheck.oracle.series;

import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ForkJoinPool;
import java.util.stream.IntStream;

/**
 * Gauss-Legendre rules on [-1, 1], nodes by Newton's method on the three-term recurrence from the
 * Tricomi initial guess; accurate to a few ulps for the orders used here (up to some tens of thousands;
 * Newton stops at a step of 2 ulps, where the absolute test 1e-17 may never be met: without that stop
 * a rule of 1000 nodes took 70 steps per node instead of 3).
 * Abramowitz and Stegun, <i>Handbook of Mathematical Functions</i>, 1964, 25.4.29 (weights
 * \(w_i = 2/((1-x_i^2) P_n'(x_i)^2)\)). Rules are cached, immutable and shared between threads.
 */
final class GaussLegendre {
    private static final ConcurrentHashMap<Integer, GaussLegendre> CACHE = new ConcurrentHashMap<>();
    private static final ForkJoinPool POOL = new ForkJoinPool(Runtime.getRuntime().availableProcessors());

    final double[] nodes;
    final double[] weights;

    private GaussLegendre(int n) {
        nodes = new double[n];
        weights = new double[n];
        // each node costs O(n) per Newton step: past a few thousand nodes they are shared among the cores
        // (each written by one task alone, so the rule does not depend on the thread count)
        // in a pool of their own: the common pool's workers may all be waiting for this very rule
        if (n > 2000) {
            POOL.submit(() -> IntStream.range(0, (n + 1) / 2).parallel().forEach(i -> node(n, i))).join();
        } else {
            for (int i = 0; i < (n + 1) / 2; i++) {
                node(n, i);
            }
        }
        if (n % 2 == 1) {
            nodes[n / 2] = 0;
        }
    }

    /** Node i and its mirror: Newton from the Tricomi guess until the step is rounding (2 ulps) or below 1e-17. */
    private void node(int n, int i) {
        double x = Math.cos(Math.PI * (i + 0.75) / (n + 0.5));
        for (int iteration = 0; iteration < 100; iteration++) {
            double[] p = legendre(n, x);
            double dp = n * (x * p[0] - p[1]) / (x * x - 1);
            double dx = p[0] / dp;
            x -= dx;
            if (Math.abs(dx) < 1e-17 || Math.abs(dx) <= 2 * Math.ulp(x)) {
                break;
            }
        }
        // one more evaluation for the derivative at the converged node
        double[] p = legendre(n, x);
        double dp = n * (x * p[0] - p[1]) / (x * x - 1);
        nodes[i] = x;
        nodes[n - 1 - i] = -x;
        double w = 2 / ((1 - x * x) * dp * dp);
        weights[i] = w;
        weights[n - 1 - i] = w;
    }

    /** {P_n(x), P_(n-1)(x)} by the three-term recurrence. */
    private static double[] legendre(int n, double x) {
        if (n == 1) {
            return new double[] {x, 1};
        }
        double p0 = 1;
        double p1 = x;
        for (int k = 2; k <= n; k++) {
            double p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
            p0 = p1;
            p1 = p2;
        }
        return new double[] {p1, p0};
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

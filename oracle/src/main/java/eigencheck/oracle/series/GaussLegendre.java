package eigencheck.oracle.series;

import java.util.concurrent.ConcurrentHashMap;
import java.util.concurrent.ForkJoinPool;
import java.util.stream.IntStream;

/**
 * Gauss-Legendre rules on [-1, 1], nodes by Newton's method on the three-term recurrence from
 * Tricomi's initial guess, four nodes per pass of the recurrence; accurate to a few ulps for the orders
 * used here (up to some tens of thousands; Newton stops at a step of 2 ulps, where the absolute test
 * 1e-17 may never be met: without that stop a rule of 1000 nodes took 70 steps per node instead of 3).
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
        int half = (n + 1) / 2;
        // the recurrence's coefficients (2k - 1)/k and (k - 1)/k, once per rule: no division in the loop
        double[] c = new double[n + 1];
        double[] d = new double[n + 1];
        for (int k = 2; k <= n; k++) {
            c[k] = (2 * k - 1) / (double) k;
            d[k] = (k - 1) / (double) k;
        }
        int blocks = (half + LANES - 1) / LANES;
        // each node costs O(n) per Newton step: past a few thousand nodes the blocks are shared among the
        // cores (each written by one task alone, so the rule does not depend on the thread count)
        // in a pool of their own: the common pool's workers may all be waiting for this very rule
        if (n > 2000) {
            POOL.submit(() -> IntStream.range(0, blocks).parallel().forEach(b -> block(n, b * LANES, c, d))).join();
        } else {
            for (int b = 0; b < blocks; b++) {
                block(n, b * LANES, c, d);
            }
        }
        if (n % 2 == 1) {
            nodes[n / 2] = 0;
        }
    }

    /** Nodes evaluated together: independent recurrences in one loop keep the floating-point units busy. */
    private static final int LANES = 4;

    /**
     * Nodes i0 .. i0 + LANES - 1 of the positive half and their mirrors: Newton from Tricomi's guess
     * (A&S 22.16.6 with the factor 1 - 1/(8n^2) + 1/(8n^3), error O(n^-4) away from the ends) until the
     * step is rounding (2 ulps) or below 1e-17, then one evaluation for the derivative at each node.
     */
    private void block(int n, int i0, double[] c, double[] d) {
        int count = Math.min(LANES, (n + 1) / 2 - i0);
        double[] x = new double[LANES];
        double[] p = new double[LANES];
        double[] q = new double[LANES];
        boolean[] done = new boolean[LANES];
        double factor = 1 - 1.0 / (8.0 * n * n) + 1.0 / (8.0 * n * n * n);
        for (int j = 0; j < LANES; j++) {
            // lanes past the half repeat the last node and are not written back
            x[j] = factor * Math.cos(Math.PI * (i0 + Math.min(j, count - 1) + 0.75) / (n + 0.5));
            done[j] = j >= count;
        }
        for (int iteration = 0; iteration < 100; iteration++) {
            legendre(n, c, d, x, p, q);
            boolean all = true;
            for (int j = 0; j < LANES; j++) {
                if (!done[j]) {
                    double dp = n * (x[j] * p[j] - q[j]) / (x[j] * x[j] - 1);
                    double dx = p[j] / dp;
                    x[j] -= dx;
                    done[j] = Math.abs(dx) < 1e-17 || Math.abs(dx) <= 2 * Math.ulp(x[j]);
                    all &= done[j];
                }
            }
            if (all) {
                break;
            }
        }
        legendre(n, c, d, x, p, q);
        for (int j = 0; j < count; j++) {
            int i = i0 + j;
            double dp = n * (x[j] * p[j] - q[j]) / (x[j] * x[j] - 1);
            nodes[i] = x[j];
            nodes[n - 1 - i] = -x[j];
            double w = 2 / ((1 - x[j] * x[j]) * dp * dp);
            weights[i] = w;
            weights[n - 1 - i] = w;
        }
    }

    /**
     * P_n(x_j) into p and P_(n-1)(x_j) into q for the LANES points, by the three-term recurrence
     * P_k = c_k x P_(k-1) - d_k P_(k-2) with c_k = (2k - 1)/k, d_k = (k - 1)/k, four independent chains at once.
     */
    private static void legendre(int n, double[] c, double[] d, double[] x, double[] p, double[] q) {
        double x0 = x[0];
        double x1 = x[1];
        double x2 = x[2];
        double x3 = x[3];
        double a0 = 1;
        double a1 = 1;
        double a2 = 1;
        double a3 = 1;
        double b0 = x0;
        double b1 = x1;
        double b2 = x2;
        double b3 = x3;
        for (int k = 2; k <= n; k++) {
            double ck = c[k];
            double dk = d[k];
            double n0 = ck * x0 * b0 - dk * a0;
            double n1 = ck * x1 * b1 - dk * a1;
            double n2 = ck * x2 * b2 - dk * a2;
            double n3 = ck * x3 * b3 - dk * a3;
            a0 = b0;
            a1 = b1;
            a2 = b2;
            a3 = b3;
            b0 = n0;
            b1 = n1;
            b2 = n2;
            b3 = n3;
        }
        p[0] = b0;
        p[1] = b1;
        p[2] = b2;
        p[3] = b3;
        q[0] = a0;
        q[1] = a1;
        q[2] = a2;
        q[3] = a3;
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

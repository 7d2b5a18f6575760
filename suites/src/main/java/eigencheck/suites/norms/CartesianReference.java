package eigencheck.suites.norms;

import eigencheck.oracle.Oracle;

/**
 * The rectangle or box oracle at one time, read at the output's first two or three coordinates
 * (a 2D output's z is ignored), with its certified gradient.
 */
public final class CartesianReference implements Reference {
    private final Oracle oracle;
    private final double time;

    public CartesianReference(Oracle oracle, double time) {
        this.oracle = oracle;
        this.time = time;
    }

    /** The oracle's exact cell mean over the box's first two or three coordinates. */
    @Override
    public double boxAverage(double[] lo, double[] hi) {
        int d = oracle.dimension();
        return oracle.cellAverage(java.util.Arrays.copyOf(lo, d), java.util.Arrays.copyOf(hi, d), time).value();
    }

    @Override
    public void evaluate(double[] xyz, double[] value, double[] gradient) {
        int n = xyz.length / 3;
        int d = oracle.dimension();
        double[] p = new double[n * d];
        double[] t = new double[n];
        for (int i = 0; i < n; i++) {
            System.arraycopy(xyz, 3 * i, p, d * i, d);
            t[i] = time;
        }
        double[] g = gradient == null ? null : new double[n * d];
        oracle.evaluatePoints(p, t, value, new double[n], g, g == null ? null : new double[n]);
        if (gradient != null) {
            java.util.Arrays.fill(gradient, 0, 3 * n, 0.0);
            for (int i = 0; i < n; i++) {
                System.arraycopy(g, d * i, gradient, 3 * i, d);
            }
        }
    }
}

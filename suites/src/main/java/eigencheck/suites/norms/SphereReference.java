package eigencheck.suites.norms;

import eigencheck.oracle.Oracle;

/**
 * The sphere oracle at one time, read at r = |point| (the distance from the origin over the output's
 * coordinates; a file that gives r alone has one coordinate, which is then r). The oracle has no
 * gradient of the sphere yet, so the H1 seminorm is not available.
 */
public final class SphereReference implements Reference {
    private final Oracle oracle;
    private final double time;

    public SphereReference(Oracle oracle, double time) {
        this.oracle = oracle;
        this.time = time;
    }

    @Override
    public void evaluate(double[] xyz, double[] value, double[] gradient) {
        int n = xyz.length / 3;
        double[] r = new double[n];
        double[] t = new double[n];
        for (int i = 0; i < n; i++) {
            r[i] = Math.sqrt(xyz[3 * i] * xyz[3 * i] + xyz[3 * i + 1] * xyz[3 * i + 1] + xyz[3 * i + 2] * xyz[3 * i + 2]);
            t[i] = time;
        }
        oracle.evaluate(Oracle.Quantity.TEMPERATURE, r, t, value, new double[n]);
        if (gradient != null) {
            java.util.Arrays.fill(gradient, 0, 3 * n, Double.NaN);
        }
    }

    @Override
    public boolean hasGradient() {
        return false;
    }
}

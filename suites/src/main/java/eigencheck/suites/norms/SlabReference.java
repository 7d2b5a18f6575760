package eigencheck.suites.norms;

import eigencheck.oracle.Oracle;

/**
 * The slab oracle at one time, read along one axis of the output's coordinates (x unless the
 * options name another); constant in the other directions, so a slab solution can also be compared
 * on a 2D or 3D mesh of a block.
 */
public final class SlabReference implements Reference {
    private final Oracle oracle;
    private final double time;
    private final int axis;

    public SlabReference(Oracle oracle, double time, int axis) {
        if (axis < 0 || axis > 2) {
            throw new IllegalArgumentException("axis " + axis + " must be 0, 1 or 2");
        }
        this.oracle = oracle;
        this.time = time;
        this.axis = axis;
    }

    @Override
    public void evaluate(double[] xyz, double[] value, double[] gradient) {
        int n = xyz.length / 3;
        double[] x = new double[n];
        double[] t = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = xyz[3 * i + axis];
            t[i] = time;
        }
        double[] bound = new double[n];
        oracle.evaluate(Oracle.Quantity.TEMPERATURE, x, t, value, bound);
        if (gradient != null) {
            double[] flux = new double[n];
            oracle.evaluate(Oracle.Quantity.HEAT_FLUX, x, t, flux, bound);
            double k = oracle.problem().material().conductivity();
            java.util.Arrays.fill(gradient, 0, 3 * n, 0.0);
            for (int i = 0; i < n; i++) {
                gradient[3 * i + axis] = -flux[i] / k;
            }
        }
    }

    /** The coordinate index read as the slab's x. */
    @Override
    public int axis() {
        return axis;
    }

    @Override
    public double segmentAverage(double a, double b) {
        return oracle.cellAverage(Math.min(a, b), Math.max(a, b), time).value();
    }
}

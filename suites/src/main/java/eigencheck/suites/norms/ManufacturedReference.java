package eigencheck.suites.norms;

import eigencheck.oracle.expr.Expression;

/**
 * A manufactured solution u(x, t) as the reference: values from the expression itself and gradients
 * from its exact symbolic derivative, read along one axis and constant across the others.
 */
public final class ManufacturedReference implements Reference {
    private final Expression u;
    private final Expression ux;
    private final double time;
    private final int axis;

    public ManufacturedReference(Expression solution, double time, int axis) {
        this.u = solution.over("x", "t");
        this.ux = u.derivative("x");
        this.time = time;
        this.axis = axis;
    }

    @Override
    public void evaluate(double[] xyz, double[] value, double[] gradient) {
        int n = xyz.length / 3;
        double[] arg = new double[2];
        for (int i = 0; i < n; i++) {
            arg[0] = xyz[3 * i + axis];
            arg[1] = time;
            value[i] = u.value(arg);
            if (gradient != null) {
                gradient[3 * i] = 0;
                gradient[3 * i + 1] = 0;
                gradient[3 * i + 2] = 0;
                gradient[3 * i + axis] = ux.value(arg);
            }
        }
    }

    @Override
    public double segmentAverage(double a, double b) {
        var gl = new org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator(32, 1e-14, 1e-16);
        return gl.integrate(1_000_000, x -> u.value(x, time), Math.min(a, b), Math.max(a, b)) / Math.abs(b - a);
    }
}

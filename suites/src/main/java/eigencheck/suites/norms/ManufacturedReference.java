package eigencheck.suites.norms;

import eigencheck.oracle.expr.Expression;
import java.util.List;

/**
 * A manufactured solution as the reference: u(x, t) on a slab (read along one axis, constant across
 * the others), u(x, y, t) on a rectangle, u(x, y, z, t) on a box, or u(r, t) on a cylinder (r the
 * distance from the z axis) or sphere (from the centre; a file with one coordinate gives r itself);
 * values from the expression itself and gradients from its exact symbolic derivatives.
 */
public final class ManufacturedReference implements Reference {
    private final Expression u;
    private final Expression[] gradient;
    private final int dimension;
    private final double time;
    private final int axis;
    private final boolean radial;
    private final boolean cylinder;

    /**
     * @param solution an expression of (x, t), (x, y, t) or (x, y, z, t)
     * @param axis the output coordinate read as x for a one-dimensional solution
     */
    public ManufacturedReference(Expression solution, double time, int axis) {
        this(solution, time, axis, false);
    }

    /**
     * @param cylinder for a solution of (r, t): r is sqrt(x^2 + y^2), not the distance from the origin
     */
    public ManufacturedReference(Expression solution, double time, int axis, boolean cylinder) {
        this.radial = solution.variables().contains("r");
        this.cylinder = cylinder;
        if (radial) {
            this.dimension = 1;
            this.u = solution.over("r", "t");
            this.gradient = new Expression[] {u.derivative("r")};
            this.time = time;
            this.axis = axis;
            return;
        }
        boolean planar = solution.variables().contains("y");
        boolean solid = solution.variables().contains("z");
        this.dimension = solid ? 3 : planar ? 2 : 1;
        this.u = solid ? solution.over("x", "y", "z", "t") : planar ? solution.over("x", "y", "t")
            : solution.over("x", "t");
        List<String> space = solid ? List.of("x", "y", "z") : planar ? List.of("x", "y") : List.of("x");
        this.gradient = new Expression[space.size()];
        for (int a = 0; a < space.size(); a++) {
            gradient[a] = u.derivative(space.get(a));
        }
        this.time = time;
        this.axis = axis;
    }

    @Override
    public void evaluate(double[] xyz, double[] value, double[] grad) {
        int n = xyz.length / 3;
        double[] arg = new double[dimension + 1];
        for (int i = 0; i < n; i++) {
            if (radial) {
                double x = xyz[3 * i];
                double y = xyz[3 * i + 1];
                double z = cylinder ? 0 : xyz[3 * i + 2];
                double r = Math.sqrt(x * x + y * y + z * z);
                arg[0] = r;
                arg[1] = time;
                value[i] = u.value(arg);
                if (grad != null) {
                    double dr = gradient[0].value(arg);
                    for (int c = 0; c < 3; c++) {
                        double component = c == 2 && cylinder ? 0 : xyz[3 * i + c];
                        grad[3 * i + c] = r > 0 ? dr * component / r : 0;
                    }
                }
                continue;
            }
            if (dimension == 1) {
                arg[0] = xyz[3 * i + axis];
            } else {
                for (int a = 0; a < dimension; a++) {
                    arg[a] = xyz[3 * i + a];
                }
            }
            arg[dimension] = time;
            value[i] = u.value(arg);
            if (grad != null) {
                grad[3 * i] = 0;
                grad[3 * i + 1] = 0;
                grad[3 * i + 2] = 0;
                if (dimension == 1) {
                    grad[3 * i + axis] = gradient[0].value(arg);
                } else {
                    for (int a = 0; a < dimension; a++) {
                        grad[3 * i + a] = gradient[a].value(arg);
                    }
                }
            }
        }
    }

    @Override
    public int axis() {
        return dimension == 1 ? axis : -1;
    }

    @Override
    public double segmentAverage(double a, double b) {
        if (dimension != 1) {
            return Double.NaN;
        }
        var gl = new org.apache.commons.math3.analysis.integration.IterativeLegendreGaussIntegrator(32, 1e-14, 1e-16);
        return gl.integrate(1_000_000, x -> u.value(x, time), Math.min(a, b), Math.max(a, b)) / Math.abs(b - a);
    }
}

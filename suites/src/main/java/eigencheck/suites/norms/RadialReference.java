package eigencheck.suites.norms;

import eigencheck.oracle.Oracle;
import eigencheck.oracle.problem.Cylinder;

/**
 * The sphere or cylinder oracle at one time, read at the distance from the centre (sphere: |point|
 * over the output's coordinates) or from the z axis (cylinder: sqrt(x^2 + y^2)); a file that gives r
 * alone has one coordinate, which is then r. The gradient is du/dr along the radial direction.
 */
public final class RadialReference implements Reference {
    private final Oracle oracle;
    private final double time;
    private final boolean cylinder;

    public RadialReference(Oracle oracle, double time) {
        this.oracle = oracle;
        this.time = time;
        this.cylinder = oracle.problem().domain() instanceof Cylinder;
    }

    @Override
    public void evaluate(double[] xyz, double[] value, double[] gradient) {
        int n = xyz.length / 3;
        double[] r = new double[n];
        double[] t = new double[n];
        for (int i = 0; i < n; i++) {
            double x = xyz[3 * i];
            double y = xyz[3 * i + 1];
            double z = cylinder ? 0 : xyz[3 * i + 2];
            r[i] = Math.sqrt(x * x + y * y + z * z);
            t[i] = time;
        }
        double[] g = gradient == null ? null : new double[n];
        oracle.evaluatePoints(r, t, value, new double[n], g, g == null ? null : new double[n]);
        if (gradient != null) {
            for (int i = 0; i < n; i++) {
                for (int c = 0; c < 3; c++) {
                    double component = c == 2 && cylinder ? 0 : xyz[3 * i + c];
                    gradient[3 * i + c] = r[i] > 0 ? g[i] * component / r[i] : 0;
                }
            }
        }
    }
}

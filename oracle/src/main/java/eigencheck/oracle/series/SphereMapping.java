package eigencheck.oracle.series;

import eigencheck.oracle.Evaluation;
import eigencheck.oracle.OracleException;
import eigencheck.oracle.OracleException.Reason;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Slab;
import eigencheck.oracle.problem.Sphere;
import java.util.EnumMap;
import java.util.Map;

/**
 * The radially symmetric sphere as a slab: w = r u turns rho c u_t = k (u_rr + 2 u_r/r) + Q into
 * rho c w_t = k w_xx + x Q on 0 < x < R with w(0) = 0 (Carslaw and Jaeger, <i>Conduction of Heat in
 * Solids</i>, 2nd ed., Oxford, 1959, section 9.2). The surface conditions become: Dirichlet u = g gives
 * w = R g; convection -k u_r = h (u - u_a) gives -k w_x = (h - k/R)(w - h R u_a/(h - k/R)): a Robin face
 * with the coefficient h - k/R, positive for Bi = hR/k > 1 and negative for Bi < 1 (the slab modes take
 * it down to -k/R, exclusive), and a flux k w_x = h R u_a at Bi = 1. A prescribed surface flux (Bi = 0)
 * would need the zero mode w = r, which is not in this version: refused.
 */
public final class SphereMapping {
    private SphereMapping() {
    }

    /** The slab solver of w = r u for a sphere problem. */
    public static SlabSolver solver(Problem sphere, double timeHorizon, double tolerance) {
        double[] coefficient = new double[1];
        Problem slab = toSlab(sphere, coefficient);
        return new SlabSolver(slab, timeHorizon, tolerance, coefficient[0]);
    }

    /** The slab problem for w = r u. */
    public static Problem toSlab(Problem sphere) {
        return toSlab(sphere, new double[1]);
    }

    /**
     * @param coefficient receives the true Robin coefficient of the outer face when it is not positive
     *     (the problem then carries its absolute value), else NaN
     */
    static Problem toSlab(Problem sphere, double[] coefficient) {
        coefficient[0] = Double.NaN;
        double radius = ((Sphere) sphere.domain()).radius();
        double k = sphere.material().conductivity();
        Expression x = Expression.parse("x", "x", "t");
        Expression initial = sphere.initial().renamed("r", "x");
        Expression initialW = Expression.parse("x", "x").times(initial);
        Expression source = sphere.source().renamed("r", "x");
        Expression sourceW = x.times(source);
        BoundaryCondition surface = sphere.condition(Side.SURFACE);
        BoundaryCondition outer;
        if (surface instanceof BoundaryCondition.Dirichlet d) {
            outer = new BoundaryCondition.Dirichlet(Expression.constant(radius, "t").times(d.temperature()));
        } else if (surface instanceof BoundaryCondition.Robin r) {
            double h = r.heatTransferCoefficient();
            double biot = h * radius / k;
            if (Math.abs(biot - 1) <= 1e-12) {
                outer = new BoundaryCondition.Neumann(Expression.constant(h * radius, "t").times(r.ambient()));
            } else {
                double effective = h - k / radius;
                outer = new BoundaryCondition.Robin(Math.abs(effective),
                    Expression.constant(h * radius / effective, "t").times(r.ambient()));
                if (effective < 0) {
                    coefficient[0] = effective;
                }
            }
        } else {
            throw new OracleException(Reason.UNSUPPORTED, "oracle: the sphere with a prescribed surface flux is not"
                + " solved by this version (w = r u would need the zero mode w = r); fixed surface temperatures and"
                + " convection are");
        }
        Map<Side, BoundaryCondition> faces = new EnumMap<>(Side.class);
        faces.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("0", "t")));
        faces.put(Side.XMAX, outer);
        return new Problem(new Slab(radius), sphere.material(), initialW, sourceW, faces, sphere.steady());
    }

    /**
     * du/dr = (w' - w/r)/r from the slab slice of w (w' = -flux/k, w/r by {@link SlabSolver.Slice#valueOverX});
     * 0 at the centre by symmetry. The bound grows like 1/r toward the centre, where it is refused once
     * it passes {@code budget}/R.
     */
    public static Evaluation gradient(SlabSolver.Slice w, double r, double radius, double budget) {
        if (r == 0) {
            w.temperature(0); // the slice's own checks
            return new Evaluation(0, 0);
        }
        double k = w.conductivity();
        Evaluation flux = w.heatFlux(r);
        Evaluation over = w.valueOverX(r);
        double value = (-flux.value() / k - over.value()) / r;
        double bound = (flux.bound() / k + over.bound() + 4 * Math.ulp(1.0) * (Math.abs(flux.value() / k)
            + Math.abs(over.value()))) / r;
        if (!(bound <= budget / radius)) {
            throw new OracleException(Reason.NOT_CERTIFIED, "oracle: du/dr of the sphere at r = " + r + " m has bound "
                + bound + " > " + budget / radius + "; near the centre the division by r amplifies the error (du/dr = 0"
                + " at r = 0 exactly)");
        }
        return new Evaluation(value, bound);
    }

    /**
     * The mean of u over the shell a < r < b, weight r^2: \(3\int_a^b w r\,dr/(b^3 - a^3)\) by
     * Gauss-Legendre on w r (w is smooth for t > 0), the quadrature error measured against a rule half as
     * fine again (times 10).
     */
    public static Evaluation shellAverage(SlabSolver.Slice w, double a, double b, double budget) {
        if (!(a >= 0 && b > a)) {
            throw new OracleException(Reason.OUTSIDE_DOMAIN, "oracle: shell " + a + " < r < " + b + " m needs 0 <= a < b");
        }
        double[] sums = new double[2];
        double bound = 0;
        int[] orders = {24, 36};
        for (int pass = 0; pass < 2; pass++) {
            GaussLegendre g = GaussLegendre.of(orders[pass]);
            double sum = 0;
            double err = 0;
            for (int i = 0; i < g.nodes.length; i++) {
                double r = 0.5 * (a + b) + 0.5 * (b - a) * g.nodes[i];
                Evaluation e = w.temperature(r);
                double weight = 0.5 * (b - a) * g.weights[i] * r;
                sum += weight * e.value();
                err += Math.abs(weight) * e.bound();
            }
            sums[pass] = sum;
            bound = Math.max(bound, err);
        }
        double volume = (b * b * b - a * a * a) / 3;
        double value = sums[1] / volume;
        double total = (bound + 10 * Math.abs(sums[1] - sums[0]) + 8 * Math.ulp(1.0) * Math.abs(sums[1])) / volume;
        if (!(total <= budget)) {
            throw new OracleException(Reason.NOT_CERTIFIED, "oracle: the shell average over " + a + " < r < " + b
                + " m has bound " + total + " > " + budget);
        }
        return new Evaluation(value, total);
    }
}

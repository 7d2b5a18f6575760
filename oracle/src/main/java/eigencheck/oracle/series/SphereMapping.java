package eigencheck.oracle.series;

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
}

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
 * w = R g; convection -k u_r = h (u - u_a) gives -k w_x = (h - k/R)(w - h R u_a/(h - k/R)), a Robin face
 * when Bi = hR/k > 1 and a flux k w_x = h R u_a when Bi = 1. For Bi < 1 and for a prescribed flux the
 * slab's face coefficient would be negative, which the slab modes do not cover yet: refused.
 */
public final class SphereMapping {
    private SphereMapping() {
    }

    /** The slab problem for w = r u. */
    public static Problem toSlab(Problem sphere) {
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
            if (biot > 1 + 1e-12) {
                double effective = h - k / radius;
                outer = new BoundaryCondition.Robin(effective,
                    Expression.constant(h * radius / effective, "t").times(r.ambient()));
            } else if (Math.abs(biot - 1) <= 1e-12) {
                outer = new BoundaryCondition.Neumann(Expression.constant(h * radius, "t").times(r.ambient()));
            } else {
                throw new OracleException(Reason.UNSUPPORTED, String.format(java.util.Locale.ROOT,
                    "oracle: the sphere with convection at Bi = hR/k = %.4g < 1 is not solved by this version"
                        + " (the mapped slab face has a negative coefficient); Bi >= 1 and fixed surface"
                        + " temperatures are", biot));
            }
        } else {
            throw new OracleException(Reason.UNSUPPORTED, "oracle: the sphere with a prescribed surface flux is not"
                + " solved by this version (the mapped slab face has a negative coefficient); fixed surface"
                + " temperatures and convection with Bi >= 1 are");
        }
        Map<Side, BoundaryCondition> faces = new EnumMap<>(Side.class);
        faces.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("0", "t")));
        faces.put(Side.XMAX, outer);
        return new Problem(new Slab(radius), sphere.material(), initialW, sourceW, faces, sphere.steady());
    }
}

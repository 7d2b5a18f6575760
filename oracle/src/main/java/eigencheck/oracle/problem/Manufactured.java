package eigencheck.oracle.problem;

import eigencheck.oracle.expr.Expression;
import java.util.EnumMap;
import java.util.Map;
import java.util.Objects;

/**
 * The problem a manufactured solution u(x, t) solves: source Q = rho c u_t - k u_xx, initial
 * value u(x, 0), and face data derived exactly (symbolic differentiation of the expression tree):
 * Dirichlet u; Neumann k du/dn (-k u_x at x = 0, k u_x at x = L); Robin ambient u + (k/h) du/dn.
 *
 * @since 0.1
 */
public final class Manufactured {
    private Manufactured() {
    }

    /** The kind of condition to derive on a face. */
    public enum Kind { DIRICHLET, NEUMANN, ROBIN }

    /**
     * A face request: kind and, for Robin, the heat transfer coefficient h (W/(m^2 K)).
     *
     * @param heatTransferCoefficient used for Robin only; ignored otherwise
     */
    public record Face(Kind kind, double heatTransferCoefficient) {
        public Face {
            Objects.requireNonNull(kind, "kind");
        }

        public static Face dirichlet() {
            return new Face(Kind.DIRICHLET, 0);
        }

        public static Face neumann() {
            return new Face(Kind.NEUMANN, 0);
        }

        public static Face robin(double h) {
            return new Face(Kind.ROBIN, h);
        }
    }

    /**
     * The slab problem whose exact solution is {@code u}, an expression of (x, t).
     *
     * @throws IllegalArgumentException if u uses variables other than x and t
     */
    public static Problem slab(Expression u, Slab slab, Material material, Face xmin, Face xmax) {
        Expression ux = u.over("x", "t");
        double k = material.conductivity();
        Expression ut = ux.derivative("t");
        Expression uxx = ux.derivative("x").derivative("x");
        Expression source = ut.linear(material.volumetricHeatCapacity(), uxx, -k);
        Expression initial = ux.substitute("t", 0.0);
        Map<Side, BoundaryCondition> boundary = new EnumMap<>(Side.class);
        boundary.put(Side.XMIN, face(ux, 0.0, -1, xmin, k));
        boundary.put(Side.XMAX, face(ux, slab.length(), +1, xmax, k));
        return new Problem(slab, material, initial, source, boundary);
    }

    /**
     * The rectangle or box problem whose exact solution is {@code u}, an expression of the domain's
     * coordinates and t: Q = rho c u_t - k lap(u), face data as for the slab, each over the coordinates
     * along its face and t.
     *
     * @param faces one request per side of the domain
     * @throws IllegalArgumentException if u uses other variables or a side has no request
     */
    public static Problem cartesian(Expression u, Domain domain, Material material, Map<Side, Face> faces) {
        java.util.List<String> coordinates = domain.coordinates();
        String[] names = new String[coordinates.size() + 1];
        for (int i = 0; i < coordinates.size(); i++) {
            names[i] = coordinates.get(i);
        }
        names[coordinates.size()] = "t";
        Expression ux = u.over(names);
        double k = material.conductivity();
        Expression laplacian = null;
        for (String c : coordinates) {
            Expression second = ux.derivative(c).derivative(c);
            laplacian = laplacian == null ? second : laplacian.linear(1, second, 1);
        }
        Expression source = ux.derivative("t").linear(material.volumetricHeatCapacity(), laplacian, -k);
        Expression initial = ux.substitute("t", 0.0);
        double[] lengths = domain.lengths();
        Map<Side, BoundaryCondition> boundary = new EnumMap<>(Side.class);
        Side[][] sides = {{Side.XMIN, Side.XMAX}, {Side.YMIN, Side.YMAX}, {Side.ZMIN, Side.ZMAX}};
        for (int i = 0; i < coordinates.size(); i++) {
            for (int s = 0; s < 2; s++) {
                Face f = faces.get(sides[i][s]);
                if (f == null) {
                    throw new IllegalArgumentException("manufactured: no condition requested for " + sides[i][s].key());
                }
                boundary.put(sides[i][s], face(ux, coordinates.get(i), s == 0 ? 0.0 : lengths[i], s == 0 ? -1 : 1, f, k));
            }
        }
        return new Problem(domain, material, initial, source, boundary);
    }

    /**
     * The cylinder or sphere problem whose exact solution is {@code u}, an expression of (r, t):
     * Q = rho c u_t - k (u_rr + n u_r / r), n = 1 (cylinder) or 2 (sphere), and the surface data as for
     * a slab's face at x = R. Below r = 1e-6 R the quotient u_r / r is replaced by u_rr (its limit for
     * a u regular at the centre, u_r(0) = 0; the difference is u(0) r^2 / 3, under 1e-12 of u R^2),
     * so the source has its true value at r = 0, where a solver's axis nodes sample it.
     *
     * @throws IllegalArgumentException if u uses variables other than r and t, or the domain is not radial
     */
    public static Problem radial(Expression u, Domain domain, Material material, Face surface) {
        int n;
        double radius;
        if (domain instanceof Cylinder c) {
            n = 1;
            radius = c.radius();
        } else if (domain instanceof Sphere s) {
            n = 2;
            radius = s.radius();
        } else {
            throw new IllegalArgumentException("manufactured: " + domain + " is not a cylinder or sphere");
        }
        Expression ur = u.over("r", "t");
        double k = material.conductivity();
        Expression first = ur.derivative("r");
        Expression second = first.derivative("r");
        double near = 1e-6 * radius;
        String quotient = "(step(r - " + near + ")*(" + first.formula() + ")/max(r, " + near + ") + (1 - step(r - "
            + near + "))*(" + second.formula() + "))";
        Expression laplacian = Expression.parse("(" + second.formula() + ") + " + n + "*" + quotient, "r", "t");
        Expression source = ur.derivative("t").linear(material.volumetricHeatCapacity(), laplacian, -k);
        Map<Side, BoundaryCondition> boundary = new EnumMap<>(Side.class);
        boundary.put(Side.SURFACE, face(ur, "r", radius, +1, surface, k));
        return new Problem(domain, material, ur.substitute("t", 0.0), source, boundary);
    }

    /** Condition at x = position with outward normal sign (du/dn = sign * u_x). */
    private static BoundaryCondition face(Expression u, double position, int sign, Face face, double k) {
        return face(u, "x", position, sign, face, k);
    }

    private static BoundaryCondition face(Expression u, String axis, double position, int sign, Face face, double k) {
        Expression value = u.substitute(axis, position);
        Expression normal = u.derivative(axis).substitute(axis, position);
        switch (face.kind()) {
            case DIRICHLET:
                return new BoundaryCondition.Dirichlet(value);
            case NEUMANN:
                return new BoundaryCondition.Neumann(normal.linear(0, normal, sign * k));
            default:
                double h = face.heatTransferCoefficient();
                return new BoundaryCondition.Robin(h, value.linear(1, normal, sign * k / h));
        }
    }
}

package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertClose;
import static eigencheck.oracle.testing.NumericAssertions.assertWithin;

import eigencheck.oracle.Evaluation;
import eigencheck.oracle.Oracle;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Cylinder;
import eigencheck.oracle.problem.Domain;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Sphere;
import java.util.Map;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegrator;
import org.apache.commons.math3.analysis.integration.gauss.GaussIntegratorFactory;
import org.apache.commons.math3.analysis.solvers.BrentSolver;
import org.apache.commons.math3.special.BesselJ;
import org.junit.jupiter.api.Test;

/** The cylinder and the small-Biot sphere with a surface temperature or ambient that varies in time. */
class RadialLevelTest {
    private static Problem body(Domain domain, Material m, String initial, BoundaryCondition surface) {
        return new Problem(domain, m, Expression.parse(initial, "r"), Expression.parse("0", "r", "t"),
            Map.of(Side.SURFACE, surface));
    }

    /**
     * u = c t + c r^2 / (2 (n + 1) alpha) solves u_t = alpha (r^n u_r)_r / r^n (common practice: uniform
     * heating); its surface temperature, or its ambient u + (k/h) u_r for convection, rises by c t.
     */
    @Test
    void uniformHeatingRateInACylinderAndASmallBiotSphere() {
        double k = 3;
        double alpha = 0.5;
        double c = 4;
        double radius = 0.2;
        for (int n = 1; n <= 2; n++) {
            double w = c / (2 * (n + 1) * alpha);
            double h = n == 1 ? 40 : 0.5; // the sphere at Bi = 0.033, which the direct series takes
            double ambient0 = w * radius * radius + k / h * 2 * w * radius;
            Domain domain = n == 1 ? new Cylinder(radius) : new Sphere(radius);
            BoundaryCondition surface = new BoundaryCondition.Robin(h,
                Expression.parse(ambient0 + " + " + c + "*t", "t"));
            Problem p = body(domain, new Material(k, k / alpha), w + "*r^2", surface);
            Oracle o = Oracle.prepare(p, 2, 1e-10);
            double limit = 1e-10 * o.temperatureScale();
            for (double t : new double[] {0.003, 0.2, 1.7}) {
                for (double r : new double[] {0, 0.05, 0.13, 0.2}) {
                    double exact = c * t + w * r * r;
                    assertWithin(exact, o.temperature(r, t), limit, (n == 1 ? "cylinder" : "sphere") + " u at r = " + r
                        + ", t = " + t);
                    assertWithin(2 * w * r, o.gradient(new double[] {r}, t)[0], limit / radius, "du/dr at r = " + r);
                }
            }
            double mean = c * 1.7 + w * (Math.pow(0.15, n + 3) - Math.pow(0.05, n + 3)) / (n + 3)
                / ((Math.pow(0.15, n + 1) - Math.pow(0.05, n + 1)) / (n + 1));
            assertWithin(mean, o.cellAverage(new double[] {0.05}, new double[] {0.15}, 1.7), limit, "shell mean");
        }
    }

    /**
     * Manufactured u = 2 + 3 t + 40 r^2 - 300 r^4 (common practice): Q = rho c 3 - k (2 (n + 1) 40 - 4 (n + 3) 300 r^2),
     * constant in time and not uniform; the surface data rise by 3 t (a moving level). The derived source must
     * have its true value at r = 0, and the oracle must reproduce u in every route: the cylinder with a fixed or
     * convective surface, the sphere through the slab mapping (Dirichlet) and the direct series (Bi = 0.02).
     */
    @Test
    void manufacturedPolynomialInEveryRadialRoute() {
        double k = 2;
        double heatCapacity = 5;
        double radius = 0.1;
        Expression u = Expression.parse("2 + 3*t + 40*r^2 - 300*r^4", "r", "t");
        Object[][] routes = {{new Cylinder(radius), eigencheck.oracle.problem.Manufactured.Face.dirichlet()},
            {new Cylinder(radius), eigencheck.oracle.problem.Manufactured.Face.robin(30)},
            {new Sphere(radius), eigencheck.oracle.problem.Manufactured.Face.dirichlet()},
            {new Sphere(radius), eigencheck.oracle.problem.Manufactured.Face.robin(0.4)}};
        for (Object[] route : routes) {
            Domain domain = (Domain) route[0];
            int n = domain instanceof Cylinder ? 1 : 2;
            Problem p = eigencheck.oracle.problem.Manufactured.radial(u, domain, new Material(k, heatCapacity),
                (eigencheck.oracle.problem.Manufactured.Face) route[1]);
            double q0 = heatCapacity * 3 - k * 2 * (n + 1) * 40;
            assertClose(q0, p.source().value(0, 0.5), 1e-12 * Math.abs(q0), "Q at the centre");
            double r1 = 0.037;
            double q1 = heatCapacity * 3 - k * (2 * (n + 1) * 40 - 4 * (n + 3) * 300 * r1 * r1);
            assertClose(q1, p.source().value(r1, 0.5), 1e-12 * Math.abs(q1), "Q at r = 0.037");
            Oracle o = Oracle.prepare(p, 1, 1e-10);
            for (double t : new double[] {0.01, 0.3, 1}) {
                for (double r : new double[] {0, 0.02, 0.05, 0.09, radius}) {
                    assertWithin(u.value(r, t), o.temperature(r, t), 1e-10 * o.temperatureScale(), domain + " "
                        + route[1] + " at r = " + r + ", t = " + t);
                }
            }
        }
    }

    /**
     * Manufactured u = 20 + 5 sin(t) - beta t P1(r) + beta P2(r) with P1 = (R^2 - r^2)/(2 (n+1) alpha) and
     * P2 its quasi-static successor (-alpha Lap P2 = P1, P2(R) = 0): by direct differentiation (common
     * practice) the source is rho c (5 cos t - beta t), uniform in space and changing in time, and the surface
     * temperature 20 + 5 sin t moves; both the level and the uniform heating enter the lag's rate.
     */
    @Test
    void uniformSourceChangingInTimeWithAMovingSurface() {
        double k = 4;
        double alpha = 0.5;
        double radius = 0.3;
        double beta = 7;
        for (int n = 1; n <= 2; n++) {
            double p1 = 1 / (2 * (n + 1) * alpha);
            double c4 = 1 / (8.0 * (n + 1) * (n + 3) * alpha * alpha);
            double c2 = -radius * radius * p1 / (2 * (n + 1) * alpha);
            double c0 = -c2 * radius * radius - c4 * Math.pow(radius, 4);
            String text = "20 + 5*sin(t) - " + beta + "*t*" + p1 + "*(" + radius * radius + " - r^2) + " + beta + "*("
                + c0 + " + " + c2 + "*r^2 + " + c4 + "*r^4)";
            Expression u = Expression.parse(text, "r", "t");
            Domain domain = n == 1 ? new Cylinder(radius) : new Sphere(radius);
            Problem p = eigencheck.oracle.problem.Manufactured.radial(u, domain, new Material(k, k / alpha),
                eigencheck.oracle.problem.Manufactured.Face.dirichlet());
            double q = p.source().value(0.1, 0.7);
            assertClose(k / alpha * (5 * Math.cos(0.7) - beta * 0.7), q, 1e-12 * Math.abs(q), "the derived source is uniform");
            Oracle o = Oracle.prepare(p, 2, 1e-10);
            for (double t : new double[] {0.05, 0.8, 2}) {
                for (double r : new double[] {0, 0.1, 0.25, radius}) {
                    assertWithin(u.value(r, t), o.temperature(r, t), 1e-10 * o.temperatureScale(),
                        domain + " u at r = " + r + ", t = " + t);
                }
            }
        }
    }

    /**
     * A rod of radius 0.05 m, initially 0, whose surface is held at b(t) = 300 (1 - exp(-t/40)). By
     * Duhamel's theorem (Carslaw and Jaeger, Conduction of Heat in Solids, 2nd ed., 1959, section 1.14;
     * recalled from memory) u = b(t) - int_0^t b'(t - s) F(r, s) ds, F the rod cooled from 1 with its
     * surface at 0: sum_n 2 J0(z_n r/R) / (z_n J1(z_n)) exp(-z_n^2 alpha s / R^2), z_n the zeros of J0
     * (the same book, section 7.4; recalled from memory), summed to 400 terms with Commons Math's BesselJ
     * and Brent solver, independently of the oracle's modes.
     */
    @Test
    void rodWithARisingSurfaceTemperatureMatchesDuhamelsTheorem() {
        double radius = 0.05;
        double alpha = 2e-5;
        double k = 20;
        Problem p = body(new Cylinder(radius), new Material(k, k / alpha), "0",
            new BoundaryCondition.Dirichlet(Expression.parse("300*(1 - exp(-t/40))", "t")));
        Oracle o = Oracle.prepare(p, 200, 1e-10);
        Rod rod = new Rod(radius, alpha);
        double limit = 1e-10 * o.temperatureScale();
        for (double t : new double[] {5, 40, 200}) {
            for (double r : new double[] {0, 0.01, 0.025, 0.04}) {
                double[] lag = rod.duhamel(s -> 300 / 40.0 * Math.exp(-s / 40), r, t);
                double exact = 300 * (1 - Math.exp(-t / 40)) - lag[0];
                Evaluation e = o.temperature(r, t);
                assertWithin(exact, e, limit, "u at r = " + r + ", t = " + t);
                assertWithin(-lag[1], o.gradient(new double[] {r}, t)[0], limit / radius, "du/dr at r = " + r);
            }
        }
        assertWithin(300 * (1 - Math.exp(-1)), o.temperature(radius, 40), limit, "on the surface u is the data");
    }

    /**
     * The radial heat polynomial u = 5 + 3 (t + r^2/(2 (n+1) alpha)) + 40 (t^2 + t r^2/((n+1) alpha)
     * + r^4/(4 (n+1)(n+3) alpha^2)) solves u_t = alpha Lap u with no source (direct differentiation, common
     * practice); its surface flux k u_r(R) grows linearly in time, so the flux surface's lag Psi1 is exercised
     * on the cylinder and the sphere.
     */
    @Test
    void heatPolynomialWithAGrowingSurfaceFlux() {
        double k = 2.5;
        double alpha = 0.4;
        double radius = 0.5;
        for (int n = 1; n <= 2; n++) {
            double a = 1 / (2.0 * (n + 1) * alpha);
            double b = 1 / ((n + 1) * alpha);
            double c = 1 / (4.0 * (n + 1) * (n + 3) * alpha * alpha);
            Expression u = Expression.parse("5 + 3*(t + " + a + "*r^2) + 40*(t^2 + " + b + "*t*r^2 + " + c + "*r^4)",
                "r", "t");
            Domain domain = n == 1 ? new Cylinder(radius) : new Sphere(radius);
            Problem p = eigencheck.oracle.problem.Manufactured.radial(u, domain, new Material(k, k / alpha),
                eigencheck.oracle.problem.Manufactured.Face.neumann());
            assertClose(0, p.source().value(0.2, 0.7), 1e-10, "no source");
            Oracle o = Oracle.prepare(p, 1.5, 1e-10);
            for (double t : new double[] {0.01, 0.5, 1.5}) {
                for (double r : new double[] {0, 0.2, 0.45, radius}) {
                    assertWithin(u.value(r, t), o.temperature(r, t), 1e-10 * o.temperatureScale(), domain + " u at r = "
                        + r + ", t = " + t);
                    assertWithin(u.derivative("r").value(r, t), o.gradient(new double[] {r}, t)[0],
                        1e-10 * o.temperatureScale() / radius, domain + " du/dr at r = " + r + ", t = " + t);
                }
            }
        }
    }

    /**
     * A rod of radius 0.04 m, initially 0, heated through its surface by q(t) = 2000 + 3000 (1 - exp(-t/30))
     * W/m^2. By Duhamel's theorem u = q(0) U(r, t) + int_0^t q'(t - s) U(r, s) ds, U the response to a unit
     * flux switched on at t = 0: U = 2 alpha t/(k R) + (R/k)(r^2/(2 R^2) - 1/4)
     * - (2 R/k) sum_n exp(-z_n^2 alpha t/R^2) J0(z_n r/R)/(z_n^2 J0(z_n)), z_n the zeros of J1 (Carslaw and
     * Jaeger, Conduction of Heat in Solids, 2nd ed., 1959, section 7.8; recalled from memory; its value at
     * t = 0 is checked to vanish), summed to 400 terms with Commons Math's BesselJ.
     */
    @Test
    void rodHeatedByAFluxThatChangesInTimeMatchesDuhamelsTheorem() {
        double radius = 0.04;
        double alpha = 1e-5;
        double k = 15;
        Problem p = body(new Cylinder(radius), new Material(k, k / alpha), "0",
            new BoundaryCondition.Neumann(Expression.parse("2000 + 3000*(1 - exp(-t/30))", "t")));
        Oracle o = Oracle.prepare(p, 120, 1e-10);
        FluxRod rod = new FluxRod(radius, alpha, k);
        for (double r : new double[] {0, 0.015, 0.03}) {
            // at t = 0 the series converges like 1/N (400 terms: about 1e-7 of R/k = 2.7e-3): the formula's sign
            // and constant, not its digits, are what this checks
            assertClose(0, rod.value(r, 0)[0], 1e-4 * radius / k, "U(r, 0)");
        }
        double limit = 1e-10 * o.temperatureScale();
        for (double t : new double[] {4, 30, 120}) {
            for (double r : new double[] {0, 0.012, 0.025, 0.032}) {
                double[] step = rod.value(r, t);
                double exact = 2000 * step[0];
                double slope = 2000 * step[1];
                for (int i = 0; i < 200; i++) {
                    GaussIntegrator rule = new GaussIntegratorFactory().legendre(20, t * i / 200, t * (i + 1) / 200);
                    for (int q = 0; q < rule.getNumberOfPoints(); q++) {
                        double s = rule.getPoint(q);
                        double[] u = rod.value(r, s);
                        double rate = 3000 / 30.0 * Math.exp(-(t - s) / 30);
                        exact += rule.getWeight(q) * rate * u[0];
                        slope += rule.getWeight(q) * rate * u[1];
                    }
                }
                assertWithin(exact, o.temperature(r, t), limit, "u at r = " + r + ", t = " + t);
                assertWithin(slope, o.gradient(new double[] {r}, t)[0], limit / radius, "du/dr at r = " + r);
            }
        }
    }

    /** The rod's response to a unit surface flux switched on at t = 0, and its radial derivative. */
    private static final class FluxRod {
        private final double radius;
        private final double alpha;
        private final double k;
        private final double[] z = new double[400];

        FluxRod(double radius, double alpha, double k) {
            this.radius = radius;
            this.alpha = alpha;
            this.k = k;
            BrentSolver solver = new BrentSolver(1e-15, 1e-15);
            for (int n = 0; n < z.length; n++) {
                double guess = (n + 1.25) * Math.PI;
                z[n] = solver.solve(200, x -> BesselJ.value(1, x), guess - 0.5, guess + 0.5);
            }
        }

        /** {U, dU/dr}; 0 before the surface is felt at these points (at least 0.2 R inside) except at t = 0 exactly. */
        double[] value(double r, double s) {
            if (s > 0 && alpha * s / (radius * radius) < 2.5e-4) {
                return new double[] {0, 0};
            }
            double u = 2 * alpha * s / (k * radius) + radius / k * (r * r / (2 * radius * radius) - 0.25);
            double du = r / (k * radius);
            for (double zn : z) {
                double c = 2 * radius / k * Math.exp(-zn * zn * alpha * s / (radius * radius)) / (zn * zn
                    * BesselJ.value(0, zn));
                u -= c * BesselJ.value(0, zn * r / radius);
                du += c * zn / radius * BesselJ.value(1, zn * r / radius);
            }
            return new double[] {u, du};
        }
    }

    /** The rod cooled from 1 with its surface at 0, and its Duhamel integral. */
    private static final class Rod {
        private final double radius;
        private final double alpha;
        private final double[] z = new double[400];

        Rod(double radius, double alpha) {
            this.radius = radius;
            this.alpha = alpha;
            BrentSolver solver = new BrentSolver(1e-15, 1e-15);
            for (int n = 0; n < z.length; n++) {
                // the n-th zero of J0 lies in ((n + 1/2) pi, (n + 1) pi) - pi/4 ... bracketed generously
                double guess = (n + 0.75) * Math.PI;
                z[n] = solver.solve(200, x -> BesselJ.value(0, x), guess - 0.5, guess + 0.5);
            }
        }

        /** {F, dF/dr} at r after s; 1 and 0 before the surface is felt (points at least 0.2 R inside). */
        double[] value(double r, double s) {
            if (alpha * s / (radius * radius) < 2.5e-4) {
                return new double[] {1, 0};
            }
            double f = 0;
            double df = 0;
            for (double zn : z) {
                double c = 2 / (zn * BesselJ.value(1, zn)) * Math.exp(-zn * zn * alpha * s / (radius * radius));
                f += c * BesselJ.value(0, zn * r / radius);
                df -= c * zn / radius * BesselJ.value(1, zn * r / radius);
            }
            return new double[] {f, df};
        }

        /** {int_0^t b'(t - s) F(r, s) ds, the same with dF/dr}, 20-point rules on 200 panels. */
        double[] duhamel(java.util.function.DoubleUnaryOperator rate, double r, double t) {
            double[] sum = new double[2];
            for (int i = 0; i < 200; i++) {
                GaussIntegrator rule = new GaussIntegratorFactory().legendre(20, t * i / 200, t * (i + 1) / 200);
                for (int q = 0; q < rule.getNumberOfPoints(); q++) {
                    double s = rule.getPoint(q);
                    double[] f = value(r, s);
                    double weight = rule.getWeight(q) * rate.applyAsDouble(t - s);
                    sum[0] += weight * f[0];
                    sum[1] += weight * f[1];
                }
            }
            return sum;
        }
    }
}

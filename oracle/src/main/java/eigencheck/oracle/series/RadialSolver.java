package eigencheck.oracle.series;

import eigencheck.oracle.Evaluation;
import eigencheck.oracle.OracleException;
import eigencheck.oracle.OracleException.Reason;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.modes.RadialModes;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import java.util.SplittableRandom;

/**
 * The solid cylinder (radially symmetric, infinitely long or with insulated ends) and the solid sphere,
 * n = 1 or 2: u = A t + P(r) + V for the data at t = 0, plus the moving part below.
 * <ul>
 * <li>P solves \(-k (r^n P')'/r^n = Q - \rho c A\) with the surface condition; A = 0 except with a flux
 * surface, where \(A = ((n+1) q/R + ((n+1)/R^{n+1})\int_0^R Q r^n\,dr)/(\rho c)\) is the mean heating
 * rate and P is fixed by P(R) = 0. With \(J(r) = r\int_0^1 s^n\,\tilde Q(rs)\,ds\) (Gauss-Legendre,
 * exact at r = 0),
 * \(P' = -J/k\) and \(P(r) = P(R) + \int_r^R J/k\); J is a Chebyshev series on [0, R] of adaptive
 * length (its integral exact), its error measured at random points (times 10).</li>
 * <li>V: \(\sum_n c_n e^{-\alpha\beta_n^2 t} X_n(r)\), \(X = J_0(\beta r)\) or \(\sin(\beta r)/(\beta r)\),
 * with \(\beta_n R\) the roots of {@link RadialModes} (and the zero mode of the flux surface), \(c_n\)
 * the projection of g - P with weight r^n (Gauss-Legendre, error against a rule 25 % finer, times 10).</li>
 * </ul>
 * The sphere takes this route for a flux surface (the zero mode w = r that the slab mapping lacks) and
 * for convection below Bi = 0.05, where the mapping's quasi-static subtraction is ill-conditioned; its
 * norms \(\|X_n\|^2 \ge 0.42 R/\beta_n^2\) for z_n >= pi (from 1 - sin(2z)/(2z) >= 1 - 1/(2 pi)), so
 * \(|c_n| \le \|g - P\| (n + 1)\pi/(\sqrt{0.42} R^{3/2})\).
 * Truncation: \(|c_n| \le \|g - P\|/\|J_0(\beta_n r)\|\) (Cauchy-Schwarz), \(|J_0|, |J_1| \le 1\),
 * \(\beta_n \ge (n-1)\pi/R\) and, beyond the computed modes, \(\|J_0(\beta_n r)\|^2 \ge R^2/(2\pi z_n)\)
 * (half the large-z value of \(R^2(J_0^2+J_1^2)/2\); an asymptotic estimate with a factor 2 of margin,
 * checked against the computed norms in CylinderTest).
 * <p>Data that change in time: a surface temperature or ambient g(0) + b(t), and a source
 * Q_0(r) + rho c sigma(t) that changes by the same amount everywhere, add b - r P1 + r' P2 with the
 * rate r = b' - sigma, P1 = A^-1 1 and P2 = A^-1 P1 in closed form (polynomials in r^2); a flux
 * q(0) + dq(t) adds dq psi + m - dq' Psi1 + dq'' Psi2 (psi the mean-free profile of a unit flux, m the
 * mean rise). What is left solves v_t + A v = -f''' P2 (f the rate or dq) with homogeneous data: its modes
 * gain -(p_i / lambda_i^2) int_0^t exp(-lambda_i (t - s)) f'''(s) ds ({@link ScheduleIntegral}), p_i the
 * projection of 1 or psi, and their tail is bounded by sum |p_i| beta_i^g / lambda_i^3 (exact over the
 * computed modes, asymptotic bounds beyond).
 * <p>A source that changes in time other than uniformly adds the response to its change
 * Q(r, t) - Q(r, 0) with homogeneous surface data, two quasi-static solves plus a remainder whose modes
 * fall off like lambda^-3 ({@link RadialChange}).
 */
public final class RadialSolver implements SpatialSolver {
    private static final double EPS = Math.ulp(1.0);
    private static final int CAP = 4000;

    private final boolean sphere;
    private final int n;
    private final double radius;
    private final double k;
    private final double rhoC;
    private final double alpha;
    private final double tolerance;
    private final double horizon;
    private final boolean steady;
    private final double biot;
    private final boolean flux;
    private final double drift;
    private final double surfaceValue;
    private final double[] j; // Chebyshev series of J on [0, R]
    private final double[] jIntegral; // its antiderivative from 0
    private final double steadyError;
    private final double gradientError;
    private final Expression initial;
    private final double scale;
    private double[] beta = new double[0];
    private double[] norm = new double[0];
    private double[] coef = new double[0];
    private double coefError;
    private double tailCoefficient;
    // a surface temperature or ambient that moves: g(t) = g(0) + b(t); u = b + S - b' P1 + b'' P2 + v with
    // P1 = A^-1 1 and P2 = A^-1 P1 in closed form (polynomials in r^2), v_t + A v = -b''' P2
    private final Expression level;
    private final Expression slope;
    private final Expression curvature;
    private final double thirdMax;
    private final ScheduleIntegral duhamel;
    // the rate r itself, for the slow modes (lambda T < 1) that take it directly, and max |r|
    private final ScheduleIntegral rateIntegral;
    private final double slopeMax;
    // P1 and P2 as polynomials in r^2 (index j: the coefficient of r^(2j))
    private final double[] lag1;
    private final double[] lag2;
    // a surface flux that changes in time, q(t) = q(0) + dq(t): u gains dq(t) psi(r) + m(t) - dq' Psi1 + dq'' Psi2,
    // psi = (r^2 - mean r^2) / (2 k R) (k psi'(R) = 1, mean 0), Psi1 = A^-1 psi and Psi2 = A^-1 Psi1 (mean 0), m the
    // mean rise (n + 1)/(rho c R) int dq plus that of a uniform source's change; null for a temperature surface
    private final double[] fluxShape;
    private final ScheduleIntegral meanRise;
    private final double riseMax;
    // a source that changes in time other than uniformly: its change's response, or null
    private final RadialChange change;

    public RadialSolver(Problem problem, double timeHorizon, double tolerance) {
        if (!(tolerance > 0 && tolerance < 1)) {
            throw new IllegalArgumentException("tolerance " + tolerance + " must be in (0, 1)");
        }
        this.sphere = problem.domain() instanceof eigencheck.oracle.problem.Sphere;
        this.n = sphere ? 2 : 1;
        this.radius = problem.domain().characteristicLength();
        this.k = problem.material().conductivity();
        this.rhoC = problem.material().volumetricHeatCapacity();
        this.alpha = problem.material().diffusivity();
        this.tolerance = tolerance;
        this.steady = problem.steady();
        this.horizon = steady ? Double.POSITIVE_INFINITY : timeHorizon;
        if (!steady && !(timeHorizon >= 0 && timeHorizon < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("time horizon " + timeHorizon + " must be finite and >= 0");
        }
        this.initial = problem.initial();
        Expression source = problem.source();
        BoundaryCondition surface = problem.condition(Side.SURFACE);
        boolean fluxSurface = surface instanceof BoundaryCondition.Neumann;
        boolean[] uneven = new boolean[1];
        Expression heating = steady ? null : heatingOf(source, timeHorizon, uneven);
        boolean dataMove = surface.data().variables().contains("t") && !surface.data().isIndependentOf("t");
        boolean moving = !steady && (dataMove || heating != null);
        // the source was sampled by heatingOf (a source naming t that does not change passes); a steady problem's
        // data may not name t at all
        Expression[] mustBeConstant = steady ? new Expression[] {source, surface.data()} : new Expression[0];
        for (Expression e : mustBeConstant) {
            if (e.variables().contains("t") && !e.isIndependentOf("t")) {
                throw new OracleException(Reason.UNSUPPORTED, "oracle: the " + (sphere ? "sphere's" : "cylinder's")
                    + " source must be constant in time or change by the same amount everywhere in this version ("
                    + e.source()
                    + " depends on t); the surface data may vary in time, and the initial temperature may be anything");
            }
        }
        if (moving) {
            Expression g = surface.data();
            if (g.variables().contains("r")) {
                g = g.substitute("r", radius);
            }
            g = dataMove ? g.over("t") : Expression.constant(0, "t");
            this.level = g.linear(1, Expression.constant(1, "t"), -g.value(0));
            if (fluxSurface) {
                // dq drives the lag; a uniform source's change only lifts the mean
                this.slope = level.derivative("t");
                Expression rise = level.linear((n + 1) / (rhoC * radius), heating == null ? Expression.constant(0, "t")
                    : heating, 1);
                this.meanRise = new ScheduleIntegral(rise);
                this.riseMax = CommonLevel.sizes(rise, rise, rise, timeHorizon)[0];
                this.fluxShape = new double[] {-(n + 1) * radius * radius / ((n + 3) * 2 * k * radius),
                    1 / (2 * k * radius)};
                this.lag1 = inverse(fluxShape);
                this.lag2 = inverse(lag1);
            } else {
                // the lag follows r = b' - sigma, sigma the uniform change of the source in K/s
                this.slope = heating == null ? level.derivative("t") : level.derivative("t").linear(1, heating, -1);
                this.meanRise = null;
                this.riseMax = 0;
                this.fluxShape = null;
                double h = surface instanceof BoundaryCondition.Robin rob ? rob.heatTransferCoefficient()
                    : Double.POSITIVE_INFINITY;
                double lagConstant = k * radius / ((n + 1) * alpha * h);
                this.lag1 = new double[] {radius * radius / (2 * (n + 1) * alpha) + lagConstant, -1 / (2 * (n + 1) * alpha)};
                // -alpha Lap P2 = P1 with Lap r^(2j) = 2j (2j + n - 1) r^(2j - 2); P2(R) + (k/h) P2'(R) = 0
                double c4 = 1 / (8 * (n + 1) * (n + 3) * alpha * alpha);
                double c2 = -lag1[0] / (2 * (n + 1) * alpha);
                double atSurface = c2 * radius * radius + c4 * Math.pow(radius, 4);
                double slopeAtSurface = 2 * c2 * radius + 4 * c4 * Math.pow(radius, 3);
                this.lag2 = new double[] {-atSurface - k / h * slopeAtSurface, c2, c4};
            }
            this.curvature = slope.derivative("t");
            Expression third = curvature.derivative("t");
            this.thirdMax = CommonLevel.sizes(curvature, third, third, timeHorizon)[1];
            this.duhamel = new ScheduleIntegral(third);
            this.rateIntegral = new ScheduleIntegral(slope);
            this.slopeMax = CommonLevel.sizes(slope, slope, slope, timeHorizon)[0];
        } else {
            this.level = null;
            this.slope = null;
            this.curvature = null;
            this.thirdMax = 0;
            this.duhamel = null;
            this.rateIntegral = null;
            this.slopeMax = 0;
            this.lag1 = new double[] {0};
            this.lag2 = new double[] {0};
            this.fluxShape = null;
            this.meanRise = null;
            this.riseMax = 0;
        }
        double levelMax = moving ? CommonLevel.sizes(level, slope, curvature, timeHorizon)[0] : 0;
        if (fluxSurface && moving) {
            // a flux change dq moves the profile by up to |dq| R/k and the mean by (n + 1) |dq| T/(rho c R)
            levelMax *= radius / k + (n + 1) * timeHorizon / (rhoC * radius);
        }
        if (heating != null) {
            // a uniform source that changes in time moves the temperature by up to max |sigma| T
            levelMax += CommonLevel.sizes(heating, heating, heating, timeHorizon)[0] * timeHorizon;
        }
        if (uneven[0]) {
            double h = surface instanceof BoundaryCondition.Robin rob ? rob.heatTransferCoefficient()
                : fluxSurface ? 0 : Double.POSITIVE_INFINITY;
            this.change = new RadialChange(source, sphere, radius, k, rhoC, h, timeHorizon, this::mode);
            // the change's response is at most sup |F| T (the maximum principle; for a flux surface its mean)
            levelMax += change.sup * timeHorizon;
        } else {
            this.change = null;
        }
        double data = valueOf(surface.data(), radius);
        Expression q = source;
        // int_0^R Q r^n dr = R^n J_Q(R), on the panels that resolve Q (a fixed rule misses a narrow heater)
        RadialChange.Flux sourceFlux = RadialChange.radialFlux(r -> valueOf(q, r), n, radius,
            (n + 1) * Math.abs(data));
        double sourceIntegral = Math.pow(radius, n) * sourceFlux.j().applyAsDouble(radius);
        if (surface instanceof BoundaryCondition.Dirichlet) {
            biot = Double.POSITIVE_INFINITY;
            flux = false;
            drift = 0;
        } else if (surface instanceof BoundaryCondition.Robin rob) {
            biot = rob.heatTransferCoefficient() * radius / k;
            flux = false;
            drift = 0;
        } else {
            biot = 0;
            flux = true;
            drift = ((n + 1) * data / radius + (n + 1) * sourceIntegral / Math.pow(radius, n + 1)) / rhoC;
            if (steady) {
                throw new OracleException(Reason.UNSUPPORTED, "oracle: a steady " + (sphere ? "sphere" : "cylinder")
                    + " with a flux surface has no"
                    + " unique steady state (u is fixed only up to a constant, and only when the net heat input is"
                    + " zero); give the surface a temperature or convection, or solve the transient");
            }
        }
        // J(r) = r int_0^1 s^n Qt(r s) ds, Qt = Q - rho c A
        RadialChange.Flux fluxOf = RadialChange.radialFlux(r -> valueOf(q, r) - rhoC * drift, n, radius);
        java.util.function.DoubleUnaryOperator jExact = fluxOf.j();
        double[] c = null;
        for (int n = 17; n <= 1025; n = 2 * n - 1) {
            c = Chebyshev.interpolate(jExact, 0, radius, n);
            if (Chebyshev.resolved(c)) {
                break;
            }
            if (n == 1025) {
                throw new OracleException(Reason.DATA_NOT_RESOLVED, "oracle: the radial source is too rough for a"
                    + " Chebyshev series of degree 1024 in r");
            }
        }
        j = c;
        jIntegral = Chebyshev.antiderivative(c, 0, radius);
        double j0 = Chebyshev.value(jIntegral, -1);
        jIntegral[0] -= j0;
        SplittableRandom random = new SplittableRandom(20261201L);
        double err = 0;
        for (int i = 0; i < 64; i++) {
            double r = random.nextDouble() * radius;
            err = Math.max(err, Math.abs(jExact.applyAsDouble(r) - Chebyshev.value(j, Chebyshev.reference(r, 0, radius))));
        }
        double jScale = Chebyshev.absSum(j);
        this.gradientError = (10 * err + 8 * EPS * jScale + fluxOf.error()) / k;
        // with a flux surface the drift carries the source integral's quadrature error over the horizon
        this.steadyError = gradientError * radius + (flux ? (n + 1) * sourceFlux.error() * horizon / (radius * rhoC) : 0);
        double jR = Chebyshev.value(j, 1);
        if (surface instanceof BoundaryCondition.Dirichlet) {
            surfaceValue = data;
        } else if (surface instanceof BoundaryCondition.Robin rob) {
            surfaceValue = data + jR / rob.heatTransferCoefficient();
        } else {
            surfaceValue = 0;
        }
        double u = Math.abs(data) * (flux ? radius / k : 1);
        u = Math.max(u, Math.abs(sourceIntegral) * (n + 1) / (k * Math.pow(radius, n - 1)));
        if (!steady) {
            for (int i = 0; i <= 32; i++) {
                u = Math.max(u, Math.abs(valueOf(initial, radius * i / 32)));
            }
            u = Math.max(u, Math.abs(drift) * horizon);
        }
        for (int i = 0; i <= 32; i++) {
            u = Math.max(u, Math.abs(steadyValue(radius * i / 32)));
        }
        u += levelMax;
        scale = u > 0 ? u : 1;
    }

    /**
     * sigma(t) = (Q(R/2, t) - Q(R/2, 0)) / (rho c) over t, or null when the source does not change in
     * time; for a source that changes other than uniformly (checked at 33 radii and 16 times to 1e-12 of
     * |Q|) null, with {@code uneven[0]} set: {@link RadialChange} takes that change.
     */
    private Expression heatingOf(Expression q, double timeHorizon, boolean[] uneven) {
        if (!q.variables().contains("t") || q.isIndependentOf("t") || !(timeHorizon > 0)) {
            return null;
        }
        Expression at = q.variables().contains("r") ? q.substitute("r", radius / 2) : q;
        at = at.over("t");
        Expression sigma = at.linear(1 / rhoC, Expression.constant(1, "t"), -at.value(0) / rhoC);
        boolean changes = false;
        int at0 = q.variables().indexOf("r");
        int atT = q.variables().indexOf("t");
        double[] args = new double[q.variables().size()];
        for (int i = 0; i <= 32; i++) {
            if (at0 >= 0) {
                args[at0] = radius * i / 32;
            }
            args[atT] = 0;
            double q0 = q.value(args);
            for (int j = 1; j <= 16; j++) {
                double t = timeHorizon * j / 16;
                args[atT] = t;
                double qt = q.value(args);
                changes |= Math.abs(qt - q0) > 1e-12 * Math.max(1, Math.abs(q0));
                if (Math.abs(qt - q0 - rhoC * sigma.value(t)) > 1e-12 * Math.max(1, Math.abs(qt))) {
                    uneven[0] = true;
                    return null;
                }
            }
        }
        return changes ? sigma : null;
    }

    /** P1(r): -alpha (r^n P1')' / r^n = 1 (or Psi1 = A^-1 psi for a flux surface) under the homogeneous condition. */
    private double lag(double r) {
        return poly(lag1, r);
    }

    /** P2(r) = A^-1 P1 (or Psi2 = A^-1 Psi1), under the homogeneous surface condition. */
    private double lag2(double r) {
        return poly(lag2, r);
    }

    /** sum_j c_j r^(2j). */
    private static double poly(double[] c, double r) {
        double r2 = r * r;
        double v = 0;
        for (int j = c.length - 1; j >= 0; j--) {
            v = v * r2 + c[j];
        }
        return v;
    }

    /** d/dr sum_j c_j r^(2j). */
    private static double polySlope(double[] c, double r) {
        double v = 0;
        for (int j = c.length - 1; j >= 1; j--) {
            v += 2 * j * c[j] * Math.pow(r, 2 * j - 1);
        }
        return v;
    }

    /** The mean of sum_j c_j r^(2j) over a < r < b with weight r^n. */
    private double polyMean(double[] c, double a, double b) {
        double v = c[0];
        for (int j = 1; j < c.length; j++) {
            v += c[j] * powerMean(j, a, b);
        }
        return v;
    }

    /** sup over [0, R] of |sum_j c_j r^(2j)|, bounded by sum_j |c_j| R^(2j). */
    private double polySup(double[] c) {
        double v = 0;
        for (int j = 0; j < c.length; j++) {
            v += Math.abs(c[j]) * Math.pow(radius, 2 * j);
        }
        return v;
    }

    /**
     * g = A^-1 f for f of mean zero (weight r^n) under the insulated surface: -alpha Lap g = f with
     * Lap r^(2j+2) = (2j + 2)(2j + n + 1) r^(2j), g'(R) = 0 following from the mean, g of mean zero.
     */
    private double[] inverse(double[] f) {
        double[] g = new double[f.length + 1];
        for (int j = 0; j < f.length; j++) {
            g[j + 1] = -f[j] / (alpha * (2 * j + 2) * (2 * j + n + 1));
        }
        for (int j = 1; j < g.length; j++) {
            g[0] -= g[j] * (n + 1) * Math.pow(radius, 2 * j) / (n + 1 + 2 * j);
        }
        return g;
    }

    /** The mean of r^(2j) over a < r < b with weight r^n. */
    private double powerMean(int j, double a, double b) {
        double area = (Math.pow(b, n + 1) - Math.pow(a, n + 1)) / (n + 1);
        return (Math.pow(b, n + 1 + 2 * j) - Math.pow(a, n + 1 + 2 * j)) / (n + 1 + 2 * j) / area;
    }

    /**
     * The projection on mode i of what drives the lag: 1 for a temperature surface; psi for a flux
     * surface, psi_i = R^n X_i(R) / (k beta_i^2 ||X_i||^2) by Green's identity (Lap psi is constant and
     * projects to 0 on i >= 1; the zero mode gets nothing, psi having mean 0).
     */
    private double projection(int i, double[] b, double[] nn) {
        if (fluxShape == null) {
            return modeIntegral(b[i], 0, radius) / nn[i];
        }
        if (b[i] == 0) {
            return 0;
        }
        return Math.pow(radius, n) * mode(b[i] * radius) / (k * b[i] * b[i] * nn[i]);
    }

    private double one(int i) {
        return Math.abs(projection(i, beta, norm));
    }

    /**
     * Bounds of sum_{i >= from} |1_i| beta_i^g / lambda_i^3 (g = 0 values, 1 gradients) past the
     * computed modes: beta_i >= i pi / R and beta_i <= 2 i pi / R; the cylinder's
     * |1_i| = 2 |J1(z)| / (z (J0^2 + J1^2)) <= 2 pi / sqrt(z) with sqrt(z) |J1(z)| <= 1 and
     * J0^2 + J1^2 >= 1 / (pi z) (half the large-z value); the sphere's |1_i| <= (1 + z)/(0.42 z) <= 3.2
     * for z >= pi.
     */
    private double beyondComputed(int from, int g) {
        double c = Math.PI / radius;
        double a3 = alpha * alpha * alpha;
        if (fluxShape != null) {
            // psi_i: cylinder 2 / (k beta^2 R |J0(z)|) <= 2 sqrt(pi) R / (k z^1.5) (J0^2 >= 1/(pi z) at J1 = 0);
            // sphere R^2 |sin z / z| / (k beta^2 0.42 R / beta^2) <= R / (0.42 k z); z >= i pi
            double factor = sphere ? radius / (0.42 * k * Math.PI) : 2 * Math.sqrt(Math.PI) * radius
                / (k * Math.pow(Math.PI, 1.5));
            double power = sphere ? 1 : 1.5;
            factor *= Math.pow(2 * c, g) / (a3 * Math.pow(c, 6));
            double q = 6 + power - g;
            return factor * Math.pow(from - 1, 1 - q) / (q - 1);
        }
        if (!sphere) {
            // 2 pi / sqrt(i pi) (2 i c)^g / (alpha^3 (i c)^6): sum i^(g - 6.5) <= (from - 1)^(g - 5.5) / (5.5 - g)
            double factor = 2 * Math.PI / Math.sqrt(Math.PI) * Math.pow(2 * c, g) / (a3 * Math.pow(c, 6));
            return factor * Math.pow(from - 1, g - 5.5) / (5.5 - g);
        }
        double factor = 3.2 * Math.pow(2 * c, g) / (a3 * Math.pow(c, 6));
        return factor * Math.pow(from - 1, g - 5) / (5 - g);
    }

    /**
     * True when a sphere problem goes to this solver: a flux surface,
     * convection below Bi = 0.05 with a source constant in time (the ambient may move), or below
     * Bi = 0.01 whatever the source does (the slab mapping takes the rest).
     */
    public static boolean prefersSphere(Problem p) {
        BoundaryCondition surface = p.condition(Side.SURFACE);
        if (surface instanceof BoundaryCondition.Neumann) {
            return true; // the mapping refuses a flux; this solver takes one that varies in time too
        }
        if (surface instanceof BoundaryCondition.Robin r) {
            // a moving ambient is a level this solver takes; a source that varies in time stays on the mapping,
            // which refuses below Bi = 0.01 (there this solver takes a source changing uniformly in time)
            double biot = r.heatTransferCoefficient() * p.domain().characteristicLength() / p.material().conductivity();
            return (p.source().isIndependentOf("t") && biot < 0.05) || biot < 0.01;
        }
        return false;
    }

    private static double valueOf(Expression e, double r) {
        double[] args = new double[e.variables().size()];
        int at = e.variables().indexOf("r");
        if (at >= 0) {
            args[at] = r;
        }
        double v = e.value(args);
        if (!Double.isFinite(v)) {
            throw new OracleException(Reason.DATA_NOT_FINITE, "oracle: " + e.source() + " is " + v + " at r = " + r);
        }
        return v;
    }

    /** P(r) = P(R) + (K(R) - K(r))/k. */
    private double steadyValue(double r) {
        double s = Chebyshev.reference(r, 0, radius);
        return surfaceValue + (Chebyshev.value(jIntegral, 1) - Chebyshev.value(jIntegral, s)) / k;
    }

    /** X(x) at x = beta r: J0(x) or sin(x)/x. */
    private double mode(double x) {
        if (!sphere) {
            return Bessel.j0(x);
        }
        return x < 1e-4 ? 1 - x * x / 6 : Math.sin(x) / x;
    }

    /** dX/dx: -J1(x) or (x cos x - sin x)/x^2. */
    private double modeSlope(double x) {
        if (!sphere) {
            return -Bessel.j1(x);
        }
        return x < 1e-3 ? -x / 3 + x * x * x / 30 : (x * Math.cos(x) - Math.sin(x)) / (x * x);
    }

    /** The mean of X(beta r) over a < r < b with weight r^n (times the weight's integral). */
    private double modeIntegral(double beta, double a, double b) {
        if (beta == 0) {
            return (Math.pow(b, n + 1) - Math.pow(a, n + 1)) / (n + 1);
        }
        if (!sphere) {
            return (b * Bessel.j1(beta * b) - a * Bessel.j1(beta * a)) / beta;
        }
        // int r^2 sin(beta r)/(beta r) dr = [sin(beta r) - beta r cos(beta r)]/beta^3, the bracket by a series
        // at small beta r (where it is about (beta r)^3/3 and would cancel: a body that keeps its heat)
        double x = beta * b;
        double y = beta * a;
        return (x * RadialModes.sincMinusCos(x) - (a == 0 ? 0 : y * RadialModes.sincMinusCos(y))) / (beta * beta * beta);
    }

    @Override
    public int dimension() {
        return 1;
    }

    @Override
    public double scale() {
        return scale;
    }

    @Override
    public double length() {
        return radius;
    }

    @Override
    public double horizon() {
        return horizon;
    }

    /** Makes modes 0..m-1 and their coefficients available (the zero mode first for a flux surface). */
    private synchronized void ensure(int m) {
        if (m <= coef.length) {
            return;
        }
        int size = Math.min(CAP, Math.max(m, Math.max(16, coef.length * 3 / 2)));
        double[] b = new double[size];
        double[] nn = new double[size];
        for (int i = 0; i < size; i++) {
            RadialModes.Shape shape = sphere ? RadialModes.Shape.SPHERE : RadialModes.Shape.CYLINDER;
            if (flux && i == 0) {
                b[i] = 0;
                nn[i] = Math.pow(radius, n + 1) / (n + 1);
            } else {
                double z = RadialModes.root(shape, flux ? i : i + 1, biot);
                b[i] = z / radius;
                nn[i] = RadialModes.normSquared(shape, radius, b[i]);
            }
        }
        double[][] result = new double[2][];
        double normF = 0;
        for (int pass = 0; pass < 2; pass++) {
            int nq = (int) Math.ceil(1.6 * size + 40);
            if (pass == 1) {
                nq += nq / 4 + 8;
            }
            GaussLegendre g = GaussLegendre.of(nq);
            double[] out = new double[size];
            double sum2 = 0;
            for (int q = 0; q < nq; q++) {
                double r = 0.5 * radius * (g.nodes[q] + 1);
                double w = 0.5 * radius * g.weights[q] * (n == 1 ? r : r * r);
                double f = valueOf(initial, r) - steadyValue(r);
                sum2 += w * f * f;
                for (int i = 0; i < size; i++) {
                    out[i] += w * f * mode(b[i] * r);
                }
            }
            for (int i = 0; i < size; i++) {
                out[i] /= nn[i];
            }
            result[pass] = out;
            if (pass == 0) {
                normF = Math.sqrt(sum2) + steadyError * radius;
            }
        }
        double diff = 0;
        for (int i = 0; i < size; i++) {
            diff = Math.max(diff, Math.abs(result[0][i] - result[1][i]));
        }
        coefError = 10 * diff + steadyError;
        if (level != null) {
            // v(0) = u_0 - S + b'(0) P1 - b''(0) P2: (P1)_i = 1_i / lambda_i, (P2)_i = 1_i / lambda_i^2 exactly;
            // ||P1|| <= P1(0) ||1|| and ||P2|| <= P2(0) ||1|| (both decrease from the centre)
            double initialSlope = slope.value(0);
            double initialCurvature = curvature.value(0);
            for (int i = 0; i < size; i++) {
                double l = alpha * b[i] * b[i];
                if (l == 0) {
                    continue; // the zero mode: P1 and P2 of a flux surface have mean 0
                }
                double one = projection(i, b, nn);
                result[0][i] += initialSlope * one / l - initialCurvature * one / (l * l);
            }
            normF += (Math.abs(initialSlope) * polySup(lag1) + Math.abs(initialCurvature) * polySup(lag2))
                * Math.sqrt(Math.pow(radius, n + 1) / (n + 1));
        }
        beta = b;
        norm = nn;
        coef = result[0];
        // cylinder: |c_i| <= ||f|| / ||J0(beta_i r)|| <= ||f|| sqrt(2 pi z_i)/R with z_i <= (i + 1) pi: <= C (i + 1);
        // sphere: ||X_i||^2 >= 0.42 R / beta_i^2 with beta_i <= (i + 1) pi/R
        tailCoefficient = sphere ? normF * Math.PI / (Math.sqrt(0.42) * Math.pow(radius, 1.5))
            : normF * Math.PI * Math.sqrt(2) / radius;
    }

    @Override
    public Slice at(double t) {
        if (steady) {
            return new RadialSlice(Double.POSITIVE_INFINITY);
        }
        if (!(t >= 0 && t <= horizon * (1 + 1e-12))) {
            throw new OracleException(Reason.OUTSIDE_TIME_RANGE, "oracle: t = " + t + " s is outside [0, " + horizon
                + "] s, the range the oracle was prepared for");
        }
        return new RadialSlice(t);
    }

    private final class RadialSlice implements Slice {
        private final double t;
        private final int m;
        private final double[] weighted;
        private final double[] b;
        private final double bound;
        private final double gradientBound;
        private final double levelNow;
        private final double slopeNow;
        private final double curvatureNow;
        private final double meanNow;
        private final double meanBound;
        // the response to a source changing unevenly in time (null before t > 0 or without one)
        private final RadialChange.At changeNow;
        private volatile double absWeighted = -1;

        RadialSlice(double t) {
            this.t = t;
            boolean moving = level != null && t > 0 && t < Double.POSITIVE_INFINITY;
            this.levelNow = moving ? level.value(t) : 0;
            this.slopeNow = moving ? slope.value(t) : 0;
            this.curvatureNow = moving ? curvature.value(t) : 0;
            if (moving && meanRise != null) {
                ScheduleIntegral.At rise = meanRise.at(t);
                this.meanNow = rise.value(0);
                // the panels resolve the rate to 1e-14 (see ScheduleIntegral): 1e-13 of what it sums, with margin
                this.meanBound = 1e-13 * (Math.abs(meanNow) + t * riseMax);
            } else {
                this.meanNow = 0;
                this.meanBound = 0;
            }
            if (t == 0 || t == Double.POSITIVE_INFINITY) {
                m = 0;
                weighted = new double[0];
                b = new double[0];
                bound = steadyError + 4 * EPS * scale;
                gradientBound = gradientError;
                changeNow = null;
                return;
            }
            // the mode tables grow under the solver's lock; reading them under it too keeps a slice's view whole
            synchronized (RadialSolver.this) {
                double budget = tolerance * scale;
                double a = alpha * t * Math.PI * Math.PI / (radius * radius);
                if (a * CAP * CAP < 1) {
                    throw new OracleException(Reason.TOO_MANY_MODES, "oracle: at t = " + t + " s the cylinder's series needs"
                        + " more than " + CAP + " modes (alpha t/R^2 = " + alpha * t / (radius * radius) + ")");
                }
                int size = 16;
                int mm;
                double tail;
                double gTail;
                while (true) {
                    ensure(size);
                    double c = tailCoefficient;
                    // mode i (0-based) has beta_i >= i pi/R and |c_i| <= c (i + 1), and |d/dr| adds beta_i <= (i + 1) pi/R
                    mm = 1;
                    while (true) {
                        tail = c * TensorSolver.gaussTail(a, mm, 1);
                        gTail = c * Math.PI / radius * TensorSolver.gaussTail(a, mm, 2);
                        if ((tail <= budget / 4 && gTail <= budget / (4 * radius)) || mm >= coef.length) {
                            break;
                        }
                        mm++;
                    }
                    if (tail <= budget / 4 && gTail <= budget / (4 * radius)) {
                        break;
                    }
                    if (coef.length >= CAP) {
                        throw new OracleException(Reason.TOO_MANY_MODES, "oracle: at t = " + t + " s the cylinder's series"
                            + " needs more than " + CAP + " modes");
                    }
                    size = coef.length * 2;
                }
                // the moving level's particular part: modes until its tails meet the budgets (values at least)
                int particular = 0;
                double pTail = 0;
                double pgTail = 0;
                if (moving && thirdMax > 0) {
                    int want = coef.length;
                    while (true) {
                        ensure(want);
                        int sz = coef.length;
                        double[] sv = new double[sz + 1];
                        double[] sg = new double[sz + 1];
                        sv[sz] = beyondComputed(sz, 0);
                        sg[sz] = beyondComputed(sz, 1);
                        for (int i = sz - 1; i >= 0; i--) {
                            double l = alpha * beta[i] * beta[i];
                            double w = l == 0 ? 0 : one(i) / (l * l * l);
                            sv[i] = sv[i + 1] + w;
                            sg[i] = sg[i + 1] + w * beta[i];
                        }
                        int both = -1;
                        int values = -1;
                        for (int i = 1; i <= sz; i++) {
                            if (values < 0 && thirdMax * sv[i] <= budget / 8) {
                                values = i;
                            }
                            if (thirdMax * sv[i] <= budget / 8 && thirdMax * sg[i] <= budget / (8 * radius)) {
                                both = i;
                                break;
                            }
                        }
                        if (both > 0 || (sz >= CAP && values > 0)) {
                            particular = both > 0 ? both : values;
                            pTail = thirdMax * sv[particular];
                            pgTail = thirdMax * sg[particular];
                            break;
                        }
                        if (sz >= CAP) {
                            throw new OracleException(Reason.TOO_MANY_MODES, "oracle: at t = " + t + " s the response to"
                                + " the moving surface data needs more than " + CAP + " modes; loosen the tolerance");
                        }
                        want = 2 * sz;
                    }
                }
                // the uneven source change's remainder z: modes until its tails meet the budgets
                int changed = 0;
                double cTail = 0;
                double cgTail = 0;
                if (change != null) {
                    int want = Math.min(coef.length, RadialChange.CAP);
                    while (true) {
                        ensure(want);
                        int sz = Math.min(coef.length, RadialChange.CAP);
                        double[] bs = java.util.Arrays.copyOf(beta, sz);
                        double[][] tails = change.tails(bs, java.util.Arrays.copyOf(norm, sz), t);
                        int found = -1;
                        for (int i = 1; i <= sz; i++) {
                            if (tails[0][i] <= budget / 8 && tails[1][i] <= budget / (8 * radius)) {
                                found = i;
                                break;
                            }
                        }
                        if (found > 0) {
                            changed = found;
                            cTail = tails[0][found];
                            cgTail = tails[1][found];
                            break;
                        }
                        if (sz >= RadialChange.CAP) {
                            throw new OracleException(Reason.TOO_MANY_MODES, "oracle: at t = " + t + " s the response to"
                                + " the source's change in time needs more than " + RadialChange.CAP + " modes; loosen"
                                + " the tolerance or ask for a later time");
                        }
                        want = Math.min(2 * sz, RadialChange.CAP);
                    }
                    changeNow = change.at(t, beta, norm, changed, budget);
                } else {
                    changeNow = null;
                }
                m = Math.max(Math.max(mm, particular), changed);
                weighted = new double[m];
                b = new double[m];
                double decaySum = 0;
                double decaySlopeSum = 0; // sum e^{-lambda t} beta: what a coefficient error does to du/dr
                for (int i = 0; i < m; i++) {
                    b[i] = beta[i];
                    if (i < mm) {
                        double e = Math.exp(-alpha * beta[i] * beta[i] * t);
                        weighted[i] = coef[i] * e;
                        decaySum += e;
                        decaySlopeSum += e * beta[i];
                    }
                }
                double quadrature = 0;
                double quadratureGradient = 0;
                if (particular > 0) {
                    ScheduleIntegral.At integrals = duhamel.at(t);
                    double sumValue = 0;
                    double sumGradient = 0;
                    ScheduleIntegral.At rates = null;
                    double slowValue = 0;
                    double slowGradient = 0;
                    double slowest = Double.POSITIVE_INFINITY;
                    for (int i = 0; i < particular; i++) {
                        double l = alpha * beta[i] * beta[i];
                        if (l == 0) {
                            continue;
                        }
                        double one = projection(i, beta, norm);
                        if (l * horizon < 1) {
                            // a slow mode (a body that keeps its heat): its share of -r P1 + r' P2 + v is solved from
                            // the rate itself, -one int_0^t e^{-l (t - s)} r(s) ds, instead of dividing r'' by l^3
                            if (rates == null) {
                                rates = rateIntegral.at(t);
                            }
                            double adjust = (slope.value(0) * one / l - curvature.value(0) * one / (l * l)) * Math.exp(-l * t);
                            double direct = one * rates.value(l);
                            double lags = slopeNow * one / l - curvatureNow * one / (l * l);
                            weighted[i] += (i < mm ? -adjust : 0) - direct + lags;
                            // the quadrature's measured error, and rounding of the terms that cancel the lags' share
                            double e = rates.relativeError(l, slopeMax) * slopeMax * Math.abs(one) / l
                                + 8 * EPS * (Math.abs(adjust) + Math.abs(direct) + Math.abs(slopeNow * one / l)
                                + Math.abs(curvatureNow * one / (l * l)));
                            slowValue += e;
                            slowGradient += e * beta[i];
                            continue;
                        }
                        weighted[i] -= one / (l * l) * integrals.value(l);
                        sumValue += Math.abs(one) / (l * l * l);
                        sumGradient += Math.abs(one) / (l * l * l) * beta[i];
                        slowest = Math.min(slowest, l);
                    }
                    double relative = integrals.relativeError(slowest, thirdMax);
                    quadrature = relative * thirdMax * sumValue + slowValue;
                    quadratureGradient = relative * thirdMax * sumGradient + slowGradient;
                }
                double changeBound = 0;
                double changeGradient = 0;
                if (changeNow != null) {
                    for (int i = 0; i < changed; i++) {
                        weighted[i] += changeNow.modes[i];
                    }
                    changeBound = cTail + changeNow.quadrature + changeNow.valueError();
                    changeGradient = cgTail + changeNow.quadratureSlope + changeNow.slopeError();
                }
                bound = steadyError + tail + coefError * decaySum + pTail + quadrature + meanBound + changeBound;
                gradientBound = gradientError + gTail + coefError * decaySlopeSum + pgTail + quadratureGradient
                    + changeGradient;
            }
        }

        /** b(t) - r(t) P1 + r'(t) P2, or for a flux surface dq psi + m - dq' Psi1 + dq'' Psi2. */
        private double levelPart(double r) {
            double shape = fluxShape == null ? 1 : poly(fluxShape, r);
            return levelNow * shape + meanNow - slopeNow * lag(r) + curvatureNow * lag2(r);
        }

        @Override
        public int modes() {
            return m;
        }

        private double radiusOf(double[] p, int o) {
            double r = p[o];
            if (!(r >= 0 && r <= radius)) {
                throw new OracleException(Reason.OUTSIDE_DOMAIN, "oracle: r = " + r + " m is outside [0, " + radius
                    + "] m");
            }
            return r;
        }

        @Override
        public Evaluation temperature(double[] p, int o) {
            double r = radiusOf(p, o);
            if (t == 0) {
                double g = valueOf(initial, r);
                return new Evaluation(g, 4 * EPS * Math.max(Math.abs(g), 1e-3 * scale));
            }
            double value = (steady ? 0 : drift * t) + steadyValue(r) + levelPart(r);
            double magnitude = Math.abs(value) + Math.abs(levelNow) * (fluxShape == null ? 1 : polySup(fluxShape))
                + Math.abs(meanNow) + Math.abs(slopeNow * lag(r)) + Math.abs(curvatureNow * lag2(r));
            if (changeNow != null) {
                value += changeNow.value(r);
                magnitude += changeNow.size();
            }
            for (int i = 0; i < m; i++) {
                double term = weighted[i] * mode(b[i] * r);
                value += term;
                magnitude += Math.abs(term);
            }
            double total = bound + 16 * EPS * magnitude + 2e-15 * Math.abs(weightedSum());
            double budget = tolerance * scale;
            if (!(total <= budget)) {
                throw new OracleException(Reason.NOT_CERTIFIED, "oracle: u at r = " + r + " m, t = " + t + " s has bound "
                    + total + " > " + budget + "; loosen the tolerance");
            }
            return new Evaluation(value, total);
        }

        private double weightedSum() {
            if (absWeighted < 0) {
                double s = 0;
                for (double w : weighted) {
                    s += Math.abs(w);
                }
                absWeighted = s; // a benign race: every thread computes the same sum
            }
            return absWeighted;
        }

        /**
         * The mean over the shell a < r < b, weight r: the modes by \(\int J_0(\beta r) r\,dr =
         * r J_1(\beta r)/\beta\), the steady part by Gauss-Legendre (two rules, the difference times 10).
         */
        @Override
        public Evaluation average(double[] lo, double[] hi) {
            double inner = radiusOf(lo, 0);
            double outer = radiusOf(hi, 0);
            if (!(outer > inner)) {
                throw new OracleException(Reason.OUTSIDE_DOMAIN, "oracle: the shell " + inner + " < r < " + outer
                    + " m is empty; give a < b");
            }
            if (t == 0) {
                throw new OracleException(Reason.UNSUPPORTED, "oracle: the shell mean at t = 0 is that of the initial"
                    + " temperature; ask for t > 0");
            }
            double area = (Math.pow(outer, n + 1) - Math.pow(inner, n + 1)) / (n + 1);
            double[] sums = RadialChange.shellMeans(RadialSolver.this::steadyValue, n, inner, outer);
            double lagMean = polyMean(lag1, inner, outer);
            double lag2Mean = polyMean(lag2, inner, outer);
            double shapeMean = fluxShape == null ? 1 : polyMean(fluxShape, inner, outer);
            double value = (steady ? 0 : drift * t) + sums[1] + levelNow * shapeMean + meanNow
                - slopeNow * lagMean + curvatureNow * lag2Mean;
            double magnitude = Math.abs(value) + Math.abs(levelNow * shapeMean) + Math.abs(meanNow)
                + Math.abs(slopeNow * lagMean) + Math.abs(curvatureNow * lag2Mean);
            double changeError = 0;
            if (changeNow != null) {
                // the slice's bound holds the change's value error; the shell mean adds its own rules' difference
                double[] c = changeNow.shellMean(inner, outer);
                value += c[0];
                magnitude += changeNow.size();
                changeError = Math.max(0, c[1] - changeNow.valueError());
            }
            for (int i = 0; i < m; i++) {
                double mean = modeIntegral(b[i], inner, outer) / area;
                double term = weighted[i] * mean;
                value += term;
                magnitude += Math.abs(term);
            }
            double total = bound + 10 * Math.abs(sums[1] - sums[0]) + 16 * EPS * magnitude + changeError;
            double budget = tolerance * scale;
            if (!(total <= budget)) {
                throw new OracleException(Reason.NOT_CERTIFIED, "oracle: the shell mean over " + inner + " < r < " + outer
                    + " m at t = " + t + " s has bound " + total + " > " + budget);
            }
            return new Evaluation(value, total);
        }

        @Override
        public double gradient(double[] p, int o, double[] out, int oo) {
            double r = radiusOf(p, o);
            if (t == 0) {
                throw new OracleException(Reason.UNSUPPORTED, "oracle: the gradient at t = 0 is that of the initial"
                    + " temperature; ask for t > 0");
            }
            double s = Chebyshev.reference(r, 0, radius);
            double g = -Chebyshev.value(j, s) / k - slopeNow * polySlope(lag1, r) + curvatureNow * polySlope(lag2, r)
                + (fluxShape == null ? 0 : levelNow * polySlope(fluxShape, r));
            if (changeNow != null) {
                g += changeNow.slope(r);
            }
            double magnitude = Math.abs(g);
            for (int i = 0; i < m; i++) {
                double term = weighted[i] * b[i] * modeSlope(b[i] * r);
                g += term;
                magnitude += Math.abs(term);
            }
            double total = gradientBound + 16 * EPS * magnitude + 2e-15 * magnitude;
            double limit = tolerance * scale / radius;
            if (!(total <= limit)) {
                throw new OracleException(Reason.NOT_CERTIFIED, "oracle: du/dr at r = " + r + " m, t = " + t + " s has"
                    + " bound " + total + " > " + limit);
            }
            out[oo] = g;
            return total;
        }
    }
}

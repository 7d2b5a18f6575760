package eigencheck.oracle.series;

import eigencheck.oracle.OracleException;
import eigencheck.oracle.OracleException.Reason;
import eigencheck.oracle.expr.Expression;
import java.util.SplittableRandom;
import java.util.function.DoubleUnaryOperator;

/**
 * What a cylinder's or sphere's source adds when it changes in time other than by the same amount
 * everywhere: with F(r, t) = (Q(r, t) - Q(r, 0))/(rho c), the part v of u with homogeneous surface
 * data and v(0) = 0 solves v_t + A v = F, A = -alpha (r^n d/dr)(d/dr)/r^n. Two quasi-static
 * subtractions leave a fast-converging remainder:
 * \[ v = m(t) + A^+ \tilde F(t) - A^{+2} \tilde F_t(t) + z, \qquad z_t + A z = A^{+2} \tilde F_{tt},\quad
 * z(0) = A^{+2} \tilde F_t(0), \]
 * \(\tilde F = F - m'\), m' the mean of F with weight r^n for an insulated (flux) surface, where A^+
 * is the inverse on functions of mean zero and m(t) the integral of that mean; m = 0 and
 * \(\tilde F = F\) otherwise (A^+ = A^-1). By direct differentiation v solves the problem.
 * <ul>
 * <li>A^+ G is a radial steady solve as in {@link RadialSolver}: J(r) = r int_0^1 s^n G(rs) ds as a
 * Chebyshev series of adaptive length, P' = -J/alpha, P(R) = 0 (temperature surface), (k/h) J(R)/alpha
 * (convection) or the value that gives P mean zero (flux); J's error is measured at 64 random points
 * (times 10). An error e in G moves A^+ G by at most 2 e (R^2 + (k/h) R)/((n + 1) alpha) and its
 * slope by 2 e R/((n + 1) alpha) (|J_e(r)| <= 2 e r/(n + 1)).</li>
 * <li>Mode i of z: e^{-lambda t} (F_t)_i(0)/lambda^2 + lambda^-2 int_0^t e^{-lambda (t - s)} (F_tt)_i(s) ds,
 * the projections by a Gauss-Legendre rule in r with 1.6 N + 40 nodes (checked at s = t and t/2 against
 * a rule 25 % finer, the difference times 10), F_tt as a Chebyshev interpolant in r (its error measured),
 * the time integral on a grid graded toward t that every mode shares (the kernel resolved as on the windows of
 * {@link ScheduleIntegral}; the error measured on the slowest mode against uniform panels at twice the density);
 * the interpolant has the fewest points whose error, times what it can do to the modes, is 1/16 of the budget.</li>
 * <li>Past the computed modes, |(G)_i| <= ||G|| / ||X_i|| (Cauchy-Schwarz, ||G|| <= sup |G| times
 * the root of the weight's integral) and e^{-x} <= min(1, 1/x) bound the tail by
 * (||F_tt|| + ||F_t(0)|| min(1/t, lambda)) sum ||X_i||^-1 lambda_i^-3 (times beta_i for the slope);
 * the norms beyond the computed modes use the same asymptotic bounds as the radial solver's tail.
 * The sups of F, F_t(., 0) and F_tt are sampled on a grid of 33 radii and 65 times, times 1.1.</li>
 * </ul>
 * The bound holds for a source smooth in t (one with abs, min, max or step of t is refused); smoothness
 * in r is measured by the Chebyshev series of the quasi-static solves.
 */
final class RadialChange {
    /** The change's modes beyond this are refused (its projection matrix grows as N^2). */
    static final int CAP = 1500;
    private static final double EPS = Math.ulp(1.0);
    private static final double WINDOW = 40; // exp(-40) < 4.3e-18
    private static final GaussLegendre RULE = GaussLegendre.of(20);

    private final Expression source;
    private final Expression rate;
    private final Expression curvature;
    private final int rAt;
    private final int tAt;
    private final int arity;
    private final ThreadLocal<double[]> scratch;
    private final int n;
    private final double radius;
    private final double alpha;
    private final double rhoC;
    private final boolean flux;
    private final double surfaceLag; // k/h for convection, 0 for a temperature surface
    private final boolean sphere;
    private final DoubleUnaryOperator mode;
    /** sup |F| over the samples times 1.1. */
    final double sup;
    private final double rateAtStart;
    private final double curvatureSup;
    private final double weightRoot;
    private final double horizon;

    /**
     * @param h the surface's heat transfer coefficient: infinite for a temperature surface, 0 for a flux
     * @param mode X(x) at x = beta r
     */
    RadialChange(Expression source, boolean sphere, double radius, double k, double rhoC, double h, double horizon,
        DoubleUnaryOperator mode) {
        if (source.mayBeNonSmoothIn("t")) {
            throw new OracleException(Reason.UNSUPPORTED, "source: " + source.source() + " changes in time other than"
                + " uniformly and has abs, min, max or step of t; the cylinder's and sphere's series for such a change"
                + " needs a source smooth in t (write a switch-on as a smooth ramp such as 1 - exp(-t/tau))");
        }
        this.source = source;
        this.rate = source.derivative("t");
        this.curvature = rate.derivative("t");
        this.rAt = source.variables().indexOf("r");
        this.tAt = source.variables().indexOf("t");
        this.arity = source.variables().size();
        this.scratch = ThreadLocal.withInitial(() -> new double[arity]);
        this.sphere = sphere;
        this.n = sphere ? 2 : 1;
        this.radius = radius;
        this.alpha = k / rhoC;
        this.rhoC = rhoC;
        this.flux = h == 0;
        this.surfaceLag = h == Double.POSITIVE_INFINITY || h == 0 ? 0 : k / h;
        this.mode = mode;
        this.weightRoot = Math.sqrt(Math.pow(radius, n + 1) / (n + 1));
        this.horizon = horizon;
        double s0 = 0;
        double s1 = 0;
        double s2 = 0;
        for (int i = 0; i <= 32; i++) {
            double r = radius * i / 32;
            double q0 = at(source, r, 0);
            s1 = Math.max(s1, Math.abs(at(rate, r, 0)));
            for (int j = 0; j <= 64; j++) {
                double t = horizon * j / 64;
                s0 = Math.max(s0, Math.abs(at(source, r, t) - q0));
                s2 = Math.max(s2, Math.abs(at(curvature, r, t)));
            }
        }
        this.sup = 1.1 * s0;
        this.rateAtStart = 1.1 * s1;
        this.curvatureSup = 1.1 * s2;
    }

    /** F, F_t or F_tt (of Q, Q_t, Q_tt) at (r, t), in K/s, K/s^2, K/s^3. */
    private double at(Expression e, double r, double t) {
        // called some 10^5 times per slice from the time grid's loops: one argument array per thread
        double[] args = scratch.get();
        if (rAt >= 0) {
            args[rAt] = r;
        }
        if (tAt >= 0) {
            args[tAt] = t;
        }
        double v = e.value(args) / rhoC;
        if (!Double.isFinite(v)) {
            throw new OracleException(Reason.DATA_NOT_FINITE, "source: " + e.source() + " is " + v * rhoC + " at r = "
                + r + " m, t = " + t + " s");
        }
        return v;
    }

    private double change(double r, double t) {
        return at(source, r, t) - at(source, r, 0);
    }

    /**
     * The tails of the change's modes from each index {@code from} = 0..beta.length at time t: values
     * ([0][from]) and slopes ([1][from]), (||F_tt|| + ||F_t(0)|| min(1/t, lambda)) S_3 with
     * S_p = sum_{i >= from} ||X_i||^-1 lambda_i^-p beta_i^g: exact over the computed modes, then with
     * beta_i >= i pi / R, beta_i <= 2 i pi / R and ||X_i||^-1 <= 2 pi sqrt(i)/R (cylinder) or
     * 2 i pi/(R sqrt(0.42 R)) (sphere), the sum over i by its integral from (past - 1).
     */
    double[][] tails(double[] beta, double[] norm, double t) {
        int size = beta.length;
        double a = curvatureSup * weightRoot;
        double b = rateAtStart * weightRoot;
        double[][] out = new double[2][size + 1];
        int past = Math.max(size, 2);
        double c = Math.PI / radius;
        for (int g = 0; g <= 1; g++) {
            double[] s = new double[4];
            for (int p = 2; p <= 3; p++) {
                double factor = (sphere ? 2 * Math.PI / (radius * Math.sqrt(0.42 * radius)) : 2 * Math.PI / radius)
                    * Math.pow(2 * c, g) / (Math.pow(alpha, p) * Math.pow(c, 2 * p));
                double e = 2 * p - g - (sphere ? 1 : 0.5);
                s[p] = factor * Math.pow(past - 1, 1 - e) / (e - 1);
            }
            out[g][size] = a * s[3] + b * Math.min(s[3] / t, s[2]);
            for (int i = size - 1; i >= 0; i--) {
                double l = alpha * beta[i] * beta[i];
                if (l > 0) {
                    double w = Math.pow(beta[i], g) / Math.sqrt(norm[i]);
                    s[2] += w / (l * l);
                    s[3] += w / (l * l * l);
                }
                out[g][i] = a * s[3] + b * Math.min(s[3] / t, s[2]);
            }
        }
        return out;
    }

    /**
     * The change's part at time t > 0, with modes 0..count-1 of the given tables; {@code budget} (K) the
     * slice's allowance, of which F_tt's interpolant in r may use 1/16.
     */
    At at(double t, double[] beta, double[] norm, int count, double budget) {
        return new At(t, beta, norm, count, budget);
    }

    /** A^+ G as a radial steady solve. */
    final class Inverse {
        private final double[] j;
        private final double[] jIntegral;
        private final double atSurface;
        /** Bounds of the errors of value and slope. */
        final double error;
        final double slopeError;
        /** sup |A^+ G| over 33 radii, for the rounding count. */
        final double size;

        Inverse(DoubleUnaryOperator given) {
            DoubleUnaryOperator g = given;
            double meanError = 0;
            if (flux) {
                double[] means = new double[2];
                int[] orders = {64, 96};
                for (int pass = 0; pass < 2; pass++) {
                    GaussLegendre rule = GaussLegendre.of(orders[pass]);
                    double sum = 0;
                    for (int i = 0; i < rule.nodes.length; i++) {
                        double r = 0.5 * radius * (rule.nodes[i] + 1);
                        sum += 0.5 * radius * rule.weights[i] * Math.pow(r, n) * given.applyAsDouble(r);
                    }
                    means[pass] = sum * (n + 1) / Math.pow(radius, n + 1);
                }
                double mean = means[1];
                meanError = 10 * Math.abs(means[1] - means[0]);
                g = r -> given.applyAsDouble(r) - mean;
            }
            Flux fluxOf = radialFlux(g, n, radius);
            DoubleUnaryOperator exact = fluxOf.j();
            double[] c = null;
            for (int size = 17; ; size = 2 * size - 1) {
                c = Chebyshev.interpolate(exact, 0, radius, size);
                if (Chebyshev.resolved(c)) {
                    break;
                }
                if (size >= 1025) {
                    throw new OracleException(Reason.DATA_NOT_RESOLVED, "source: its change in time is too rough in r"
                        + " for a Chebyshev series of degree 1024");
                }
            }
            this.j = c;
            double[] integral = Chebyshev.antiderivative(c, 0, radius);
            integral[0] -= Chebyshev.value(integral, -1);
            this.jIntegral = integral;
            SplittableRandom random = new SplittableRandom(20261202L);
            double err = 0;
            for (int i = 0; i < 64; i++) {
                double r = random.nextDouble() * radius;
                err = Math.max(err, Math.abs(exact.applyAsDouble(r) - Chebyshev.value(j, Chebyshev.reference(r, 0,
                    radius))));
            }
            double jErr = 10 * err + 8 * EPS * Chebyshev.absSum(j) + fluxOf.error();
            double whole = Chebyshev.value(jIntegral, 1);
            double surface;
            double valueError = jErr * radius / alpha;
            if (flux) {
                // P(R) such that the mean of P = P(R) + (K(R) - K(r))/alpha with weight r^n is 0
                GaussLegendre m = GaussLegendre.of(64);
                double sum = 0;
                for (int i = 0; i < m.nodes.length; i++) {
                    double r = 0.5 * radius * (m.nodes[i] + 1);
                    sum += 0.5 * radius * m.weights[i] * Math.pow(r, n) * (whole - Chebyshev.value(jIntegral,
                        Chebyshev.reference(r, 0, radius))) / alpha;
                }
                surface = -sum * (n + 1) / Math.pow(radius, n + 1);
                valueError *= 2;
            } else {
                surface = surfaceLag * Chebyshev.value(j, 1) / alpha;
                valueError += surfaceLag * jErr / alpha;
            }
            this.atSurface = surface;
            double gain = 2 * (radius * radius + surfaceLag * radius) / ((n + 1) * alpha);
            this.error = valueError + gain * meanError;
            this.slopeError = jErr / alpha + 2 * radius * meanError / ((n + 1) * alpha);
            double s = 0;
            for (int i = 0; i <= 32; i++) {
                s = Math.max(s, Math.abs(value(radius * i / 32)));
            }
            this.size = s;
        }

        double value(double r) {
            return atSurface + (Chebyshev.value(jIntegral, 1) - Chebyshev.value(jIntegral, Chebyshev.reference(r, 0,
                radius))) / alpha;
        }

        double slope(double r) {
            return -Chebyshev.value(j, Chebyshev.reference(r, 0, radius)) / alpha;
        }

        /** The mean over a < r < b (weight r^n) by two Gauss-Legendre rules; [mean, error]. */
        double[] mean(double a, double b) {
            double[] sums = shellMeans(this::value, n, a, b);
            return new double[] {sums[1], error + 10 * Math.abs(sums[1] - sums[0])};
        }
    }

    /** The change's part at one time: the two quasi-static solves, the mean rise and the modes of z. */
    final class At {
        final Inverse first;
        final Inverse second;
        /** The mean rise m(t) of a flux surface (0 otherwise) and its error. */
        final double mean;
        final double meanError;
        /** z_i(t) for i < count (0 for the zero mode). */
        final double[] modes;
        /** Bounds of the quadrature errors of z's computed modes in values and slopes. */
        final double quadrature;
        final double quadratureSlope;

        private At(double t, double[] beta, double[] norm, int count, double budget) {
            double[] lambda = new double[count];
            for (int i = 0; i < count; i++) {
                lambda[i] = alpha * beta[i] * beta[i];
            }
            int nq = (int) Math.ceil(1.6 * count + 40);
            double[][] matrix = projections(beta, norm, count, nq);
            double[] nodes = radialNodes(nq);
            int fine = nq + nq / 4 + 8;
            double[] fineNodes = radialNodes(fine);
            double[][] fineMatrix = projections(beta, norm, count, fine);
            // the slow modes (lambda T < 1, a body that keeps its heat) are taken out of the quasi-static solves,
            // which would otherwise divide by lambda^2, and solved by Duhamel's integral of F itself
            int slowCount = 0;
            while (slowCount < count && (lambda[slowCount] == 0 || lambda[slowCount] * horizon < 1)) {
                slowCount++;
            }
            int[] slow = new int[slowCount];
            int ns = 0;
            for (int i = 0; i < slowCount; i++) {
                if (lambda[i] > 0) {
                    slow[ns++] = i;
                }
            }
            slow = java.util.Arrays.copyOf(slow, ns);
            double[] sweep = new double[2];
            DoubleUnaryOperator change = r -> change(r, t);
            DoubleUnaryOperator rateNow = r -> at(rate, r, t);
            double[] changeSlow = slowProjections(change, slow, matrix, fineMatrix, nodes, fineNodes, sweep, 0);
            double[] rateSlow = slowProjections(rateNow, slow, matrix, fineMatrix, nodes, fineNodes, sweep, 1);
            this.first = new Inverse(without(change, slow, changeSlow, beta));
            Inverse rateSolve = new Inverse(without(rateNow, slow, rateSlow, beta));
            // A^+ of the rate's fast part, its slow content (rounding) taken out again before the second solve
            double[] innerSlow = slowProjections(rateSolve::value, slow, matrix, fineMatrix, nodes, fineNodes, sweep, 1);
            Inverse nested = new Inverse(without(rateSolve::value, slow, innerSlow, beta));
            // the error of the inner solve passes through the outer one with its gain
            double gain = 2 * (radius * radius + surfaceLag * radius) / ((n + 1) * alpha);
            this.second = nested;
            double innerValue = gain * rateSolve.error;
            double innerSlope = 2 * radius * rateSolve.error / ((n + 1) * alpha);
            // a slow projection's error e leaves e X_i / lambda_i (first solve) or e X_i / lambda_i (second, from the
            // re-projected inner solve) behind: |X_i| <= 1, |X_i'| <= beta_i
            double slowValue = 0;
            double slowSlope = 0;
            for (int i : slow) {
                double e = (sweep[0] + sweep[1]) / lambda[i];
                slowValue += e;
                slowSlope += e * beta[i];
            }
            double density = density(t);
            if (flux) {
                double coarse = meanRise(t, density, 1);
                double fineRise = meanRise(t, density, 2);
                this.mean = fineRise;
                this.meanError = 10 * Math.abs(fineRise - coarse) + 1e-14 * t * sup;
            } else {
                this.mean = 0;
                this.meanError = 0;
            }
            // the fast modes' rates; the slow ones' are 0 from here on and their modes come from F directly
            double[] fast = lambda.clone();
            for (int i : slow) {
                fast[i] = 0;
            }
            // F_tt(., s) as a Chebyshev interpolant of d points in r; its projections through the matrix
            // G[i][j] = <l_j, X_i> / ||X_i||^2 (l_j the Lagrange polynomials), by Gauss-Legendre with nq nodes
            double gauge = 0;
            double gaugeSlope = 0;
            for (int i = 0; i < count; i++) {
                if (fast[i] > 0) {
                    double weight = weightRoot / (Math.sqrt(norm[i]) * Math.pow(fast[i], 3));
                    gauge += weight;
                    gaugeSlope += weight * beta[i];
                }
            }
            double[] represented = gauge > 0 ? radialSize(t, Math.min(budget / (16 * gauge), budget / (16 * radius
                * gaugeSlope))) : new double[] {9, 0};
            int d = (int) represented[0];
            double representation = represented[1];
            double[][] lagrange = lagrangeProjections(matrix, nodes, d);
            double[] cheb = Chebyshev.nodes(0, radius, d);
            double[] initialRate = new double[nq];
            for (int q = 0; q < nq; q++) {
                initialRate[q] = at(rate, nodes[q], 0);
            }
            double[] z = new double[count];
            int slowest = -1;
            for (int i = 0; i < count; i++) {
                if (fast[i] > 0) {
                    double p = dot(matrix[i], initialRate);
                    z[i] = Math.exp(-fast[i] * t) * p / (fast[i] * fast[i]);
                    if (slowest < 0 || fast[i] < fast[slowest]) {
                        slowest = i;
                    }
                }
            }
            double[] integrals = new double[count];
            duhamel(lagrange, fast, 0, count, t, density, 1, cheb, integrals);
            double sumValue = 0;
            double sumSlope = 0;
            for (int i = 0; i < count; i++) {
                if (fast[i] > 0) {
                    z[i] += integrals[i] / (fast[i] * fast[i]);
                    double weight = weightRoot / (Math.sqrt(norm[i]) * Math.pow(fast[i], 3));
                    sumValue += weight;
                    sumSlope += weight * beta[i];
                }
            }
            double[] direct = slowModes(slow, lambda, matrix, nodes, t, density);
            for (int k = 0; k < slow.length; k++) {
                int i = slow[k];
                z[i] = direct[2 * k];
                slowValue += direct[2 * k + 1] + 10 * sweep[0] * t;
                slowSlope += (direct[2 * k + 1] + 10 * sweep[0] * t) * beta[i];
            }
            this.modes = z;
            double relative = 0;
            if (slowest >= 0 && curvatureSup > 0) {
                double l = fast[slowest];
                double doubled = uniformIntegral(lagrange[slowest], cheb, l, t, density);
                double scaleOf = curvatureSup * weightRoot / Math.sqrt(norm[slowest]) / l;
                relative = Math.abs(doubled - integrals[slowest]) / scaleOf + 1e-14;
            }
            // the radial rule against one 25 % finer, at s = t and t/2 and for the initial rate
            double[][] fineLagrange = lagrangeProjections(fineMatrix, fineNodes, d);
            double radial = 0;
            double radialSlope = 0;
            double[] worst = new double[count];
            for (double s : new double[] {t, t / 2, -1}) {
                double[] coarseF;
                double[] fineF;
                double[][] coarseM;
                double[][] fineM;
                if (s < 0) {
                    coarseF = initialRate;
                    fineF = new double[fine];
                    for (int q = 0; q < fine; q++) {
                        fineF[q] = at(rate, fineNodes[q], 0);
                    }
                    coarseM = matrix;
                    fineM = fineMatrix;
                } else {
                    coarseF = new double[d];
                    for (int q = 0; q < d; q++) {
                        coarseF[q] = at(curvature, cheb[q], s);
                    }
                    fineF = coarseF;
                    coarseM = lagrange;
                    fineM = fineLagrange;
                }
                for (int i = 0; i < count; i++) {
                    if (fast[i] == 0) {
                        continue;
                    }
                    double e = 10 * Math.abs(dot(coarseM[i], coarseF) - dot(fineM[i], fineF));
                    // the curvature's projection error acts through int e^{-lambda (t-s)} ds / lambda^2 <= 1/lambda^3,
                    // the initial rate's through e^{-lambda t} / lambda^2
                    double effect = s < 0 ? e * Math.exp(-fast[i] * t) / (fast[i] * fast[i]) : e / Math.pow(fast[i], 3);
                    worst[i] = Math.max(worst[i], effect);
                }
            }
            for (int i = 0; i < count; i++) {
                radial += worst[i];
                radialSlope += worst[i] * beta[i];
            }
            // rounding in the sums over the radial nodes and the panels
            double rounding = 0;
            double roundingSlope = 0;
            for (int i = 0; i < count; i++) {
                if (fast[i] > 0) {
                    double r = 4 * EPS * nq * (curvatureSup * t * absSum(lagrange[i]) + rateAtStart * absSum(matrix[i]))
                        / (fast[i] * fast[i]);
                    rounding += r;
                    roundingSlope += r * beta[i];
                }
            }
            // an error e of the interpolant in F_tt moves mode i by at most e ||1|| / (||X_i|| lambda_i^3)
            double spread = relative * curvatureSup + representation;
            this.quadrature = spread * sumValue + radial + rounding + innerValue + slowValue;
            this.quadratureSlope = spread * sumSlope + radialSlope + roundingSlope + innerSlope + slowSlope;
        }

        /** g minus sum over the slow modes of p_k X_k. */
        private DoubleUnaryOperator without(DoubleUnaryOperator g, int[] slow, double[] p, double[] beta) {
            if (slow.length == 0) {
                return g;
            }
            return r -> {
                double v = g.applyAsDouble(r);
                for (int k = 0; k < slow.length; k++) {
                    v -= p[k] * mode.applyAsDouble(beta[slow[k]] * r);
                }
                return v;
            };
        }

        /** A^+ F - A^+2 F_t + m at r. */
        double value(double r) {
            return first.value(r) - second.value(r) + mean;
        }

        double slope(double r) {
            return first.slope(r) - second.slope(r);
        }

        /** Bound of the errors of {@link #value} (the quasi-static solves and the mean). */
        double valueError() {
            return first.error + second.error + meanError;
        }

        double slopeError() {
            return first.slopeError + second.slopeError;
        }

        /** sup |A^+ F| + sup |A^+2 F_t| + |m|, for the rounding count. */
        double size() {
            return first.size + second.size + Math.abs(mean);
        }

        /** The shell mean of {@link #value} over a < r < b: [mean, error]. */
        double[] shellMean(double a, double b) {
            double[] p = first.mean(a, b);
            double[] q = second.mean(a, b);
            return new double[] {p[0] - q[0] + mean, p[1] + q[1] + meanError};
        }
    }

    /**
     * The number d of Chebyshev points in r (9, 17, 33, ... 257) whose interpolant of F_tt(., s) at
     * s = 0, t/4, t/2, 3t/4 and t is within {@code limit} (K/s^3) or resolves it to rounding (the last four
     * coefficients below 1e-15 of the largest), the error measured at eight random radii per time, times 10,
     * plus rounding: [d, error].
     */
    private double[] radialSize(double t, double limit) {
        double[] times = {0, t / 4, t / 2, 3 * t / 4, t};
        SplittableRandom random = new SplittableRandom(20261203L);
        double[][] probes = new double[times.length][8];
        for (double[] row : probes) {
            for (int i = 0; i < row.length; i++) {
                row[i] = random.nextDouble() * radius;
            }
        }
        double[][] exact = new double[times.length][8];
        for (int k = 0; k < times.length; k++) {
            for (int i = 0; i < 8; i++) {
                exact[k][i] = at(curvature, probes[k][i], times[k]);
            }
        }
        for (int size = 9; ; size = 2 * size - 1) {
            double err = 0;
            boolean resolved = true;
            for (int k = 0; k < times.length; k++) {
                double s = times[k];
                double[] c = Chebyshev.interpolate(r -> at(curvature, r, s), 0, radius, size);
                resolved &= Chebyshev.resolved(c);
                for (int i = 0; i < 8; i++) {
                    double r = probes[k][i];
                    err = Math.max(err, Math.abs(exact[k][i] - Chebyshev.value(c, Chebyshev.reference(r, 0, radius)))
                        + 8 * EPS * Chebyshev.absSum(c));
                }
            }
            if (resolved || 10 * err <= limit) {
                return new double[] {size, 10 * err};
            }
            if (size >= 257) {
                throw new OracleException(Reason.DATA_NOT_RESOLVED, "source: its second time derivative is too rough in"
                    + " r for a Chebyshev series of degree 256 (error " + 10 * err + " K/s^3 for a limit of " + limit
                    + "); smooth the source's change in time or loosen the tolerance");
            }
        }
    }

    /**
     * G[i][j] = sum_q M[i][q] l_j(r_q): the projections of the Lagrange polynomials at the d Chebyshev
     * points, l_j = sum_k V_kj T_k with V_kj = (2/d) cos(pi k (2j + 1)/(2d)) (halved at k = 0).
     */
    private double[][] lagrangeProjections(double[][] m, double[] nodes, int d) {
        int nq = nodes.length;
        double[][] v = new double[d][d];
        for (int k = 0; k < d; k++) {
            for (int j = 0; j < d; j++) {
                v[k][j] = (k == 0 ? 1.0 : 2.0) / d * Math.cos(Math.PI * k * (2 * j + 1) / (2.0 * d));
            }
        }
        double[][] ell = new double[nq][d];
        double[] tk = new double[d];
        for (int q = 0; q < nq; q++) {
            double x = Chebyshev.reference(nodes[q], 0, radius);
            tk[0] = 1;
            if (d > 1) {
                tk[1] = x;
            }
            for (int k = 2; k < d; k++) {
                tk[k] = 2 * x * tk[k - 1] - tk[k - 2];
            }
            for (int k = 0; k < d; k++) {
                double a = tk[k];
                double[] row = v[k];
                double[] out = ell[q];
                for (int j = 0; j < d; j++) {
                    out[j] += a * row[j];
                }
            }
        }
        double[][] g = new double[m.length][d];
        for (int i = 0; i < m.length; i++) {
            double[] row = m[i];
            double[] out = g[i];
            for (int q = 0; q < nq; q++) {
                double a = row[q];
                double[] e = ell[q];
                for (int j = 0; j < d; j++) {
                    out[j] += a * e[j];
                }
            }
        }
        return g;
    }

    /** J as an operator on r and the measured error of its quadrature (K m/s for a source in K/s). */
    record Flux(DoubleUnaryOperator j, double error) {
    }

    /**
     * J(r) = r int_0^1 s^n g(r s) ds = r^-n int_0^r s^n g(s) ds, the radial steady solve's flux, on P equal
     * panels of 20-point Gauss-Legendre rules in s: P doubles from 2 until J at r = R i/16 (i = 1..16)
     * agrees with 2P panels to 1e-15 of max |J| (or of R max |g| when J nearly cancels); the operator uses
     * P panels and its error is 10 times the last difference (past 1024 panels, a feature narrower than
     * about R/2000, that difference stands as the error). A fixed rule would not do: for a heater 1/50 of
     * the radius wide, 40 points leave 1e-5 of the answer and measure nothing.
     */
    static Flux radialFlux(DoubleUnaryOperator g, int n, double radius) {
        return radialFlux(g, n, radius, 0);
    }

    /** As above, {@code scale} a size of J below which its differences do not matter (0: none). */
    static Flux radialFlux(DoubleUnaryOperator g, int n, double radius, double scale) {
        double[] previous = fluxAt(g, n, radius, 2);
        // the scale of J: its largest value, R max |g| when J nearly cancels (a source balanced by a drift), or
        // the caller's
        double floor = scale;
        for (int i = 0; i <= 32; i++) {
            floor = Math.max(floor, radius * Math.abs(g.applyAsDouble(radius * i / 32)));
        }
        for (int panels = 2; ; panels *= 2) {
            double[] next = fluxAt(g, n, radius, 2 * panels);
            double diff = 0;
            double max = floor;
            for (int i = 0; i < next.length; i++) {
                diff = Math.max(diff, Math.abs(next[i] - previous[i]));
                max = Math.max(max, Math.abs(next[i]));
            }
            if (diff <= 1e-15 * max || max == 0) {
                // the coarser of the two: the difference measures its error, and it costs half
                int used = panels;
                double error = 10 * diff;
                return new Flux(r -> fluxValue(g, n, r, used), error);
            }
            if (panels >= 512) {
                // not settled (a feature narrower than about R/2000): the measured difference is the error, and a
                // bound it makes too large is refused where it is used
                int used = 2 * panels;
                return new Flux(r -> fluxValue(g, n, r, used), 10 * diff);
            }
            previous = next;
        }
    }

    private static double[] fluxAt(DoubleUnaryOperator g, int n, double radius, int panels) {
        double[] out = new double[16];
        for (int i = 1; i <= 16; i++) {
            out[i - 1] = fluxValue(g, n, radius * i / 16, panels);
        }
        return out;
    }

    private static double fluxValue(DoubleUnaryOperator g, int n, double r, int panels) {
        double h = 1.0 / panels;
        double sum = 0;
        for (int p = 0; p < panels; p++) {
            double mid = (p + 0.5) * h;
            double part = 0;
            for (int i = 0; i < RULE.nodes.length; i++) {
                double s = mid + 0.5 * h * RULE.nodes[i];
                part += RULE.weights[i] * (n == 1 ? s : s * s) * g.applyAsDouble(r * s);
            }
            sum += 0.5 * h * part;
        }
        return r * sum;
    }

    /** The mean of f over a < r < b with weight r^n by 24- and 36-point Gauss-Legendre rules: [coarse, fine]. */
    static double[] shellMeans(DoubleUnaryOperator f, int n, double a, double b) {
        double area = (Math.pow(b, n + 1) - Math.pow(a, n + 1)) / (n + 1);
        double[] sums = new double[2];
        int[] orders = {24, 36};
        for (int pass = 0; pass < 2; pass++) {
            GaussLegendre g = GaussLegendre.of(orders[pass]);
            double sum = 0;
            for (int i = 0; i < g.nodes.length; i++) {
                double r = 0.5 * (a + b) + 0.5 * (b - a) * g.nodes[i];
                sum += 0.5 * (b - a) * g.weights[i] * Math.pow(r, n) * f.applyAsDouble(r);
            }
            sums[pass] = sum / area;
        }
        return sums;
    }

    private static double absSum(double[] v) {
        double s = 0;
        for (double x : v) {
            s += Math.abs(x);
        }
        return s;
    }

    private static double dot(double[] a, double[] b) {
        double s = 0;
        for (int i = 0; i < b.length; i++) {
            s += a[i] * b[i];
        }
        return s;
    }

    private double[] radialNodes(int nq) {
        GaussLegendre g = GaussLegendre.of(nq);
        double[] r = new double[nq];
        for (int q = 0; q < nq; q++) {
            r[q] = 0.5 * radius * (g.nodes[q] + 1);
        }
        return r;
    }

    private double[][] projections(double[] beta, double[] norm, int count, int nq) {
        GaussLegendre g = GaussLegendre.of(nq);
        double[][] m = new double[count][nq];
        for (int q = 0; q < nq; q++) {
            double r = 0.5 * radius * (g.nodes[q] + 1);
            double w = 0.5 * radius * g.weights[q] * Math.pow(r, n);
            for (int i = 0; i < count; i++) {
                m[i][q] = w * mode.applyAsDouble(beta[i] * r) / norm[i];
            }
        }
        return m;
    }

    private static int window(double lambda, double t) {
        return lambda * t <= WINDOW ? 0 : (int) Math.floor(Math.log(lambda * t / WINDOW) / Math.log(2));
    }

    /**
     * Panels per unit time at which int_0^t sum_j F_tt(r_j, s)^2 ds over five radii settles to 1e-14
     * (panels doubled up to 4096).
     */
    private double density(double t) {
        int panels = 1;
        double previous = squares(t, panels);
        while (panels < 4096) {
            double next = squares(t, 2 * panels);
            panels *= 2;
            boolean settled = Math.abs(next - previous) <= 1e-14 * Math.max(next, 1e-300);
            previous = next;
            if (settled) {
                break;
            }
        }
        return panels / t;
    }

    private double squares(double t, int panels) {
        double h = t / panels;
        double sum = 0;
        for (int p = 0; p < panels; p++) {
            double mid = (p + 0.5) * h;
            for (int q = 0; q < RULE.nodes.length; q++) {
                double s = mid + 0.5 * h * RULE.nodes[q];
                for (int j = 0; j < 5; j++) {
                    double v = at(curvature, radius * (0.1 + 0.2 * j), s);
                    sum += RULE.weights[q] * v * v;
                }
            }
        }
        return 0.5 * h * sum;
    }

    /** m(t) = int_0^t mean F(., s) ds (weight r^n) on panels at the density (refined by a factor). */
    private double meanRise(double t, double density, int refine) {
        int panels = refine * (int) Math.max(10, Math.ceil(t * density));
        double h = t / panels;
        GaussLegendre g = GaussLegendre.of(64);
        double sum = 0;
        for (int p = 0; p < panels; p++) {
            double mid = (p + 0.5) * h;
            for (int node = 0; node < RULE.nodes.length; node++) {
                double s = mid + 0.5 * h * RULE.nodes[node];
                double inner = 0;
                for (int i = 0; i < g.nodes.length; i++) {
                    double r = 0.5 * radius * (g.nodes[i] + 1);
                    inner += 0.5 * radius * g.weights[i] * Math.pow(r, n) * change(r, s);
                }
                sum += RULE.weights[node] * inner;
            }
        }
        return 0.5 * h * sum * (n + 1) / Math.pow(radius, n + 1);
    }

    /**
     * The projections of g on the slow modes by the nq-node rule; the largest difference to the finer
     * rule, times 10, plus rounding (4 eps nq sup |g| sum |M|) goes to {@code sweep[slot]} (kept as the maximum).
     */
    private double[] slowProjections(DoubleUnaryOperator g, int[] slow, double[][] m, double[][] fineM, double[] nodes,
        double[] fineNodes, double[] sweep, int slot) {
        double[] p = new double[slow.length];
        if (slow.length == 0) {
            return p;
        }
        double[] v = new double[nodes.length];
        double size = 0;
        for (int q = 0; q < nodes.length; q++) {
            v[q] = g.applyAsDouble(nodes[q]);
            size = Math.max(size, Math.abs(v[q]));
        }
        double[] fv = new double[fineNodes.length];
        for (int q = 0; q < fineNodes.length; q++) {
            fv[q] = g.applyAsDouble(fineNodes[q]);
        }
        for (int k = 0; k < slow.length; k++) {
            int i = slow[k];
            p[k] = dot(m[i], v);
            double e = 10 * Math.abs(p[k] - dot(fineM[i], fv)) + 4 * EPS * nodes.length * size * absSum(m[i]);
            sweep[slot] = Math.max(sweep[slot], e);
        }
        return p;
    }

    /**
     * The slow modes' full response int_0^t e^{-lambda (t - s)} F_i(s) ds, on uniform panels over [0, t] at the
     * density (at least 10) against twice as many: [value, 10 |difference| + rounding] per mode.
     */
    private double[] slowModes(int[] slow, double[] lambda, double[][] m, double[] nodes, double t, double density) {
        double[] out = new double[2 * slow.length];
        if (slow.length == 0) {
            return out;
        }
        double[][] sums = new double[2][slow.length];
        double[] f = new double[nodes.length];
        for (int refine = 1; refine <= 2; refine++) {
            int panels = refine * (int) Math.max(10, Math.ceil(t * density));
            double h = t / panels;
            for (int p = 0; p < panels; p++) {
                double mid = (p + 0.5) * h;
                for (int node = 0; node < RULE.nodes.length; node++) {
                    double s = mid + 0.5 * h * RULE.nodes[node];
                    for (int q = 0; q < nodes.length; q++) {
                        f[q] = change(nodes[q], s);
                    }
                    double w = 0.5 * h * RULE.weights[node];
                    for (int k = 0; k < slow.length; k++) {
                        int i = slow[k];
                        sums[refine - 1][k] += w * Math.exp(-lambda[i] * (t - s)) * dot(m[i], f);
                    }
                }
            }
        }
        for (int k = 0; k < slow.length; k++) {
            out[2 * k] = sums[1][k];
            out[2 * k + 1] = 10 * Math.abs(sums[1][k] - sums[0][k]) + 1e-14 * t * sup * absSum(m[slow[k]]);
        }
        return out;
    }

    /**
     * The slowest mode's Duhamel integral of F_tt on a second grid: its window at twice the density, in uniform
     * panels (at least 20), against which the graded grid's result is checked.
     */
    private double uniformIntegral(double[] row, double[] nodes, double lambda, double t, double density) {
        int k = window(lambda, t);
        double width = t / Math.pow(2, k);
        int panels = 2 * (int) Math.max(10, Math.ceil(width * density));
        double h = width / panels;
        double[] f = new double[nodes.length];
        double sum = 0;
        for (int p = 0; p < panels; p++) {
            double mid = t - width + (p + 0.5) * h;
            for (int node = 0; node < RULE.nodes.length; node++) {
                double s = mid + 0.5 * h * RULE.nodes[node];
                for (int q = 0; q < nodes.length; q++) {
                    f[q] = at(curvature, nodes[q], s);
                }
                sum += 0.5 * h * RULE.weights[node] * Math.exp(-lambda * (t - s)) * dot(row, f);
            }
        }
        return sum;
    }

    /**
     * out[i] += int_0^t e^{-lambda_i (t - s)} (F_tt)_i(s) ds for first <= i < last (lambda_i > 0), by 20-point
     * Gauss-Legendre on a graded grid toward t shared by every mode: annulus j, t - t/2^j < s < t - t/2^(j+1), with
     * max(5, width x density) panels, down to the innermost window of the fastest mode, t/2^K wide with
     * max(10, width x density) panels (all times {@code refine}). Mode i, of window k (lambda_i t / 2^k in
     * (40, 80]), sums annuli k..K, where lambda_i times a panel's width is at most 8, as on the windows of
     * {@link ScheduleIntegral}; each node's values of F_tt serve every mode.
     */
    private void duhamel(double[][] rows, double[] lambda, int first, int last, double t, double density, int refine,
        double[] cheb, double[] out) {
        int start = Integer.MAX_VALUE;
        int top = -1;
        int[] windowOf = new int[last];
        for (int i = first; i < last; i++) {
            if (lambda[i] > 0) {
                windowOf[i] = window(lambda[i], t);
                start = Math.min(start, windowOf[i]);
                top = Math.max(top, windowOf[i]);
            }
        }
        double[] f = new double[cheb.length];
        for (int j = start; j <= top; j++) {
            double lo = t - t / Math.pow(2, j);
            double hi = j < top ? t - t / Math.pow(2, j + 1) : t;
            int panels = refine * (int) Math.max(j < top ? 5 : 10, Math.ceil((hi - lo) * density));
            double h = (hi - lo) / panels;
            for (int p = 0; p < panels; p++) {
                double mid = lo + (p + 0.5) * h;
                for (int node = 0; node < RULE.nodes.length; node++) {
                    double s = mid + 0.5 * h * RULE.nodes[node];
                    for (int q = 0; q < cheb.length; q++) {
                        f[q] = at(curvature, cheb[q], s);
                    }
                    double w = 0.5 * h * RULE.weights[node];
                    for (int i = first; i < last; i++) {
                        if (lambda[i] > 0 && windowOf[i] <= j) {
                            out[i] += w * Math.exp(-lambda[i] * (t - s)) * dot(rows[i], f);
                        }
                    }
                }
            }
        }
    }
}

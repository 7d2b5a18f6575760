package eigencheck.oracle.series;

import eigencheck.oracle.Evaluation;
import eigencheck.oracle.OracleException;
import eigencheck.oracle.OracleException.Reason;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.modes.SlabModes;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Slab;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.SplittableRandom;
import org.apache.commons.math3.analysis.differentiation.DerivativeStructure;
import org.apache.commons.math3.special.Erf;

/**
 * Eigenfunction-series solution of rho c u_t = k u_xx + Q(x, t) on a slab 0 < x < L, each face
 * Dirichlet, Neumann or Robin with data that vary in time; see the package documentation of
 * {@code eigencheck.oracle} for the mathematics. Outline:
 * <ol>
 * <li>Lifting w(x, t) = beta_0(x) b_0(t) + beta_1(x) b_1(t), linear in x (quadratic for Neumann at
 * both faces), satisfies both conditions; v = u - w has homogeneous ones and the source
 * F = Q/(rho c) - w_t + alpha w_xx.</li>
 * <li>F is represented on [0, L] x [0, T] by piecewise Chebyshev series in x (panels split
 * adaptively at jumps and kinks) times one Chebyshev series in t; the data b_i(t) by Chebyshev
 * series in t; v(x, 0) = g - w(., 0) by a piecewise Chebyshev series in x. Differences to the
 * expressions are measured at random points and enter the bound.</li>
 * <li>Quasi-static subtraction: Q_J = sum_{j <= J} (-1)^j A^{-(j+1)} d^j F/dt^j, with A = -alpha
 * d^2/dx^2 under the homogeneous conditions, is a piecewise polynomial in closed form (exact
 * double integration of the series). What is left in mode n is
 * e_n(t) = [c_n - P_n(0)] exp(-lambda_n t) + sum_{j > J} (-1)^j F_n^(j)(t)/lambda_n^(j+1),
 * P_n the polynomial solution of P' + lambda_n P = F_n (finite, as F_n is a polynomial in t), which
 * decays like n^-(2J+5) plus an exponentially small part. High modes use that closed form
 * (the resolvent solved by a backward Chebyshev recurrence); low modes, where it would cancel,
 * integrate Duhamel's integral by Gauss-Legendre on the window where the kernel matters.</li>
 * <li>Truncation after N modes with bounds from integration by parts (|F_n^(j)| <= B_j/(mu_n ||X_n||^2),
 * B_j a variation bound of d^jF/dt^j) and from the Gaussian sum bound for exp(-lambda_n t); N is the
 * least that brings the tails below 1e-3 of the tolerance.</li>
 * </ol>
 * Thread-safe: mode tables grow under a lock and are published as immutable snapshots.
 */
public final class SlabSolver {
    /** Modes beyond this are refused; the image (heat-kernel) form for very small times is left for later. */
    static final int MAX_MODES = 6000;
    private static final double TAIL_FRACTION = 1e-3;
    /** A further subtraction is taken only while its closed-form part stays this close to the scale. */
    private static final double SUBTRACTION_GROWTH = Double.parseDouble(System.getProperty("eigencheck.growth", "1000"));
    private static final double EPS = Math.ulp(1.0);
    private static final double WINDOW = 40; // exp(-40) < 4.3e-18
    private static final int[] TIME_POINTS = {1, 9, 17, 33, 65, 129, 257, 513};

    private final double length;
    private final double conductivity;
    private final double heatCapacity;
    private final double alpha;
    private final double horizon;
    private final double tolerance;
    private final double scale;
    private final double leftH;
    private final double rightH;
    private final SlabModes modes;
    private final boolean zeroMode;
    private final boolean leftDirichlet;
    private final boolean rightDirichlet;
    private final Expression initial;
    private final double leftData0;
    private final double rightData0;
    // lifting: w = sum_i beta[i](x) b_i(t); beta monomial coefficients of degree <= 2
    private final double[][] beta;
    private final double[][] data;
    private final double[][] dataDerivative;
    // forcing F(x,t): coef[k][p][j], panels fEdges
    private final double[] fEdges;
    private final double[][][] fCoef;
    private final int nT;
    // initial v0 = g - w(.,0)
    private final double[] gEdges;
    private final double[][] gCoef;
    private final boolean[] gResolved;
    // zero mode
    private final double c0;
    private final double[] zeroAntiderivative;
    // quasi-static closed form Q_J: coef[k][p][j] on fEdges
    private final int subtractions;
    private final double[][][] qsCoef;
    // bounds
    private final double[] variation; // B_j
    private final double v0L1;
    private final double v0Variation;
    private final double deltaF;
    private final double deltaV0;
    private final double deltaData;
    private final double liftSup;
    private final double unresolvedMass;
    private final double steadyGain;
    private final GaussLegendre windowRule;

    private volatile ModeTable table;
    private final boolean steady;
    private final double rightCoefficient;

    /**
     * Prepares the series for {@code problem} on a slab over 0 <= t <= timeHorizon.
     *
     * @param tolerance relative to {@link #scale()}, in (0, 1)
     * @throws OracleException if the data are not finite or too rough to represent
     */
    public SlabSolver(Problem problem, double timeHorizon, double tolerance) {
        this(problem, timeHorizon, tolerance, Double.NaN);
    }

    /**
     * As {@link #SlabSolver(Problem, double, double)}, with the convection coefficient of a Robin
     * face at x = L replaced by {@code rightCoefficient}, which may be negative down to -k/L when
     * x = 0 is Dirichlet: what the sphere's w = r u needs at Bi < 1 (see {@link SphereMapping}).
     * NaN keeps the problem's own coefficient.
     */
    SlabSolver(Problem problem, double timeHorizon, double tolerance, double rightCoefficient) {
        if (!(problem.domain() instanceof Slab slab)) {
            throw new OracleException(Reason.UNSUPPORTED, "oracle: " + problem.domain() + " is not a slab");
        }
        if (!(tolerance > 0 && tolerance < 1)) {
            throw new IllegalArgumentException("tolerance " + tolerance + " must lie in (0, 1), for example 1e-10");
        }
        if (!(timeHorizon >= 0 && timeHorizon < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("time horizon " + timeHorizon + " s must be finite and >= 0");
        }
        this.length = slab.length();
        this.conductivity = problem.material().conductivity();
        this.heatCapacity = problem.material().volumetricHeatCapacity();
        this.alpha = problem.material().diffusivity();
        this.tolerance = tolerance;
        // a horizon of zero still needs a non-degenerate time interval for the series in t
        this.horizon = Math.max(timeHorizon, 1e-9 * length * length / alpha);
        this.initial = problem.initial();
        this.steady = problem.steady();
        BoundaryCondition left = problem.condition(Side.XMIN);
        BoundaryCondition right = problem.condition(Side.XMAX);
        this.rightCoefficient = rightCoefficient;
        this.leftH = homogeneousH(left, conductivity);
        this.rightH = Double.isNaN(rightCoefficient) ? homogeneousH(right, conductivity)
            : rightCoefficient / conductivity;
        this.leftDirichlet = left instanceof BoundaryCondition.Dirichlet;
        this.rightDirichlet = right instanceof BoundaryCondition.Dirichlet;
        this.modes = new SlabModes(length, leftH, rightH);
        this.zeroMode = modes.hasZeroMode();
        if (steady && zeroMode) {
            throw new OracleException(Reason.UNSUPPORTED, "oracle: a steady slab insulated or flux-driven on both faces"
                + " has no unique steady state (u is fixed only up to a constant, and only when the net heat input"
                + " vanishes); give a Dirichlet or Robin face, or solve the transient problem");
        }

        // boundary data in time
        this.data = new double[][] {fitTime(left.data(), "boundary.xmin"), fitTime(right.data(), "boundary.xmax")};
        this.dataDerivative = new double[][] {
            Chebyshev.derivative(data[0], 0, horizon), Chebyshev.derivative(data[1], 0, horizon)};
        this.beta = lifting(left, right);
        this.leftData0 = Chebyshev.value(data[0], -1);
        this.rightData0 = Chebyshev.value(data[1], -1);

        // source Q/(rho c) as piecewise-in-x times Chebyshev-in-t
        Expression source = problem.source();
        int sourcePoints = source.isIndependentOf("t") ? 1 : timePointsOf(source);
        double[] tNodes = sourcePoints == 1 ? new double[] {0.5 * horizon} : Chebyshev.nodes(0, horizon, sourcePoints);
        double sourceScale = sampleScale(source, tNodes);
        PiecewiseFit sourceFit = fitFamily(source, tNodes, sourceScale, "source");
        sourceScale = Math.max(sourceScale, sourceFit.scanMax);
        int dataPoints = Math.max(data[0].length, data[1].length);
        this.nT = Math.max(sourcePoints, dataPoints);
        this.fEdges = edges(sourceFit.panels);
        double[][][] sourceOnly = new double[sourcePoints][sourceFit.panels.size()][];
        int panels = sourceFit.panels.size();
        this.fCoef = new double[nT][panels][];
        for (int p = 0; p < panels; p++) {
            PiecewiseFit.Panel panel = sourceFit.panels.get(p);
            int nx = Math.max(panel.coefficients()[0].length, 3);
            double[][] perTime = new double[sourcePoints][];
            for (int m = 0; m < sourcePoints; m++) {
                perTime[m] = Chebyshev.resize(panel.coefficients()[m], nx);
            }
            for (int k = 0; k < nT; k++) {
                fCoef[k][p] = new double[nx];
            }
            double[] column = new double[sourcePoints];
            for (int j = 0; j < nx; j++) {
                for (int m = 0; m < sourcePoints; m++) {
                    column[m] = perTime[m][j] / heatCapacity;
                }
                double[] timeCoef = sourcePoints == 1 ? column.clone() : Chebyshev.fromValues(column);
                for (int k = 0; k < sourcePoints; k++) {
                    fCoef[k][p][j] = timeCoef[k];
                }
            }
            for (int k = 0; k < sourcePoints; k++) {
                sourceOnly[k][p] = fCoef[k][p].clone();
            }
            // lifting terms: - beta_i(x) b_i'(t) + alpha beta_i''(x) b_i(t)
            for (int i = 0; i < 2; i++) {
                double[] bx = Chebyshev.fromMonomial(beta[i], panel.a(), panel.b());
                double[] bxx = Chebyshev.fromMonomial(new double[] {2 * beta[i][2]}, panel.a(), panel.b());
                for (int k = 0; k < dataDerivative[i].length; k++) {
                    for (int j = 0; j < bx.length; j++) {
                        fCoef[k][p][j] -= bx[j] * dataDerivative[i][k];
                    }
                }
                for (int k = 0; k < data[i].length; k++) {
                    fCoef[k][p][0] += alpha * bxx[0] * data[i][k];
                }
            }
        }

        // initial v0 = g - w(.,0)
        double gScale = sampleScale(initial);
        PiecewiseFit gFit;
        try {
            gFit = PiecewiseFit.fit(new PiecewiseFit.Family() {
                private final double[] arg = new double[1];

                @Override
                public int size() {
                    return 1;
                }

                @Override
                public void values(double x, double[] out) {
                    arg[0] = x;
                    out[0] = initial.value(arg);
                }
            }, 0, length, gScale, 1e-15, 1e-13 * length);
        } catch (PiecewiseFit.NonFiniteException e) {
            throw new OracleException(Reason.DATA_NOT_FINITE, "initial: \"" + initial.source()
                + "\" is " + e.value + " at x = " + e.x + "; give a finite initial temperature on [0, L]");
        }
        gScale = Math.max(gScale, gFit.scanMax);
        this.gEdges = edges(gFit.panels);
        this.gCoef = new double[gFit.panels.size()][];
        this.gResolved = new boolean[gFit.panels.size()];
        double l1 = 0;
        double tv = 0;
        double unresolved = 0;
        for (int p = 0; p < gCoef.length; p++) {
            PiecewiseFit.Panel panel = gFit.panels.get(p);
            double[] c = Chebyshev.resize(panel.coefficients()[0], Math.max(3, panel.coefficients()[0].length));
            double[] liftAt0 = Chebyshev.fromMonomial(liftMonomial(-1), panel.a(), panel.b());
            for (int j = 0; j < liftAt0.length; j++) {
                c[j] -= liftAt0[j];
            }
            gCoef[p] = c;
            gResolved[p] = panel.resolved();
            double w = panel.b() - panel.a();
            l1 += w * Chebyshev.absSum(c);
            tv += edgeVariation(c);
            if (!panel.resolved()) {
                unresolved += w * (Chebyshev.absSum(c) + gScale);
            }
        }
        this.v0L1 = l1;
        this.v0Variation = tv;
        this.unresolvedMass = unresolved;

        // zero mode (Neumann at both faces): X_0 = 1, ||X_0||^2 = L
        if (zeroMode) {
            double[] f0 = new double[nT];
            for (int k = 0; k < nT; k++) {
                f0[k] = integrate(fEdges, fCoef[k]) / length;
            }
            this.zeroAntiderivative = Chebyshev.antiderivative(f0, 0, horizon);
            this.c0 = integrate(gEdges, gCoef) / length;
        } else {
            this.zeroAntiderivative = new double[] {0};
            this.c0 = 0;
        }

        // quasi-static closed form
        double[][][] mean = zeroMode ? removeMean(fCoef) : fCoef;
        double[][][] derivative = mean;
        List<double[][][]> parts = new ArrayList<>();
        List<Double> sizes = new ArrayList<>();
        for (int j = 0; j <= 2; j++) {
            if (j > 0) {
                derivative = timeDerivative(derivative);
            }
            double[][][] s = derivative;
            for (int r = 0; r <= j; r++) {
                s = inverseOperator(s);
            }
            parts.add(s);
            sizes.add(absSum(s));
        }
        this.steadyGain = zeroMode ? Double.POSITIVE_INFINITY
            : Chebyshev.absSum(inverseOperator(new double[][][] {{{1}}}, new double[] {0, length})[0][0]);
        double provisionalScale = scaleOf(problem, sourceScale, gScale);
        int chosen = 0;
        for (int j = 1; j <= 2; j++) {
            if (sizes.get(j) <= SUBTRACTION_GROWTH * Math.max(provisionalScale, sizes.get(0))) {
                chosen = j;
            } else {
                break;
            }
        }
        this.subtractions = chosen;
        this.qsCoef = combine(parts, chosen);

        // variation bounds of d^j F / dt^j, j = 0 .. nT-1
        this.variation = new double[nT];
        double[][][] dj = mean;
        for (int j = 0; j < nT; j++) {
            if (j > 0) {
                dj = timeDerivative(dj);
            }
            double b = 0;
            for (int k = 0; k < dj.length; k++) {
                for (int p = 0; p < dj[k].length; p++) {
                    b += edgeVariation(dj[k][p]);
                }
            }
            variation[j] = b;
        }

        this.scale = provisionalScale;
        this.liftSup = Math.abs(beta[0][0]) + Math.abs(beta[0][1]) * length + Math.abs(beta[0][2]) * length * length
            + Math.abs(beta[1][0]) + Math.abs(beta[1][1]) * length + Math.abs(beta[1][2]) * length * length;
        this.windowRule = GaussLegendre.of((nT + 70) / 2 + 6);

        // representation errors, measured at random points
        this.deltaData = Math.max(measureTimeFit(left.data(), data[0]), measureTimeFit(right.data(), data[1]));
        // the lifting terms of F use the same data series as w, so the data enter the error only
        // through the data series' own difference to the expressions (deltaData)
        // safety factor on the sampled sup: 3 where the difference is rounding noise of the fit,
        // 10 where it is a genuine approximation error
        double measured = measureSource(source, sourceOnly);
        double noise = 256 * EPS * sourceScale / heatCapacity;
        this.deltaF = (measured <= noise ? 3 : 10) * measured + sourceFit.maxTail / heatCapacity;
        this.deltaV0 = 10 * measureInitial() + gFit.maxTail;
        this.table = new ModeTable(0, this);
    }

    // ------------------------------------------------------------------ public surface

    /** Temperature scale U the tolerance is relative to (see {@link eigencheck.oracle.Oracle}). */
    public double scale() {
        return scale;
    }

    /** Number of quasi-static subtractions J used (0 to 2). */
    public int subtractions() {
        return subtractions;
    }

    /** Length of the Chebyshev series in time. */
    public int timeSeriesLength() {
        return nT;
    }

    /** Time horizon T the series covers. */
    public double horizon() {
        return horizon;
    }

    /** Prepared state at one time: call {@link Slice#temperature} etc. for many points. */
    public Slice at(double t) {
        if (steady) {
            return new Slice(Double.POSITIVE_INFINITY);
        }
        checkTime(t);
        return new Slice(t);
    }

    /** True for a steady problem: every time gives the same slice. */
    public boolean steady() {
        return steady;
    }

    /** What one of the three quantities is. */
    public enum Quantity { TEMPERATURE, HEAT_FLUX, CELL_AVERAGE }

    /** Everything that depends on t alone, computed once for all points at that time. */
    public final class Slice {
        private final double t;
        private final int n;
        private final double[] e;
        private final double[] mu;
        private final double[] phase;
        private final double a0;
        private final double[] lift = new double[3];
        private final double[][] qs; // per panel, collapsed at t
        private final double[][] qsDerivative;
        private final double[][] qsIntegral; // antiderivatives, continuous across panels
        private final double valueBound;
        private final double fluxBound;
        private final boolean uniform;
        private final double spacing;
        private final double offset;

        private Slice(double t) {
            this.t = t;
            double s = Chebyshev.reference(t, 0, horizon);
            for (int i = 0; i < 2; i++) {
                double b = Chebyshev.value(data[i], s);
                for (int d = 0; d < 3; d++) {
                    lift[d] += beta[i][d] * b;
                }
            }
            if (t == 0) {
                n = 0;
                e = new double[0];
                mu = new double[0];
                phase = new double[0];
                a0 = c0;
                qs = null;
                qsDerivative = null;
                qsIntegral = null;
                valueBound = 4 * EPS * scale;
                fluxBound = 0;
                uniform = false;
                spacing = 0;
                offset = 0;
                return;
            }
            if (t == Double.POSITIVE_INFINITY) {
                // steady: the lifting and the exact inverse of the operator applied to F; no modes
                n = 0;
                e = new double[0];
                mu = new double[0];
                phase = new double[0];
                a0 = 0;
                int panels = fEdges.length - 1;
                qs = new double[panels][];
                qsDerivative = new double[panels][];
                qsIntegral = new double[panels][];
                // steady data are constant in t: only the first Chebyshev coefficient in t is nonzero
                double[] first = new double[qsCoef.length];
                first[0] = 1;
                double qsMagnitude = collapse(first);
                double liftMagnitude = Math.abs(lift[0]) + Math.abs(lift[1]) * length;
                double rounding = 8 * EPS * (qsMagnitude + liftMagnitude);
                double qsDerivativeMagnitude = 0;
                for (double[] c : qsDerivative) {
                    qsDerivativeMagnitude += Chebyshev.absSum(c);
                }
                valueBound = rounding + deltaF * steadyGain + deltaData * dataGain(0);
                fluxBound = conductivity * (8 * EPS * (qsDerivativeMagnitude + Math.abs(lift[1]))
                    + deltaF * 2 * length / alpha + deltaData * dataGain(0) / length);
                uniform = false;
                spacing = 0;
                offset = 0;
                return;
            }
            int modesNeeded = modesFor(t);
            ModeTable tab = ensure(modesNeeded);
            this.n = modesNeeded;
            this.e = new double[n];
            this.mu = Arrays.copyOf(tab.mu, n);
            this.phase = Arrays.copyOf(tab.phase, n);
            double magnitude = 0;
            double fluxMagnitude = 0;
            double quadrature = 0;
            for (int i = 0; i < n; i++) {
                double before = magnitude;
                double lambda = tab.lambda[i];
                double decay = Math.exp(-lambda * t);
                if (tab.asymptotic[i]) {
                    double d = Chebyshev.value(tab.series[i], s);
                    e[i] = (tab.c[i] - tab.pinf0[i]) * decay + d;
                    magnitude += Math.abs(tab.c[i] * decay) + Math.abs(tab.pinf0[i] * decay)
                        + Chebyshev.absSum(tab.series[i]);
                } else {
                    double integral = duhamel(tab.forcing[i], lambda, t);
                    double pj = Chebyshev.value(tab.series[i], s);
                    e[i] = tab.c[i] * decay + integral - pj;
                    magnitude += Math.abs(tab.c[i] * decay) + Math.abs(integral) + Chebyshev.absSum(tab.series[i]);
                    quadrature += 1e-15 * Math.abs(integral)
                        + (lambda * t > WINDOW ? Math.exp(-WINDOW) * Chebyshev.absSum(tab.forcing[i]) / lambda : 0);
                }
                fluxMagnitude += mu[i] * (magnitude - before) + Math.abs(e[i]) * mu[i] * (2 + mu[i] * length);
                magnitude += Math.abs(e[i]) * (2 + mu[i] * length);
            }
            this.a0 = zeroMode ? c0 + Chebyshev.value(zeroAntiderivative, s) : 0;
            // quasi-static part collapsed at t
            double[] tk = chebyshevValues(s, qsCoef.length);
            int panels = fEdges.length - 1;
            this.qs = new double[panels][];
            this.qsDerivative = new double[panels][];
            this.qsIntegral = new double[panels][];
            double qsMagnitude = collapse(tk);
            double liftMagnitude = Math.abs(lift[0]) + Math.abs(lift[1]) * length + Math.abs(lift[2]) * length * length;
            double rounding = 8 * EPS * (magnitude + qsMagnitude + liftMagnitude + Math.abs(a0));
            double representation = deltaF * Math.min(t, steadyGain) + deltaV0 + deltaData * dataGain(t)
                + unresolvedMass * (2 / Math.sqrt(4 * Math.PI * alpha * t) + 1 / length);
            this.valueBound = algebraicTail(n, 0) + exponentialTail(n, t, 0) + quadrature + rounding + representation;
            double qsDerivativeMagnitude = 0;
            for (double[] c : qsDerivative) {
                qsDerivativeMagnitude += Chebyshev.absSum(c);
            }
            double roundingFlux = 8 * EPS * (fluxMagnitude + qsDerivativeMagnitude
                + Math.abs(lift[1]) + 2 * Math.abs(lift[2]) * length);
            // gradient response to a source error: int_0^t ||grad G||_1 ds <= 2 * 2 sqrt(t/(pi alpha))
            double representationFlux = deltaF * Math.min(4 * Math.sqrt(t / (Math.PI * alpha)), 2 * length / alpha)
                + (deltaV0 + unresolvedMass / length) / Math.sqrt(Math.PI * alpha * t) + deltaData * dataGain(t) / length;
            double muMax = n > 0 ? mu[n - 1] : 0;
            this.fluxBound = conductivity * (algebraicTail(n, 1) + exponentialTail(n, t, 1) + quadrature * muMax
                + roundingFlux + representationFlux);
            if (Boolean.getBoolean("eigencheck.debug")) {
                System.err.printf("t=%g n=%d alg=%.3g exp=%.3g quad=%.3g round=%.3g repr=%.3g (dF=%.3g dV0=%.3g"
                    + " dD=%.3g) magnitude=%.3g qs=%.3g J=%d fluxBound=%.3g%n", t, n, algebraicTail(n, 0),
                    exponentialTail(n, t, 0), quadrature, rounding, representation, deltaF, deltaV0, deltaData,
                    magnitude, qsMagnitude, subtractions, fluxBound);
            }
            this.uniform = modes.isUniform();
            if (uniform && n > 0) {
                this.spacing = Math.PI / length;
                this.offset = mu[0] - spacing; // mu_n = offset + n * spacing
            } else {
                this.spacing = 0;
                this.offset = 0;
            }
        }

        /**
         * The quasi-static part at this time, sum_k qsCoef[k] T_k(t), per panel, with its derivative and
         * its antiderivative (continuous across panels); returns the sum of |coefficients|.
         */
        private double collapse(double[] tk) {
            double magnitude = 0;
            double running = 0;
            for (int p = 0; p < qs.length; p++) {
                int len = qsCoef[0][p].length;
                double[] c = new double[len];
                for (int k = 0; k < qsCoef.length; k++) {
                    double w = tk[k];
                    if (w == 0) {
                        continue;
                    }
                    double[] src = qsCoef[k][p];
                    for (int j = 0; j < len; j++) {
                        c[j] += w * src[j];
                    }
                }
                qs[p] = c;
                qsDerivative[p] = Chebyshev.derivative(c, fEdges[p], fEdges[p + 1]);
                double[] anti = Chebyshev.antiderivative(c, fEdges[p], fEdges[p + 1]);
                anti[0] += running;
                running = Chebyshev.value(anti, 1);
                qsIntegral[p] = anti;
                magnitude += Chebyshev.absSum(c);
            }
            return magnitude;
        }

        /** Conductivity k of the problem (W/(m K)). */
        public double conductivity() {
            return conductivity;
        }

        /** Modes summed at this time. */
        public int modes() {
            return n;
        }

        /** u(x, t) with its bound. */
        public Evaluation temperature(double x) {
            checkSpace(x);
            if (t == 0) {
                return initialValue(x);
            }
            double value = liftValue(x) + a0 + quasiStatic(x) + modalSum(x, false);
            return certify(value, valueBound, "u", x);
        }

        /**
         * u(x)/x for a solution with u(0) = 0 at a Dirichlet face x = 0 (the sphere's w = r T gives
         * T = w/r this way), summed term by term so that nothing cancels near x = 0: the modes as
         * mu sinc(mu x), the quasi-static part by its Taylor expansion at 0 below x = 1e-3 L. The
         * error e of the computed u vanishes at x = 0, so |e(x)/x| <= max |e'|: the bound is that of
         * the gradient.
         */
        public Evaluation valueOverX(double x) {
            checkSpace(x);
            if (!leftDirichlet || Math.abs(leftData0) > 0 || t == 0) {
                throw new OracleException(Reason.UNSUPPORTED, "oracle: u/x needs u = 0 at x = 0 and t > 0");
            }
            double sum = lift[1] + lift[2] * x + (Math.abs(lift[0]) > 0 ? lift[0] / Math.max(x, Double.MIN_VALUE) : 0);
            int p = panelOf(fEdges, x);
            double a = fEdges[p];
            double b = fEdges[p + 1];
            double extra;
            if (x > 1e-3 * length) {
                sum += Chebyshev.value(qs[p], Chebyshev.reference(x, a, b)) / x;
                extra = 8 * EPS * Chebyshev.absSum(qs[p]) / x; // the division's amplified rounding
            } else {
                // q(x)/x = q'(0) + q''(0) x/2 + q'''(0) x^2/6 + q''''(c) x^3/24, as q(0) = 0
                int p0 = panelOf(fEdges, 0);
                double[] d1 = qsDerivative[p0];
                double[] d2 = Chebyshev.derivative(d1, fEdges[p0], fEdges[p0 + 1]);
                double[] d3 = Chebyshev.derivative(d2, fEdges[p0], fEdges[p0 + 1]);
                double[] d4 = Chebyshev.derivative(d3, fEdges[p0], fEdges[p0 + 1]);
                double s0 = Chebyshev.reference(0, fEdges[p0], fEdges[p0 + 1]);
                sum += Chebyshev.value(d1, s0) + Chebyshev.value(d2, s0) * x / 2 + Chebyshev.value(d3, s0) * x * x / 6;
                extra = Chebyshev.absSum(d4) * x * x * x / 24
                    + 8 * EPS * (Chebyshev.absSum(d1) + Chebyshev.absSum(d2) * x + Chebyshev.absSum(d3) * x * x);
            }
            for (int i = 0; i < n; i++) {
                double m = mu[i];
                double arg = m * x;
                double sinc = arg < 1e-4 ? 1 - arg * arg / 6 : Math.sin(arg) / arg;
                sum += e[i] * m * sinc;
            }
            double bound = fluxBound / conductivity + extra;
            double limit = tolerance * scale / length;
            if (!(bound <= limit)) {
                throw notCertified("u/x", x, bound, limit);
            }
            return new Evaluation(sum, bound);
        }

        /** Heat flux -k du/dx (W/m^2) in the +x direction, with its bound. */
        public Evaluation heatFlux(double x) {
            checkSpace(x);
            if (t == 0) {
                return initialFlux(x);
            }
            double gradient = lift[1] + 2 * lift[2] * x + quasiStaticDerivative(x) + modalSum(x, true);
            double fluxTolerance = tolerance * scale * conductivity / length;
            if (fluxBound > fluxTolerance) {
                throw notCertified("heat flux", x, fluxBound, fluxTolerance);
            }
            return new Evaluation(-conductivity * gradient, fluxBound);
        }

        /** Mean of u over [x0, x1] (what a finite-volume cell holds), with its bound. */
        public Evaluation cellAverage(double x0, double x1) {
            checkSpace(x0);
            checkSpace(x1);
            if (!(x1 > x0)) {
                throw new OracleException(Reason.OUTSIDE_DOMAIN, "oracle: cell [" + x0 + ", " + x1
                    + "] is empty or reversed; give x0 < x1");
            }
            double w = x1 - x0;
            double integral;
            if (t == 0) {
                integral = integratePiecewise(gEdges, gCoef, x0, x1) + liftIntegral(x0, x1, lift0());
                return new Evaluation(integral / w, deltaV0 + unresolvedMass / w + 4 * EPS * scale);
            }
            integral = liftIntegral(x0, x1, lift) + a0 * w + quasiStaticIntegral(x1) - quasiStaticIntegral(x0);
            for (int i = 0; i < n; i++) {
                double m = mu[i];
                integral += e[i] * (Math.cos(m * x0 + phase[i]) - Math.cos(m * x1 + phase[i])) / m;
            }
            return certify(integral / w, valueBound, "cell average", 0.5 * (x0 + x1));
        }

        private double modalSum(double x, boolean derivative) {
            double sum = 0;
            if (uniform) {
                // X_n = sin(mu_n x + phi): rotate by exp(i pi x / L), restart every 64 terms
                double ds = Math.sin(spacing * x);
                double dc = Math.cos(spacing * x);
                double phi = phase.length > 0 ? phase[0] : 0;
                double sn = 0;
                double cn = 0;
                for (int i = 0; i < n; i++) {
                    if ((i & 63) == 0) {
                        double arg = mu[i] * x + phi;
                        sn = Math.sin(arg);
                        cn = Math.cos(arg);
                    } else {
                        double s2 = sn * dc + cn * ds;
                        cn = cn * dc - sn * ds;
                        sn = s2;
                    }
                    sum += derivative ? e[i] * mu[i] * cn : e[i] * sn;
                }
                return sum;
            }
            for (int i = 0; i < n; i++) {
                double arg = mu[i] * x + phase[i];
                sum += derivative ? e[i] * mu[i] * Math.cos(arg) : e[i] * Math.sin(arg);
            }
            return sum;
        }

        private double quasiStatic(double x) {
            int p = panelOf(fEdges, x);
            return Chebyshev.value(qs[p], Chebyshev.reference(x, fEdges[p], fEdges[p + 1]));
        }

        private double quasiStaticDerivative(double x) {
            int p = panelOf(fEdges, x);
            return Chebyshev.value(qsDerivative[p], Chebyshev.reference(x, fEdges[p], fEdges[p + 1]));
        }

        private double quasiStaticIntegral(double x) {
            int p = panelOf(fEdges, x);
            return Chebyshev.value(qsIntegral[p], Chebyshev.reference(x, fEdges[p], fEdges[p + 1]));
        }

        private double liftValue(double x) {
            return lift[0] + x * (lift[1] + x * lift[2]);
        }

        private Evaluation certify(double value, double bound, String what, double x) {
            double limit = tolerance * scale;
            if (!(bound <= limit)) {
                throw notCertified(what, x, bound, limit);
            }
            return new Evaluation(value, bound);
        }

        private OracleException notCertified(String what, double x, double bound, double limit) {
            return new OracleException(Reason.NOT_CERTIFIED, String.format(
                "oracle: %s(x=%s, t=%s) not certified to %.3g (bound %.3g); %s", what, x, t, limit, bound,
                "tighten nothing: give a larger --tolerance, or evaluate at a later time"));
        }

        private Evaluation initialValue(double x) {
            int p = panelOf(gEdges, x);
            if (!gResolved[p]) {
                throw new OracleException(Reason.NOT_CERTIFIED, "oracle: u(x=" + x
                    + ", t=0) not certified: the initial data jumps at this point; evaluate at t > 0");
            }
            double g = initial.value(x);
            checkCompatibility(x, g);
            return new Evaluation(g, 4 * EPS * Math.max(Math.abs(g), scale * 1e-3));
        }

        private Evaluation initialFlux(double x) {
            int p = panelOf(gEdges, x);
            if (!gResolved[p]) {
                throw new OracleException(Reason.NOT_CERTIFIED, "oracle: heat flux(x=" + x
                    + ", t=0) not certified: the initial data jumps at this point; evaluate at t > 0");
            }
            checkCompatibility(x, initial.value(x));
            DerivativeStructure dx = new DerivativeStructure(1, 1, 0, x);
            double g = initial.value(dx).getPartialDerivative(1);
            return new Evaluation(-conductivity * g, 64 * EPS * conductivity * (Math.abs(g) + scale / length));
        }

        private void checkCompatibility(double x, double g) {
            double limit = tolerance * scale;
            if (x == 0 && leftDirichlet && Math.abs(g - leftData0) > limit
                || x == length && rightDirichlet && Math.abs(g - rightData0) > limit) {
                throw new OracleException(Reason.NOT_CERTIFIED, "oracle: u(x=" + x + ", t=0) not certified:"
                    + " the boundary temperature and the initial temperature disagree at this face"
                    + " (incompatible data); evaluate at t > 0 or inside the slab");
            }
        }
    }

    /**
     * Bound of the temperature response to a data error of size 1 (sup over time): the lifting's
     * sup for Dirichlet and Robin data (maximum principle), plus, with Neumann at both faces, the
     * mean rise the flux error drives, 2 t/(rho c L). A heuristic factor: data errors are at the
     * rounding level of the Chebyshev fits, so this part is tiny wherever it matters.
     */
    private double dataGain(double t) {
        return 2 * Math.max(1, liftSup) + (zeroMode ? 2 * t / (heatCapacity * length) : 0);
    }

    private double[] lift0() {
        double[] l = new double[3];
        for (int i = 0; i < 2; i++) {
            for (int d = 0; d < 3; d++) {
                l[d] += beta[i][d] * Chebyshev.value(data[i], -1);
            }
        }
        return l;
    }

    private static double liftIntegral(double x0, double x1, double[] l) {
        return l[0] * (x1 - x0) + l[1] * (x1 * x1 - x0 * x0) / 2 + l[2] * (x1 * x1 * x1 - x0 * x0 * x0) / 3;
    }

    // ------------------------------------------------------------------ modes

    /** Immutable snapshot of the first n modes and their time data. */
    private static final class ModeTable {
        final int n;
        final double[] mu;
        final double[] phase;
        final double[] lambda;
        final double[] c;
        final boolean[] asymptotic;
        final double[][] forcing;
        final double[][] series; // asymptotic: D_n; quadrature: P^J_n
        final double[] pinf0;

        ModeTable(int n, SlabSolver s) {
            this.n = n;
            mu = new double[n];
            phase = new double[n];
            lambda = new double[n];
            c = new double[n];
            asymptotic = new boolean[n];
            forcing = new double[n][];
            series = new double[n][];
            pinf0 = new double[n];
        }
    }

    private synchronized ModeTable ensure(int needed) {
        ModeTable old = table;
        if (needed <= old.n) {
            return old;
        }
        int n = Math.max(needed, Math.min(MAX_MODES, old.n + old.n / 2));
        ModeTable t = new ModeTable(n, this);
        System.arraycopy(old.mu, 0, t.mu, 0, old.n);
        System.arraycopy(old.phase, 0, t.phase, 0, old.n);
        System.arraycopy(old.lambda, 0, t.lambda, 0, old.n);
        System.arraycopy(old.c, 0, t.c, 0, old.n);
        System.arraycopy(old.asymptotic, 0, t.asymptotic, 0, old.n);
        System.arraycopy(old.forcing, 0, t.forcing, 0, old.n);
        System.arraycopy(old.series, 0, t.series, 0, old.n);
        System.arraycopy(old.pinf0, 0, t.pinf0, 0, old.n);
        double[][] first = modes.first(n);
        int from = old.n;
        int count = n - from;
        double[] nsq = new double[count];
        for (int i = from; i < n; i++) {
            t.mu[i] = first[0][i];
            t.phase[i] = first[1][i];
            nsq[i - from] = first[2][i];
            t.lambda[i] = alpha * t.mu[i] * t.mu[i];
        }
        double[][] fn = project(fEdges, fCoef, t.mu, t.phase, from, count);
        double[][] cn = project(gEdges, new double[][][] {gCoef}, t.mu, t.phase, from, count);
        int degree = Math.max(1, nT - 1);
        for (int i = 0; i < count; i++) {
            int m = from + i;
            double[] f = new double[nT];
            for (int k = 0; k < nT; k++) {
                f[k] = fn[i][k] / nsq[i];
            }
            t.forcing[m] = f;
            t.c[m] = cn[i][0] / nsq[i];
            double lambda = t.lambda[m];
            boolean asym = lambda * horizon >= 8.0 * degree * degree;
            t.asymptotic[m] = asym;
            if (asym) {
                double[] g = f;
                for (int j = 0; j <= subtractions; j++) {
                    g = Chebyshev.derivative(g, 0, horizon);
                }
                double[] r = resolvent(g, lambda);
                double factor = ((subtractions & 1) == 0 ? -1 : 1) / Math.pow(lambda, subtractions + 1);
                for (int k = 0; k < r.length; k++) {
                    r[k] *= factor;
                }
                t.series[m] = r;
                t.pinf0[m] = Chebyshev.value(resolvent(f, lambda), -1);
            } else {
                double[] pj = new double[nT];
                double[] g = f;
                double power = lambda;
                for (int j = 0; j <= subtractions; j++) {
                    if (j > 0) {
                        g = Chebyshev.derivative(g, 0, horizon);
                        power *= lambda;
                    }
                    double sign = (j & 1) == 0 ? 1 : -1;
                    for (int k = 0; k < g.length; k++) {
                        pj[k] += sign * g[k] / power;
                    }
                }
                t.series[m] = pj;
            }
        }
        table = t;
        return t;
    }

    /**
     * Polynomial P with P' + lambda P = f, f a Chebyshev series on [0, T]: backward recurrence
     * lambda p_k = f_k - p'_k with p'_{k-1} = p'_{k+1} + 2k (2/T) p_k (Mason and Handscomb 2.4.4);
     * stable when lambda T is large against the squared degree.
     */
    private double[] resolvent(double[] f, double lambda) {
        int n = f.length;
        double[] p = new double[n];
        double s = 2 / horizon;
        double dPlus = 0; // p'~_{k+1}
        double dCur = 0; // p'~_k
        for (int k = n - 1; k >= 0; k--) {
            p[k] = (f[k] - (k == 0 ? 0.5 * dCur : dCur)) / lambda;
            double dMinus = dPlus + 2 * k * p[k] * s;
            dPlus = dCur;
            dCur = dMinus;
        }
        return p;
    }

    /** int_0^t exp(-lambda (t - s)) f(s) ds by Gauss-Legendre on the window where the kernel matters. */
    private double duhamel(double[] f, double lambda, double t) {
        double t0 = lambda * t > WINDOW ? t - WINDOW / lambda : 0;
        double half = 0.5 * (t - t0);
        double mid = 0.5 * (t + t0);
        double sum = 0;
        GaussLegendre rule = windowRule;
        for (int q = 0; q < rule.nodes.length; q++) {
            double sq = mid + half * rule.nodes[q];
            sum += rule.weights[q] * Math.exp(-lambda * (t - sq)) * Chebyshev.value(f, Chebyshev.reference(sq, 0, horizon));
        }
        return sum * half;
    }

    /**
     * Projections int g_k(x) X_n(x) dx for the family g_k (coef[k][p][]) and modes from..from+count-1,
     * by Gauss-Legendre per panel with enough nodes for the highest mode's oscillation.
     */
    private double[][] project(double[] edges, double[][][] coef, double[] mu, double[] phase, int from, int count) {
        int family = coef.length;
        double[][] out = new double[count][family];
        if (count == 0) {
            return out;
        }
        double muMax = mu[from + count - 1];
        double[] gk = new double[family];
        double[] x = new double[count];
        for (int p = 0; p < edges.length - 1; p++) {
            double a = edges[p];
            double b = edges[p + 1];
            double w = b - a;
            int degree = coef[0][p].length;
            int q = (int) Math.ceil((degree + 0.55 * muMax * w + 40) / 2);
            GaussLegendre rule = GaussLegendre.of(q);
            for (int node = 0; node < q; node++) {
                double s = rule.nodes[node];
                double xq = 0.5 * (a + b) + 0.5 * w * s;
                double weight = 0.5 * w * rule.weights[node];
                for (int k = 0; k < family; k++) {
                    gk[k] = weight * Chebyshev.value(coef[k][p], s);
                }
                for (int i = 0; i < count; i++) {
                    x[i] = Math.sin(mu[from + i] * xq + phase[from + i]);
                }
                for (int i = 0; i < count; i++) {
                    double xi = x[i];
                    double[] row = out[i];
                    for (int k = 0; k < family; k++) {
                        row[k] += xi * gk[k];
                    }
                }
            }
        }
        return out;
    }

    // ------------------------------------------------------------------ truncation

    /** Least N with both tails below the target at time t, or a refusal past the cap. */
    private int modesFor(double t) {
        double target = TAIL_FRACTION * tolerance * scale;
        double fluxTarget = target / length;
        int n = 1;
        while (!(algebraicTail(n, 0) <= target && exponentialTail(n, t, 0) <= target
            && algebraicTail(n, 1) <= fluxTarget && exponentialTail(n, t, 1) <= fluxTarget)) {
            if (n >= MAX_MODES) {
                throw new OracleException(Reason.TOO_MANY_MODES, String.format(
                    "oracle: t = %s s is too small for the series (alpha t / L^2 = %.3g would need more than %d"
                        + " modes); evaluate at a later time or loosen the tolerance", t,
                    alpha * t / (length * length), MAX_MODES));
            }
            n = Math.min(MAX_MODES, n < 8 ? n + 1 : n + n / 4);
        }
        return n;
    }

    /** Lower bound of ||X_n||^2 for n > N: L/2 - 1/(2 mu), mu >= N pi / L. */
    private double normFloor(int n) {
        return 0.5 * length * (1 - 1 / (Math.PI * n));
    }

    /**
     * Sum over modes n > N of |sum_{j > J} F_n^(j)/lambda_n^(j+1)| (times mu_n^deriv), from
     * |F_n^(j)| <= B_j/(mu_n ||X_n||^2), mu_n >= (n-1) pi/L and the integral test.
     */
    private double algebraicTail(int n, int deriv) {
        double total = 0;
        double logLengthOverPi = Math.log(length / Math.PI);
        for (int j = subtractions + 1; j < nT; j++) {
            if (variation[j] == 0) {
                continue;
            }
            int s = 2 * j + 3 - deriv;
            double logSum = s * logLengthOverPi - s * Math.log(n) + Math.log1p(n / (s - 1.0));
            double log = Math.log(variation[j]) - (j + 1) * Math.log(alpha) + logSum - Math.log(normFloor(n));
            total += Math.exp(log);
        }
        return total;
    }

    /**
     * Sum over n > N of |c_n - P_n(0)| exp(-lambda_n t) (times mu_n^deriv): |c_n| <= min(||v0||_1,
     * TV(v0)/mu)/||X_n||^2, |P_n(0)| <= sum_j B_j/(mu ||X||^2 lambda^(j+1)), and
     * sum_{i >= N} exp(-a i^2) <= exp(-a N^2) + (1/2) sqrt(pi/a) erfc(N sqrt(a)), a = alpha pi^2 t/L^2.
     */
    private double exponentialTail(int n, double t, int deriv) {
        double muN = n * Math.PI / length;
        double floor = normFloor(n);
        double k = Math.min(v0L1, v0Variation / muN) / floor;
        double lambdaN = alpha * muN * muN;
        for (int j = 0; j < nT; j++) {
            if (variation[j] == 0) {
                continue;
            }
            k += Math.exp(Math.log(variation[j]) - Math.log(floor * muN) - (j + 1) * Math.log(lambdaN));
        }
        if (k == 0) {
            return 0;
        }
        double a = alpha * Math.PI * Math.PI * t / (length * length);
        double an2 = a * n * n;
        double head = Math.exp(-an2);
        double erfcPart = 0.5 * Math.sqrt(Math.PI / a) * Erf.erfc(n * Math.sqrt(a));
        if (deriv == 0) {
            return k * (head + erfcPart);
        }
        if (2 * a * n * (n + 1) < 1) {
            return Double.POSITIVE_INFINITY;
        }
        return k * Math.PI / length * ((n + 1) * head + head / (2 * a) + erfcPart);
    }

    // ------------------------------------------------------------------ construction helpers

    /** H = h/k of the homogeneous condition: +infinity Dirichlet, 0 Neumann. */
    private static double homogeneousH(BoundaryCondition c, double conductivity) {
        if (c instanceof BoundaryCondition.Dirichlet) {
            return Double.POSITIVE_INFINITY;
        }
        if (c instanceof BoundaryCondition.Neumann) {
            return 0;
        }
        return ((BoundaryCondition.Robin) c).heatTransferCoefficient() / conductivity;
    }

    /** Monomial coefficients beta_i(x) of the lifting for left data (i=0) and right data (i=1). */
    private double[][] lifting(BoundaryCondition left, BoundaryCondition right) {
        double k = conductivity;
        double l = length;
        if (left instanceof BoundaryCondition.Neumann && right instanceof BoundaryCondition.Neumann) {
            // w = -(q0/k) x + (q0 + qL)/(2 k L) x^2
            return new double[][] {{0, -1 / k, 1 / (2 * k * l)}, {0, 0, 1 / (2 * k * l)}};
        }
        // rows: a p + b q = c0 d0 + cL dL
        double[] r1 = row(left, true);
        double[] r2 = row(right, false);
        double det = r1[0] * r2[1] - r1[1] * r2[0];
        // p = (r2[1] (r1[2] d0 + r1[3] dL) - r1[1] (r2[2] d0 + r2[3] dL)) / det, q similarly
        double p0 = (r2[1] * r1[2] - r1[1] * r2[2]) / det;
        double pL = (r2[1] * r1[3] - r1[1] * r2[3]) / det;
        double q0 = (r1[0] * r2[2] - r2[0] * r1[2]) / det;
        double qL = (r1[0] * r2[3] - r2[0] * r1[3]) / det;
        return new double[][] {{p0, q0, 0}, {pL, qL, 0}};
    }

    /** One boundary row [a, b, c0, cL] of a p + b q = c0 d0 + cL dL for w = p + q x. */
    private double[] row(BoundaryCondition c, boolean atLeft) {
        double k = conductivity;
        double l = length;
        if (c instanceof BoundaryCondition.Dirichlet) {
            return atLeft ? new double[] {1, 0, 1, 0} : new double[] {1, l, 0, 1};
        }
        if (c instanceof BoundaryCondition.Neumann) {
            // left: -k w_x = q0; right: k w_x = qL
            return atLeft ? new double[] {0, -k, 1, 0} : new double[] {0, k, 0, 1};
        }
        double h = !atLeft && !Double.isNaN(rightCoefficient) ? rightCoefficient
            : ((BoundaryCondition.Robin) c).heatTransferCoefficient();
        // left: k q = h (p - a0) -> h p - k q = h a0; right: -k q = h (p + q L - aL)
        return atLeft ? new double[] {h, -k, h, 0} : new double[] {h, k + h * l, 0, h};
    }

    /** Lifting at the reference time s as monomial coefficients. */
    private double[] liftMonomial(double s) {
        double[] l = new double[3];
        for (int i = 0; i < 2; i++) {
            double b = Chebyshev.value(data[i], s);
            for (int d = 0; d < 3; d++) {
                l[d] += beta[i][d] * b;
            }
        }
        return l;
    }

    private double[] fitTime(Expression e, String where) {
        for (String v : e.usedVariables()) {
            if (!v.equals("t")) {
                throw new OracleException(Reason.UNSUPPORTED, where + ": a slab face's data may depend on t only, not "
                    + v);
            }
        }
        if (e.isConstant()) {
            double v = e.value(0.0);
            if (!Double.isFinite(v)) {
                throw new OracleException(Reason.DATA_NOT_FINITE, where + ": \"" + e.source() + "\" is " + v);
            }
            return new double[] {v};
        }
        double[] c = null;
        for (int n : TIME_POINTS) {
            if (n < 9) {
                continue;
            }
            c = fitTimeAt(e, n, where);
            double max = Chebyshev.absSum(c);
            double tail = 0;
            for (int k = n - 3; k < n; k++) {
                tail = Math.max(tail, Math.abs(c[k]));
            }
            if (tail <= 1e-15 * Math.max(max, 1e-300)) {
                return trim(c, max);
            }
        }
        throw new OracleException(Reason.DATA_NOT_RESOLVED, where + ": \"" + e.source()
            + "\" is not smooth enough in t on [0, " + horizon + "] s for a Chebyshev series of degree 512"
            + " (a step or kink in time?); the oracle needs data smooth over the time horizon");
    }

    private double[] fitTimeAt(Expression e, int n, String where) {
        double[] nodes = Chebyshev.nodes(0, horizon, n);
        double[] v = new double[n];
        for (int j = 0; j < n; j++) {
            v[j] = e.value(nodes[j]);
            if (!Double.isFinite(v[j])) {
                throw new OracleException(Reason.DATA_NOT_FINITE, where + ": \"" + e.source() + "\" is " + v[j]
                    + " at t = " + nodes[j] + " s; give data finite on [0, " + horizon + "] s");
            }
        }
        return Chebyshev.fromValues(v);
    }

    private static double[] trim(double[] c, double max) {
        int keep = 1;
        for (int k = c.length - 1; k >= 1; k--) {
            if (Math.abs(c[k]) > 1e-18 * max) {
                keep = k + 1;
                break;
            }
        }
        return Chebyshev.resize(c, keep);
    }

    /** Number of Chebyshev points in t that resolve the source, from fits at a few x. */
    private int timePointsOf(Expression source) {
        int best = 1;
        for (int i = 0; i <= 8; i++) {
            double x = length * (i == 0 ? 0 : i == 8 ? 1 : (i + 0.1234567) / 8.5);
            boolean done = false;
            for (int n : TIME_POINTS) {
                if (n < 9) {
                    continue;
                }
                double[] nodes = Chebyshev.nodes(0, horizon, n);
                double[] v = new double[n];
                for (int j = 0; j < n; j++) {
                    v[j] = source.value(x, nodes[j]);
                    if (!Double.isFinite(v[j])) {
                        throw new OracleException(Reason.DATA_NOT_FINITE, "source: \"" + source.source() + "\" is "
                            + v[j] + " at x = " + x + ", t = " + nodes[j] + "; give a source finite on the slab");
                    }
                }
                double[] c = Chebyshev.fromValues(v);
                double max = Chebyshev.absSum(c);
                double tail = 0;
                for (int k = n - 3; k < n; k++) {
                    tail = Math.max(tail, Math.abs(c[k]));
                }
                if (tail <= 1e-15 * Math.max(max, 1e-300)) {
                    best = Math.max(best, trim(c, max).length);
                    done = true;
                    break;
                }
            }
            if (!done) {
                throw new OracleException(Reason.DATA_NOT_RESOLVED, "source: \"" + source.source()
                    + "\" is not smooth enough in t on [0, " + horizon + "] s (a step or kink in time?);"
                    + " the oracle needs a source smooth in time over the horizon");
            }
        }
        // interpolate at a point count of the form 2^m + 1 at least as long as needed
        for (int n : TIME_POINTS) {
            if (n >= best) {
                return n == 1 ? 1 : n;
            }
        }
        return best;
    }

    private double sampleScale(Expression source, double[] tNodes) {
        double max = 0;
        for (int i = 0; i <= 32; i++) {
            double x = length * i / 32.0;
            for (double t : tNodes) {
                double v = source.value(x, t);
                if (Double.isFinite(v)) {
                    max = Math.max(max, Math.abs(v));
                }
            }
        }
        return max;
    }

    private double sampleScale(Expression g) {
        double max = 0;
        for (int i = 0; i <= 64; i++) {
            double v = g.value(length * i / 64.0);
            if (Double.isFinite(v)) {
                max = Math.max(max, Math.abs(v));
            }
        }
        return max;
    }

    /**
     * The relative tolerance of the source's piecewise fit: 1e-15, or 1e-3 of the slab's tolerance up to 1e-13
     * when that is looser. A source built from derivatives and differences (a box's product factor less its
     * blend, differentiated) carries rounding noise above 1e-15 of its size, and a fit held to 1e-15 would halve
     * its panels down to the noise's scale; what the looser fit leaves is measured and joins deltaF.
     */
    private double sourceFitTolerance() {
        return Math.max(1e-15, Math.min(1e-13, 1e-3 * tolerance));
    }

    private PiecewiseFit fitFamily(Expression source, double[] tNodes, double sourceScale, String where) {
        try {
            return PiecewiseFit.fit(new PiecewiseFit.Family() {
                private final double[] arg = new double[2];

                @Override
                public int size() {
                    return tNodes.length;
                }

                @Override
                public void values(double x, double[] out) {
                    arg[0] = x;
                    for (int m = 0; m < tNodes.length; m++) {
                        arg[1] = tNodes[m];
                        out[m] = source.value(arg);
                    }
                }
            }, 0, length, sourceScale, sourceFitTolerance(), 1e-13 * length);
        } catch (PiecewiseFit.NonFiniteException e) {
            throw new OracleException(Reason.DATA_NOT_FINITE, where + ": \"" + source.source() + "\" is " + e.value
                + " at x = " + e.x + "; give a source finite on the slab");
        }
    }

    /**
     * The temperature scale U: the largest of |initial|, |Dirichlet and ambient data|, |Q| L^2/k,
     * |q| L/k and, for Neumann at both faces, |q_0 + q_L| T/(rho c L); 1 when all are zero.
     */
    private double scaleOf(Problem problem, double sourceScale, double gScale) {
        double u = gScale;
        double[] flux = new double[2];
        Side[] sides = {Side.XMIN, Side.XMAX};
        for (int i = 0; i < 2; i++) {
            BoundaryCondition c = problem.condition(sides[i]);
            double sup = supOf(data[i]);
            if (c instanceof BoundaryCondition.Neumann) {
                flux[i] = sup;
                u = Math.max(u, sup * length / conductivity);
            } else {
                u = Math.max(u, sup);
            }
        }
        u = Math.max(u, sourceScale * length * length / conductivity);
        if (zeroMode) {
            u = Math.max(u, (flux[0] + flux[1]) * horizon / (heatCapacity * length));
            u = Math.max(u, sourceScale * horizon / heatCapacity);
        }
        return u > 0 ? u : 1;
    }

    /** Largest |value| of a time series, sampled at 513 points (the series are smooth). */
    private static double supOf(double[] c) {
        double max = 0;
        for (int i = 0; i <= 512; i++) {
            max = Math.max(max, Math.abs(Chebyshev.value(c, -1 + i / 256.0)));
        }
        return max;
    }

    private double measureTimeFit(Expression e, double[] c) {
        SplittableRandom random = new SplittableRandom(20261201L);
        double max = 0;
        for (int i = 0; i < 64; i++) {
            double t = random.nextDouble() * horizon;
            max = Math.max(max, Math.abs(e.value(t) - Chebyshev.value(c, Chebyshev.reference(t, 0, horizon))));
        }
        return max;
    }

    /** Points of the deterministic scan of the data: a feature wider than about L/4096 is seen by it. */
    static final int SCAN = 4097;

    /**
     * Largest difference between the represented Q/(rho c) and the expression, at 96 random points and on a
     * uniform grid of {@link #SCAN} points in x at t = 0, T/2 and T (a heater narrower than the fit's first
     * sampling would otherwise go unseen by both the fit and its check).
     */
    private double measureSource(Expression source, double[][][] coef) {
        SplittableRandom random = new SplittableRandom(7L);
        double max = 0;
        int points = coef.length;
        for (int i = 0; i < 96 + 3 * SCAN; i++) {
            boolean scan = i >= 96;
            double x = scan ? length * ((i - 96) % SCAN) / (SCAN - 1) : random.nextDouble() * length;
            double t = scan ? horizon * ((i - 96) / SCAN) / 2 : random.nextDouble() * horizon;
            int p = panelOf(fEdges, x);
            double s = Chebyshev.reference(x, fEdges[p], fEdges[p + 1]);
            double r = 0;
            double[] tk = chebyshevValues(Chebyshev.reference(t, 0, horizon), points);
            for (int k = 0; k < points; k++) {
                r += tk[k] * Chebyshev.value(coef[k][p], s);
            }
            max = Math.max(max, Math.abs(r - source.value(x, t) / heatCapacity));
        }
        return max;
    }

    /** As {@link #measureSource} for the initial temperature: 96 random points and the scan of x. */
    private double measureInitial() {
        SplittableRandom random = new SplittableRandom(11L);
        double[] l0 = lift0();
        double max = 0;
        for (int i = 0; i < 96 + SCAN; i++) {
            double x = i < 96 ? random.nextDouble() * length : length * (i - 96) / (SCAN - 1);
            int p = panelOf(gEdges, x);
            if (!gResolved[p]) {
                continue;
            }
            double r = Chebyshev.value(gCoef[p], Chebyshev.reference(x, gEdges[p], gEdges[p + 1]));
            double exact = initial.value(x) - (l0[0] + l0[1] * x + l0[2] * x * x);
            max = Math.max(max, Math.abs(r - exact));
        }
        return max;
    }

    // ------------------------------------------------------------------ piecewise algebra

    private static double[] edges(List<PiecewiseFit.Panel> panels) {
        double[] e = new double[panels.size() + 1];
        for (int p = 0; p < panels.size(); p++) {
            e[p] = panels.get(p).a();
        }
        e[panels.size()] = panels.get(panels.size() - 1).b();
        return e;
    }

    static int panelOf(double[] edges, double x) {
        int last = edges.length - 2;
        if (x >= edges[last]) {
            return last;
        }
        int i = Arrays.binarySearch(edges, x);
        if (i >= 0) {
            return Math.min(i, last);
        }
        return Math.max(0, Math.min(last, -i - 2));
    }

    private static double integrate(double[] edges, double[][] coef) {
        double s = 0;
        for (int p = 0; p < coef.length; p++) {
            s += Chebyshev.integral(coef[p], edges[p], edges[p + 1]);
        }
        return s;
    }

    private static double integratePiecewise(double[] edges, double[][] coef, double x0, double x1) {
        double s = 0;
        for (int p = 0; p < coef.length; p++) {
            double a = Math.max(edges[p], x0);
            double b = Math.min(edges[p + 1], x1);
            if (b <= a) {
                continue;
            }
            double[] anti = Chebyshev.antiderivative(coef[p], edges[p], edges[p + 1]);
            s += Chebyshev.value(anti, Chebyshev.reference(b, edges[p], edges[p + 1]))
                - Chebyshev.value(anti, Chebyshev.reference(a, edges[p], edges[p + 1]));
        }
        return s;
    }

    /** |g(a)| + |g(b)| + int |g'| on one panel (in the reference variable), for integration by parts. */
    private static double edgeVariation(double[] c) {
        double[] d = Chebyshev.derivative(c, -1, 1);
        return Math.abs(Chebyshev.value(c, -1)) + Math.abs(Chebyshev.value(c, 1)) + 2 * Chebyshev.absSum(d);
    }

    private static double absSum(double[][][] c) {
        double s = 0;
        for (double[][] a : c) {
            for (double[] b : a) {
                s += Chebyshev.absSum(b);
            }
        }
        return s;
    }

    private double[][][] removeMean(double[][][] c) {
        double[][][] r = new double[c.length][][];
        for (int k = 0; k < c.length; k++) {
            double mean = integrate(fEdges, c[k]) / length;
            r[k] = new double[c[k].length][];
            for (int p = 0; p < c[k].length; p++) {
                r[k][p] = c[k][p].clone();
                r[k][p][0] -= mean;
            }
        }
        return r;
    }

    private double[][][] timeDerivative(double[][][] c) {
        int nk = c.length;
        int panels = c[0].length;
        double[][][] r = new double[nk][panels][];
        for (int p = 0; p < panels; p++) {
            int nx = c[0][p].length;
            for (int k = 0; k < nk; k++) {
                r[k][p] = new double[nx];
            }
            double[] column = new double[nk];
            for (int j = 0; j < nx; j++) {
                for (int k = 0; k < nk; k++) {
                    column[k] = c[k][p][j];
                }
                double[] d = Chebyshev.derivative(column, 0, horizon);
                for (int k = 0; k < d.length; k++) {
                    r[k][p][j] = d[k];
                }
            }
        }
        return r;
    }

    private double[][][] inverseOperator(double[][][] c) {
        return inverseOperator(c, fEdges);
    }

    /**
     * S = A^{-1} g: -alpha S'' = g with the homogeneous face conditions, by exact double integration
     * of the piecewise series: S = -(1/alpha) I2(x) + c0 + c1 x, I2 = int_0^x int_0^y g.
     * Neumann at both faces: g has zero mean, and S is taken with zero mean.
     */
    private double[][][] inverseOperator(double[][][] c, double[] edges) {
        int nk = c.length;
        int panels = c[0].length;
        double[][][] r = new double[nk][panels][];
        for (int k = 0; k < nk; k++) {
            double run1 = 0;
            double run2 = 0;
            double[][] i2 = new double[panels][];
            for (int p = 0; p < panels; p++) {
                double a = edges[p];
                double b = edges[p + 1];
                double[] a1 = Chebyshev.antiderivative(c[k][p], a, b);
                a1[0] += run1;
                double[] a2 = Chebyshev.antiderivative(a1, a, b);
                a2[0] += run2;
                run1 = Chebyshev.value(a1, 1);
                run2 = Chebyshev.value(a2, 1);
                i2[p] = a2;
            }
            double i1L = run1;
            double i2L = run2;
            double l = length;
            double cc0;
            double cc1;
            if (zeroMode) {
                cc1 = 0;
                double mean = 0;
                for (int p = 0; p < panels; p++) {
                    mean += Chebyshev.integral(i2[p], edges[p], edges[p + 1]);
                }
                cc0 = mean / (alpha * l);
            } else {
                double a11;
                double a12;
                if (leftH == Double.POSITIVE_INFINITY) {
                    a11 = 1;
                    a12 = 0;
                } else {
                    a11 = -leftH;
                    a12 = 1;
                }
                double a21;
                double a22;
                double rhs;
                if (rightH == Double.POSITIVE_INFINITY) {
                    a21 = 1;
                    a22 = l;
                    rhs = i2L / alpha;
                } else {
                    a21 = rightH;
                    a22 = 1 + rightH * l;
                    rhs = (i1L + rightH * i2L) / alpha;
                }
                double det = a11 * a22 - a12 * a21;
                cc0 = (-a12 * rhs) / det;
                cc1 = (a11 * rhs) / det;
            }
            for (int p = 0; p < panels; p++) {
                double a = edges[p];
                double b = edges[p + 1];
                double[] s = i2[p];
                for (int j = 0; j < s.length; j++) {
                    s[j] = -s[j] / alpha;
                }
                s[0] += cc0 + cc1 * 0.5 * (a + b);
                s[1] += cc1 * 0.5 * (b - a);
                r[k][p] = s;
            }
        }
        return r;
    }

    private static double[][][] combine(List<double[][][]> parts, int upTo) {
        double[][][] first = parts.get(0);
        int nk = first.length;
        int panels = first[0].length;
        double[][][] r = new double[nk][panels][];
        for (int p = 0; p < panels; p++) {
            int len = parts.get(upTo).length > 0 ? parts.get(upTo)[0][p].length : 1;
            for (int j = 0; j <= upTo; j++) {
                len = Math.max(len, parts.get(j)[0][p].length);
            }
            for (int k = 0; k < nk; k++) {
                r[k][p] = new double[len];
                for (int j = 0; j <= upTo; j++) {
                    double sign = (j & 1) == 0 ? 1 : -1;
                    double[] src = parts.get(j)[k][p];
                    for (int i = 0; i < src.length; i++) {
                        r[k][p][i] += sign * src[i];
                    }
                }
            }
        }
        return r;
    }

    private static double[] chebyshevValues(double s, int n) {
        double[] t = new double[n];
        if (n > 0) {
            t[0] = 1;
        }
        if (n > 1) {
            t[1] = s;
        }
        for (int k = 2; k < n; k++) {
            t[k] = 2 * s * t[k - 1] - t[k - 2];
        }
        return t;
    }

    private void checkTime(double t) {
        if (!(t >= 0) || t > horizon * (1 + 1e-12)) {
            throw new OracleException(Reason.OUTSIDE_TIME_RANGE, "oracle: t = " + t + " s is outside [0, "
                + horizon + "] s, the horizon the oracle was prepared for; times must be >= 0");
        }
    }

    private void checkSpace(double x) {
        if (!(x >= 0 && x <= length)) {
            throw new OracleException(Reason.OUTSIDE_DOMAIN, "oracle: x = " + x + " m is outside the slab [0, "
                + length + "] m");
        }
    }
}

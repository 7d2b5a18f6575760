package eigencheck.oracle.series;

import eigencheck.oracle.Evaluation;
import eigencheck.oracle.OracleException;
import eigencheck.oracle.OracleException.Reason;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Rectangle;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Slab;
import java.util.ArrayList;
import java.util.EnumMap;
import java.util.List;
import java.util.Map;

/**
 * The rectangle and the box, by superposition: u = P + sum over faces U_f + V.
 * <ul>
 * <li>P(x_a): the source's part, for a source that varies along one axis a at most, the steady slab
 * solution of -k P'' = Q with the homogeneous conditions of the two faces normal to a (the certified
 * slab oracle). It satisfies those faces exactly and leaves B_f(P) on the others.</li>
 * <li>U_f, one per face f with data (B-form: Dirichlet u, Neumann q = k du/dn, Robin h u_amb, less
 * B_f(P)): the elliptic series \(\sum_m G_m \prod X_m(x_\parallel)\, a_m y_m(s)\) with the modes of
 * the tangential axes, s the distance from the face and
 * \(y_m(s) = e^{-\kappa s} + \rho\, e^{-\kappa(2D-s)}\), \(\kappa^2 = \sum \mu^2\), \(\rho\) from the
 * opposite face (-1 Dirichlet, +1 Neumann, \((k\kappa - h)/(k\kappa + h)\) Robin; linear when
 * \(\kappa = 0\)), and \(a_m = 1/B_f(y_m)\). Each face's series converges exponentially at distance s
 * from it, whatever its data do at the edges: the corner where two sides' data disagree costs modes
 * only near that face.</li>
 * <li>V: the decaying transient, \(\sum_J c_J e^{-\alpha \lambda_J t} \prod X_{j_i}(x_i)\) with
 * \(\lambda_J = \sum \mu_{j_i}^2\) and \(c_J = g_J - U_J\): the initial data's projection (tensor
 * Gauss-Legendre) less that of the steady part, which is exact: \(\int_0^D y\,Z = [y(0) Z'(0) -
 * y'(0) Z(0)]/(\kappa^2 + \nu^2)\) by Green's identity, both satisfying the opposite face's
 * condition.</li>
 * </ul>
 *
 * <p>Bounds: every truncation is bounded rigorously from \(|G_m| \le \|G\|/\|X_m\|\) and
 * \(|c_J| \le (\|g\| + \|U\|)/\|X_J\|\) (Cauchy-Schwarz), \(|X| \le 1\), \(\mu_j \ge j\pi/L\), and
 * geometric or Gaussian sums; the projections' quadrature error is measured against a rule 25 % finer
 * (times 10); rounding is 16 ulps of the sum of magnitudes. A rectangle's side with smooth data also
 * gets the integration-by-parts bound \(|\langle G, X_j\rangle| \le V/\mu_j\), V = |G(0)| + |G(L)| +
 * 2 \(\int|G'|\) with the integral measured on a 2048-point rule: that part rests on the smoothness of
 * the data (expressions that may be non-smooth keep the Cauchy-Schwarz bound alone) and is checked by
 * tests near the sides, not proved.
 *
 * <p>Data that change in time: a level b(t) shared by every temperature and ambient, and a source change
 * uniform in space, through {@link CommonLevel}; a source change that is not uniform as at most four
 * terms theta(t) phi(x), each adding theta V (V = A^-1 phi by a steady solver of its own) and modes
 * -V_J E_J(t) ({@link SourceSchedule}); otherwise each side's own change as at most four
 * terms theta(t) phi(s) ({@link SideSchedule}), each adding theta H + theta' Pi_1 / alpha + theta'' Pi_2 /
 * alpha^2 with H the face series of phi and Pi_1, Pi_2 its lags by the resonant profiles
 * ({@link Face#lagProfile}), and particular modes driven by theta''' ({@link #addScheduled}). This version
 * takes a source varying along one axis at most, a sum of such terms, in a box a sum of terms of two
 * coordinates ({@link #addPairTerms}) or one product F(x) G(y) H(z) ({@link ProductSource}), or in a rectangle any smooth
 * source: then the blend's parts psi(x) beta(y) replace P and the remainder
 * \(W = \sum Q_{r,J} X_J / (k \lambda_J)\) joins the steady part ({@link SourceRemainder},
 * {@link #addBlends}, {@link #remainderSeries}). With every face insulated or
 * flux-driven the constant mode stays, the faces' constant modes take the quadratic profile (1 - s/D)^2
 * (its uniform sink balanced by the mean's drift, {@link #driftRate}); side terms there use their
 * shape series less its mean and lags of mean zero ({@link #zeroMeanLag}), and the source must be
 * uniform (a change in time only raises the mean, by its integral). It refuses the rest (UNSUPPORTED), and points nearer to a face with data than its
 * series can reach (TOO_MANY_MODES), except on Dirichlet faces, where u is the data, and on and next to a
 * rectangle's sides, which take the side's series in lifted form ({@link Lifted}), and next to its corners, where
 * the faces are summed jointly ({@link Joint}); only points next to a corner where two sides' data disagree are
 * refused.
 */
public final class TensorSolver implements SpatialSolver {
    private static final double EPS = Math.ulp(1.0);
    private static final int DIRICHLET = 0;
    private static final int NEUMANN = 1;
    private static final int ROBIN = 2;
    private static final Side[][] SIDES = {{Side.XMIN, Side.XMAX}, {Side.YMIN, Side.YMAX}, {Side.ZMIN, Side.ZMAX}};
    private static final String[] NAMES = {"x", "y", "z"};

    private final int d;
    /** Answers past the tolerance keep their bound instead of being refused (a part of another solver's answer). */
    private final boolean lenient;
    private final double[] len;
    private final double k;
    private final double alpha;
    private final double tolerance;
    private final double horizon;
    private final boolean steady;
    private final double scale;
    private final double lengthScale;
    private final AxisModes[] axes;
    private final int[][] type = new int[3][2];
    private final double[][] h = new double[3][2];
    private final Expression[][] data = new Expression[3][2];
    /** Per axis: the slab slice of the source's part along it, or null (an additive source has several). */
    private final SlabSolver.Slice[] sourceSlices;
    private final Expression[] sourceParts;
    private final List<Face> faces = new ArrayList<>();
    private final Expression initial;
    private final int transientCap;
    private final double timeVariation;
    private final double shift;
    /** The level b(t) shared by every temperature and ambient, or null when the data are constant in time. */
    private final CommonLevel level;
    /** P, with -alpha Laplace P = 1 under the homogeneous conditions: the lag behind a moving level (box). */
    private final Slice lag;
    private final int lagFaces;
    /** P as one series with closed-form profiles (rectangle): for points P's face series cannot reach. */
    private final LagSeries lagSeries;
    /** Every face insulated or flux-driven: the mean drifts at {@link #driftRate} (K/s), the faces' constant modes quadratic. */
    private final boolean allFlux;
    private final double driftRate;
    private final double driftError;
    /** sigma(t), the change of a uniform source in K/s, on a body with flux faces only: the mean rises by its integral. */
    private final Expression heatingOnly;
    /** The terms theta(t) phi(s) of rectangle sides whose data change in time other than by a common level. */
    private final List<Moving> moving = new ArrayList<>();
    /** Each side's data as given (with t), for u on a Dirichlet side. */
    private final Expression[][] original = new Expression[3][2];
    private Modal modal;
    /** A rectangle's source that is not a sum of one-coordinate terms: its blend and remainder (null otherwise). */
    private final SourceRemainder remainder;
    /** The blend's steady parts psi(x_a) beta(x_b), one per Dirichlet side (empty without a remainder). */
    private final List<Blend> blends = new ArrayList<>();
    /**
     * A box source's terms of two coordinates each (a heater line along the third axis): T_ab(x_a, x_b), the
     * part of Q that couples axes a and b, with V (-k Laplace V = T_ab on the rectangle of those axes under
     * their homogeneous conditions) from a rectangle solver of its own; empty otherwise.
     */
    private final List<PairTerm> pairs = new ArrayList<>();
    /**
     * The largest error of the pair terms' V where they enter face data (a temperature or convective face
     * across their third axis), summed over the terms: by the maximum principle the face series' answer,
     * and every later temperature, moves by no more (common practice).
     */
    private double pairDataError;
    /** The terms theta(t) phi(x) of a source that changes in time other than uniformly. */
    private final List<SourceSchedule> sourceTerms = new ArrayList<>();
    /** A box source's part that couples x, y and z, as products of factors, one per term (none otherwise). */
    private final List<ProductSource> productParts = new ArrayList<>();
    /** Their steady series W_J = a_i b_j c_k / (k lambda_J) for values and for gradients, one per product. */
    private RemainderSeries[] productValues = new RemainderSeries[0];
    private RemainderSeries[] productGradients;
    /** The remainder's steady series W_J = Q_r,J / (k lambda_J) on boxes for values and for gradients. */
    private RemainderSeries remainderValues;
    private RemainderSeries remainderGradients;

    /**
     * One pair term of a box's source: its axes a < b, the third axis c, T_ab over (x_a, x_b), V's slice
     * (answers with their bounds, not refused) and the error V vouches for at any point it serves.
     */
    private record PairTerm(int a, int b, int c, Expression source, Slice slice, double error, double w0, double w1) {
        /** A term constant along its third axis (w = 1). */
        PairTerm(int a, int b, int c, Expression source, Slice slice, double error) {
            this(a, b, c, source, slice, error, 1, 0);
        }

        Evaluation at(double xa, double xb) {
            return slice.temperature(new double[] {xa, xb}, 0);
        }

        /** The linear factor along the third axis, w = w0 + w1 x_c (1 for a term constant along it). */
        double w(double xc) {
            return w0 + w1 * xc;
        }

        /** The mean of w over [lo, hi]. */
        double wMean(double lo, double hi) {
            return w0 + w1 * 0.5 * (lo + hi);
        }
    }

    /** One term of a side's change in time: its schedule and the face series of its shape. */
    private record Moving(SideSchedule schedule, Face shape, double mean, double input) {
    }

    /**
     * One steady part of the blend: psi(x_axis) beta(x_along), psi = c0 + c1 x_axis the weight of end
     * {@code side} ({@link SourceRemainder}), beta the slab solution along the other axis of the source
     * {@code source} (over x_along), with that axis's homogeneous conditions. It leaves faceFactor beta in
     * B-form on its own side (1 on a Dirichlet side, -+k on a flux or convective one, since B = k du/dn + h u
     * there and B_e psi = 1) and nothing on the others; its {@link BlendCorrection} takes that away.
     */
    private record Blend(int axis, int side, double c0, double c1, int along, SlabSolver.Slice slice,
                         Expression source, double faceFactor, BlendCorrection correction) {
        double psi(double x) {
            return c0 + c1 * x;
        }

        /** The mean of psi over [a, b], or its value when a == b. */
        double psiMean(double a, double b) {
            return c0 + c1 * 0.5 * (a + b);
        }

        /** max |psi| over [0, l]. */
        double psiMax(double l) {
            return Math.max(Math.abs(c0), Math.abs(c0 + c1 * l));
        }
    }

    /**
     * W_J on the box 0..m-1 per axis (row-major), cut from a table of {@code table} modes per axis, with the
     * bounds {value, gradient} of all it leaves out.
     */
    private record RemainderSeries(int table, int[] m, double[] weights, double bound, double gradientBound) {
    }

    public TensorSolver(Problem problem, double timeHorizon, double tolerance) {
        this(problem, timeHorizon, tolerance, false);
    }

    /**
     * @param lenient answers whose bound exceeds the tolerance are returned with that bound instead of refused
     *     (a part of another solver's answer, which checks the sum)
     */
    private TensorSolver(Problem problem, double timeHorizon, double tolerance, boolean lenient) {
        this.lenient = lenient;
        if (!(tolerance > 0 && tolerance < 1)) {
            throw new IllegalArgumentException("tolerance " + tolerance + " must be in (0, 1)");
        }
        this.len = problem.domain().lengths();
        this.d = len.length;
        this.tolerance = tolerance;
        this.steady = problem.steady();
        this.horizon = steady ? Double.POSITIVE_INFINITY : timeHorizon;
        if (!steady && !(timeHorizon >= 0 && timeHorizon < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("time horizon " + timeHorizon + " must be finite and >= 0");
        }
        Material material = problem.material();
        this.k = material.conductivity();
        this.alpha = material.diffusivity();
        this.lengthScale = problem.domain().characteristicLength();
        this.transientCap = d == 2 ? 1024 : 64;
        boolean allFlux = true;
        double variation = 0;
        axes = new AxisModes[d];
        Expression levelExpression = steady ? null : levelOf(problem);
        // a rectangle whose sides change in time other than by one level: each side's change as terms theta(t) phi(s)
        boolean perSide = !steady && timeHorizon > 0 && needsSchedules(problem, levelExpression, timeHorizon);
        if (perSide) {
            levelExpression = null;
        }
        List<Object[]> pending = new ArrayList<>();
        double movingSize = 0;
        for (int i = 0; i < d; i++) {
            double[] hk = new double[2];
            for (int s = 0; s < 2; s++) {
                BoundaryCondition c = problem.condition(SIDES[i][s]);
                original[i][s] = c.data();
                double units = c instanceof BoundaryCondition.Neumann ? lengthScale / k : 1;
                if (perSide && c.data().variables().contains("t") && !c.data().isIndependentOf("t")) {
                    double[] sizes = new double[2];
                    pending.addAll(changeTerms(c.data(), i, s, timeHorizon, sizes));
                    variation += 2 * sizes[0] * units;
                    movingSize += sizes[1] * units;
                    data[i][s] = c.data().substitute("t", 0);
                } else if (levelExpression != null && !(c instanceof BoundaryCondition.Neumann)) {
                    variation += 2 * requireLevel(c.data(), levelExpression, i, s, timeHorizon);
                    data[i][s] = c.data().variables().contains("t") ? c.data().substitute("t", 0) : c.data();
                } else {
                    double v = requireConstantInTime(c.data(), "boundary." + SIDES[i][s].key(), timeHorizon);
                    variation += 2 * v * (c instanceof BoundaryCondition.Neumann ? lengthScale / k : 1);
                    data[i][s] = c.data();
                }
                if (c instanceof BoundaryCondition.Dirichlet) {
                    type[i][s] = DIRICHLET;
                    hk[s] = Double.POSITIVE_INFINITY;
                    allFlux = false;
                } else if (c instanceof BoundaryCondition.Neumann) {
                    type[i][s] = NEUMANN;
                } else {
                    type[i][s] = ROBIN;
                    h[i][s] = ((BoundaryCondition.Robin) c).heatTransferCoefficient();
                    hk[s] = h[i][s] / k;
                    allFlux = false;
                }
            }
            axes[i] = new AxisModes(len[i], hk[0], hk[1]);
        }
        this.allFlux = allFlux;
        if (allFlux && steady) {
            throw new OracleException(Reason.UNSUPPORTED, "oracle: every face is insulated or flux-driven, so a steady"
                + " state exists only when the net heat input vanishes, and then only up to a constant; give the"
                + " problem a time horizon (the mean then drifts with the net input), or a face a temperature or"
                + " convection");
        }
        double[] mismatch = new double[2];
        Expression heating = steady ? null : heatingOf(problem, timeHorizon, mismatch);
        // every face insulated or flux-driven: a uniform source's change only raises the mean, by int sigma
        this.heatingOnly = allFlux ? heating : null;
        List<Object[]> sourceChange = List.of();
        double sourceChangeSize = 0;
        if (mismatch[1] != 0) {
            if (allFlux) {
                throw new OracleException(Reason.UNSUPPORTED, "source: changes in time other than uniformly on a body"
                    + " whose faces are all insulated or flux-driven; this version solves such bodies with a source"
                    + " that changes by the same amount everywhere (Q(x, t) = Q_0(x) + q(t)); give a face a"
                    + " temperature or convection, or use a manufactured solution");
            }
            // Q(x, t) = Q(x, 0) + sum_k theta_k(t) phi_k(x): each term's response by its own steady solution
            double[] sizes = new double[2];
            sourceChange = changeTerms(problem.source(), -1, -1, timeHorizon, sizes);
            variation += 2 * sizes[0] * lengthScale * lengthScale / k;
            sourceChangeSize = sizes[1] * lengthScale * lengthScale / k;
        } else if (heating == null) {
            variation += 2 * requireConstantInTime(problem.source(), "source", timeHorizon) * lengthScale * lengthScale / k;
        } else {
            variation += 2 * mismatch[0] * lengthScale * lengthScale / k;
            if (allFlux) {
                heating = null;
            } else if (levelExpression == null) {
                levelExpression = Expression.constant(0, "t");
            }
        }
        this.initial = problem.initial();
        this.level = levelExpression == null ? null
            : new CommonLevel(levelExpression, heating, timeHorizon, alpha, axes);
        // a uniform source that changes in time moves the temperature by up to max |sigma| T
        Expression anyHeating = heating != null ? heating : heatingOnly;
        double heated = anyHeating == null ? 0
            : CommonLevel.sizes(anyHeating, anyHeating, anyHeating, timeHorizon)[0] * timeHorizon;
        this.scale = scaleOf(problem) + (level == null ? 0 : level.levelMax) + heated + movingSize + sourceChangeSize
            + (allFlux ? driftEstimate(problem) * timeHorizon : 0);
        Expression q = problem.source();
        // a source that is rounding noise (a manufactured source whose terms cancel) is taken as zero: its
        // sampled size, doubled, joins the bound; fitting the noise would only chase rounding
        double noise = sourceSize(q) * lengthScale * lengthScale / k;
        boolean negligible = !(q.isConstant()) && noise <= 1e-13 * scale;
        if (negligible) {
            variation += 2 * noise;
            q = Expression.parse("0", q.variables().toArray(String[]::new));
        }
        List<Integer> along = new ArrayList<>();
        for (int i = 0; i < d; i++) {
            double change = variationAlong(q, i);
            variation += 2 * (Double.isFinite(change) ? change : 0) * lengthScale * lengthScale / k;
            if (change == Double.POSITIVE_INFINITY) {
                along.add(i);
            }
        }
        SourceRemainder split = null;
        if (along.size() > 1) {
            double[] mixed = mixedDifference(q, along);
            if (mixed[0] <= 1e-12 * Math.max(1, mixed[1])) {
                variation += 2 * mixed[0] * lengthScale * lengthScale / k;
            } else if (d == 2 && !allFlux) {
                split = remainderOf(q);
            } else if (d == 3 && !allFlux) {
                double[] triple = tripleDifference(q);
                boolean coupledOnly = false;
                if (!(triple[0] <= 1e-12 * Math.max(1, triple[1]))) {
                    // a source coupling x, y and z as one product F(x) G(y) H(z): its own parts, and nothing left
                    double[] residual = new double[1];
                    // the whole source when it is one product (a spot heater)
                    ProductSource whole = productOf(q, residual);
                    if (whole == null) {
                        // else Q's terms as written (two spots, a spot on a background beside a heater line): a
                        // term that is one product leaves the rest, another that couples all three gives its
                        // part Q_t = D_x D_y D_z term (D_i f = f - f at x_i = 0) and stays, read by the pair
                        // terms off the planes through the origin, where Q_t vanishes
                        double[] parts = new double[2];
                        q = productTerms(q, residual[0], parts);
                        variation += 2 * parts[0] * lengthScale * lengthScale / k;
                        coupledOnly = parts[1] != 0;
                    } else {
                        productParts.add(whole);
                        q = Expression.constant(0, q.variables().toArray(String[]::new));
                        variation += 2 * residual[0] * lengthScale * lengthScale / k;
                    }
                    if (coupledOnly) {
                        triple = new double[] {0, triple[1]};
                    } else {
                        triple = tripleDifference(q);
                        for (java.util.Iterator<Integer> it = along.iterator(); it.hasNext(); ) {
                            double change = variationAlong(q, it.next());
                            if (Double.isFinite(change)) {
                                variation += 2 * change * lengthScale * lengthScale / k;
                                it.remove();
                            }
                        }
                    }
                }
                double[] pairMixed = along.size() > 1 && !coupledOnly ? mixedDifference(q, along) : new double[] {0, 0};
                if (!productParts.isEmpty() && !coupledOnly && pairMixed[0] <= 1e-12 * Math.max(1, pairMixed[1])) {
                    // the rest is additive: a slab along each axis it varies on
                    variation += 2 * (triple[0] + pairMixed[0]) * lengthScale * lengthScale / k;
                } else {
                    double[] left = addPairTerms(problem, q, along);
                    variation += 2 * (triple[0] + left[0]) * lengthScale * lengthScale / k;
                    // the first pair term holds the constant and its axes' own terms: a slab remains along its
                    // third axis alone
                    int third = (int) left[1];
                    along.removeIf(i -> i != third);
                }
            } else {
                throw notAdditive(along);
            }
        }
        this.remainder = split;
        boolean zeroSource = negligible || q.isConstant() && q.value(new double[q.variables().size()]) == 0;
        int constantAxis = along.isEmpty() ? -1 : along.get(0);
        double sourceDrift = 0;
        if (allFlux && !zeroSource && along.isEmpty()) {
            // every face insulated or flux-driven: a uniform source only raises the mean, Q / (rho c) per second
            sourceDrift = valueAt(q, new double[d]) / material.volumetricHeatCapacity();
            zeroSource = true;
        }
        if (!zeroSource && along.isEmpty() && pairs.isEmpty()) {
            for (int i = 0; i < d && constantAxis < 0; i++) {
                if (!axes[i].zero) {
                    constantAxis = i;
                }
            }
            along.add(constantAxis);
        }
        this.sourceSlices = new SlabSolver.Slice[d];
        this.sourceParts = new Expression[d];
        if (remainder != null) {
            variation += addBlends(problem.material(), sourceSize(q));
            buildRemainderSeries();
        } else if (!zeroSource && !along.isEmpty()) {
            for (int i : along) {
                if (axes[i].zero) {
                    throw new OracleException(Reason.UNSUPPORTED, "source: varies along " + NAMES[i] + ", whose two"
                        + " faces are both insulated or flux-driven; this version needs a temperature or convection on"
                        + " one of them");
                }
            }
            // an additive source Q(0) + sum_i (Q along axis i - Q(0)): the constant goes with the first axis
            double q0 = valueAt(q, new double[d]);
            for (int i : along) {
                Problem slab = sourceSlab(q, problem.material(), i, i == along.get(0) && pairs.isEmpty() ? 0 : q0);
                sourceParts[i] = slab.source();
                sourceSlices[i] = new SlabSolver(slab, 0, tolerance / (8 * along.size())).at(0);
            }
        }
        if (!productParts.isEmpty()) {
            addProductParts(problem.material());
        }
        this.timeVariation = variation;
        this.shift = shiftOf();
        if (level != null && level.rateMax > 0) {
            // P's own tolerance: its error, times max|b'|, within an eighth of the budget (P's scale is L^2/alpha)
            double lagTolerance = tolerance * scale * alpha / (8 * level.rateMax * lengthScale * lengthScale);
            if (d == 3) {
                TensorSolver p = new TensorSolver(lagProblem(problem), 0, Math.max(1e-14, Math.min(0.25, lagTolerance)));
                this.lag = p.at(Double.POSITIVE_INFINITY);
                this.lagFaces = p.dataFaces();
            } else {
                // in a rectangle P is one series with its smooth part in closed form, certified up to the sides
                this.lag = null;
                this.lagFaces = 0;
            }
            if (d == 2) {
                double[][] hOverK = new double[2][2];
                for (int i = 0; i < 2; i++) {
                    for (int s = 0; s < 2; s++) {
                        hOverK[i][s] = type[i][s] == DIRICHLET ? Double.POSITIVE_INFINITY : type[i][s] == NEUMANN ? 0
                            : h[i][s] / k;
                    }
                }
                this.lagSeries = new LagSeries(axes, alpha, hOverK);
            } else {
                this.lagSeries = null;
            }
        } else {
            this.lag = null;
            this.lagFaces = 0;
            this.lagSeries = null;
        }
        for (int i = 0; i < d; i++) {
            for (int s = 0; s < 2; s++) {
                Face f = new Face(i, s);
                if (f.present) {
                    faces.add(f);
                }
            }
        }
        double rate = sourceDrift;
        double rateError = 0;
        if (allFlux) {
            // the net input through the faces, each face's mean flux (its series' constant mode) over its depth
            for (Face f : faces) {
                Face.Table tb = f.table(new int[f.tangential.length]);
                rate += tb.coef[0] / (f.depth * material.volumetricHeatCapacity());
                rateError += tb.error / (f.depth * material.volumetricHeatCapacity());
            }
        }
        this.driftRate = rate;
        this.driftError = rateError + 4 * EPS * Math.abs(rate);
        for (Object[] term : pending) {
            int axis = (Integer) term[0];
            int side = (Integer) term[1];
            Face f = new Face(axis, side, (Expression) term[3]);
            if (f.present) {
                // every face a flux face: the shape series' mean G_0 a / 3 is taken out (the lags need a mean of
                // zero), and its input G_0 / D raises the mean at the rate theta(t) G_0 / (D rho c)
                double mean = 0;
                double input = 0;
                if (allFlux) {
                    Face.Table tb = f.table(new int[f.tangential.length]);
                    mean = tb.coef[0] * tb.amplitude[0] / 3;
                    input = tb.coef[0] / (f.depth * material.volumetricHeatCapacity());
                }
                moving.add(new Moving(new SideSchedule(axis, side, (Expression) term[2], timeHorizon,
                    "the schedule of boundary." + SIDES[axis][side].key()), f, mean, input));
            }
        }
        // each term's steady solver is its own work: built side by side
        if (!sourceChange.isEmpty()) {
            int threads = Math.min(sourceChange.size(), Runtime.getRuntime().availableProcessors());
            java.util.concurrent.ExecutorService pool = java.util.concurrent.Executors.newFixedThreadPool(threads, r -> {
                Thread thread = new Thread(r, "eigencheck-source-term");
                thread.setDaemon(true);
                return thread;
            });
            try {
                List<java.util.concurrent.Future<SourceSchedule>> built = new ArrayList<>();
                for (int j = 0; j < sourceChange.size(); j++) {
                    Object[] term = sourceChange.get(j);
                    int index = j;
                    int count = sourceChange.size();
                    built.add(pool.submit(() -> sourceTerm(problem, (Expression) term[2], (Expression) term[3],
                        timeHorizon, index, count)));
                }
                for (java.util.concurrent.Future<SourceSchedule> f : built) {
                    sourceTerms.add(f.get());
                }
            } catch (java.util.concurrent.ExecutionException e) {
                if (e.getCause() instanceof RuntimeException r) {
                    throw r;
                }
                throw new IllegalStateException(e.getCause());
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                throw new IllegalStateException("interrupted while preparing the source's terms", e);
            } finally {
                pool.shutdownNow();
            }
        }
    }

    /**
     * One term theta(t) phi(x) of the source's change: its schedule, and V (-k Laplace V = phi under the
     * homogeneous conditions) by a steady solver of its own whose error, times max|theta|, is within
     * tolerance * scale / (2 n) for n terms (or up to 16 times that where its series cannot reach it).
     */
    private SourceSchedule sourceTerm(Problem problem, Expression theta, Expression phi, double timeHorizon, int j,
                                      int n) {
        String what = "the schedule of the source's change in time, term " + (j + 1) + " of " + n;
        String[] coordinates = java.util.Arrays.copyOf(NAMES, d);
        Expression shape = (phi.variables().contains("t") ? phi.substitute("t", 0) : phi).over(coordinates);
        double thetaMax = CommonLevel.sizes(theta, theta, theta, timeHorizon, what)[0];
        double shapeSize = 0;
        double[] p = new double[d];
        for (int c = 0; c < gridCount(); c++) {
            gridPoint(c, p);
            shapeSize = Math.max(shapeSize, Math.abs(shape.value(p)));
        }
        double ownScale = shapeSize > 0 ? shapeSize * lengthScale * lengthScale / k : 1;
        double ownTolerance = tolerance * scale / (2 * n * Math.max(thetaMax, 1e-300) * ownScale);
        String[] withTime = java.util.Arrays.copyOf(NAMES, d + 1);
        withTime[d] = "t";
        Problem steadyProblem = homogeneousProblem(problem, shape.over(withTime));
        SpatialSolver.Slice response = null;
        // V's own parts rarely use all of their shares: when its series cannot reach that tolerance, a looser one
        // (at most 16 times) may still leave the sum within this solver's budget, which every answer checks
        for (int attempt = 0; response == null; attempt++) {
            try {
                TensorSolver solver = new TensorSolver(steadyProblem, 0,
                    Math.max(1e-14, Math.min(0.25, ownTolerance * Math.pow(4, attempt))), true);
                response = solver.at(Double.POSITIVE_INFINITY);
            } catch (OracleException e) {
                if (e.reason() != Reason.TOO_MANY_MODES || attempt == 2) {
                    throw new OracleException(e.reason(), "source: changes in time by a term theta(t) phi(x) whose"
                        + " shape phi this version cannot take as a steady source at this tolerance ("
                        + e.getMessage() + ")");
                }
            }
        }
        return new SourceSchedule(theta, timeHorizon, shape, response, axes, k, alpha,
            m -> project(point -> shape.value(point), allAxes(), m, new double[d]), what);
    }

    /**
     * Whether a side's data change in time other than by the common level (or, without one, at all
     * for a flux side): then a rectangle takes each side's change as its own terms.
     */
    private boolean needsSchedules(Problem problem, Expression levelExpression, double timeHorizon) {
        for (int i = 0; i < d; i++) {
            for (int s = 0; s < 2; s++) {
                BoundaryCondition c = problem.condition(SIDES[i][s]);
                Expression e = c.data();
                boolean followsLevel = levelExpression != null && !(c instanceof BoundaryCondition.Neumann);
                if (!followsLevel && (!e.variables().contains("t") || e.isIndependentOf("t"))) {
                    continue;
                }
                try {
                    if (followsLevel) {
                        requireLevel(e, levelExpression, i, s, timeHorizon);
                    } else {
                        requireConstantInTime(e, "boundary." + SIDES[i][s].key(), timeHorizon);
                    }
                } catch (OracleException refused) {
                    if (refused.reason() != Reason.UNSUPPORTED) {
                        throw refused;
                    }
                    return true;
                }
            }
        }
        return false;
    }

    /**
     * The change of a side's data g(s, t) - g(s, 0) as at most four terms theta_k(t) phi_k(s), by cross
     * approximation on a grid of the side (17 points of a rectangle's side, 9 x 9 of a box's face) and 32
     * times: each term is the residual's line through its largest sample, R(s, t*) R(s*, t) / R(s*, t*), so
     * the residual vanishes on that cross. The residual left must be below 1e-12 of the data's size on a
     * shifted grid (33 points, or 17 x 17) at 48 other times, or the side is refused. With axis -1, the
     * source's change Q(x, t) - Q(x, 0) over the whole body, likewise (17 x 17 points of a rectangle,
     * 9 x 9 x 9 of a box; checked on 33 x 33 or 17 x 17 x 17). Returns {axis, side, theta over t, phi} per
     * term; {largest residual, largest change} go into {@code sizes}.
     */
    private List<Object[]> changeTerms(Expression g, int axis, int side, double horizon, double[] sizes) {
        boolean body = axis < 0;
        String field = body ? "source" : "boundary." + SIDES[axis][side].key();
        String shapeOf = body ? "(shape over the body)" : "(shape along the side)";
        String solves = body ? "whose source changes in time" : "whose side data change in time";
        String[] vars = g.variables().toArray(String[]::new);
        int[] tangential = new int[body ? d : d - 1];
        for (int i = 0, j = 0; i < d; i++) {
            if (i != axis) {
                tangential[j++] = i;
            }
        }
        int per = d == 2 ? 17 : 9;
        double[][] grid = sideGrid(tangential, per, 0);
        Expression delta = g.linear(1, g.substitute("t", 0).over(vars), -1);
        double size = 0;
        double[] point = new double[d];
        if (!body) {
            point[axis] = side == 0 ? 0 : len[axis];
        }
        for (double[] s : grid) {
            place(point, tangential, s);
            for (int j = 0; j <= 32; j++) {
                size = Math.max(size, Math.abs(valueAt(g, point, horizon * j / 32)));
            }
        }
        double limit = 1e-12 * Math.max(1, size);
        // each term as a combination of the change at the pivot times (shapes) and points (schedules), so its
        // expression stays as cheap as the data's: phi_k = sum_i c_ki delta(., t_i), theta_k = sum_i e_ki delta(s_i, .)
        List<Expression> slices = new ArrayList<>();
        List<Expression> lines = new ArrayList<>();
        List<Expression> shapes = new ArrayList<>();
        List<Expression> schedules = new ArrayList<>();
        List<double[]> shapeMix = new ArrayList<>();
        List<double[]> scheduleMix = new ArrayList<>();
        List<Object[]> terms = new ArrayList<>();
        double change = 0;
        for (int term = 0; term <= 4; term++) {
            double best = 0;
            double[] bestS = null;
            double bestT = 0;
            for (double[] s : grid) {
                place(point, tangential, s);
                for (int j = 1; j <= 32; j++) {
                    double tj = horizon * j / 32;
                    double v = Math.abs(residual(delta, shapes, schedules, point, tj));
                    if (term == 0) {
                        change = Math.max(change, v);
                    }
                    if (v > best) {
                        best = v;
                        bestS = s;
                        bestT = tj;
                    }
                }
            }
            if (best <= limit) {
                break;
            }
            if (term == 4) {
                throw new OracleException(Reason.UNSUPPORTED, field + ": changes in time in a way that is not a sum"
                    + " of at most four terms " + shapeOf + " x (schedule in t) (after four, " + best + " is left"
                    + " at " + java.util.Arrays.toString(bestS) + " m" + (body ? "" : " along it") + " and t = " + bestT
                    + " s); this version solves rectangles and boxes " + solves + " by such terms (a moving heat"
                    + " source is not one); for other time-dependent data use a manufactured solution");
            }
            place(point, tangential, bestS);
            double pivot = residual(delta, shapes, schedules, point, bestT);
            // the change along the side at t*, and in time at s*
            slices.add(delta.substitute("t", bestT).over(vars));
            Expression line = delta;
            for (String v : vars) {
                if (!v.equals("t")) {
                    line = line.substitute(v, point[java.util.Arrays.asList(NAMES).indexOf(v)]);
                }
            }
            lines.add(line.over("t"));
            // phi_k = (delta(., t*) - sum_j theta_j(t*) phi_j) / pivot; theta_k = delta(s*, .) - sum_j phi_j(s*) theta_j
            int n = term + 1;
            double[] c = new double[n];
            double[] e = new double[n];
            c[term] = 1 / pivot;
            e[term] = 1;
            for (int j = 0; j < term; j++) {
                double thetaAt = schedules.get(j).value(bestT);
                double phiAt = valueAt(shapes.get(j), point);
                for (int i = 0; i <= j; i++) {
                    c[i] -= thetaAt * shapeMix.get(j)[i] / pivot;
                    e[i] -= phiAt * scheduleMix.get(j)[i];
                }
            }
            shapeMix.add(c);
            scheduleMix.add(e);
            Expression shape = slices.get(0).linear(c[0], slices.get(0), 0);
            Expression schedule = lines.get(0).linear(e[0], lines.get(0), 0);
            for (int i = 1; i < n; i++) {
                shape = shape.linear(1, slices.get(i), c[i]);
                schedule = schedule.linear(1, lines.get(i), e[i]);
            }
            shapes.add(shape);
            schedules.add(schedule);
            terms.add(new Object[] {axis, side, schedule, shape});
        }
        double left = 0;
        for (double[] s : sideGrid(tangential, d == 2 ? 33 : 17, 0.37)) {
            place(point, tangential, s);
            for (int j = 1; j <= 48; j++) {
                left = Math.max(left, Math.abs(residual(delta, shapes, schedules, point, horizon * (j - 0.41) / 47.59)));
            }
        }
        if (left > limit) {
            throw new OracleException(Reason.UNSUPPORTED, field + ": changes in time in a way that is not a sum of at"
                + " most four terms " + shapeOf + " x (schedule in t) (" + left + " is left between the"
                + " sampled points); this version solves rectangles and boxes " + solves + " by such"
                + " terms; for other time-dependent data use a manufactured solution");
        }
        sizes[0] = left;
        sizes[1] = change;
        return terms;
    }

    /** A grid of per^(d-1) points of a side (its tangential coordinates), shifted by {@code offset} of a step. */
    private double[][] sideGrid(int[] tangential, int per, double offset) {
        int count = (int) Math.pow(per, tangential.length);
        double[][] grid = new double[count][tangential.length];
        for (int c = 0; c < count; c++) {
            int rest = c;
            for (int j = 0; j < tangential.length; j++) {
                int q = rest % per;
                rest /= per;
                double step = offset == 0 ? q / (per - 1.0) : (q + offset) / (per + offset);
                grid[c][j] = len[tangential[j]] * step;
            }
        }
        return grid;
    }

    /** delta(p, t) - sum_j theta_j(t) phi_j(p): what the terms found so far leave of the change. */
    private double residual(Expression delta, List<Expression> shapes, List<Expression> schedules, double[] point,
                            double t) {
        double r = valueAt(delta, point, t);
        for (int j = 0; j < shapes.size(); j++) {
            r -= schedules.get(j).value(t) * valueAt(shapes.get(j), point);
        }
        return r;
    }

    private static void place(double[] point, int[] tangential, double[] s) {
        for (int j = 0; j < tangential.length; j++) {
            point[tangential[j]] = s[j];
        }
    }

    /**
     * The level b(t) = g(c, t) - g(c, 0) of the first Dirichlet or convective side whose data change in
     * time, c the side's centre, over the single variable t; null when no such side's data name t.
     */
    private Expression levelOf(Problem problem) {
        for (int i = 0; i < d; i++) {
            for (int s = 0; s < 2; s++) {
                BoundaryCondition c = problem.condition(SIDES[i][s]);
                Expression e = c.data();
                if (c instanceof BoundaryCondition.Neumann || !e.variables().contains("t") || e.isIndependentOf("t")) {
                    continue;
                }
                for (int j = 0; j < d; j++) {
                    if (e.variables().contains(NAMES[j])) {
                        e = e.substitute(NAMES[j], j == i ? (s == 0 ? 0 : len[i]) : len[j] / 2);
                    }
                }
                e = e.over("t");
                return e.linear(1, Expression.constant(1, "t"), -e.value(0));
            }
        }
        return null;
    }

    /**
     * sigma(t) = (Q(c, t) - Q(c, 0)) / (rho c) at the body's centre c, over t, when the source names t;
     * null when it does not change in time. A source that changes other than uniformly (Q(p, t) - Q(p, 0)
     * = rho c sigma(t) to 1e-12 of |Q| at 9^d points and 16 times) returns null with {@code mismatch[1]}
     * set to 1 (its change is then taken as terms theta(t) phi(x), {@link SourceSchedule}); the largest
     * difference found (W/m^3) goes into {@code mismatch[0]}.
     */
    private Expression heatingOf(Problem problem, double timeHorizon, double[] mismatch) {
        Expression q = problem.source();
        if (!q.variables().contains("t") || q.isIndependentOf("t") || !(timeHorizon > 0)) {
            return null;
        }
        double rhoC = problem.material().volumetricHeatCapacity();
        Expression at = q;
        for (int i = 0; i < d; i++) {
            if (at.variables().contains(NAMES[i])) {
                at = at.substitute(NAMES[i], len[i] / 2);
            }
        }
        at = at.over("t");
        Expression sigma = at.linear(1 / rhoC, Expression.constant(1, "t"), -at.value(0) / rhoC);
        double worst = 0;
        boolean changes = false;
        int count = gridCount();
        double[] p = new double[d];
        for (int c = 0; c < count; c++) {
            gridPoint(c, p);
            double q0 = valueAt(q, p, 0);
            for (int j = 1; j <= 16; j++) {
                double t = timeHorizon * j / 16;
                double qt = valueAt(q, p, t);
                double miss = Math.abs(qt - q0 - rhoC * sigma.value(t));
                changes |= Math.abs(qt - q0) > 1e-12 * Math.max(1, Math.abs(q0));
                worst = Math.max(worst, miss);
                if (miss > 1e-12 * Math.max(1, Math.abs(qt))) {
                    mismatch[1] = 1;
                    return null;
                }
            }
        }
        mismatch[0] = worst;
        return changes ? sigma : null;
    }

    /**
     * Refuses a Dirichlet or convective side whose data do not change in time by the common level:
     * g(p, t) - g(p, 0) - b(t) must vanish (to 1e-12 of |g|) at 9^(d-1) points of the side and 16 times.
     * Returns the largest difference found (temperature units).
     */
    private double requireLevel(Expression g, Expression b, int axis, int side, double timeHorizon) {
        int count = gridCount();
        double[] p = new double[d];
        double worst = 0;
        for (int c = 0; c < count; c++) {
            gridPoint(c, p);
            if (p[axis] != 0) {
                continue; // one layer of the grid, moved onto the side
            }
            p[axis] = side == 0 ? 0 : len[axis];
            double g0 = valueAt(g, p, 0);
            for (int j = 1; j <= 16; j++) {
                double t = timeHorizon * j / 16;
                double gt = valueAt(g, p, t);
                double miss = Math.abs(gt - g0 - b.value(t));
                worst = Math.max(worst, miss);
                if (miss > 1e-12 * Math.max(1, Math.abs(gt))) {
                    throw new OracleException(Reason.UNSUPPORTED, "boundary." + SIDES[axis][side].key() + ": changes"
                        + " in time other than by the level b(t) of the first side that does (at "
                        + java.util.Arrays.toString(p) + " and t = " + t + " s it is " + gt + ", not " + (g0 + b.value(t))
                        + "); the common level needs every temperature and ambient to follow it");
                }
            }
            p[axis] = 0;
        }
        return worst;
    }

    /** The steady problem of P: -k Laplace P = rho c (so -alpha Laplace P = 1), every side's data zero. */
    private Problem lagProblem(Problem problem) {
        String[] withTime = java.util.Arrays.copyOf(NAMES, d + 1);
        withTime[d] = "t";
        return homogeneousProblem(problem, Expression.constant(problem.material().volumetricHeatCapacity(), withTime));
    }

    /** The steady problem -k Laplace V = source (over the coordinates and t) with every side's data zero. */
    private Problem homogeneousProblem(Problem problem, Expression source) {
        Map<Side, BoundaryCondition> bc = new EnumMap<>(Side.class);
        String[] coordinates = java.util.Arrays.copyOf(NAMES, d);
        String[] withTime = java.util.Arrays.copyOf(NAMES, d + 1);
        withTime[d] = "t";
        for (int i = 0; i < d; i++) {
            for (int s = 0; s < 2; s++) {
                Expression zero = Expression.constant(0, withTime);
                bc.put(SIDES[i][s], switch (type[i][s]) {
                    case DIRICHLET -> new BoundaryCondition.Dirichlet(zero);
                    case NEUMANN -> new BoundaryCondition.Neumann(zero);
                    default -> new BoundaryCondition.Robin(h[i][s], zero);
                });
            }
        }
        return new Problem(problem.domain(), problem.material(), Expression.constant(0, coordinates), source, bc, true);
    }

    /**
     * Refuses data that vary in time. Data that name t but do not change with it (a manufactured face
     * where the time factor multiplies a mode that vanishes there) are accepted when 9^d samples at
     * five times differ from t = 0 by less than 1e-12 of their size; the variation found, doubled, is
     * added to every bound (in temperature units). Returns it.
     */
    private double requireConstantInTime(Expression e, String field, double timeHorizon) {
        if (!e.variables().contains("t") || e.isIndependentOf("t")) {
            return 0;
        }
        double variation = 0;
        boolean constant = timeHorizon > 0 && timeHorizon < Double.POSITIVE_INFINITY;
        int count = gridCount();
        double[] p = new double[d];
        for (int c = 0; c < count && constant; c++) {
            gridPoint(c, p);
            double v0 = valueAt(e, p, 0);
            for (int j = 1; j <= 4 && constant; j++) {
                double v = valueAt(e, p, timeHorizon * j / 4);
                variation = Math.max(variation, Math.abs(v - v0));
                constant = Math.abs(v - v0) <= 1e-12 * Math.max(1, Math.abs(v0));
            }
        }
        if (!constant) {
            throw new OracleException(Reason.UNSUPPORTED, field + ": depends on t; this version solves side data"
                + " that change in time by terms (shape along the side) x (schedule) over a time horizon, and a"
                + " source that changes by the same amount everywhere or by a few terms (shape) x (schedule) (the"
                + " initial temperature may be anything); for"
                + " other time-dependent data use a manufactured solution");
        }
        return variation;
    }

    /**
     * The largest change of the expression along the axis over 81 sampled lines (0 if it does not name
     * the coordinate): a source that names a coordinate but does not change along it to 1e-12 of its size
     * (a manufactured source whose terms cancel) counts as not varying, and the change is bounded.
     */
    private double variationAlong(Expression e, int axis) {
        if (e.isIndependentOf(NAMES[axis])) {
            return 0;
        }
        double[] p = new double[d];
        double change = 0;
        double size = 0;
        for (int c = 0; c < 81; c++) {
            for (int i = 0; i < d; i++) {
                p[i] = len[i] * (((c * 7 + i * 3) % 9) / 8.0);
            }
            p[axis] = 0;
            double v0 = valueAt(e, p);
            size = Math.max(size, Math.abs(v0));
            for (int j = 1; j <= 8; j++) {
                p[axis] = len[axis] * j / 8;
                change = Math.max(change, Math.abs(valueAt(e, p) - v0));
            }
        }
        if (sourcePeak != null) {
            // the line through the scan's peak, finely: a narrow heater changes along it
            double[] q = sourcePeak.clone();
            q[axis] = 0;
            double v0 = valueAt(e, q);
            size = Math.max(size, Math.abs(v0));
            for (int j = 1; j < 4097; j++) {
                q[axis] = len[axis] * j / 4096;
                double v = valueAt(e, q);
                size = Math.max(size, Math.abs(v));
                change = Math.max(change, Math.abs(v - v0));
            }
        }
        return change <= 1e-12 * Math.max(1, size) ? change : Double.POSITIVE_INFINITY;
    }

    /**
     * Whether a source that varies along several axes is additive, Q = sum_i q_i(x_i): the mixed
     * differences Q(p) - Q(p, x_i = 0) - Q(p, x_j = 0) + Q(p, x_i = x_j = 0) at 81 sampled points for
     * every pair. Returns {largest mixed difference, largest |Q|}; additive when the first is within
     * 1e-12 of the second.
     */
    private double[] mixedDifference(Expression q, List<Integer> along) {
        double worst = 0;
        double size = 0;
        double[] p = new double[d];
        for (int c = 0; c < 82; c++) {
            for (int i = 0; i < d; i++) {
                p[i] = c == 81 ? (sourcePeak == null ? 0 : sourcePeak[i]) : len[i] * (((c * 7 + i * 5 + 1) % 9) / 8.0);
            }
            size = Math.max(size, Math.abs(valueAt(q, p)));
            for (int a = 0; a < along.size(); a++) {
                for (int b = a + 1; b < along.size(); b++) {
                    int i = along.get(a);
                    int j = along.get(b);
                    double[] pi = p.clone();
                    pi[i] = 0;
                    double[] pj = p.clone();
                    pj[j] = 0;
                    double[] pij = pi.clone();
                    pij[j] = 0;
                    worst = Math.max(worst, Math.abs(valueAt(q, p) - valueAt(q, pi) - valueAt(q, pj) + valueAt(q, pij)));
                }
            }
        }
        return new double[] {worst, size};
    }

    /**
     * The largest triple mixed difference of a box's source, sum over the corners of [0, p] of
     * (-1)^(3 - |S|) Q(p_S, 0) (zero exactly when Q is a sum of terms of two coordinates each), at the
     * scan's points and its peak: {difference, size}.
     */
    private double[] tripleDifference(Expression q) {
        double worst = 0;
        double size = 0;
        double[] p = new double[3];
        double[] corner = new double[3];
        for (int c = 0; c < 82; c++) {
            for (int i = 0; i < 3; i++) {
                p[i] = c == 81 ? (sourcePeak == null ? 0 : sourcePeak[i]) : len[i] * (((c * 7 + i * 5 + 1) % 9) / 8.0);
            }
            double sum = 0;
            for (int mask = 0; mask < 8; mask++) {
                for (int i = 0; i < 3; i++) {
                    corner[i] = (mask >> i & 1) == 1 ? p[i] : 0;
                }
                double v = valueAt(q, corner);
                size = Math.max(size, Math.abs(v));
                sum += Integer.bitCount(mask) % 2 == 1 ? v : -v;
            }
            worst = Math.max(worst, Math.abs(sum));
        }
        return new double[] {worst, size};
    }

    /** Q with the listed axes at 0 and t at 0, over the variables (x_a, x_b). */
    private static Expression fixed(Expression q, int a, int b, boolean keepA, boolean keepB) {
        Expression e = q;
        for (int i = 0; i < 3; i++) {
            boolean keep = i == a && keepA || i == b && keepB;
            if (!keep && e.variables().contains(NAMES[i])) {
                e = e.substitute(NAMES[i], 0);
            }
        }
        if (e.variables().contains("t")) {
            e = e.substitute("t", 0); // constant in t, or its change handled by the source's terms
        }
        return e.over(NAMES[a], NAMES[b]);
    }

    /**
     * Splits a box source whose triple mixed difference vanishes into terms of two coordinates. With the
     * pairs of axes whose mixed difference does not vanish (the first a, b, with third axis c):
     * Q = Q(x_a, x_b, 0) + sum over the other coupled pairs of T_ij + (Q(0, 0, x_c) - Q(0, 0, 0)), where
     * T_ij = Q(x_i, x_j, 0) - Q(x_i, 0, 0) - Q(0, x_j, 0) + Q(0, 0, 0) (the other coordinate at 0) is the
     * part that couples i and j; the last term is a slab's source along c. The first term holds the
     * constant and the terms of a and b alone, so no face across a or b receives data from the source.
     * Each term's V comes from a rectangle solver of its own at tolerance / (32 n) for n terms. Returns
     * {the largest mixed difference of the pairs taken as not coupled (rounding), c}.
     */
    private double[] addPairTerms(Problem problem, Expression q, List<Integer> along) {
        List<int[]> coupled = new ArrayList<>();
        double left = 0;
        for (int x = 0; x < along.size(); x++) {
            for (int y = x + 1; y < along.size(); y++) {
                int a = Math.min(along.get(x), along.get(y));
                int b = Math.max(along.get(x), along.get(y));
                double[] mixed = mixedDifference(q, List.of(a, b));
                if (mixed[0] <= 1e-12 * Math.max(1, mixed[1])) {
                    left = Math.max(left, mixed[0]);
                } else {
                    coupled.add(new int[] {a, b});
                }
            }
        }
        for (int[] pair : coupled) {
            int a = pair[0];
            int b = pair[1];
            int c = 3 - a - b;
            String which = NAMES[a] + " and " + NAMES[b];
            if (axes[a].zero && axes[b].zero) {
                throw new OracleException(Reason.UNSUPPORTED, "source: has a part that varies with " + which
                    + " together, and the four faces across " + which + " are all insulated or flux-driven; this"
                    + " version needs a temperature or convection on one of them");
            }
            Expression t = fixed(q, a, b, true, true);
            if (pair != coupled.get(0)) {
                Expression qa = fixed(q, a, b, true, false);
                Expression qb = fixed(q, a, b, false, true);
                double q00 = valueAt(q, new double[3]);
                // grouped as (Q(x_a, x_b) - Q(x_a, 0)) - (Q(0, x_b) - Q(0, 0)): exactly 0 in floating point on
                // the sides x_a = 0 and x_b = 0 (the rectangle would otherwise fit rounding noise there)
                t = t.linear(1, qa, -1).linear(1, qb.linear(1, Expression.constant(1, NAMES[a], NAMES[b]), -q00), -1);
            }
            Expression rect = t;
            if (a != 0) {
                rect = rect.renamed(NAMES[a], "x");
            }
            if (b != 1) {
                rect = rect.renamed(NAMES[b], "y");
            }
            double subTolerance = pairTolerance(rect, a, b, coupled.size());
            TensorSolver v;
            try {
                v = new TensorSolver(pairProblem(rect, a, b, problem.material()), 0, subTolerance, true);
            } catch (OracleException e) {
                throw new OracleException(e.reason(), "source: its part that varies with " + which + " together"
                    + " is solved on the " + NAMES[a] + "-" + NAMES[b] + " rectangle (read there as x and y), which"
                    + " answered: " + e.getMessage());
            }
            PairTerm term = new PairTerm(a, b, c, t, v.at(Double.POSITIVE_INFINITY), subTolerance * v.scale());
            pairs.add(term);
            if (carriesData(term)) {
                pairDataError += term.error() * pairDataWeight(term);
            }
        }
        int[] first = coupled.get(0);
        return new double[] {left, 3 - first[0] - first[1]};
    }

    /**
     * A box's source as one product F(x) G(y) H(z), read off at the point p0 where |Q| is largest among 4096
     * scanned points (and the source's peak): F = Q(x, y0, z0), G = Q(x0, y, z0) / Q(p0), H likewise. Taken when
     * Q - F G H stays within 1e-11 of max |Q| at every scanned point; the largest difference goes to
     * residual[0] (the caller adds twice its effect to the bound); null otherwise.
     */
    private ProductSource productOf(Expression coupling, double[] residual) {
        Expression e = coupling.variables().contains("t") ? coupling.substitute("t", 0) : coupling;
        e = e.over("x", "y", "z");
        if (e.mayBeNonSmooth()) {
            throw new OracleException(Reason.UNSUPPORTED, "source: varies with x, y and z together and may be"
                + " non-smooth (abs, min, max or a step); this version takes such a box source when it is smooth:"
                + " write it without them, or use a manufactured solution");
        }
        Expression[] factors = productFactors(e, 4096, 1e-11, residual);
        if (factors == null) {
            return null;
        }
        double[][] hOverK = new double[3][2];
        for (int i = 0; i < 3; i++) {
            for (int s = 0; s < 2; s++) {
                hOverK[i][s] = type[i][s] == DIRICHLET ? Double.POSITIVE_INFINITY : type[i][s] == NEUMANN ? 0
                    : h[i][s] / k;
            }
        }
        return new ProductSource(factors, axes, len, hOverK);
    }

    /** The most products a box source's coupled part is split into (each costs up to six rectangles). */
    private static final int PRODUCT_TERMS = 4;

    /**
     * Splits a box source that is not one product by its terms as written ({@link Expression#terms}): a term
     * that couples x, y and z and is one product goes to {@link #productParts} and leaves the rest; one that
     * couples all three and is not gives its coupled part ({@link #coupledPart}) as a product and stays in the
     * rest, whose pair terms then read it off the planes through the origin (where that part vanishes). When
     * the terms do not serve, Q's own coupled part as one product (Q stays whole). At most
     * {@link #PRODUCT_TERMS} products. Returns the rest (the sum of the terms that stay, exactly as written);
     * out[0] = the products' residuals summed, out[1] = 1 when the rest still couples all three (its pair terms
     * must read the planes), else 0. Refuses (UNSUPPORTED) otherwise, naming the term that is not a product.
     */
    private Expression productTerms(Expression q, double wholeResidual, double[] out) {
        double[] residual = new double[1];
        List<Expression> terms = q.terms();
        double size = Math.max(1, tripleDifference(q)[1]);
        Expression rest = null;
        double total = 0;
        boolean coupled = false;
        String refusal = null;
        for (Expression term : terms.size() > 1 ? terms : List.<Expression>of()) {
            double[] triple = tripleDifference(term);
            ProductSource ps = null;
            if (triple[0] <= 1e-12 * size) {
                total += triple[0];
            } else if ((ps = productOf(term, residual)) != null) {
                productParts.add(ps);
                total += residual[0];
                continue;
            } else if ((ps = productOf(coupledPart(term), residual)) != null) {
                productParts.add(ps);
                total += residual[0];
                coupled = true;
            } else {
                refusal = "its term " + term.formula() + " couples all three and neither it nor its part that"
                    + " couples all three is one product (the nearest differs by " + residual[0] + " W/m^3)";
                break;
            }
            rest = rest == null ? term : rest.linear(1, term, 1);
        }
        if (refusal == null && productParts.size() > PRODUCT_TERMS) {
            refusal = "it has " + productParts.size() + " terms that couple all three, more than the " + PRODUCT_TERMS
                + " this version splits";
        }
        if (refusal == null && !productParts.isEmpty()) {
            out[0] = total;
            out[1] = coupled ? 1 : 0;
            return rest == null ? Expression.constant(0, q.variables().toArray(String[]::new)) : rest;
        }
        productParts.clear();
        ProductSource one = productOf(coupledPart(q), residual);
        if (one != null) {
            productParts.add(one);
            out[0] = residual[0];
            out[1] = 1;
            return q;
        }
        throw new OracleException(Reason.UNSUPPORTED, "source: varies with x, y and z together, and neither it nor"
            + " its part that couples all three (Q less its values on the planes x = 0, y = 0 and z = 0, combined)"
            + " is one product F(x) G(y) H(z) (the nearest differ by " + wholeResidual + " and " + residual[0]
            + " W/m^3)" + (refusal == null ? "" : "; written as a sum, " + refusal) + "; this version solves boxes"
            + " whose source is a sum of terms of two coordinates each plus up to " + PRODUCT_TERMS + " terms that"
            + " are each one such product (a spot heater A exp(-((x - a)^2 + (y - b)^2 + (z - c)^2) / w^2), on a"
            + " background or beside a heater line along an axis), and a rectangle takes any smooth source; for a"
            + " general source (exp(x y z), say) use a manufactured solution");
    }

    /**
     * The part of a box source that couples x, y and z, anchored at the origin: Q_t = D_x D_y D_z Q with
     * D_i f = f - f(x_i = 0), the sum over the corners of [0, p] of (-1)^(3 - |S|) Q(p_S, 0). It vanishes on the
     * planes x_i = 0, so Q - Q_t is the sum of terms of two coordinates that those planes give, and for
     * Q = (such a sum) + F G H it is (F - F(0)) (G - G(0)) (H - H(0)), one product again.
     */
    private static Expression coupledPart(Expression q) {
        Expression e = q.variables().contains("t") ? q.substitute("t", 0) : q;
        e = e.over("x", "y", "z");
        for (String v : NAMES) {
            e = e.linear(1, e.substitute(v, 0).over("x", "y", "z"), -1);
        }
        return e;
    }

    /**
     * The product's parts ({@link ProductSource}): for each end e of a blended axis c, the pair term
     * psi_e(x_c) V(x_a, x_b), V from a rectangle solver of its own under a's and b's homogeneous conditions with
     * source B_e f_c times the other two factors (less their blends on the axes before c); then the steady series
     * of F_r G_r H_r.
     */
    private void addProductParts(Material material) {
        int terms = 0;
        for (ProductSource ps : productParts) {
            for (int c = 0; c < 3; c++) {
                for (int e = 0; e < 2 && ps.blended(c); e++) {
                    terms += ps.endData(c, e) != 0 ? 1 : 0;
                }
            }
        }
        int count = productParts.size();
        productValues = new RemainderSeries[count];
        productGradients = new RemainderSeries[count];
        // each table is sized for an equal share of tolerance * scale / 16; what they leave together must stay
        // within the whole of it (a wide spot's table may take what a narrow one's leaves)
        double left = 0;
        StringBuilder each = new StringBuilder();
        for (int part = 0; part < count; part++) {
            ProductSource ps = productParts.get(part);
            addProductPart(ps, material, terms);
            productValues[part] = productSeries(ps, false, count);
            left += productValues[part].bound();
            each.append(part == 0 ? "" : ", ").append(productValues[part].bound());
        }
        double budget = tolerance * scale / 16;
        if (!(left <= budget)) {
            throw new OracleException(Reason.TOO_MANY_MODES, "source: its part that couples x, y and z"
                + (count > 1 ? " (" + count + " products)" : "") + " needs more than " + PRODUCT_CAP + " modes per"
                + " axis at tolerance " + tolerance + " (what they leave is bounded by " + left + " K"
                + (count > 1 ? " (" + each + ")" : "") + ", the budget is " + budget + " K); loosen the tolerance,"
                + " or widen the source");
        }
    }

    /** One product's blend parts, as pair terms (one of {@code terms} in all). */
    private void addProductPart(ProductSource ps, Material material, int terms) {
        for (int c = 0; c < 3; c++) {
            if (!ps.blended(c)) {
                continue;
            }
            int a = c == 0 ? 1 : 0;
            int b = c == 2 ? 1 : 2;
            Expression fa = (a < c ? ps.rest(a) : ps.factor(a)).renamed(NAMES[a], "x").over("x", "y");
            Expression fb = (b < c ? ps.rest(b) : ps.factor(b)).renamed(NAMES[b], "y").over("x", "y");
            for (int e = 0; e < 2; e++) {
                double data = ps.endData(c, e);
                if (data == 0) {
                    continue;
                }
                Expression rect = fa.times(fb);
                rect = rect.linear(data, rect, 0);
                String which = NAMES[a] + " and " + NAMES[b];
                double subTolerance = pairTolerance(rect, a, b, terms);
                TensorSolver v;
                try {
                    v = new TensorSolver(pairProblem(rect, a, b, material), 0, subTolerance, true);
                } catch (OracleException x) {
                    throw new OracleException(x.reason(), "source: its part that couples x, y and z is blended at "
                        + "boundary." + SIDES[c][e].key() + ", and what that leaves along " + which + " is solved"
                        + " on the " + NAMES[a] + "-" + NAMES[b] + " rectangle (read there as x and y), which"
                        + " answered: " + x.getMessage());
                }
                double[] w = ps.weight(c, e);
                PairTerm term = new PairTerm(a, b, c, rect, v.at(Double.POSITIVE_INFINITY), subTolerance * v.scale(),
                    w[0], w[1]);
                pairs.add(term);
                if (carriesData(term)) {
                    pairDataError += term.error() * pairDataWeight(term);
                }
            }
        }
    }

    /**
     * The tolerance of a pair term's rectangle, one of n: tolerance / (32 n) of its own scale, or looser (to
     * 1e-4) when its source is small beside this body's, so that its error is tolerance * scale / (32 n) of
     * this body's scale (the rectangle's scale estimated as max |T| L^2 / k on a 65 x 65 grid, times 2).
     */
    private double pairTolerance(Expression rect, int a, int b, int n) {
        double own = Math.max(1e-15, tolerance / (32 * n));
        double size = 0;
        for (int i = 0; i <= 64; i++) {
            for (int j = 0; j <= 64; j++) {
                size = Math.max(size, Math.abs(rect.value(len[a] * i / 64, len[b] * j / 64)));
            }
        }
        double l = Math.max(len[a], len[b]);
        double estimate = 2 * size * l * l / k;
        if (!(estimate > 0)) {
            return own;
        }
        return Math.max(own, Math.min(1e-4, tolerance * scale / (32 * n * estimate)));
    }

    /** The most modes per axis of the product's series (a table of 128^3 weights, 16 MB). */
    private static final int PRODUCT_CAP = 128;
    /** The factors' coefficients computed for the tails of that series. */
    private static final int PRODUCT_TAIL = 2048;

    /**
     * W_J = a_i b_j c_k / (k lambda_J) on the smallest table (8 to 128 modes per axis, doubling, each axis on its
     * own) whose left-out entries stay within a quarter of tolerance * scale / 16 per axis (over the length scale
     * for gradients). What the table leaves out has i >= n_x, j >= n_y or k >= n_z; with lambda >= mu_i^2 the
     * first is at most sum_{i >= n_x} |a_i| / mu_i^2 sum |b| sum |c| / k, and for gradients (|dX/dx| <= mu,
     * mu_i / lambda <= 1 / mu_i and mu_p / lambda <= 1 / (2 mu_i) for another axis p) twice sum |a_i| / mu_i,
     * summed over the three components. Projection errors e_i per coefficient add
     * e_x n_x sum |b| sum |c| / (k lambda_min) and likewise.
     */
    private RemainderSeries productSeries(ProductSource ps, boolean forGradients, int share) {
        // the factors' coefficients are cheap: 2048 of each make the tails' integration-by-parts part negligible
        ps.ensure(PRODUCT_TAIL);
        double budget = tolerance * scale / (16 * share) / (forGradients ? lengthScale : 1);
        double[] total = new double[3];
        for (int i = 0; i < 3; i++) {
            total[i] = ps.total(i);
        }
        int[] n = new int[3];
        double valueTail = 0;
        double gradientTail = 0;
        for (int i = 0; i < 3; i++) {
            double others = total[(i + 1) % 3] * total[(i + 2) % 3] / k;
            for (int size = 8; ; size *= 2) {
                double vt = ps.tail(i, size, 2) * others;
                double gt = 2 * ps.tail(i, size, 1) * others;
                if ((forGradients ? gt : vt) <= budget / 4 || size >= PRODUCT_CAP) {
                    n[i] = size;
                    valueTail += vt;
                    gradientTail += gt;
                    break;
                }
            }
        }
        double lambdaMin = 0;
        double muSum = 0;
        for (int i = 0; i < 3; i++) {
            lambdaMin += axes[i].mu[0] * axes[i].mu[0];
            muSum += axes[i].mu[n[i] - 1];
        }
        double projection = 0;
        for (int i = 0; i < 3; i++) {
            projection += ps.projectionError(i) * n[i] * total[(i + 1) % 3] * total[(i + 2) % 3];
        }
        projection /= k * lambdaMin;
        double[] w = new double[n[0] * n[1] * n[2]];
        for (int i = 0; i < n[0]; i++) {
            double mu = axes[0].mu[i];
            double ai = ps.coefficient(0, i);
            for (int j = 0; j < n[1]; j++) {
                double nu = axes[1].mu[j];
                double aij = ai * ps.coefficient(1, j);
                int row = (i * n[1] + j) * n[2];
                for (int l = 0; l < n[2]; l++) {
                    double xi = axes[2].mu[l];
                    w[row + l] = aij * ps.coefficient(2, l) / (k * (mu * mu + nu * nu + xi * xi));
                }
            }
        }
        return new RemainderSeries(PRODUCT_CAP, n, w, valueTail + projection, gradientTail + projection * muSum);
    }

    /** The eigenvalue lambda_J = sum_i mu_i,J_i^2 of the tensor mode with the given index per axis. */
    private double eigenvalue(int[] index) {
        double lambda = 0;
        for (int i = 0; i < d; i++) {
            lambda += axes[i].mu[index[i]] * axes[i].mu[index[i]];
        }
        return lambda;
    }

    /** The rectangle's remainder series (or null) followed by the products' value series. */
    private RemainderSeries[] withProducts(RemainderSeries first) {
        RemainderSeries[] all = new RemainderSeries[productValues.length + 1];
        all[0] = first;
        System.arraycopy(productValues, 0, all, 1, productValues.length);
        return all;
    }

    /** A product's series for gradients, on the first request: the value table when its gradient bound serves. */
    private synchronized RemainderSeries productGradients(int part) {
        if (productGradients[part] == null) {
            int count = productParts.size();
            double budget = tolerance * scale / (16 * count * lengthScale);
            productGradients[part] = productValues[part].gradientBound() <= budget ? productValues[part]
                : productSeries(productParts.get(part), true, count);
        }
        return productGradients[part];
    }

    /** The steady rectangle of axes a, b (as x, y) under their homogeneous conditions, with source T_ab. */
    private Problem pairProblem(Expression source, int a, int b, Material material) {
        Map<Side, BoundaryCondition> bc = new EnumMap<>(Side.class);
        Side[][] rectSides = {{Side.XMIN, Side.XMAX}, {Side.YMIN, Side.YMAX}};
        int[] pair = {a, b};
        for (int r = 0; r < 2; r++) {
            int axis = pair[r];
            for (int s = 0; s < 2; s++) {
                Expression zero = Expression.parse("0", r == 0 ? "y" : "x", "t");
                bc.put(rectSides[r][s], switch (type[axis][s]) {
                    case DIRICHLET -> new BoundaryCondition.Dirichlet(zero);
                    case NEUMANN -> new BoundaryCondition.Neumann(zero);
                    default -> new BoundaryCondition.Robin(h[axis][s], zero);
                });
            }
        }
        return new Problem(new Rectangle(len[a], len[b]), material, Expression.parse("0", "x", "y"), source, bc,
            true);
    }

    private OracleException notAdditive(List<Integer> along) {
        StringBuilder names = new StringBuilder();
        for (int i : along) {
            names.append(names.length() == 0 ? "" : " and ").append(NAMES[i]);
        }
        if (d == 3 && !allFlux) {
            return new OracleException(Reason.UNSUPPORTED, "source: varies with x, y and z together (it is not a sum"
                + " of terms of two coordinates each); this version solves boxes whose source is such a sum,"
                + " Q = a(x, y) + b(y, z) + c(x, z) (a heater line along an axis, say), and a rectangle takes any"
                + " smooth source; for a general source use a manufactured solution");
        }
        String where = d == 3 ? "every face is insulated or flux-driven, where this version takes a uniform source"
            + " only" : "every side is insulated or flux-driven, where this version takes a uniform source only";
        return new OracleException(Reason.UNSUPPORTED, "source: varies along " + names + " and is not a sum of"
            + " terms of one coordinate each; " + where + "; for a general source use a manufactured solution");
    }

    /**
     * The blend and remainder of a rectangle's source that is not additive ({@link SourceRemainder}).
     * Refused when the source may be non-smooth (the bound of the remainder's coefficients rests on
     * smoothness).
     */
    private SourceRemainder remainderOf(Expression q) {
        if (q.mayBeNonSmooth()) {
            throw new OracleException(Reason.UNSUPPORTED, "source: varies along x and y, is not a sum of terms of"
                + " one coordinate each, and may be non-smooth (abs, min, max or a step); this version takes such a"
                + " source when it is smooth: write it without them, or use a manufactured solution");
        }
        Expression qxy = q.variables().contains("t") ? q.substitute("t", 0) : q;
        double[][] hOverK = new double[2][2];
        for (int i = 0; i < 2; i++) {
            for (int s = 0; s < 2; s++) {
                hOverK[i][s] = type[i][s] == DIRICHLET ? Double.POSITIVE_INFINITY : type[i][s] == NEUMANN ? 0
                    : h[i][s] / k;
            }
        }
        Expression over = qxy.over("x", "y");
        return new SourceRemainder(over, len, hOverK, rectangleProduct(over));
    }

    /**
     * A rectangle's source as one product f(x) g(y) (a box's pair term of a spot, say), read off at the largest
     * of 1024 scanned points and taken when it matches every one to 1e-13 of that peak (the remainder's
     * derivative tables then take two 1D expansions per point instead of one in 2D); null otherwise.
     */
    private Expression[] rectangleProduct(Expression q) {
        return productFactors(q, 1024, 1e-13, new double[1]);
    }

    /**
     * A source over (x, y[, z]) as one product of a factor per coordinate, read off at the point p0 where |Q| is
     * largest among {@code count} points of a Kronecker sequence (plastic-number steps, which fill the body
     * evenly) and the source's peak: the factor of axis i is Q with the other coordinates at p0, divided by
     * Q(p0) for i > 0. Taken when the product matches Q at every scanned point to {@code relative} of |Q(p0)|;
     * the largest difference goes to residual[0]. Null otherwise.
     */
    private Expression[] productFactors(Expression q, int count, double relative, double[] residual) {
        double g = d == 3 ? 1.2207440846057596 : 1.324717957244746;
        double[][] points = new double[count + 1][d];
        double peak = -1;
        int best = 0;
        for (int c = 0; c <= count; c++) {
            for (int i = 0; i < d; i++) {
                double u = c == count ? (sourcePeak == null ? 0.5 : sourcePeak[i] / len[i])
                    : (0.5 + c * Math.pow(g, -(i + 1))) % 1;
                points[c][i] = len[i] * u;
            }
            double v = Math.abs(q.value(points[c]));
            if (v > peak) {
                peak = v;
                best = c;
            }
        }
        double[] p0 = points[best];
        double c0 = q.value(p0);
        if (!(Math.abs(c0) > 0 && Double.isFinite(c0))) {
            return null;
        }
        Expression[] factors = new Expression[d];
        for (int i = 0; i < d; i++) {
            Expression f = q;
            for (int j = 0; j < d; j++) {
                if (j != i) {
                    f = f.substitute(NAMES[j], p0[j]);
                }
            }
            factors[i] = i == 0 ? f : f.linear(1 / c0, f, 0);
        }
        double worst = 0;
        for (double[] p : points) {
            double product = 1;
            for (int i = 0; i < d; i++) {
                product *= factors[i].value(p[i]);
            }
            worst = Math.max(worst, Math.abs(q.value(p) - product));
        }
        residual[0] = worst;
        return worst <= relative * Math.abs(c0) ? factors : null;
    }

    /**
     * The remainder's steady series for values: the smallest table of 64 to 1024 modes per axis (doubling)
     * whose tail ({@link SourceRemainder#tails}) is within tolerance * scale / 32; refused
     * (TOO_MANY_MODES) when 1024 modes do not reach it.
     */
    private void buildRemainderSeries() {
        double budget = tolerance * scale / 16;
        int m = 64;
        double[] tails = remainder.tails(axes, m, k);
        while (tails[0] > budget / 2) {
            if (m >= 1024) {
                throw new OracleException(Reason.TOO_MANY_MODES, "source: its part that is not a sum of terms of"
                    + " one coordinate each needs more than 1024 modes per axis at tolerance " + tolerance
                    + " (what 1024 modes leave is bounded by " + tails[0] + " K, the budget is " + budget / 2
                    + " K); loosen the tolerance, or smooth the source");
            }
            m *= 2;
            tails = remainder.tails(axes, m, k);
        }
        remainderValues = remainderSeries(m, tails, false);
    }

    /**
     * The remainder's series for gradients, on the first request: the value table when its tail is within
     * tolerance * scale / (32 L), else the smallest larger table (up to 1024 modes per axis) whose tail is;
     * the value table when none is (its points are then refused, with their bound).
     */
    private synchronized RemainderSeries remainderGradients() {
        if (remainderGradients == null) {
            double budget = tolerance * scale / (16 * lengthScale);
            int m = remainderValues.table();
            double[] tails = remainder.tails(axes, m, k);
            int chosen = m;
            for (int size = m; size <= 1024; size *= 2) {
                double[] t = size == m ? tails : remainder.tails(axes, size, k);
                if (t[1] <= budget / 2) {
                    chosen = size;
                    tails = t;
                    break;
                }
            }
            remainderGradients = chosen == m && remainderValues.gradientBound() <= budget ? remainderValues
                : remainderSeries(chosen, tails, true);
        }
        return remainderGradients;
    }

    /**
     * W_J = Q_r,J / (k lambda_J) on an m x m table, projected on tensor Gauss rules (the error by a rule 25 %
     * finer), cut to the smallest square box whose left-out entries, tail and projection error stay within
     * tolerance * scale / 16 (over the length scale for gradients).
     */
    private RemainderSeries remainderSeries(int m, double[] tails, boolean forGradients) {
        // millions of samples of Q_r (the source and its values on the sides at each): among the cores, a
        // remainder sampler per row of x
        double[][] pr = project(() -> {
            SourceRemainder.Sampler sampler = remainder.sampler();
            return point -> sampler.value(point[0], point[1]);
        }, true, new int[] {0, 1}, new int[] {m, m}, new double[2], 0);
        double error = pr[1][0];
        double[] w = new double[m * m];
        double[] ringAbs = new double[m];
        double[] ringGrad = new double[m];
        double[] ringInverse = new double[m];
        double[] ringInverseGrad = new double[m];
        for (int a = 0; a < m; a++) {
            double mu = axes[0].mu[a];
            for (int b = 0; b < m; b++) {
                double nu = axes[1].mu[b];
                double inverse = 1 / (k * (mu * mu + nu * nu));
                double c = pr[0][a * m + b] * inverse;
                w[a * m + b] = c;
                int ring = Math.max(a, b);
                ringAbs[ring] += Math.abs(c);
                ringGrad[ring] += Math.abs(c) * (mu + nu);
                ringInverse[ring] += inverse;
                ringInverseGrad[ring] += inverse * (mu + nu);
            }
        }
        double totalAbs = 0;
        double totalGrad = 0;
        for (int r = 0; r < m; r++) {
            totalAbs += ringAbs[r];
            totalGrad += ringGrad[r];
        }
        double budget = tolerance * scale / 16 / (forGradients ? lengthScale : 1);
        double insideAbs = 0;
        double insideGrad = 0;
        double inverse = 0;
        double inverseGrad = 0;
        for (int v = 1; v <= m; v++) {
            insideAbs += ringAbs[v - 1];
            insideGrad += ringGrad[v - 1];
            inverse += ringInverse[v - 1];
            inverseGrad += ringInverseGrad[v - 1];
            double value = Math.max(0, totalAbs - insideAbs) + tails[0] + error * inverse + 4 * EPS * totalAbs;
            double gradient = Math.max(0, totalGrad - insideGrad) + tails[1] + error * inverseGrad + 4 * EPS * totalGrad;
            if ((forGradients ? gradient : value) <= budget || v == m) {
                return new RemainderSeries(m, new int[] {v, v}, square(w, m, v), value, gradient);
            }
        }
        throw new IllegalStateException("unreachable: the loop returns at v = m");
    }

    /** The leading v x v block of an m x m row-major table. */
    private static double[] square(double[] w, int m, int v) {
        double[] out = new double[v * v];
        for (int a = 0; a < v; a++) {
            System.arraycopy(w, a * m, out, a * v, v);
        }
        return out;
    }

    /**
     * The blend's parts, one per end of a blended axis: for an end e of x, psi_e(x) times the y slab of
     * G_e(y) = B_e Q(x_e, y) less its own blend in y, sum_r phi_r(y) B_r B_e Q(x_e, y_r) (so that the parts
     * sum to S = P_x (I - P_y) Q + P_y Q); for an end r of y, phi_r(y) times the x slab of B_r Q(x, y_r).
     * A part that is rounding noise beside the source (within 1e-13 of its sampled size) is left out; returns
     * the bound of what that moves u by.
     */
    private double addBlends(Material material, double sourceSize) {
        double skipped = 0;
        int terms = 0;
        for (int axis = 0; axis < 2; axis++) {
            terms += remainder.blended(axis) ? 2 : 0;
        }
        for (int axis = 0; axis < 2; axis++) {
            if (!remainder.blended(axis)) {
                continue;
            }
            int along = 1 - axis;
            for (int side = 0; side < 2; side++) {
                double at = side == 0 ? 0 : len[axis];
                double[][] op = remainder.operator(axis, side);
                Expression g = null;
                for (int t = 0; t < op[0].length; t++) {
                    int order = (int) op[0][t];
                    Expression part = (axis == 0 ? remainder.sourceDerivative(order, 0)
                        : remainder.sourceDerivative(0, order)).substitute(NAMES[axis], at);
                    g = g == null ? part.linear(op[1][t], part, 0) : g.linear(1, part, op[1][t]);
                }
                if (axis == 0 && remainder.blended(1)) {
                    for (int r = 0; r < 2; r++) {
                        double[] wr = remainder.weight(1, r);
                        double[][] opy = remainder.operator(1, r);
                        double corner = 0;
                        for (int t = 0; t < op[0].length; t++) {
                            for (int u = 0; u < opy[0].length; u++) {
                                corner += op[1][t] * opy[1][u] * remainder.sourceDerivative((int) op[0][t],
                                    (int) opy[0][u]).value(at, r == 0 ? 0 : len[1]);
                            }
                        }
                        Expression phi = Expression.constant(wr[0], "y").linear(1, Expression.parse("y", "y"), wr[1]);
                        g = g.linear(1, phi, -corner);
                    }
                }
                double[] w = remainder.weight(axis, side);
                double psiMax = Math.max(Math.abs(w[0]), Math.abs(w[0] + w[1] * len[axis]));
                double gMax = 0;
                for (int q = 0; q <= 64; q++) {
                    gMax = Math.max(gMax, Math.abs(g.value(len[along] * q / 64)));
                }
                if (psiMax * gMax <= 1e-13 * sourceSize) {
                    // rounding noise of a source that meets this side's condition (a box's product factor less
                    // its blend): a slab fitted to it would chase the noise; leaving it out moves u by no more
                    // than its size times L^2 / k, twice that taken (as for a source that is noise)
                    skipped += 2 * psiMax * gMax * lengthScale * lengthScale / k;
                    continue;
                }
                double factor = type[axis][side] == DIRICHLET ? 1 : side == 0 ? -k : k;
                double budget = tolerance * scale / (16 * terms);
                if (axes[along].zero) {
                    // the tangential pair is insulated: G's mean m goes to the slab of psi(x) m along the normal
                    // (constant along the side, it meets every condition); its zero-mean rest is a series
                    double mean = meanOf(g, along);
                    Expression rest = g.linear(1, Expression.constant(1, NAMES[along]), -mean);
                    Expression linear = Expression.constant(w[0] * mean, NAMES[axis])
                        .linear(1, Expression.parse(NAMES[axis], NAMES[axis]), w[1] * mean);
                    SlabSolver.Slice slice = new SlabSolver(slabProblem(linear, axis, material), 0,
                        tolerance / (8 * terms)).at(0);
                    blends.add(new Blend(along, 0, 1, 0, axis, slice, linear, 0, null));
                    blends.add(new Blend(axis, side, w[0], w[1], along, null, rest, factor,
                        blendCorrection(axis, side, along, rest, factor, budget, w)));
                    continue;
                }
                SlabSolver.Slice slice = new SlabSolver(slabProblem(g, along, material), 0, tolerance / (8 * terms)).at(0);
                blends.add(new Blend(axis, side, w[0], w[1], along, slice, g, factor,
                    blendCorrection(axis, side, along, g, factor, budget, null)));
            }
        }
        return skipped;
    }

    /** The mean of an expression of one coordinate over its axis, by a 2048-point Gauss rule. */
    private double meanOf(Expression g, int axis) {
        return meanAlong(axis, g::value);
    }

    /** The mean of a function of one coordinate over its axis, by a 2048-point Gauss rule. */
    private double meanAlong(int axis, java.util.function.DoubleUnaryOperator g) {
        double[][] r = GaussLegendre.onInterval(2048, len[axis]);
        double sum = 0;
        for (int q = 0; q < 2048; q++) {
            sum += r[1][q] * g.applyAsDouble(r[0][q]);
        }
        return sum / len[axis];
    }

    /**
     * The correction of a blend part on its own side ({@link BlendCorrection}): 1024 to 8192 tangential
     * modes (doubling), the fewest whose tail on the side itself is within {@code budget}; the largest
     * otherwise (points on and next to the side are then refused with their bound). On a Dirichlet side u
     * is the data, so 1024 modes serve there (the profiles' exp(-nu s) does the rest off the side).
     */
    private BlendCorrection blendCorrection(int axis, int side, int along, Expression g, double factor, double budget,
                                            double[] psi) {
        double[] alongHOverK = new double[2];
        for (int e = 0; e < 2; e++) {
            alongHOverK[e] = type[along][e] == DIRICHLET ? Double.POSITIVE_INFINITY : type[along][e] == NEUMANN ? 0
                : h[along][e] / k;
        }
        BlendCorrection c = null;
        for (int n = Math.max(1024, transientCap); n <= 8192; n *= 2) {
            double[][] gp = project(point -> g.value(point[along]), new int[] {along}, new int[] {n}, new double[d]);
            c = new BlendCorrection(axes[along], len[along], alongHOverK, g, gp[0], gp[1][0], len[axis], type[axis][side],
                h[axis][side], type[axis][1 - side], h[axis][1 - side], k, factor, len[axis], psi, side);
            double[] tails = c.lastTails();
            if (2 * tails[0] <= budget || type[axis][side] == DIRICHLET && 2 * c.lastFlatTail() <= budget) {
                break;
            }
        }
        return c;
    }

    /** The steady slab problem of P along {@code axis}, with that axis's homogeneous face conditions. */
    private Problem sourceSlab(Expression source, Material material, int axis, double subtract) {
        Expression q = source;
        for (int i = 0; i < d; i++) {
            if (i != axis && q.variables().contains(NAMES[i])) {
                q = q.substitute(NAMES[i], 0);
            }
        }
        if (q.variables().contains("t")) {
            q = q.substitute("t", 0); // constant in t (checked)
        }
        if (subtract != 0) {
            q = q.linear(1, Expression.constant(1, q.variables().toArray(String[]::new)), -subtract);
        }
        return slabProblem(q, axis, material);
    }

    /** The steady slab problem along {@code axis} of a source over that axis's coordinate, with its homogeneous conditions. */
    private Problem slabProblem(Expression source, int axis, Material material) {
        Map<Side, BoundaryCondition> bc = new EnumMap<>(Side.class);
        Side[] slabSides = {Side.XMIN, Side.XMAX};
        for (int s = 0; s < 2; s++) {
            Expression zero = Expression.parse("0", "t");
            bc.put(slabSides[s], switch (type[axis][s]) {
                case DIRICHLET -> new BoundaryCondition.Dirichlet(zero);
                case NEUMANN -> new BoundaryCondition.Neumann(zero);
                default -> new BoundaryCondition.Robin(h[axis][s], zero);
            });
        }
        Expression q = source.over(NAMES[axis], "t");
        if (axis != 0) {
            q = q.renamed(NAMES[axis], "x");
        }
        return new Problem(new Slab(len[axis]), material, Expression.parse("0", "x"), q, bc, true);
    }

    @Override
    public int dimension() {
        return d;
    }

    @Override
    public double scale() {
        return scale;
    }

    @Override
    public double length() {
        return lengthScale;
    }

    @Override
    public double horizon() {
        return horizon;
    }

    /** Faces whose data need an elliptic series (their data, less the source part's, do not vanish). */
    public int dataFaces() {
        return faces.size();
    }

    // ---------------------------------------------------------------- data and scale

    /** Evaluates an expression of (x, y, z, t) at a point and t = 0, by its own variable order. */
    private double valueAt(Expression e, double[] point) {
        return valueAt(e, point, 0);
    }

    private double valueAt(Expression e, double[] point, double t) {
        List<String> vars = e.variables();
        double[] args = new double[vars.size()];
        for (int v = 0; v < args.length; v++) {
            String name = vars.get(v);
            for (int i = 0; i < d; i++) {
                if (NAMES[i].equals(name)) {
                    args[v] = point[i];
                }
            }
            if ("t".equals(name)) {
                args[v] = t;
            }
        }
        double value = e.value(args);
        if (!Double.isFinite(value)) {
            throw new OracleException(Reason.DATA_NOT_FINITE, "oracle: " + e.source() + " is " + value + " at "
                + java.util.Arrays.toString(point));
        }
        return value;
    }

    /** The face condition's data in B-form (u, q or h u_amb) at a point on it. */
    private double faceData(int axis, int side, double[] point) {
        double g = valueAt(data[axis][side], point);
        return type[axis][side] == ROBIN ? h[axis][side] * g : g;
    }

    /**
     * The data the series solve, of u - c with the constant shift c: a Dirichlet side's u - c, a
     * convective side's h (u_amb - c), a flux side's q unchanged.
     */
    private double shiftedData(int axis, int side, double[] point) {
        double g = valueAt(data[axis][side], point);
        return switch (type[axis][side]) {
            case DIRICHLET -> g - shift;
            case ROBIN -> h[axis][side] * (g - shift);
            default -> g;
        };
    }

    /**
     * c: the common ambient when every convective side has the same constant ambient (then those sides
     * carry no data for the series, and points on them are certified), else 0.
     */
    private double shiftOf() {
        double c = Double.NaN;
        for (int i = 0; i < d; i++) {
            for (int s = 0; s < 2; s++) {
                if (type[i][s] == ROBIN) {
                    Expression e = data[i][s];
                    if (!e.isConstant()) {
                        return 0;
                    }
                    double v = e.value(new double[e.variables().size()]);
                    if (Double.isNaN(c)) {
                        c = v;
                    } else if (v != c) {
                        return 0;
                    }
                }
            }
        }
        return Double.isNaN(c) ? 0 : c;
    }

    /**
     * A sampled size of the mean's drift on a body with every face insulated or flux-driven (for the
     * scale): (max |Q| + sum over faces of max |q| / depth) / (rho c), in K/s.
     */
    private double driftEstimate(Problem problem) {
        double total = 0;
        double source = 0;
        int count = gridCount();
        double[] p = new double[d];
        double[] faceMax = new double[2 * d];
        for (int c = 0; c < count; c++) {
            gridPoint(c, p);
            source = Math.max(source, Math.abs(valueAt(problem.source(), p)));
            for (int i = 0; i < d; i++) {
                for (int s = 0; s < 2; s++) {
                    double[] f = p.clone();
                    f[i] = s == 0 ? 0 : len[i];
                    faceMax[2 * i + s] = Math.max(faceMax[2 * i + s], Math.abs(valueAt(data[i][s], f)));
                }
            }
        }
        for (int i = 0; i < d; i++) {
            total += (faceMax[2 * i] + faceMax[2 * i + 1]) / len[i];
        }
        return (source + total) / problem.material().volumetricHeatCapacity();
    }

    /** The number of points of the 9^d sampling grid. */
    private int gridCount() {
        return (int) Math.pow(9, d);
    }

    /** Point c of the 9^d sampling grid, nodes at j/8 of each edge (the faces included), into p. */
    private void gridPoint(int c, double[] p) {
        int rest = c;
        for (int i = 0; i < d; i++) {
            p[i] = len[i] * (rest % 9) / 8.0;
            rest /= 9;
        }
    }

    /** Where the scan found the source's largest |Q| at t = 0 (null before the scan). */
    private double[] sourcePeak;
    private double sourcePeakValue;

    /**
     * A uniform scan of the source at t = 0 (513^2 points of a rectangle, 97^3 of a box): its largest |Q| and
     * where. A heater narrower than the 9^d sampling grid would otherwise be read as no source at all.
     */
    private void scanSource(Expression q) {
        int n = d == 2 ? 513 : 97;
        int count = (int) Math.pow(n, d);
        double[] p = new double[d];
        double max = -1;
        double[] at = new double[d];
        for (int c = 0; c < count; c++) {
            int rest = c;
            for (int i = 0; i < d; i++) {
                p[i] = len[i] * (rest % n) / (n - 1);
                rest /= n;
            }
            double v = Math.abs(valueAt(q, p));
            if (v > max) {
                max = v;
                System.arraycopy(p, 0, at, 0, d);
            }
        }
        sourcePeak = at;
        sourcePeakValue = max;
    }

    /** The largest |Q| at 9^d points of the body and on the scan (t = 0). */
    private double sourceSize(Expression q) {
        if (sourcePeak == null) {
            scanSource(q);
        }
        int n = 9;
        int count = (int) Math.pow(n, d);
        double[] p = new double[d];
        double max = 0;
        for (int c = 0; c < count; c++) {
            int rest = c;
            for (int i = 0; i < d; i++) {
                p[i] = len[i] * (rest % n + 0.37) / (n + 0.5);
                rest /= n;
            }
            max = Math.max(max, Math.abs(valueAt(q, p)));
        }
        return Math.max(max, sourcePeakValue);
    }

    private double scaleOf(Problem problem) {
        if (sourcePeak == null) {
            scanSource(problem.source());
        }
        double u = sourcePeakValue * lengthScale * lengthScale / k;
        int count = gridCount();
        double[] p = new double[d];
        for (int c = 0; c < count; c++) {
            gridPoint(c, p);
            if (!steady) {
                u = Math.max(u, Math.abs(valueAt(initial, p)));
            }
            u = Math.max(u, Math.abs(valueAt(problem.source(), p)) * lengthScale * lengthScale / k);
            for (int i = 0; i < d; i++) {
                for (int s = 0; s < 2; s++) {
                    double[] f = p.clone();
                    f[i] = s == 0 ? 0 : len[i];
                    double g = Math.abs(valueAt(data[i][s], f));
                    u = Math.max(u, type[i][s] == NEUMANN ? g * lengthScale / k : g);
                }
            }
        }
        return u > 0 ? u : 1;
    }

    // ---------------------------------------------------------------- the faces' elliptic series

    /** Nodes needed to project modes 0..m-1 to machine precision (about pi/2 per mode, plus margin). */
    private static int nodesFor(int m) {
        return (int) Math.ceil(1.6 * m + 40);
    }

    /**
     * Contracts axis {@code a} of a tensor of shape {@code shape} (row-major, axis 0 slowest) with the
     * weighted modes of that axis divided by their norms: shape[a] = nodes becomes m.
     */
    private static double[] contract(double[] tensor, int[] shape, int a, double[] x, double[] w, AxisModes modes,
                                     int m) {
        return contract(tensor, shape, a, x, w, modes, m, 0);
    }

    /**
     * As {@link #contract(double[], int[], int, double[], double[], AxisModes, int)} for modes first..m-1 only
     * (shape[a] becomes m - first); first > 0 only for a few profiles along the last axis.
     */
    private static double[] contract(double[] tensor, int[] shape, int a, double[] x, double[] w, AxisModes modes,
                                     int m, int first) {
        int outer = 1;
        for (int i = 0; i < a; i++) {
            outer *= shape[i];
        }
        int inner = 1;
        for (int i = a + 1; i < shape.length; i++) {
            inner *= shape[i];
        }
        int n = shape[a];
        modes.ensure(m);
        int rest = inner;
        long work = (long) outer * m * n * inner;
        if (inner == 1 && outer < 16) {
            // a few rows (a face's profile, thousands of modes): each mode's row of the basis made and used at
            // once, the modes shared among the cores (the sines are most of the work; no m x n matrix is kept)
            int profiles = outer;
            int count = m - first;
            double[] part = new double[outer * count];
            // blocks of JT modes per task, one row buffer per block
            int blocks = (count + JT - 1) / JT;
            rows(blocks, (long) count * n > 1_000_000L, block -> {
                double[] b = new double[n];
                for (int jj = block * JT; jj < Math.min(count, (block + 1) * JT); jj++) {
                    int j = first + jj;
                    double norm = modes.norm[j];
                    for (int q = 0; q < n; q++) {
                        b[q] = w[q] * Math.sin(modes.mu[j] * x[q] + modes.phase[j]) / norm;
                    }
                    for (int o = 0; o < profiles; o++) {
                        double sum = 0;
                        for (int q = 0; q < n; q++) {
                            sum += b[q] * tensor[o * n + q];
                        }
                        part[o * count + jj] = sum;
                    }
                }
            });
            shape[a] = count;
            return part;
        }
        if (first != 0) {
            throw new IllegalArgumentException("a contraction from mode " + first + " needs a few profiles on the last axis");
        }
        double[] out = new double[outer * m * inner];
        double[][] basis = new double[m][n];
        for (int j = 0; j < m; j++) {
            double norm = modes.norm[j];
            for (int q = 0; q < n; q++) {
                basis[j][q] = w[q] * Math.sin(modes.mu[j] * x[q] + modes.phase[j]) / norm;
            }
        }
        boolean parallel = work > 4_000_000L;
        if (inner == 1) {
            // the last axis: out[o][j] = sum_q tensor[o][q] basis[j][q], with the basis transposed so that the
            // innermost loop runs along j (a multiply-add over contiguous rows, which the compiler vectorises)
            double[] transposed = new double[n * m];
            for (int j = 0; j < m; j++) {
                for (int q = 0; q < n; q++) {
                    transposed[q * m + j] = basis[j][q];
                }
            }
            java.util.function.IntConsumer row = o -> {
                int target = o * m;
                for (int q = 0; q < n; q++) {
                    double tq = tensor[o * n + q];
                    int source = q * m;
                    for (int j = 0; j < m; j++) {
                        out[target + j] += tq * transposed[source + j];
                    }
                }
            };
            rows(outer, parallel, row);
        } else {
            // out[o][j][r] = sum_q basis[j][q] tensor[o][q][r], in tiles of JT modes by RT entries so that a
            // tile of out stays in cache while the tensor streams past once per JT modes; each (o, tile of j)
            // is written by one task alone, in a fixed order, so the sums do not depend on how the work is
            // shared among the cores
            int tiles = (m + JT - 1) / JT;
            java.util.function.IntConsumer block = task -> {
                int o = task / tiles;
                int j0 = (task % tiles) * JT;
                int j1 = Math.min(m, j0 + JT);
                for (int r0 = 0; r0 < rest; r0 += RT) {
                    int r1 = Math.min(rest, r0 + RT);
                    for (int q = 0; q < n; q++) {
                        int source = (o * n + q) * rest;
                        for (int j = j0; j < j1; j++) {
                            double bq = basis[j][q];
                            int target = (o * m + j) * rest;
                            for (int r = r0; r < r1; r++) {
                                out[target + r] += bq * tensor[source + r];
                            }
                        }
                    }
                }
            };
            rows(outer * tiles, parallel, block);
        }
        shape[a] = m;
        return out;
    }

    /** Modes and entries per tile of a contraction along an axis that is not the last. */
    private static final int JT = 16;
    private static final int RT = 512;

    /** Runs task(0..count-1), shared among the cores when the work is large enough to repay it. */
    private static void rows(int count, boolean parallel, java.util.function.IntConsumer task) {
        if (parallel && count > 1) {
            java.util.stream.IntStream.range(0, count).parallel().forEach(task);
        } else {
            for (int i = 0; i < count; i++) {
                task.accept(i);
            }
        }
    }

    /** Coefficients of a function of the given axes, sampled on tensor Gauss rules, over the modes. */
    private interface Sampler {
        double at(double[] point);

        /**
         * The part of the last sample's error that the maximum-principle share does not cover (0 for samples
         * that are exact to rounding); {@link #project} integrates it on its rules into an L1 excess.
         */
        default double excess() {
            return 0;
        }
    }

    /**
     * Projects f onto modes 0..m[i]-1 of the listed axes (other coordinates fixed by {@code base}),
     * with a second, 25 % finer rule for the error: returns {coefficients, {error, L2 norm, L1 excess}}, the
     * excess the larger of the two rules' integrals of {@link Sampler#excess()}.
     */
    private double[][] project(Sampler f, int[] axisList, int[] m, double[] base) {
        return project(f, axisList, m, base, 0);
    }

    /**
     * As {@link #project(Sampler, int[], int[], double[])} for modes first..m[0]-1 of a single axis only
     * (first > 0 needs one axis), on the rules of m[0] modes: the error is that of these modes alone.
     */
    private double[][] project(Sampler f, int[] axisList, int[] m, double[] base, int first) {
        return project(() -> f, false, axisList, m, base, first);
    }

    /**
     * As {@link #project(Sampler, int[], int[], double[], int)}; when {@code parallel}, the samples are taken
     * among the cores, row by row of the first axis, each row from a sampler of its own (samplers that keep
     * what depends on the slower coordinates, which are fixed along a row), and the norm's sums added in row
     * order, so that the result does not depend on the thread count.
     */
    private double[][] project(java.util.function.Supplier<Sampler> samplers, boolean parallel, int[] axisList, int[] m,
                               double[] base, int first) {
        double[][] result = null;
        for (int pass = 0; pass < 2; pass++) {
            int dims = axisList.length;
            int[] shape = new int[dims];
            double[][][] rules = new double[dims][][];
            int total = 1;
            for (int i = 0; i < dims; i++) {
                int n = nodesFor(m[i]);
                if (pass == 1) {
                    n += n / 4 + 8;
                }
                shape[i] = n;
                rules[i] = GaussLegendre.onInterval(n, len[axisList[i]]);
                total *= n;
            }
            double[] values = new double[total];
            int rowCount = shape[0];
            int rowLength = total / rowCount;
            double[] rowNorms = new double[rowCount];
            double[] rowExcess = new double[rowCount];
            java.util.function.IntConsumer row = r -> {
                Sampler f = samplers.get();
                double[] point = base.clone();
                double sum = 0;
                double excess = 0;
                for (int c = r * rowLength; c < (r + 1) * rowLength; c++) {
                    int rest = c;
                    double weight = 1;
                    for (int i = dims - 1; i >= 0; i--) {
                        int q = rest % shape[i];
                        rest /= shape[i];
                        point[axisList[i]] = rules[i][0][q];
                        weight *= rules[i][1][q];
                    }
                    double v = f.at(point);
                    values[c] = v;
                    sum += weight * v * v;
                    excess += weight * f.excess();
                }
                rowNorms[r] = sum;
                rowExcess[r] = excess;
            };
            rows(rowCount, parallel, row);
            double normSquared = 0;
            double excess = 0;
            for (int r = 0; r < rowCount; r++) {
                normSquared += rowNorms[r];
                excess += rowExcess[r];
            }
            double[] t = values;
            for (int i = 0; i < dims; i++) {
                t = contract(t, shape, i, rules[i][0], rules[i][1], axes[axisList[i]], m[i], i == 0 ? first : 0);
            }
            if (pass == 0) {
                result = new double[][] {t, {0, Math.sqrt(normSquared), excess}};
            } else {
                double diff = 0;
                double max = 0;
                for (int c = 0; c < t.length; c++) {
                    diff = Math.max(diff, Math.abs(t[c] - result[0][c]));
                    max = Math.max(max, Math.abs(t[c]));
                }
                result[1][0] = 10 * diff + 4 * EPS * max;
                result[1][2] = Math.max(result[1][2], excess);
            }
        }
        return result;
    }

    /** One face's elliptic series; its coefficients grow on demand up to {@link #cap} per direction. */
    private final class Face {
        final int axis;
        final int side;
        final int[] tangential;
        final int[] cap;
        final double depth;
        final boolean present;
        /** The shape phi of a term of the data's change in time (B-form data phi, or h phi), or null: the data at t = 0. */
        final Expression shape;
        /**
         * B-form data added to the side's own (a rectangle's joint lifting, {@link Joint}): a polynomial in the
         * tangential coordinate, or null.
         */
        final Expression extra;
        private final double variation;
        private volatile Table table;

        Face(int axis, int side) {
            this(axis, side, null, null);
        }

        Face(int axis, int side, Expression shape) {
            this(axis, side, shape, null);
        }

        Face(int axis, int side, Expression shape, Expression extra) {
            this.axis = axis;
            this.side = side;
            this.shape = shape;
            this.extra = extra;
            this.depth = len[axis];
            tangential = new int[d - 1];
            for (int i = 0, j = 0; i < d; i++) {
                if (i != axis) {
                    tangential[j++] = i;
                }
            }
            cap = new int[d - 1];
            java.util.Arrays.fill(cap, d == 2 ? 8192 : 256);
            int[] start = new int[d - 1];
            java.util.Arrays.fill(start, d == 2 ? 256 : 32);
            Table first = new Table(start);
            present = first.norm > 0;
            table = first;
            variation = present && d == 2 ? variationOfData() : Double.NaN;
        }

        /** The data this face's series solves at a point on it: the shifted data less the source part, or the shape. */
        double boundaryData(double[] point) {
            if (shape == null) {
                return shiftedData(axis, side, point) - sourcePart(axis, side, point, null)
                    + (extra == null ? 0 : valueAt(extra, point));
            }
            double g = valueAt(shape, point);
            return type[axis][side] == ROBIN ? h[axis][side] * g : g;
        }

        /**
         * The face's data as samples for a projection, with the excess of a pair term's error over its share at
         * each (one sampler per thread).
         */
        Sampler dataSampler() {
            if (shape != null || pairs.isEmpty()) {
                return this::boundaryData;
            }
            return new Sampler() {
                private final double[] excess = new double[1];

                @Override
                public double at(double[] point) {
                    excess[0] = 0;
                    return shiftedData(axis, side, point) - sourcePart(axis, side, point, excess);
                }

                @Override
                public double excess() {
                    return excess[0];
                }
            };
        }

        /**
         * For a rectangle's side: V = |G(0)| + |G(L)| + 2 int |G'| (the integral by a 2048-point rule,
         * doubled), which bounds |<G, X_j>| <= V/mu_j by one integration by parts; NaN when the data may
         * be non-smooth (a step), where only the Cauchy-Schwarz bound is used.
         */
        private double variationOfData() {
            int t = tangential[0];
            Expression e = shape != null ? shape : data[axis][side];
            boolean rough = e.mayBeNonSmooth();
            for (Expression part : sourceParts) {
                rough |= shape == null && part != null && part.mayBeNonSmooth();
            }
            if (rough) {
                return Double.NaN;
            }
            Expression de = e.variables().contains(NAMES[t]) ? e.derivative(NAMES[t]) : null;
            Expression dExtra = extra == null ? null : extra.derivative(NAMES[t]);
            double scaleData = type[axis][side] == ROBIN ? h[axis][side] : 1;
            double[] point = new double[d];
            point[axis] = side == 0 ? 0 : len[axis];
            double[][] rule = GaussLegendre.onInterval(2048, len[t]);
            double integral = 0;
            for (int q = 0; q < 2048; q++) {
                point[t] = rule[0][q];
                double g = (de == null ? 0 : scaleData * valueAt(de, point)) + (dExtra == null ? 0 : valueAt(dExtra, point));
                if (shape == null && sourceSlices[t] != null && type[axis][side] != NEUMANN) {
                    double slope = -sourceSlices[t].heatFlux(point[t]).value() / k;
                    g -= (type[axis][side] == ROBIN ? h[axis][side] : 1) * slope;
                }
                integral += rule[1][q] * Math.abs(g);
            }
            point[t] = 0;
            double g0 = boundaryData(point);
            point[t] = len[t];
            double gL = boundaryData(point);
            double v = Math.abs(g0) + Math.abs(gL) + 2 * integral;
            return Double.isFinite(v) ? v : Double.NaN;
        }

        /** Integration-by-parts tails {value, gradient} of a rectangle's side from mode m on, at r = exp(-pi s/L). */
        private double[] partsTails(double r, int m, Table tb) {
            int t = tangential[0];
            double lt = len[t];
            double e1 = Math.exp(-2 * Math.PI * depth / lt);
            double n = tb.normLower;
            double geometric = Math.pow(r, m) / (1 - r);
            if (type[axis][side] == DIRICHLET) {
                double c = 2 * variation * lt / (Math.PI * n * (1 - e1));
                double cg = 4 * variation / (n * (1 - e1));
                return new double[] {c * geometric / m, cg * geometric};
            }
            double c = 2 * variation * lt * lt / (Math.PI * Math.PI * n * k * (1 - e1));
            double cg = 4 * variation * lt / (Math.PI * n * k * (1 - e1));
            return new double[] {c * geometric / ((double) m * m), cg * geometric / m};
        }

        private volatile Table boundsTable;

        /**
         * The side's coefficients for at least {@code needed} modes per direction, kept apart from the table
         * the series sums (whose projection error, which grows with the rule, enters every point's bound).
         */
        Table boundsTable(int[] needed) {
            Table t = boundsTable;
            if (t != null && covers(t, needed)) {
                return t;
            }
            synchronized (this) {
                if (boundsTable == null || !covers(boundsTable, needed)) {
                    int[] size = new int[needed.length];
                    for (int i = 0; i < size.length; i++) {
                        size[i] = Math.min(cap[i], needed[i]);
                    }
                    boundsTable = new Table(size);
                }
                return boundsTable;
            }
        }

        private boolean covers(Table t, int[] needed) {
            for (int i = 0; i < needed.length; i++) {
                if (t.size[i] < Math.min(cap[i], needed[i])) {
                    return false;
                }
            }
            return true;
        }

        /** The table entry of the tangential indices of a body mode index. */
        int tableIndex(Table tb, int[] index) {
            return tb.index(index[tangential[0]], tangential.length == 1 ? 0 : index[tangential[1]]);
        }

        /** Coefficients for at least {@code needed} modes per direction. */
        Table table(int[] needed) {
            Table t = table;
            boolean enough = true;
            for (int i = 0; i < needed.length; i++) {
                enough &= t.size[i] >= needed[i];
            }
            if (enough) {
                return t;
            }
            synchronized (this) {
                t = table;
                int[] size = new int[needed.length];
                boolean grow = false;
                for (int i = 0; i < needed.length; i++) {
                    size[i] = Math.min(cap[i], Math.max(needed[i], t.size[i] >= needed[i] ? t.size[i] : 2 * t.size[i]));
                    grow |= size[i] > t.size[i];
                }
                if (grow) {
                    table = new Table(size);
                }
                return table;
            }
        }

        // a side's projection (one tangential axis) in pieces: piece i holds modes ends[i-1]..ends[i]-1, projected
        // on the rules of ends[i] modes, with that piece's own error and the data's norm on those rules; a
        // larger table projects only the modes it adds (doubling a table of thousands of modes projected all
        // of them again, which was most of a convecting plate's preparation)
        private final java.util.List<double[]> pieces = new java.util.ArrayList<>();
        private final java.util.List<double[]> piecesInfo = new java.util.ArrayList<>(); // {end, error, norm, excess}

        /** The data's coefficients for modes 0..size-1 of the tangential axes, as {coefficients, {error, norm, excess}}. */
        private synchronized double[][] projection(int[] size, double[] base) {
            if (tangential.length != 1) {
                return project(Face.this::dataSampler, false, tangential, size, base, 0);
            }
            int covered = piecesInfo.isEmpty() ? 0 : (int) piecesInfo.get(piecesInfo.size() - 1)[0];
            if (covered < size[0]) {
                double[][] p = project(Face.this::dataSampler, false, tangential, size, base, covered);
                pieces.add(p[0]);
                piecesInfo.add(new double[] {size[0], p[1][0], p[1][1], p[1][2]});
            }
            double[] coef = new double[size[0]];
            double error = 0;
            double norm = 0;
            double excess = 0;
            int start = 0;
            for (int i = 0; i < pieces.size() && start < size[0]; i++) {
                double[] piece = pieces.get(i);
                System.arraycopy(piece, 0, coef, start, Math.min(piece.length, size[0] - start));
                error = Math.max(error, piecesInfo.get(i)[1]);
                norm = piecesInfo.get(i)[2];
                excess = Math.max(excess, piecesInfo.get(i)[3]);
                start += piece.length;
            }
            return new double[][] {coef, {error, norm, excess}};
        }

        /** The face's coefficients and profiles for modes 0..size[i]-1 of each tangential axis. */
        final class Table {
            final int[] size;
            final double[] coef;
            final double[] kappa;
            final double[] amplitude; // a_m
            final double[] rho;
            final double[] beta; // kappa = 0: y = 1 + beta s
            // kappa = 0 between two flux faces (every face insulated or flux-driven): y = (1 - s/D)^2, a = D/(2k)
            final boolean[] quadratic;
            // its lags of mean zero, as power series in s (order 1 and 2); null when no entry is quadratic
            double[] quadraticLag1;
            double[] quadraticLag2;
            // the resonant profile d(a y)/d(kappa^2): da/dkappa, drho/dkappa; kappa = 0: a (s^2/2 + beta s^3/6) + c1 + c2 s
            final double[] dAmplitude;
            final double[] dRho;
            final double[] d2Amplitude;
            final double[] d2Rho;
            final double[] c1;
            final double[] c2;
            // kappa = 0, order 2: a (s^4/24 + beta s^5/120) + c1 s^2/2 + c2 s^3/6 + d1 + d2 s
            final double[] d1;
            final double[] d2;
            final double error;
            final double norm;
            final double sup; // bound of 2 |a_m| |G_m| over all m
            final double profileNorm; // bound of ||a_m y_m|| over all m
            final double normLower; // lower bound of the tangential modes' norms (product over the axes)
            final double coefficientShift; // bound of every |G_m| change by the pair terms' excess (in error and sup)

            Table(int[] size) {
                this.size = size.clone();
                double[] base = new double[d];
                base[axis] = side == 0 ? 0 : len[axis];
                double[][] p = projection(this.size, base);
                norm = p[1][1];
                coef = p[0];
                double normLower = 1;
                for (int i = 0; i < tangential.length; i++) {
                    normLower *= axes[tangential[i]].normLowerBound(this.size[i]);
                }
                // where a pair term's V is less certain than its share (next to its rectangle's corners), the
                // excess delta_b moves every coefficient by |<delta_b, X_m>|/||X_m||^2 <= ||delta_b||_1 / normLower
                // (|X_m| <= 1), the L1 norm measured on the projection's rules and doubled
                coefficientShift = 2 * p[1][2] / normLower;
                error = p[1][0] + coefficientShift;
                int count = coef.length;
                kappa = new double[count];
                amplitude = new double[count];
                rho = new double[count];
                beta = new double[count];
                quadratic = new boolean[count];
                dAmplitude = new double[count];
                dRho = new double[count];
                d2Amplitude = new double[count];
                d2Rho = new double[count];
                c1 = new double[count];
                c2 = new double[count];
                d1 = new double[count];
                d2 = new double[count];
                double aMax = 0;
                double yMax = 0;
                int far = 1 - side;
                for (int c = 0; c < count; c++) {
                    int rest = c;
                    double k2 = 0;
                    for (int i = tangential.length - 1; i >= 0; i--) {
                        int j = rest % this.size[i];
                        rest /= this.size[i];
                        double m = axes[tangential[i]].mu[j];
                        k2 += m * m;
                    }
                    double kap = Math.sqrt(k2);
                    kappa[c] = kap;
                    double y0;
                    double dy0;
                    double y0k = 0; // d y(0)/d kappa
                    double dy0k = 0; // d y'(0)/d kappa
                    double y0kk = 0;
                    double dy0kk = 0;
                    if (kap == 0 && allFlux) {
                        // no linear profile carries a flux between two flux faces: (1 - s/D)^2 does, with the
                        // uniform sink -k Laplace = -G/D that the mean's drift balances
                        quadratic[c] = true;
                        y0 = 1;
                        dy0 = -2 / depth;
                        double a0 = k * 2 / depth;
                        double[] profile = {1 / a0, -2 / (a0 * depth), 1 / (a0 * depth * depth)};
                        quadraticLag1 = zeroMeanLag(profile, depth);
                        quadraticLag2 = zeroMeanLag(quadraticLag1, depth);
                    } else if (kap == 0) {
                        beta[c] = switch (type[axis][far]) {
                            case DIRICHLET -> -1 / depth;
                            case NEUMANN -> 0;
                            default -> -h[axis][far] / (k + h[axis][far] * depth);
                        };
                        y0 = 1;
                        dy0 = beta[c];
                    } else {
                        rho[c] = switch (type[axis][far]) {
                            case DIRICHLET -> -1;
                            case NEUMANN -> 1;
                            default -> (k * kap - h[axis][far]) / (k * kap + h[axis][far]);
                        };
                        if (type[axis][far] == ROBIN) {
                            double q = k * kap + h[axis][far];
                            dRho[c] = 2 * k * h[axis][far] / (q * q);
                            d2Rho[c] = -4 * k * k * h[axis][far] / (q * q * q);
                        }
                        double e = Math.exp(-2 * kap * depth);
                        y0 = 1 + rho[c] * e;
                        dy0 = kap * (-1 + rho[c] * e);
                        y0k = (dRho[c] - 2 * depth * rho[c]) * e;
                        dy0k = -1 + e * (rho[c] + kap * dRho[c] - 2 * kap * depth * rho[c]);
                        double dd = depth;
                        y0kk = (d2Rho[c] - 4 * dd * dRho[c] + 4 * dd * dd * rho[c]) * e;
                        dy0kk = (2 * dRho[c] + kap * d2Rho[c] - 4 * dd * rho[c] - 4 * kap * dd * dRho[c]
                            + 4 * kap * dd * dd * rho[c]) * e;
                    }
                    double b = switch (type[axis][side]) {
                        case DIRICHLET -> y0;
                        case NEUMANN -> -k * dy0;
                        default -> -k * dy0 + h[axis][side] * y0;
                    };
                    if (!(Math.abs(b) > 0)) {
                        throw new OracleException(Reason.UNSUPPORTED, "oracle: face " + SIDES[axis][side].key()
                            + " has no decaying profile for mode " + c + " (insulated on both sides of it)");
                    }
                    double a = 1 / b;
                    amplitude[c] = a;
                    if (kap > 0) {
                        double bk = switch (type[axis][side]) {
                            case DIRICHLET -> y0k;
                            case NEUMANN -> -k * dy0k;
                            default -> -k * dy0k + h[axis][side] * y0k;
                        };
                        dAmplitude[c] = -bk * a * a;
                        double bkk = switch (type[axis][side]) {
                            case DIRICHLET -> y0kk;
                            case NEUMANN -> -k * dy0kk;
                            default -> -k * dy0kk + h[axis][side] * y0kk;
                        };
                        d2Amplitude[c] = -bkk * a * a + 2 * bk * bk * a * a * a;
                    } else if (!quadratic[c]) {
                        // P'' = a (1 + beta s), the face's and the far face's homogeneous conditions fix c1 + c2 s
                        double p0 = type[axis][side] == DIRICHLET ? 1 : type[axis][side] == NEUMANN ? 0 : h[axis][side];
                        double q0 = type[axis][side] == DIRICHLET ? 0 : type[axis][side] == NEUMANN ? 1 : -k;
                        double pD = type[axis][far] == DIRICHLET ? 1 : type[axis][far] == NEUMANN ? 0 : h[axis][far];
                        double qD = type[axis][far] == DIRICHLET ? 0 : type[axis][far] == NEUMANN ? 1 : k;
                        double v = depth * depth / 2 + beta[c] * depth * depth * depth / 6;
                        double dv = depth + beta[c] * depth * depth / 2;
                        double rhs = -a * (pD * v + qD * dv);
                        double det = p0 * (pD * depth + qD) - q0 * pD;
                        c1[c] = -q0 * rhs / det;
                        c2[c] = p0 * rhs / det;
                        // order 2: the particular part a (s^4/24 + beta s^5/120) + c1 s^2/2 + c2 s^3/6, then d1 + d2 s
                        double d4 = depth * depth * depth * depth;
                        double v2 = a * (d4 / 24 + beta[c] * d4 * depth / 120) + c1[c] * depth * depth / 2
                            + c2[c] * depth * depth * depth / 6;
                        double dv2 = a * (d4 / depth / 6 + beta[c] * d4 / 24) + c1[c] * depth + c2[c] * depth * depth / 2;
                        double rhs2 = -(pD * v2 + qD * dv2);
                        d1[c] = -q0 * rhs2 / det;
                        d2[c] = p0 * rhs2 / det;
                    }
                    aMax = Math.max(aMax, Math.abs(a));
                    double profile = kap == 0 ? Math.abs(a) * Math.sqrt(depth)
                        : Math.abs(a) * Math.sqrt(Math.min(2 / kap, 4 * depth));
                    yMax = Math.max(yMax, profile);
                }
                sup = 2 * aMax * (norm / Math.sqrt(normLower) + coefficientShift);
                profileNorm = yMax;
                this.normLower = normLower;
            }

            int index(int j0, int j1) {
                return size.length == 1 ? j0 : j0 * size[1] + j1;
            }
        }

        /** Distance of a point from this face. */
        double distance(double[] p, int o) {
            return side == 0 ? p[o + axis] : len[axis] - p[o + axis];
        }

        /**
         * Adds this face's value (and gradient, if {@code grad} is not null) at the point; returns
         * {value bound, gradient bound} in {@code bounds}.
         */
        double add(double[] p, int o, double budget, double[] grad, double[] bounds) {
            return add(p, o, null, budget, grad, bounds, 0);
        }

        double add(double[] p, int o, double[] hi, double budget, double[] grad, double[] bounds) {
            return add(p, o, hi, budget, grad, bounds, 0);
        }

        /**
         * The lag profile of order 1 or 2 of mode {@code index} at distance s: {Pi, dPi/ds} into out. Order 1:
         * Pi_1 = d(a y)/d(kappa^2), Pi_1'' - kappa^2 Pi_1 = a y; order 2: Pi_2 = (1/2) d Pi_1/d(kappa^2),
         * Pi_2'' - kappa^2 Pi_2 = Pi_1; both under the homogeneous conditions of this face and the far one
         * (differentiating y'' = kappa^2 y and the conditions, which do not name kappa, in kappa^2).
         */
        void lagProfile(Table tb, int index, int order, double s, double[] out) {
            double kap = tb.kappa[index];
            double a = tb.amplitude[index];
            if (kap == 0 && tb.quadratic[index]) {
                polynomial(order == 1 ? tb.quadraticLag1 : tb.quadraticLag2, s, out);
                return;
            }
            if (kap == 0) {
                double beta = tb.beta[index];
                double s2 = s * s;
                double s3 = s2 * s;
                if (order == 1) {
                    out[0] = a * (s2 / 2 + beta * s3 / 6) + tb.c1[index] + tb.c2[index] * s;
                    out[1] = a * (s + beta * s2 / 2) + tb.c2[index];
                } else {
                    out[0] = a * (s2 * s2 / 24 + beta * s2 * s3 / 120) + tb.c1[index] * s2 / 2 + tb.c2[index] * s3 / 6
                        + tb.d1[index] + tb.d2[index] * s;
                    out[1] = a * (s3 / 6 + beta * s2 * s2 / 24) + tb.c1[index] * s + tb.c2[index] * s2 / 2 + tb.d2[index];
                }
                return;
            }
            double[] c = lagCoefficients(tb, index, order);
            double e1 = Math.exp(-kap * s);
            double e2 = Math.exp(-kap * (2 * depth - s));
            double near = c[0] + s * (c[1] + s * c[2]);
            double far = c[3] + s * (c[4] + s * c[5]);
            out[0] = near * e1 + far * e2;
            out[1] = (c[1] + 2 * c[2] * s - kap * near) * e1 + (c[4] + 2 * c[5] * s + kap * far) * e2;
        }

        /**
         * Pi = (p0 + p1 s + p2 s^2) exp(-kappa s) + (q0 + q1 s + q2 s^2) exp(-kappa (2D - s)): {p0, p1, p2, q0,
         * q1, q2}, from a(kappa) and rho(kappa) with their first two derivatives (Pi_1 = DY/(2 kappa), Pi_2 =
         * (D^2 Y - DY/kappa)/(8 kappa^2), D = d/d kappa, Y = a y).
         */
        private double[] lagCoefficients(Table tb, int index, int order) {
            double kap = tb.kappa[index];
            double a = tb.amplitude[index];
            double da = tb.dAmplitude[index];
            double rho = tb.rho[index];
            double dr = tb.dRho[index];
            double dd = depth;
            if (order == 1) {
                double half = 1 / (2 * kap);
                return new double[] {da * half, -a * half, 0, (da * rho + a * (dr - 2 * dd * rho)) * half, a * rho * half, 0};
            }
            double d2a = tb.d2Amplitude[index];
            double d2r = tb.d2Rho[index];
            double f = 1 / (8 * kap * kap);
            double q0 = d2a * rho + 2 * da * dr - 4 * dd * da * rho + a * d2r - 4 * dd * a * dr + 4 * dd * dd * a * rho
                - (da * rho + a * dr - 2 * dd * a * rho) / kap;
            double q1 = 2 * da * rho + 2 * a * dr - 4 * dd * a * rho - a * rho / kap;
            return new double[] {(d2a - da / kap) * f, (-2 * da + a / kap) * f, a * f, q0 * f, q1 * f, a * rho * f};
        }

        /** The mean of a lag profile over distances [s, s + w]: closed form, or 10-point Gauss when kappa w < 2. */
        double lagMean(Table tb, int index, int order, double s, double w) {
            double kap = tb.kappa[index];
            if (kap * w < 2) {
                GaussLegendre g = GaussLegendre.of(10);
                double[] out = new double[2];
                double sum = 0;
                for (int q = 0; q < g.nodes.length; q++) {
                    lagProfile(tb, index, order, s + 0.5 * w * (g.nodes[q] + 1), out);
                    sum += g.weights[q] * out[0];
                }
                return 0.5 * sum;
            }
            double[] c = lagCoefficients(tb, index, order);
            double s2 = s + w;
            double ik = 1 / kap;
            // antiderivatives of s^j exp(-kappa s) and s^j exp(kappa (s - 2D)), j = 0, 1, 2, over [s, s2]
            double a1 = Math.exp(-kap * s);
            double b1 = Math.exp(-kap * s2);
            double near = c[0] * ik * (a1 - b1)
                + c[1] * ((s * ik + ik * ik) * a1 - (s2 * ik + ik * ik) * b1)
                + c[2] * ((s * s * ik + 2 * s * ik * ik + 2 * ik * ik * ik) * a1
                    - (s2 * s2 * ik + 2 * s2 * ik * ik + 2 * ik * ik * ik) * b1);
            double a2 = Math.exp(-kap * (2 * depth - s2));
            double b2 = Math.exp(-kap * (2 * depth - s));
            double far = c[3] * ik * (a2 - b2)
                + c[4] * ((s2 * ik - ik * ik) * a2 - (s * ik - ik * ik) * b2)
                + c[5] * ((s2 * s2 * ik - 2 * s2 * ik * ik + 2 * ik * ik * ik) * a2
                    - (s * s * ik - 2 * s * ik * ik + 2 * ik * ik * ik) * b2);
            return (near + far) / w;
        }

        /**
         * {value factor, gradient factor} of a lag profile of the given order for every mode with that kappa or
         * more, relative to the face series' own bounds (|a| 2 exp(-kappa s) and (kappa + mu) times that): with
         * e = exp(-2 kappa D), |rho'| <= 1/(2 kappa), |rho''| <= 0.6/kappa^2, |a'/a| <= A = [(1 + e)/kappa + (1/(2
         * kappa) + 2D) e]/(1 - e) and |a''/a| <= A2 = |B''/B| + 2 A^2, each coefficient of the profile is bounded
         * by the same products; all decrease in kappa.
         */
        private double[] lagFactors(int order, double kap, double s) {
            double e = Math.exp(-2 * kap * depth);
            double r1 = 0.5 / kap;
            double r2 = 0.6 / (kap * kap);
            double dd = depth;
            double a1 = ((1 + e) / kap + (r1 + 2 * dd) * e) / (1 - e);
            if (order == 1) {
                // |Pi_1| <= |a| exp(-kappa s) [2A + s + 1/(2 kappa) + 2D]/(2 kappa)
                double r = (2 * a1 + s + r1 + 2 * dd) / (2 * kap);
                return new double[] {r, r + 1 / (kap * kap)};
            }
            double b2 = ((2 * r1 / kap + r2 + 4 * dd / kap + 4 * dd * r1 + 4 * dd * dd) + (r2 + 4 * dd * r1 + 4 * dd * dd))
                * e / (1 - e);
            double a2 = b2 + 2 * a1 * a1;
            double p0 = a2 + a1 / kap
                + a2 + 2 * a1 * r1 + 4 * dd * a1 + r2 + 4 * dd * r1 + 4 * dd * dd + (a1 + r1 + 2 * dd) / kap;
            double p1 = 2 * a1 + 1 / kap + 2 * a1 + 2 * r1 + 4 * dd + 1 / kap;
            double p2 = 2;
            double f = 1 / (8 * kap * kap);
            double value = (p0 + s * (p1 + s * p2)) * f;
            return new double[] {value, value + (p1 + 2 * p2 * s) * f / kap};
        }

        /** The least kappa of a mode outside the box m: min over the tangential axes of m_i pi / L_i. */
        private double tailKappa(int[] m) {
            double low = Double.POSITIVE_INFINITY;
            for (int i = 0; i < m.length; i++) {
                low = Math.min(low, m[i] * Math.PI / len[tangential[i]]);
            }
            return low;
        }

        /**
         * As {@link #add(double[], int, double, double[], double[])}, or with {@code hi} not null the
         * mean over the cell from the corner p to hi (no gradient): the modes' means in closed form,
         * the tail as at the cell's nearest point to the face.
         */
        double add(double[] p, int o, double[] hi, double budget, double[] grad, double[] bounds, int order) {
            double s = Math.max(0, hi == null ? distance(p, o) : side == 0 ? p[o + axis] : len[axis] - hi[axis]);
            double thickness = hi == null ? 0 : hi[axis] - p[o + axis];
            int nt = tangential.length;
            double[] r = new double[nt];
            int[] m = new int[nt];
            if (order > 0) {
                // size for the lag profiles' bound at the least kappa of any tail (m >= 1)
                int[] ones = new int[nt];
                java.util.Arrays.fill(ones, 1);
                double[] factors = lagFactors(order, tailKappa(ones), s + thickness);
                budget /= Math.max(factors[0], factors[1]);
            }
            double gradientBudget = budget / lengthScale;
            Table tb = table;
            double sup = tb.sup;
            // region i (j_i >= m_i): kappa >= sum_l w_il j_l pi/L_l with sum_l w_il^2 <= 1 (Cauchy-Schwarz)
            double[][] rr = new double[nt][nt];
            for (int i = 0; i < nt; i++) {
                for (int l = 0; l < nt; l++) {
                    double w = nt == 1 ? 1 : (l == i ? 0.95 : 0.3122);
                    rr[i][l] = Math.exp(-w * Math.PI * s / len[tangential[l]]);
                }
                r[i] = rr[i][i];
            }
            if (!(s > 0) || r[0] >= 1) {
                return unreached(p, o, hi, budget, grad, bounds, order, s);
            }
            for (int i = 0; i < nt; i++) {
                double others = 1;
                for (int l = 0; l < nt; l++) {
                    if (l != i) {
                        others /= 1 - rr[i][l];
                    }
                }
                double target = budget * (1 - r[i]) / (nt * sup * others);
                m[i] = Math.max(1, (int) Math.ceil(Math.log(target) / Math.log(r[i])));
            }
            double tail = valueTail(rr, m, sup);
            double gTail = grad == null ? 0 : gradientTail(rr, m, sup);
            while (grad != null && gTail > gradientBudget) {
                for (int i = 0; i < nt; i++) {
                    m[i] += Math.max(1, m[i] / 8);
                }
                if (m[0] > cap[0] || (nt > 1 && m[1] > cap[1])) {
                    break;
                }
                gTail = gradientTail(rr, m, sup);
                tail = valueTail(rr, m, sup);
            }
            if (nt == 1 && Double.isFinite(variation)) {
                // the integration-by-parts tail decays faster in m: the fewest modes that meet both budgets
                int hiM = Math.min(m[0], cap[0]);
                double[] atHi = partsTails(r[0], hiM, tb);
                if (atHi[0] <= budget && (grad == null || atHi[1] <= gradientBudget)) {
                    int loM = 1;
                    while (loM < hiM) {
                        int mid = (loM + hiM) >>> 1;
                        double[] at = partsTails(r[0], mid, tb);
                        if (at[0] <= budget && (grad == null || at[1] <= gradientBudget)) {
                            hiM = mid;
                        } else {
                            loM = mid + 1;
                        }
                    }
                    double[] at = partsTails(r[0], hiM, tb);
                    m[0] = hiM;
                    tail = Math.min(at[0], valueTail(rr, m, sup));
                    gTail = grad == null ? 0 : Math.min(at[1], gradientTail(rr, m, sup));
                }
            }
            for (int i = 0; i < nt; i++) {
                if (m[i] > cap[i]) {
                    return unreached(p, o, hi, budget, grad, bounds, order, s);
                }
            }
            if (order > 0) {
                double[] factors = lagFactors(order, tailKappa(m), s + thickness);
                tail *= factors[0];
                gTail *= factors[1];
            }
            tb = table(m);
            if (tb.sup > sup) {
                // the finer rule found a larger norm: the tails scale with it
                tail *= tb.sup / sup;
                gTail *= tb.sup / sup;
                sup = tb.sup;
            }
            double value = 0;
            double magnitude = 0;
            double profileSum = 0;
            double gradientProfile = 0;
            double gradientMagnitude = 0;
            double[] gsum = new double[d];
            double dSign = side == 0 ? 1 : -1; // d/dx_axis = dSign d/ds
            double[][] xs = new double[nt][];
            double[][] dxs = new double[nt][];
            for (int i = 0; i < nt; i++) {
                AxisModes ax = axes[tangential[i]];
                double x = p[o + tangential[i]];
                xs[i] = new double[m[i]];
                dxs[i] = new double[m[i]];
                for (int j = 0; j < m[i]; j++) {
                    double arg = ax.mu[j] * x + ax.phase[j];
                    xs[i][j] = hi == null ? Math.sin(arg) : meanOfMode(ax.mu[j], ax.phase[j], x, hi[tangential[i]]);
                    dxs[i][j] = ax.mu[j] * Math.cos(arg);
                }
            }
            int count = nt == 1 ? m[0] : m[0] * m[1];
            double[] profile = new double[2];
            for (int c = 0; c < count; c++) {
                int j0 = nt == 1 ? c : c / m[1];
                int j1 = nt == 1 ? 0 : c % m[1];
                int index = tb.index(j0, j1);
                double kap = tb.kappa[index];
                double y;
                double dy;
                double amp = tb.amplitude[index];
                if (order > 0) {
                    // the profile carries its amplitude: y = Pi / a
                    if (thickness > 0) {
                        y = lagMean(tb, index, order, s, thickness) / amp;
                        dy = 0;
                    } else {
                        lagProfile(tb, index, order, s, profile);
                        y = profile[0] / amp;
                        dy = profile[1] / amp;
                    }
                } else if (kap == 0 && tb.quadratic[index]) {
                    double r0 = 1 - s / depth;
                    if (thickness > 0) {
                        double r1 = 1 - (s + thickness) / depth;
                        y = (r0 * r0 * r0 - r1 * r1 * r1) * depth / (3 * thickness);
                    } else {
                        y = r0 * r0;
                    }
                    dy = thickness > 0 ? 0 : -2 * r0 / depth;
                } else if (kap == 0) {
                    y = 1 + tb.beta[index] * (s + 0.5 * thickness);
                    dy = tb.beta[index];
                } else if (thickness > 0) {
                    // mean of exp(-kappa s') + rho exp(-kappa (2D - s')) over [s, s + thickness]
                    double e1 = Math.exp(-kap * s) * -Math.expm1(-kap * thickness);
                    double e2 = tb.rho[index] == 0 ? 0
                        : tb.rho[index] * Math.exp(-kap * (2 * depth - s - thickness)) * -Math.expm1(-kap * thickness);
                    y = (e1 + e2) / (kap * thickness);
                    dy = 0;
                } else {
                    double e1 = Math.exp(-kap * s);
                    double e2 = tb.rho[index] == 0 ? 0 : tb.rho[index] * Math.exp(-kap * (2 * depth - s));
                    y = e1 + e2;
                    dy = kap * (-e1 + e2);
                }
                double ga = tb.coef[index] * tb.amplitude[index];
                double x0 = xs[0][j0];
                double x1 = nt == 1 ? 1 : xs[1][j1];
                double term = ga * x0 * x1 * y;
                value += term;
                magnitude += Math.abs(term);
                profileSum += Math.abs(tb.amplitude[index] * y);
                if (grad != null) {
                    double tangentialMu = axes[tangential[0]].mu[j0] + (nt > 1 ? axes[tangential[1]].mu[j1] : 0);
                    double slope = Math.abs(dy) + Math.abs(y) * tangentialMu;
                    gradientProfile += Math.abs(tb.amplitude[index]) * slope;
                    gradientMagnitude += Math.abs(ga) * slope;
                    gsum[axis] += ga * x0 * x1 * dy * dSign;
                    gsum[tangential[0]] += ga * dxs[0][j0] * x1 * y;
                    if (nt > 1) {
                        gsum[tangential[1]] += ga * x0 * dxs[1][j1] * y;
                    }
                }
            }
            double valueBound = tail + tb.error * profileSum + 16 * EPS * magnitude;
            double gradientBound = gTail + tb.error * gradientProfile + 16 * EPS * gradientMagnitude;
            if (order == 0 && (valueBound > budget || grad != null && gradientBound > gradientBudget)) {
                // next to the side thousands of modes carry the projection's error: the lifted form, where it
                // exists and bounds the point more tightly
                Lifted l = lifted();
                if (l != null) {
                    double[] lg = grad == null ? null : new double[d];
                    double[] lb = new double[2];
                    double lv = Double.NaN;
                    try {
                        lv = l.add(p, o, hi, budget, lg, lb);
                    } catch (OracleException e) {
                        if (e.reason() != Reason.TOO_MANY_MODES) {
                            throw e;
                        }
                    }
                    if (!Double.isNaN(lv) && lb[0] <= valueBound && (grad == null || lb[1] <= gradientBound)) {
                        if (grad != null) {
                            for (int i = 0; i < d; i++) {
                                grad[i] += lg[i];
                            }
                        }
                        bounds[0] = lb[0];
                        bounds[1] = lb[1];
                        return lv;
                    }
                }
            }
            if (grad != null) {
                for (int i = 0; i < d; i++) {
                    grad[i] += gsum[i];
                }
            }
            bounds[0] = valueBound;
            bounds[1] = gradientBound;
            return value;
        }

        private double valueTail(double[][] rr, int[] m, double sup) {
            double total = 0;
            for (int i = 0; i < rr.length; i++) {
                double product = 1;
                for (int l = 0; l < rr.length; l++) {
                    product *= (l == i ? Math.pow(rr[i][l], m[l]) : 1) / (1 - rr[i][l]);
                }
                total += product;
            }
            return sup * total;
        }

        /** Tail of sup * 2 sum_i (j_i + 1) pi/L_i r^j over the complement (|grad| <= kappa + sum mu). */
        private double gradientTail(double[][] rr, int[] m, double sup) {
            int nt = rr.length;
            double total = 0;
            for (int cut = 0; cut < nt; cut++) {
                // the part j_cut >= m_cut, all other j
                for (int weighted = 0; weighted < nt; weighted++) {
                    double product = Math.PI / len[tangential[weighted]];
                    for (int i = 0; i < nt; i++) {
                        int from = i == cut ? m[i] : 0;
                        double q = rr[cut][i];
                        product *= i == weighted ? weightedGeometric(q, from) : Math.pow(q, from) / (1 - q);
                    }
                    total += product;
                }
            }
            return 2 * sup * total;
        }

        /**
         * A point this face's own series cannot reach: the lifted form of the same function where the face has
         * one ({@link Lifted}), else refused.
         */
        private double unreached(double[] p, int o, double[] hi, double budget, double[] grad, double[] bounds,
                                 int order, double s) {
            Lifted l = order == 0 ? lifted() : null;
            if (l == null) {
                throw tooClose(s);
            }
            return l.add(p, o, hi, budget, grad, bounds);
        }

        private volatile Lifted lifted;
        private volatile boolean liftTried;

        /** The lifted form, built on first use; null where the face has none. */
        private Lifted lifted() {
            if (liftTried) {
                return lifted;
            }
            synchronized (this) {
                if (!liftTried) {
                    lifted = lift(this);
                    liftTried = true;
                }
                return lifted;
            }
        }

        private OracleException tooClose(double s) {
            return new OracleException(Reason.TOO_MANY_MODES, "oracle: the point is " + s + " m from face "
                + SIDES[axis][side].key() + ", whose data (less the source part) do not vanish along its edges;"
                + " that face's series would need more than " + cap[0] + " modes per direction there. Points this close"
                + " to such a face are not certified in this version (on a Dirichlet face itself u is the data)");
        }
    }

    /** The mean of sin(mu x + phase) over [a, b] (the value at a when b = a). */
    static double meanOfMode(double mu, double phase, double a, double b) {
        double w = b - a;
        if (mu == 0) {
            return Math.sin(phase);
        }
        double half = 0.5 * mu * w;
        if (half < 1e-8) {
            return Math.sin(mu * (a + 0.5 * w) + phase);
        }
        // (cos(mu a + phase) - cos(mu b + phase))/(mu w) = sin(mu (a+b)/2 + phase) sin(half)/half
        return Math.sin(mu * (a + 0.5 * w) + phase) * Math.sin(half) / half;
    }

    /** sum_{j >= m} (j + 1) r^j = r^m ((m + 1)/(1 - r) + r/(1 - r)^2). */
    private static double weightedGeometric(double r, int m) {
        double q = 1 - r;
        return Math.pow(r, m) * ((m + 1) / q + r / (q * q));
    }

    private double minLength() {
        double m = len[0];
        for (double l : len) {
            m = Math.min(m, l);
        }
        return m;
    }

    /** Whether a pair term puts data on a face across its third axis. */
    private boolean carriesData(PairTerm t) {
        return pairFaceFactor(t, 0) != 0 || pairFaceFactor(t, 1) != 0;
    }

    /**
     * B-form of a pair term's factor w on a face across its third axis: w on a Dirichlet face, k dw/dn on a
     * flux face, k dw/dn + h w on a convective one (n the outward normal); the term leaves that times V there.
     */
    private double pairFaceFactor(PairTerm t, int side) {
        int c = t.c();
        double w = t.w(side == 0 ? 0 : len[c]);
        double outward = side == 0 ? -t.w1() : t.w1();
        return switch (type[c][side]) {
            case DIRICHLET -> w;
            case NEUMANN -> k * outward;
            default -> k * outward + h[c][side] * w;
        };
    }

    /**
     * How far a pair term's face data move the temperature per kelvin of V's error: by the maximum principle
     * |factor| on a Dirichlet face and |factor| / h on a convective one, the largest of those; a flux face adds
     * |factor| (D / k + 1 / h_far), D the depth and h_far the far face's (infinite when held), by the comparison
     * function (G / k)(D - s) + G / h_far, which is harmonic and meets or exceeds the data on every face.
     */
    private double pairDataWeight(PairTerm t) {
        int c = t.c();
        double held = 0;
        double flux = 0;
        for (int s = 0; s < 2; s++) {
            double f = Math.abs(pairFaceFactor(t, s));
            if (f == 0) {
                continue;
            }
            if (type[c][s] == DIRICHLET) {
                held = Math.max(held, f);
            } else if (type[c][s] == ROBIN) {
                held = Math.max(held, f / h[c][s]);
            } else {
                int far = 1 - s;
                flux += f * (len[c] / k + (type[c][far] == ROBIN ? 1 / h[c][far] : type[c][far] == DIRICHLET ? 0
                    : Double.POSITIVE_INFINITY));
            }
        }
        return held + flux;
    }

    /**
     * The pair terms' face-data errors in a gradient: each term's error H is harmonic with |H| <= E (its share)
     * and |dH/dx_i| <= 3 E / r, r the radius of a ball where H stays harmonic (the interior gradient estimate,
     * Gilbarg and Trudinger, Elliptic Partial Differential Equations of Second Order, eq. 2.31). H meets the
     * homogeneous condition of every face but the term's own data faces across its third axis; across a held or
     * insulated face an odd or even reflection extends it as harmonic with the same bound, so the ball need only
     * keep clear of the data faces and the convective faces (in a held cube, 0.1 from two faces and 0.5 from the
     * data faces gives r = 0.5 where the nearest face gave 0.1).
     */
    private double pairGradientError(double[] p, int o) {
        double total = 0;
        for (PairTerm t : pairs) {
            if (!carriesData(t)) {
                continue;
            }
            double r = Double.POSITIVE_INFINITY;
            for (int i = 0; i < d; i++) {
                for (int s = 0; s < 2; s++) {
                    boolean dataFace = i == t.c() && pairFaceFactor(t, s) != 0;
                    if (dataFace || type[i][s] == ROBIN) {
                        r = Math.min(r, s == 0 ? p[o + i] : len[i] - p[o + i]);
                    }
                }
            }
            total += 3 * t.error() * pairDataWeight(t) / r;
        }
        return total;
    }

    /**
     * B_f of the source's slab parts along the other axes on a face: P_i, 0, h P_i on a Dirichlet, flux,
     * convective face. A pair term's V must be certified to its share at the point; with {@code excess} not
     * null, a larger (finite) bound is allowed and what it exceeds the share by, in B_f, is added to excess[0].
     */
    private double sourcePart(int axis, int side, double[] point, double[] excess) {
        double p = 0;
        if (type[axis][side] != NEUMANN) {
            for (int i = 0; i < d; i++) {
                if (i != axis && sourceSlices[i] != null) {
                    p += sourceSlices[i].temperature(point[i]).value();
                }
            }
        }
        p *= type[axis][side] == ROBIN ? h[axis][side] : 1;
        for (PairTerm t : pairs) {
            double factor = t.c() == axis ? pairFaceFactor(t, side) : 0;
            if (factor != 0) {
                // V vanishes (in B) on the faces across its own axes; across the third w V is data
                Evaluation e = t.at(point[t.a()], point[t.b()]);
                if (excess != null && e.bound() > t.error() && Double.isFinite(e.bound())) {
                    excess[0] += Math.abs(factor) * (e.bound() - t.error());
                } else if (!(e.bound() <= t.error())) {
                    throw new OracleException(Reason.TOO_MANY_MODES, "source: its part that varies with "
                        + NAMES[t.a()] + " and " + NAMES[t.b()] + " together is not certified to " + t.error()
                        + " K at (" + point[t.a()] + ", " + point[t.b()] + ") on boundary." + SIDES[axis][side].key()
                        + " (bound " + e.bound() + " K); loosen the tolerance or smooth the source");
                }
                p += factor * e.value();
            }
        }
        return p;
    }

    // ---------------------------------------------------------------- the transient

    /** The transient's coefficients for modes 0..m[i]-1 per axis. */
    private final class Modal {
        final int[] m;
        final double[] c;
        final double error;
        final double tailCoefficient;

        Modal(int[] m) {
            this.m = m;
            double[][] g = project(point -> valueAt(initial, point) - shift, allAxes(), m, new double[d]);
            c = g[0];
            double err = g[1][0];
            double uNorm = 0;
            int count = c.length;
            // the source parts: P_j = Q_j / (k mu_j^2), times the projections of 1 on the other axes
            for (int sourceAxis = 0; sourceAxis < d; sourceAxis++) {
                if (sourceSlices[sourceAxis] == null) {
                    continue;
                }
                AxisModes a = axes[sourceAxis];
                double[][] qa = projectSource(sourceAxis, m[sourceAxis]);
                double[][] ones = new double[d][];
                for (int i = 0; i < d; i++) {
                    axes[i].ensure(m[i]);
                    ones[i] = new double[m[i]];
                    for (int j = 0; j < m[i]; j++) {
                        ones[i][j] = axes[i].integral(j) / axes[i].norm[j];
                    }
                }
                double weightMax = 0;
                int[] index = new int[d];
                for (int cIndex = 0; cIndex < count; cIndex++) {
                    unflatten(cIndex, m, index);
                    double w = 1;
                    for (int i = 0; i < d; i++) {
                        if (i != sourceAxis) {
                            w *= ones[i][index[i]];
                        }
                    }
                    double mu = a.mu[index[sourceAxis]];
                    double pj = qa[0][index[sourceAxis]] / (k * mu * mu);
                    c[cIndex] -= pj * w;
                    weightMax = Math.max(weightMax, Math.abs(w) / (k * mu * mu));
                }
                err += qa[1][0] * weightMax;
                uNorm += qa[1][1];
            }
            for (PairTerm term : pairs) {
                // V_ij = T_ij / (k (mu_i^2 + nu_j^2)) exactly, times the projections of 1 on the third axis;
                // ||V|| <= ||T|| / (k lambda_min) on the rectangle, times sqrt(L_c)
                int a = term.a();
                int b = term.b();
                int cc = term.c();
                Expression ts = term.source();
                double[] args = new double[2];
                double[][] gt = project(point -> {
                    args[0] = point[a];
                    args[1] = point[b];
                    return ts.value(args);
                }, new int[] {a, b}, new int[] {m[a], m[b]}, new double[d]);
                for (int i = 0; i < d; i++) {
                    axes[i].ensure(m[i]);
                }
                double[] ones = new double[m[cc]];
                for (int j = 0; j < m[cc]; j++) {
                    ones[j] = (term.w0() * axes[cc].integral(j) + term.w1() * axes[cc].firstMoment(j)) / axes[cc].norm[j];
                }
                double weightMax = 0;
                int[] index = new int[d];
                for (int cIndex = 0; cIndex < count; cIndex++) {
                    unflatten(cIndex, m, index);
                    double mu = axes[a].mu[index[a]];
                    double nu = axes[b].mu[index[b]];
                    double w = ones[index[cc]] / (k * (mu * mu + nu * nu));
                    c[cIndex] -= gt[0][index[a] * m[b] + index[b]] * w;
                    weightMax = Math.max(weightMax, Math.abs(w));
                }
                err += gt[1][0] * weightMax;
                double lambdaMin = axes[a].mu[0] * axes[a].mu[0] + axes[b].mu[0] * axes[b].mu[0];
                double lc = len[cc];
                double wNorm = Math.sqrt(lc * (term.w0() * term.w0() + term.w0() * term.w1() * lc
                    + term.w1() * term.w1() * lc * lc / 3));
                uNorm += 1.01 * gt[1][1] * wNorm / (k * lambdaMin);
            }
            for (Blend b : blends) {
                // psi_j beta_n: psi's projection on the modes of its axis, beta_n = G_n / (k nu_n^2) exactly
                int ax = b.axis();
                int al = b.along();
                double[][] gb = project(point -> b.source().value(point[al]), new int[] {al}, new int[] {m[al]},
                    new double[d]);
                axes[ax].ensure(m[ax]);
                axes[al].ensure(m[al]);
                double[] psi = new double[m[ax]];
                for (int j = 0; j < m[ax]; j++) {
                    psi[j] = (b.c0() * axes[ax].integral(j) + b.c1() * axes[ax].firstMoment(j)) / axes[ax].norm[j];
                }
                double weightMax = 0;
                int[] index = new int[d];
                for (int cIndex = 0; cIndex < count; cIndex++) {
                    unflatten(cIndex, m, index);
                    double nu = axes[al].mu[index[al]];
                    if (nu == 0) {
                        continue; // the zero-mean rest of an insulated pair's G (its mean went to a slab)
                    }
                    double w = psi[index[ax]] / (k * nu * nu);
                    c[cIndex] -= gb[0][index[al]] * w;
                    weightMax = Math.max(weightMax, Math.abs(w));
                }
                err += gb[1][0] * weightMax;
                if (b.slice() != null) {
                    double[][] r = GaussLegendre.onInterval(64, len[al]);
                    double beta = 0;
                    for (int i = 0; i < 64; i++) {
                        Evaluation e = b.slice().temperature(r[0][i]);
                        double v = Math.abs(e.value()) + e.bound();
                        beta += r[1][i] * v * v;
                    }
                    double l = len[ax];
                    double psiNorm = Math.sqrt(l * (b.c0() * b.c0() + b.c0() * b.c1() * l + b.c1() * b.c1() * l * l / 3));
                    uNorm += 1.01 * psiNorm * Math.sqrt(beta);
                }
                // the correction on its side: coef_q (y_q, X_p) / ||X_p||^2 on the modes X_p(x_axis) Y_q(x_along)
                BlendCorrection bc = b.correction();
                if (bc == null) {
                    continue;
                }
                double profileMax = 0;
                for (int cIndex = 0; cIndex < count; cIndex++) {
                    unflatten(cIndex, m, index);
                    if (index[al] >= bc.modes()) {
                        throw new IllegalStateException("the transient's box exceeds the blend correction's modes");
                    }
                    double unit = bc.profileProjection(index[al], axes[ax], index[ax], b.side());
                    c[cIndex] -= bc.coefficient(index[al]) * unit;
                    profileMax = Math.max(profileMax, Math.abs(unit));
                }
                err += bc.coefficientError() * profileMax;
                uNorm += bc.norm;
            }
            if (remainder != null) {
                // W_J = Q_r,J / (k lambda_J), and ||W|| <= ||Q_r|| / (k lambda_min)
                SourceRemainder.Sampler sampler = remainder.sampler();
                double[][] qr = project(point -> sampler.value(point[0], point[1]), allAxes(), m, new double[d]);
                double weightMax = 0;
                int[] index = new int[d];
                for (int cIndex = 0; cIndex < count; cIndex++) {
                    unflatten(cIndex, m, index);
                    double lambda = eigenvalue(index);
                    c[cIndex] -= qr[0][cIndex] / (k * lambda);
                    weightMax = Math.max(weightMax, 1 / (k * lambda));
                }
                err += qr[1][0] * weightMax;
                double lambdaMin = axes[0].mu[0] * axes[0].mu[0] + axes[1].mu[0] * axes[1].mu[0];
                uNorm += 1.01 * qr[1][1] / (k * lambdaMin);
            }
            for (ProductSource ps : productParts) {
                // W_J = a_i b_j c_k / (k lambda_J) exactly, and ||W|| <= ||F_r|| ||G_r|| ||H_r|| / (k lambda_min)
                int most = Math.max(m[0], Math.max(m[1], m[2]));
                ps.ensure(Math.max(most, ps.computed()));
                double[] sizes = new double[3];
                double coefficientError = 0;
                for (int i = 0; i < 3; i++) {
                    for (int j = 0; j < m[i]; j++) {
                        sizes[i] = Math.max(sizes[i], Math.abs(ps.coefficient(i, j)) + ps.projectionError(i));
                    }
                }
                for (int i = 0; i < 3; i++) {
                    coefficientError += ps.projectionError(i) * sizes[(i + 1) % 3] * sizes[(i + 2) % 3];
                }
                double weightMax = 0;
                int[] index = new int[d];
                for (int cIndex = 0; cIndex < count; cIndex++) {
                    unflatten(cIndex, m, index);
                    double lambda = eigenvalue(index);
                    c[cIndex] -= ps.coefficient(0, index[0]) * ps.coefficient(1, index[1])
                        * ps.coefficient(2, index[2]) / (k * lambda);
                    weightMax = Math.max(weightMax, 1 / (k * lambda));
                }
                err += coefficientError * weightMax;
                double lambdaMin = 0;
                for (int i = 0; i < 3; i++) {
                    lambdaMin += axes[i].mu[0] * axes[i].mu[0];
                }
                uNorm += 1.01 * ps.restNorm(0) * ps.restNorm(1) * ps.restNorm(2) / (k * lambdaMin);
            }
            for (Face f : faces) {
                double weightMax = 0;
                int[] index = new int[d];
                int[] tangentialSize = new int[f.tangential.length];
                for (int i = 0; i < tangentialSize.length; i++) {
                    tangentialSize[i] = m[f.tangential[i]];
                }
                Face.Table tb = f.table(tangentialSize);
                for (int cIndex = 0; cIndex < count; cIndex++) {
                    unflatten(cIndex, m, index);
                    int faceIndex = tb.index(index[f.tangential[0]], f.tangential.length == 1 ? 0 : index[f.tangential[1]]);
                    double w = faceWeight(f, tb, faceIndex, index[f.axis]);
                    c[cIndex] -= tb.coef[faceIndex] * w;
                    weightMax = Math.max(weightMax, Math.abs(w));
                }
                err += tb.error * weightMax;
                uNorm += tb.norm * tb.profileNorm;
            }
            // the least eigenvalue the lags' modes have (the constant mode of a body with flux faces only excluded)
            double lowest = 0;
            double firstUp = Double.POSITIVE_INFINITY;
            for (int i = 0; i < d; i++) {
                axes[i].ensure(Math.max(2, m[i]));
                lowest += axes[i].mu[0] * axes[i].mu[0];
                firstUp = Math.min(firstUp, axes[i].mu[1] * axes[i].mu[1]);
            }
            if (lowest == 0) {
                lowest = firstUp;
            }
            for (Moving mv : moving) {
                // - theta'(0) Pi_1 / alpha - theta''(0) Pi_2 / alpha^2 for each side's term, with Pi_1 = -H_J /
                // lambda_J and Pi_2 = H_J / lambda_J^2 exactly
                double rate = mv.schedule().initialSlope;
                double bend = mv.schedule().initialCurvature;
                if (rate == 0 && bend == 0) {
                    continue;
                }
                Face f = mv.shape();
                Face.Table tb = f.table(tangentialSizes(f, m));
                int[] index = new int[d];
                double weightMax = 0;
                for (int cIndex = 0; cIndex < count; cIndex++) {
                    unflatten(cIndex, m, index);
                    int faceIndex = f.tableIndex(tb, index);
                    double lambda = eigenvalue(index);
                    if (lambda == 0) {
                        continue; // the constant mode: the lags have mean zero
                    }
                    double big = alpha * lambda;
                    double w = faceWeight(f, tb, faceIndex, index[f.axis]) * (rate / big - bend / (big * big));
                    c[cIndex] += tb.coef[faceIndex] * w;
                    weightMax = Math.max(weightMax, Math.abs(w));
                }
                err += tb.error * weightMax;
                double low = alpha * lowest;
                uNorm += (Math.abs(rate) / low + Math.abs(bend) / (low * low)) * tb.norm * tb.profileNorm;
            }
            if (level != null && level.initialRate != 0) {
                // + b'(0) P: P_J = 1_J / lambda_J exactly, and ||P|| <= ||1|| / lambda_min
                double lambdaMin = 0;
                double volume = 1;
                for (int i = 0; i < d; i++) {
                    axes[i].ensure(m[i]);
                    lambdaMin += axes[i].mu[0] * axes[i].mu[0];
                    volume *= len[i];
                }
                lambdaMin *= alpha;
                int[] index = new int[d];
                for (int cIndex = 0; cIndex < count; cIndex++) {
                    unflatten(cIndex, m, index);
                    double one = 1;
                    double lambda = 0;
                    for (int i = 0; i < d; i++) {
                        one *= level.one(i, index[i]);
                        lambda += axes[i].mu[index[i]] * axes[i].mu[index[i]];
                    }
                    if (one != 0) {
                        c[cIndex] += level.initialRate * one / (alpha * lambda);
                    }
                }
                uNorm += Math.abs(level.initialRate) * Math.sqrt(volume) / lambdaMin;
            }
            error = err;
            double normLower = 1;
            for (int i = 0; i < d; i++) {
                normLower *= axes[i].normLowerBound(m[i]);
            }
            tailCoefficient = (g[1][1] + uNorm) / Math.sqrt(normLower);
        }
    }

    /**
     * a_m (y_m, Z_p) / ||Z_p||^2: face f's mode (table entry faceIndex, unit coefficient) projected on
     * mode p of the normal axis, exactly by Green's identity (both satisfy the far face's condition).
     */
    private double faceWeight(Face f, Face.Table tb, int faceIndex, int p) {
        AxisModes normal = axes[f.axis];
        double nu = normal.mu[p];
        double[] z = normal.atEnd(p, f.side);
        double z0 = z[0];
        double dz0 = z[1];
        double kap = tb.kappa[faceIndex];
        double y0;
        double dy0;
        if (kap == 0) {
            y0 = 1;
            dy0 = tb.quadratic[faceIndex] ? -2 / f.depth : tb.beta[faceIndex];
        } else {
            double e = tb.rho[faceIndex] * Math.exp(-2 * kap * f.depth);
            y0 = 1 + e;
            dy0 = kap * (-1 + e);
        }
        double denominator = kap * kap + nu * nu;
        // both constant: the quadratic profile's integral D/3 against the normal axis' constant mode (every face
        // insulated or flux-driven; Green's identity also holds for nu > 0, as y'' is constant and Z' vanishes)
        double inner = denominator == 0 ? f.depth / 3 : (y0 * dz0 - dy0 * z0) / denominator;
        return tb.amplitude[faceIndex] * inner / normal.norm[p];
    }

    // ---------------------------------------------------------------- sides whose data change in time

    /**
     * The particular part of the side terms in box m at time t. With u = S + sum_k [theta H + theta' Pi_1 /
     * alpha + theta'' Pi_2 / alpha^2] + v (Laplace Pi_1 = H, Laplace Pi_2 = Pi_1, homogeneous conditions),
     * v_t - alpha Laplace v = -theta''' Pi_2 / alpha^2, and Pi_2's modes are H_J / lambda_J^2 exactly, so mode J
     * gains -(H_J / Lambda_J^2) I_J(t), H_J = G_m a_m (y_m, Z_n) / ||Z_n||^2, Lambda_J = alpha lambda_J,
     * I_J = int_0^t exp(-Lambda_J (t - s)) theta'''(s) ds. Returns a bound of the quadrature's share.
     */
    private double addScheduled(double t, int[] m, double[] into) {
        double quadrature = 0;
        int[] index = new int[d];
        for (Moving mv : moving) {
            SideSchedule schedule = mv.schedule();
            if (schedule.thirdMax == 0) {
                continue;
            }
            Face f = mv.shape();
            Face.Table tb = f.table(tangentialSizes(f, m));
            ScheduleIntegral.At integrals = schedule.integrals(t);
            double weightSum = 0;
            double lowest = Double.POSITIVE_INFINITY;
            for (int c = 0; c < into.length; c++) {
                unflatten(c, m, index);
                int faceIndex = f.tableIndex(tb, index);
                double coef = tb.coef[faceIndex];
                if (coef == 0) {
                    continue;
                }
                double lambda = eigenvalue(index);
                if (lambda == 0) {
                    continue; // the constant mode: Pi_2 has mean zero
                }
                lambda *= alpha;
                double hj = coef * faceWeight(f, tb, faceIndex, index[f.axis]);
                into[c] -= hj / (lambda * lambda) * integrals.value(lambda);
                weightSum += Math.abs(hj) / (lambda * lambda * lambda);
                lowest = Math.min(lowest, lambda);
            }
            quadrature += integrals.relativeError(lowest, schedule.thirdMax) * schedule.thirdMax * weightSum;
        }
        return quadrature;
    }

    /**
     * The power series in s of q with q'' = p - mean(p) on [0, D], q'(0) = 0 (so q'(D) = 0 too) and mean(q) =
     * 0: the lag of a flux face's constant mode when every face is a flux face, exact.
     */
    static double[] zeroMeanLag(double[] p, double depth) {
        double mean = 0;
        for (int i = 0; i < p.length; i++) {
            mean += p[i] * Math.pow(depth, i) / (i + 1);
        }
        double[] q = new double[p.length + 2];
        double qMean = 0;
        for (int i = 0; i < p.length; i++) {
            double r = i == 0 ? p[0] - mean : p[i];
            q[i + 2] = r / ((i + 1) * (i + 2));
            qMean += q[i + 2] * Math.pow(depth, i + 2) / (i + 3);
        }
        q[0] = -qMean;
        return q;
    }

    /** The sizes of box m along face f's tangential axes. */
    private static int[] tangentialSizes(Face f, int[] m) {
        int[] size = new int[f.tangential.length];
        for (int i = 0; i < size.length; i++) {
            size[i] = m[f.tangential[i]];
        }
        return size;
    }

    /** int_0^inf (1 + u^2)^(-p/2) du for p = 3 .. 8. */
    private static double halfLine(int p) {
        return switch (p) {
            case 3 -> 1;
            case 4 -> Math.PI / 4;
            case 5 -> 2.0 / 3;
            case 6 -> 3 * Math.PI / 16;
            case 7 -> 8.0 / 15;
            default -> 5 * Math.PI / 32;
        };
    }

    /** sum_{n >= from} (kappa^2 + (n q)^2)^(-p/2), from >= 1, p = 4 .. 8: first term plus the integral beyond. */
    private static double normalSum(double kappa, int from, double q, int p) {
        double x = from * q;
        double first = Math.pow(kappa * kappa + x * x, -p / 2.0);
        double integral = Math.pow(x, 1 - p) / ((p - 1) * q);
        if (kappa > 0) {
            integral = Math.min(integral, halfLine(p) * Math.pow(kappa, 1 - p) / q);
        }
        return first + integral;
    }

    /** sum over all n >= 0 of (kappa^2 + (n q)^2)^(-p/2), kappa > 0. */
    private static double wholeNormalSum(double kappa, double q, int p) {
        return Math.pow(kappa, -p) + halfLine(p) * Math.pow(kappa, 1 - p) / q;
    }

    /**
     * int_M^inf of (x qb)^-p + c_p (x qb)^(1-p) / qa dx (the whole normal sum at kappa = x qb), times x^-extra
     * (extra = 1 with the integration-by-parts bound of the coefficients).
     */
    private static double wholeNormalIntegral(int bigM, double qb, double qa, int p, int extra) {
        int e1 = p + extra;
        int e2 = p - 1 + extra;
        return Math.pow(qb, -p) * Math.pow(bigM, 1 - e1) / (e1 - 1)
            + halfLine(p) * Math.pow(qb, 1 - p) * Math.pow(bigM, 1 - e2) / ((e2 - 1) * qa);
    }

    /**
     * The particular part's truncation outside box m for one side term: {value, each gradient component}.
     * A mode's weight is |G a| (2 nu + 2 kappa + |beta|) / (||Z||^2 lambda) (|y(0)| <= 2, |y'(0)| <= 2
     * kappa, |Z| <= 1, |Z'| <= nu), |I| <= C / Lambda with C the schedule's local bound of theta'''
     * ({@link SideSchedule#localThird}) at the slowest mode outside m, so a term is at most
     * C |G a| / (alpha^3 ||Z||^2) (2 sqrt2 lambda^(-7/2) + |beta| lambda^-4), and its gradient (the sum of
     * the mu's and nu, at most sqrt(d) lambda^(1/2)) times that, at most g lambda^-3 + sqrt(d) |beta|
     * lambda^(-7/2), g = 4 (rectangle) or 2 sqrt6 (box). Tangential modes inside the box are summed over
     * n >= N by {@link #normalSum}, those outside it up to S per axis (S >= 512 in a rectangle, 256 in a box;
     * the shape's coefficients known with their projection error) over every n; beyond S, |G| <= ||G|| /
     * ||X|| (and V / mu in a rectangle) and |a| <= (1, 1/(k kappa), 1/(k kappa + h))/(1 - exp(-2 kappa D))
     * (Dirichlet, flux, convective side), the sums over the tangential indices by their first term and the
     * integral beyond.
     */
    private double[] scheduleTruncation(Moving mv, int[] m, double t) {
        Face f = mv.shape();
        int a = f.axis;
        int nt = f.tangential.length;
        int bigN = m[a];
        double qa = Math.PI / len[a];
        double edge = Math.pow(bigN * qa, 2);
        int[] known = new int[nt];
        double[] q = new double[nt];
        for (int i = 0; i < nt; i++) {
            int b = f.tangential[i];
            q[i] = Math.PI / len[b];
            edge = Math.min(edge, Math.pow(m[b] * q[i], 2));
            known[i] = Math.min(f.cap[i], Math.max(nt == 1 ? 512 : 256, 2 * m[b]));
        }
        double third = mv.schedule().localThird(t, alpha * edge);
        Face.Table tb = f.boundsTable(known);
        for (int i = 0; i < nt; i++) {
            known[i] = Math.min(known[i], tb.size[i]);
        }
        double normA = axes[a].normLowerBound(Math.min(axes[a].mu.length, 4096));
        double root2 = Math.sqrt(2);
        double gradientWeight = nt == 1 ? 4 : 2 * Math.sqrt(6);
        double rootD = Math.sqrt(d);
        double value = 0;
        double gradient = 0;
        int count = nt == 1 ? known[0] : known[0] * known[1];
        for (int c = 0; c < count; c++) {
            int j0 = nt == 1 ? c : c / known[1];
            int j1 = nt == 1 ? 0 : c % known[1];
            int index = tb.index(j0, j1);
            double w = (Math.abs(tb.coef[index]) + tb.error) * Math.abs(tb.amplitude[index]);
            double kap = tb.kappa[index];
            boolean inside = j0 < m[f.tangential[0]] && (nt == 1 || j1 < m[f.tangential[1]]);
            if (inside) {
                double beta = kap > 0 ? 0 : tb.quadratic[index] ? 2 / f.depth : Math.abs(tb.beta[index]);
                value += w * (2 * root2 * normalSum(kap, bigN, qa, 7) + beta * normalSum(kap, bigN, qa, 8));
                gradient += w * (gradientWeight * normalSum(kap, bigN, qa, 6) + rootD * beta * normalSum(kap, bigN, qa, 7));
            } else {
                value += w * 2 * root2 * wholeNormalSum(kap, qa, 7);
                gradient += w * gradientWeight * wholeNormalSum(kap, qa, 6);
            }
        }
        double gCs = tb.norm / Math.sqrt(tb.normLower);
        if (nt == 1) {
            // m >= S: kappa >= S qb
            int bigM = known[0];
            double qb = q[0];
            double kM = bigM * qb;
            double aBound = amplitudeBound(f, kM);
            double smooth = Double.isFinite(f.variation) ? f.variation / (qb * tb.normLower) : Double.POSITIVE_INFINITY;
            double first = Math.min(gCs, smooth / bigM) * aBound;
            value += first * 2 * root2 * wholeNormalSum(kM, qa, 7);
            gradient += first * gradientWeight * wholeNormalSum(kM, qa, 6);
            value += aBound * 2 * root2 * Math.min(gCs * wholeNormalIntegral(bigM, qb, qa, 7, 0),
                smooth * wholeNormalIntegral(bigM, qb, qa, 7, 1));
            gradient += aBound * gradientWeight * Math.min(gCs * wholeNormalIntegral(bigM, qb, qa, 6, 0),
                smooth * wholeNormalIntegral(bigM, qb, qa, 6, 1));
        } else {
            // j_i >= S_i (every other index): kappa >= j_i q_i; the sum over the other index and n of
            // lambda^(-p/2) is at most W_p(k1) = k1^-p + c_p k1^(1-p)/q_o + (c_p/qa)(k1^(1-p) + c_(p-1) k1^(2-p)/q_o)
            for (int i = 0; i < 2; i++) {
                double qi = q[i];
                double qo = q[1 - i];
                double aBound = amplitudeBound(f, known[i] * qi);
                value += gCs * aBound * 2 * root2 * planeTail(known[i], qi, qo, qa, 7);
                gradient += gCs * aBound * gradientWeight * planeTail(known[i], qi, qo, qa, 6);
            }
        }
        double factor = third / (alpha * alpha * alpha * normA);
        return new double[] {factor * value, factor * gradient};
    }

    /** (1, 1/(k kappa), 1/(k kappa + h)) / (1 - exp(-2 kappa D)) for a Dirichlet, flux or convective side. */
    private double amplitudeBound(Face f, double kappa) {
        double base = switch (type[f.axis][f.side]) {
            case DIRICHLET -> 1;
            case NEUMANN -> 1 / (k * kappa);
            default -> 1 / (k * kappa + h[f.axis][f.side]);
        };
        return base / -Math.expm1(-2 * kappa * f.depth);
    }

    /**
     * sum over j >= from, every other tangential index and every n of (kappa^2 + nu^2)^(-p/2), kappa^2 >=
     * (j qi)^2 + (l qo)^2: by the whole sums over n and then l, each a first term plus an integral, and
     * sum_{j >= from} (j qi)^-r <= qi^-r (from^-r + from^(1-r)/(r - 1)).
     */
    private static double planeTail(int from, double qi, double qo, double qa, int p) {
        double cp = halfLine(p);
        double cq = halfLine(p - 1);
        // W_p(k1) = k1^-p + (c_p/qo + c_p/qa) k1^(1-p) + (c_p c_(p-1)/(qa qo)) k1^(2-p)
        return powerTail(from, qi, p) + (cp / qo + cp / qa) * powerTail(from, qi, p - 1)
            + cp * cq / (qa * qo) * powerTail(from, qi, p - 2);
    }

    private static double powerTail(int from, double q, int r) {
        return Math.pow(q, -r) * (Math.pow(from, -r) + Math.pow(from, 1 - r) / (r - 1));
    }

    /**
     * The least box (per axis, at most the transient's cap) whose side terms' truncation is within
     * {@code target} in value and {@code gradientTarget} in each gradient component at time t.
     */
    private int[] scheduleBox(double t, double target, double gradientTarget) {
        int[] m = new int[d];
        java.util.Arrays.fill(m, 16);
        while (true) {
            for (int i = 0; i < d; i++) {
                axes[i].ensure(m[i] + 1);
            }
            boolean grewN = false;
            boolean grewM = false;
            for (Moving mv : moving) {
                Face f = mv.shape();
                double[] whole = scheduleTruncation(mv, m, t);
                if (whole[0] * moving.size() <= target && whole[1] * moving.size() <= gradientTarget) {
                    continue;
                }
                // which direction to grow: the share left by the normal axis (n >= N) against the rest
                int[] wider = m.clone();
                wider[f.axis] = 2 * m[f.axis];
                axes[f.axis].ensure(wider[f.axis] + 1);
                double[] normalGrown = scheduleTruncation(mv, wider, t);
                double normalShare = Math.max((whole[0] - normalGrown[0]) / target,
                    (whole[1] - normalGrown[1]) / gradientTarget);
                double restShare = Math.max(normalGrown[0] / target, normalGrown[1] / gradientTarget);
                if (normalShare >= restShare) {
                    grewN = true;
                    m[f.axis] += Math.max(4, m[f.axis] / 4);
                } else {
                    grewM = true;
                    for (int b : f.tangential) {
                        m[b] += Math.max(4, m[b] / 4);
                    }
                }
                break;
            }
            if (!grewN && !grewM) {
                return m;
            }
            for (int i = 0; i < d; i++) {
                if (m[i] > transientCap) {
                    Moving first = moving.get(0);
                    throw new OracleException(Reason.TOO_MANY_MODES, "oracle: at t = " + t + " s the change in time of"
                        + " the side data (boundary." + SIDES[first.schedule().axis][first.schedule().side].key()
                        + " and the other changing sides) needs more than " + transientCap + " modes along " + NAMES[i]
                        + " to reach the tolerance; loosen the tolerance or smooth the schedule");
                }
            }
        }
    }

    private int[] allAxes() {
        int[] a = new int[d];
        for (int i = 0; i < d; i++) {
            a[i] = i;
        }
        return a;
    }

    /** Index c of a row-major box of sizes m (last axis fastest) as its per-axis indices. */
    static void unflatten(int c, int[] m, int[] index) {
        for (int i = m.length - 1; i >= 0; i--) {
            index[i] = c % m[i];
            c /= m[i];
        }
    }

    /** Q_j/(rho c ... ) projections of the source along its axis: {coefficients, {error, ||P|| in the body}}. */
    private double[][] projectSource(int a, int m) {
        Expression q = sourceParts[a];
        SlabSolver.Slice sourceSlice = sourceSlices[a];
        double[][] p = project(point -> q.value(point[a], 0), new int[] {a}, new int[] {m}, new double[d]);
        // ||P|| over the body: the slab values on a Gauss rule, times the other edges' lengths
        double[][] r = GaussLegendre.onInterval(64, len[a]);
        double sum = 0;
        for (int i = 0; i < 64; i++) {
            Evaluation e = sourceSlice.temperature(r[0][i]);
            double v = Math.abs(e.value()) + e.bound();
            sum += r[1][i] * v * v;
        }
        double others = 1;
        for (int i = 0; i < d; i++) {
            if (i != a) {
                others *= len[i];
            }
        }
        return new double[][] {p[0], {p[1][0], 1.01 * Math.sqrt(sum * others)}};
    }

    private synchronized Modal modal(int[] needed) {
        Modal current = modal;
        if (current != null) {
            boolean enough = true;
            for (int i = 0; i < d; i++) {
                enough &= current.m[i] >= needed[i];
            }
            if (enough) {
                return current;
            }
        }
        int[] m = new int[d];
        for (int i = 0; i < d; i++) {
            int have = current == null ? 0 : current.m[i];
            m[i] = Math.min(transientCap, Math.max(needed[i], Math.max(8, have * 3 / 2)));
        }
        modal = new Modal(m);
        return modal;
    }

    @Override
    public Steady steadyPart() {
        // cheap without face series, lags, schedules, a source's blend, remainder or pair terms: not worth sharing
        if (faces.isEmpty() && lagFaces == 0 && lagSeries == null && moving.isEmpty() && sourceTerms.isEmpty()
            && blends.isEmpty() && remainder == null && pairs.isEmpty() && productParts.isEmpty()) {
            return null;
        }
        return (p, o) -> {
            int base = hasLag() ? 2 : 1;
            int first = base + 3 * moving.size();
            Evaluation[] parts = new Evaluation[first + sourceTerms.size()];
            for (int k = 0; k < sourceTerms.size(); k++) {
                parts[first + k] = sourceResponse(k, p, o);
            }
            parts[0] = steadyTemperature(p, o);
            if (hasLag()) {
                parts[1] = lagAt(p, o);
            }
            for (int k = 0; k < moving.size(); k++) {
                for (int order = 0; order < 3; order++) {
                    parts[base + 3 * k + order] = sidePart(k, order, p, o, null, null);
                }
            }
            return parts;
        };
    }

    /**
     * Part {@code order} of side term k at a point, or its cell mean up to hi, or with its gradient: 0, the
     * shape series H_k (harmonic, B = phi on its side; less its mean when every face is a flux face); 1 and
     * 2, its lags (Laplace Pi_1 = H_k, Laplace Pi_2 = Pi_1, homogeneous conditions) by the resonant profiles.
     * Each within tolerance * scale / 16 per term once multiplied by the largest theta, theta' / alpha or
     * theta'' / alpha^2; zero when that factor is.
     */
    private Evaluation sidePart(int k, int order, double[] p, int o, double[] hi, double[] grad) {
        Moving mv = moving.get(k);
        SideSchedule schedule = mv.schedule();
        double size = order == 0 ? schedule.thetaMax
            : order == 1 ? schedule.slopeMax / alpha : schedule.curvatureMax / (alpha * alpha);
        if (size == 0) {
            return new Evaluation(0, 0);
        }
        double[] bounds = new double[2];
        double budget = tolerance * scale / (16 * moving.size() * size);
        double mean = order == 0 ? mv.mean() : 0;
        double value = mv.shape().add(p, o, hi, budget, grad, bounds, order) - mean;
        return new Evaluation(value, grad == null ? bounds[0] + 2 * EPS * Math.abs(mean) : bounds[1]);
    }

    /** V_k at a point: the steady response to the shape of source term k, within its share of the budget. */
    private Evaluation sourceResponse(int k, double[] p, int o) {
        try {
            return sourceTerms.get(k).steady.temperature(p, o);
        } catch (OracleException e) {
            throw sourceRefused(p, o, "u", e);
        }
    }

    /** The gradient of V_k into {@code out}; returns its bound. */
    private double sourceResponseGradient(int k, double[] p, int o, double[] out) {
        try {
            return sourceTerms.get(k).steady.gradient(p, o, out, 0);
        } catch (OracleException e) {
            throw sourceRefused(p, o, "grad u", e);
        }
    }

    private OracleException sourceRefused(double[] p, int o, String what, OracleException cause) {
        if (cause.reason() != Reason.TOO_MANY_MODES && cause.reason() != Reason.NOT_CERTIFIED) {
            return cause;
        }
        double[] point = java.util.Arrays.copyOfRange(p, o, o + d);
        return new OracleException(cause.reason(), "oracle: " + what + " at " + java.util.Arrays.toString(point)
            + " needs the steady response to the shape of the source's change in time, which is not certified"
            + " there at the share of the tolerance it has; loosen the tolerance or smooth the source ("
            + cause.getMessage() + ")");
    }

    /** The box that holds every source term's truncation within {@code target} (values, or each gradient component). */
    private int[] sourceBox(double t, double target, boolean gradients) {
        int[] m = new int[d];
        for (SourceSchedule term : sourceTerms) {
            int[] b = term.box(t, target / sourceTerms.size(), gradients, transientCap);
            for (int i = 0; i < d; i++) {
                m[i] = Math.max(m[i], b[i]);
                axes[i].ensure(m[i] + 1);
            }
        }
        return m;
    }

    /** Whether u carries the lag term -r(t) P (a level or uniform source that moves). */
    private boolean hasLag() {
        return lag != null || lagSeries != null;
    }

    /**
     * P at a point, within tolerance * scale / (8 max|b'|): in a rectangle by {@link LagSeries}, certified up
     * to the sides; in a box by its own solver, refused where that solver's face series cannot reach.
     */
    private Evaluation lagAt(double[] p, int o) {
        if (lagSeries != null) {
            double[] bounds = new double[2];
            double value = lagSeries.evaluate(p, o, tolerance * scale / (8 * level.rateMax), null, bounds);
            return new Evaluation(value, bounds[0]);
        }
        try {
            return lag.temperature(p, o);
        } catch (OracleException e) {
            if (e.reason() != Reason.TOO_MANY_MODES && e.reason() != Reason.NOT_CERTIFIED) {
                throw e;
            }
            throw lagRefused(p, o, "u", e);
        }
    }

    /** The gradient of P into {@code out}; returns its bound. */
    private double lagGradient(double[] p, int o, double[] out) {
        if (lagSeries != null) {
            double[] bounds = new double[2];
            lagSeries.evaluate(p, o, tolerance * scale / (8 * level.rateMax), out, bounds);
            return bounds[1];
        }
        try {
            return lag.gradient(p, o, out, 0);
        } catch (OracleException e) {
            if (e.reason() != Reason.TOO_MANY_MODES && e.reason() != Reason.NOT_CERTIFIED) {
                throw e;
            }
            throw lagRefused(p, o, "grad u", e);
        }
    }

    private OracleException lagRefused(double[] p, int o, String what, OracleException cause) {
        double[] point = java.util.Arrays.copyOfRange(p, o, o + d);
        return new OracleException(cause.reason(), "oracle: " + what + " at " + java.util.Arrays.toString(point)
            + " needs the lag behind the moving level (P, with -alpha Laplace P = 1), whose series cannot reach a"
            + " point this near a convective or flux " + (d == 3 ? "face of a box" : "side") + " in this"
            + " version; move the point inside, or hold the level constant (" + cause.getMessage() + ")");
    }

    /**
     * The shift, the source's slab parts and the face series at a point, with their bounds: what
     * every time shares (with P, when the level moves). A point on a Dirichlet face is answered by the
     * slices from the data.
     */
    private Evaluation steadyTemperature(double[] p, int o) {
        checkPoint(p, o);
        double value = shift;
        double bound = timeVariation + 2 * EPS * Math.abs(shift);
        double[] bounds = new double[2];
        for (int i = 0; i < d; i++) {
            if (sourceSlices[i] != null) {
                Evaluation e = sourceSlices[i].temperature(p[o + i]);
                value += e.value();
                bound += e.bound();
            }
        }
        for (PairTerm t : pairs) {
            Evaluation e = t.at(p[o + t.a()], p[o + t.b()]);
            double w = t.w(p[o + t.c()]);
            value += w * e.value();
            bound += Math.abs(w) * e.bound() + (t.w1() == 0 ? 0 : 2 * EPS * Math.abs(w * e.value()));
        }
        bound += pairDataError;
        double blendBudget = tolerance * scale / (16 * Math.max(1, blends.size()));
        for (Blend b : blends) {
            if (b.slice() != null) {
                Evaluation e = b.slice().temperature(p[o + b.along()]);
                double psi = b.psi(p[o + b.axis()]);
                value += psi * e.value();
                bound += Math.abs(psi) * e.bound() + 2 * EPS * Math.abs(psi * e.value());
            }
            if (b.correction() != null) {
                double s = b.side() == 0 ? p[o + b.axis()] : len[b.axis()] - p[o + b.axis()];
                double[] c = b.correction().add(p[o + b.along()], s, Double.NaN, Double.NaN, blendBudget, 0, null);
                value += c[0];
                bound += c[1];
            }
        }
        for (RemainderSeries r : withProducts(remainderValues)) {
            if (r != null) {
                double[] vb = sumModes(p, o, null, null, r.m(), r.weights());
                value += vb[0];
                bound += vb[1] + r.bound();
            }
        }
        double faceBudget = tolerance * scale / (4 * faces.size());
        value += addFaces(p, o, null, faceBudget, null, bounds);
        bound += bounds[0];
        return new Evaluation(value, bound);
    }

    // ---------------------------------------------------------------- slices

    @Override
    public Slice at(double t) {
        if (steady) {
            return new TensorSlice(Double.POSITIVE_INFINITY);
        }
        if (!(t >= 0 && t <= horizon * (1 + 1e-12))) {
            throw new OracleException(Reason.OUTSIDE_TIME_RANGE, "oracle: t = " + t + " s is outside [0, " + horizon
                + "] s, the range the oracle was prepared for");
        }
        return new TensorSlice(t);
    }

    /** A wider box of modal coefficients for gradients, with the bound of what it leaves out. */
    /**
     * A rectangle side's series in lifted form, for points on or next to that side where the series itself
     * converges too slowly: its data G (B-form, less the source part) need not meet the conditions of the side's
     * two ends, so its coefficients fall off like 1/mu^2 only. With l(y) a line that meets the ends' conditions
     * as G does (B_e l = B_e G at both ends e) and phi(x) the line across the body with B_f phi = 1 on this side
     * and B phi = 0 on the far one, U_f = H + L + sum_e U_e:
     * <ul>
     * <li>H, the side's series of G - l, which meets its ends' conditions: a {@link BlendCorrection} of source
     * -k G'' (its coefficients (G - l)_n = g_n / (k nu_n^2) by Green's identity), certified on the side itself;</li>
     * <li>L = phi(x) l(y), bilinear and so harmonic, with B_f L = l, 0 on the far side and phi(x) B_e l on each
     * end side;</li>
     * <li>U_e, the end sides' series of -B_e L, which converge exponentially away from those sides.</li>
     * </ul>
     * Each part meets the others' conditions, so the sum is U_f exactly; the disagreement of the data moves into
     * the corners, and only points near a side and an end side both are refused. Between two insulated or
     * flux-driven ends no line meets both slopes: l is then the quadratic c + a y + b y^2 with the mean of G
     * (the series has no constant mode there), and L = phi(x) l(y) - 2 b psi(x) with psi'' = phi and B psi = 0
     * on both sides across, harmonic again. Between two flux sides across no line phi meets both: phi is then
     * (x - x_far)^2 / (2 k D), psi'' = phi - D/(6 k) with psi' = 0 at both, and L gains chi(y) with
     * chi'' = -(l/(k D) + D l''/(6 k)). The slab part's error at the ends (its bound in G and G') moves l by
     * a polynomial whose largest value, over h on a convective side, bounds what it does to u (maximum
     * principle, common practice).
     */
    private final class Lifted {
        private static final double[] MEAN_NODE = {-Math.sqrt(0.6) / 2, 0, Math.sqrt(0.6) / 2};
        private static final double[] MEAN_WEIGHT = {5 / 18.0, 8 / 18.0, 5 / 18.0};
        private final Face face;
        /** l(y) = line[0] + line[1] y + line[2] y^2 + line[3] y^3. */
        private final double[] line;
        /** phi(x) = sum_j across[j] x^j: a line, or between two insulated faces across a parabola. */
        private final double[] across;
        /** psi(x) = sum_j cubic[j] x^j, with psi'' = phi (less its mean between two insulated faces) and B psi = 0 across. */
        private final double[] cubic;
        /** chi(y) = sum_j chi[j] y^j: zero, or between two insulated faces across what keeps L harmonic. */
        private final double[] chi;
        /** l'', and the derivatives the gradient takes: l', the third derivative of l, phi', psi', chi'. */
        private final double[] curvature;
        private final double[] slope;
        private final double[] curvatureSlope;
        private final double[] acrossSlope;
        private final double[] cubicSlope;
        private final double[] chiSlope;
        private final BlendCorrection compatible;
        private final List<Face> ends;
        /** Per end side: the B-form data -B_e L its series takes (cubic coefficients in x), or null. */
        private final double[][] endData;
        /**
         * Per end series: max |data| times the largest of zeta, the line across that side with B zeta = 1 on it and
         * 0 on the far side; zeta max|data| +- U_e meets B >= 0 on every side, so |U_e| is below it (maximum
         * principle).
         */
        private final double[] endBarrier;
        private final double lineError;

        Lifted(Face face, double[] line, double[] across, double[] cubic, double[] chi, BlendCorrection compatible,
               List<Face> ends, double[][] endData, double lineError) {
            this.face = face;
            this.line = line;
            this.across = across;
            this.cubic = cubic;
            this.chi = chi;
            curvature = derivative(derivative(line));
            slope = derivative(line);
            curvatureSlope = derivative(curvature);
            acrossSlope = derivative(across);
            cubicSlope = derivative(cubic);
            chiSlope = derivative(chi);
            this.compatible = compatible;
            this.ends = ends;
            this.endData = endData;
            this.lineError = lineError;
            endBarrier = new double[ends.size()];
            for (int i = 0; i < ends.size(); i++) {
                Face e = ends.get(i);
                double[][] inverse = lineInverse(e.axis);
                double zeta = inverse == null ? Double.POSITIVE_INFINITY
                    : Math.max(Math.abs(inverse[0][e.side]), Math.abs(inverse[0][e.side] + inverse[1][e.side] * len[e.axis]));
                endBarrier[i] = zeta * polynomialMax(endData[e.side], len[face.axis]);
            }
        }

        /** L at a point, or its mean over the cell to hi: {value, dL/dx_normal, dL/dy, size for rounding}. */
        private double[] lifting(double[] p, int o, double[] hi) {
            int a = face.axis;
            int t = face.tangential[0];
            double x0 = p[o + a];
            double y0 = p[o + t];
            double x1 = hi == null ? x0 : hi[a];
            double y1 = hi == null ? y0 : hi[t];
            // three-point Gauss means, exact for the quintics here; the point itself when the cell has no width
            double ell = 0;
            double curve = 0;
            double phi = 0;
            double psi = 0;
            double lone = 0;
            double size = 0;
            for (int q = 0; q < 3; q++) {
                double x = 0.5 * (x0 + x1) + MEAN_NODE[q] * (x1 - x0);
                double y = 0.5 * (y0 + y1) + MEAN_NODE[q] * (y1 - y0);
                double weight = MEAN_WEIGHT[q];
                ell += weight * polynomialAt(line, y);
                curve += weight * polynomialAt(curvature, y);
                phi += weight * polynomialAt(across, x);
                psi += weight * polynomialAt(cubic, x);
                lone += weight * polynomialAt(chi, y);
                size += weight * (polynomialSize(line, y) * polynomialSize(across, x)
                    + polynomialSize(curvature, y) * polynomialSize(cubic, x) + polynomialSize(chi, y));
            }
            double value = phi * ell - psi * curve + lone;
            double x = x0;
            double y = y0;
            double dx = polynomialAt(acrossSlope, x) * polynomialAt(line, y)
                - polynomialAt(cubicSlope, x) * polynomialAt(curvature, y);
            double dy = polynomialAt(across, x) * polynomialAt(slope, y)
                - polynomialAt(cubic, x) * polynomialAt(curvatureSlope, y) + polynomialAt(chiSlope, y);
            return new double[] {value, dx, dy, size};
        }

        /** As {@link Face#add(double[], int, double[], double, double[], double[], int)} with order 0. */
        double add(double[] p, int o, double[] hi, double budget, double[] grad, double[] bounds) {
            return add(p, o, hi, budget, grad, bounds, true);
        }

        /** L + H, and with {@code withEnds} the end sides' series too (without them: a part of {@link Joint}). */
        double add(double[] p, int o, double[] hi, double budget, double[] grad, double[] bounds, boolean withEnds) {
            int a = face.axis;
            int t = face.tangential[0];
            double[] l = lifting(p, o, hi);
            double value = l[0];
            double bound = lineError + 8 * EPS * l[3];
            double gradientBound = 8 * EPS * (Math.abs(l[1]) + Math.abs(l[2])) + 8 * EPS * l[3] / lengthScale;
            double s;
            double[] c;
            if (hi == null) {
                s = face.distance(p, o);
                double[] gc = grad == null ? null : new double[2];
                c = compatible.add(p[o + t], s, Double.NaN, Double.NaN, budget / 2, budget / (2 * lengthScale), gc);
                if (grad != null) {
                    grad[a] += l[1] + (face.side == 0 ? 1 : -1) * gc[1];
                    grad[t] += l[2] + gc[0];
                }
            } else {
                s = face.side == 0 ? p[o + a] : len[a] - hi[a];
                double s1 = face.side == 0 ? hi[a] : len[a] - p[o + a];
                c = compatible.add(p[o + t], s, hi[t], s1, budget / 2, 0, null);
            }
            value += c[0];
            bound += c[1];
            gradientBound += c[2];
            double[] part = new double[2];
            for (int i = 0; withEnds && i < ends.size(); i++) {
                Face e = ends.get(i);
                if (grad == null && endBarrier[i] <= budget / (16 * ends.size())) {
                    // data this small (the rounding of a corner where the data agree): bounded, not summed
                    bound += endBarrier[i];
                    continue;
                }
                try {
                    value += e.add(p, o, hi, budget / (2 * ends.size()), grad, part, 0);
                } catch (OracleException ex) {
                    if (ex.reason() != Reason.TOO_MANY_MODES) {
                        throw ex;
                    }
                    throw new OracleException(Reason.TOO_MANY_MODES, "oracle: the point is " + s + " m from face "
                        + SIDES[a][face.side].key() + " and " + e.distance(p, o) + " m from face "
                        + SIDES[e.axis][e.side].key() + ", next to the corner where they meet; the data of "
                        + SIDES[a][face.side].key() + " do not meet the condition of " + SIDES[e.axis][e.side].key()
                        + " there (the true field is not smooth at that corner), and points this close"
                        + " to such a corner are not certified in this version; compare at points farther from it"
                        + " (about 1e-3 of the edge), or give the two sides data that agree at the corner");
                }
                bound += part[0];
                gradientBound += part[1];
            }
            bounds[0] = bound;
            bounds[1] = gradientBound;
            return value;
        }
    }

    /** sum_j c_j x_axis^j as an expression of that coordinate. */
    private static Expression polynomialOver(double[] c, int axis) {
        Expression x = Expression.parse(NAMES[axis], NAMES[axis]);
        Expression sum = Expression.constant(c[0], NAMES[axis]);
        Expression power = x;
        for (int j = 1; j < c.length; j++) {
            if (c[j] != 0) {
                sum = sum.linear(1, power, c[j]);
            }
            power = power.times(x);
        }
        return sum;
    }

    /**
     * A rectangle's faces written jointly, for points next to a corner where the per-side lifted forms do not
     * reach: with the sides of one axis lifted (L_f + H_f each, {@link Lifted}), the sides of the other axis
     * take their own data plus what those liftings leave on them, -sum_f B_e L_f, as one series each (itself
     * lifted near its side). At a corner where the two sides' data agree as the data of a smooth solution do
     * (B_f G_e = B_e G_f, and the same for G''), that joint data meet the corner's condition, so nothing is
     * left there and the corner is certified; where they disagree, the joint side's own lifting leaves data
     * on the first side next to the corner and the point is refused as before.
     */
    private final class Joint {
        private final List<Lifted> lifts;
        private final List<Face> joined;

        Joint(List<Lifted> lifts, List<Face> joined) {
            this.lifts = lifts;
            this.joined = joined;
        }

        /** The faces' sum at a point (or a cell's mean), within {@code budget} in all. */
        double add(double[] p, int o, double[] hi, double budget, double[] grad, double[] bounds) {
            double share = budget / (lifts.size() + joined.size());
            double[] part = new double[2];
            double value = 0;
            double valueBound = 0;
            double gradientBound = 0;
            for (Lifted l : lifts) {
                value += l.add(p, o, hi, share, grad, part, false);
                valueBound += part[0];
                gradientBound += part[1];
            }
            for (Face f : joined) {
                value += f.add(p, o, hi, share, grad, part, 0);
                valueBound += part[0];
                gradientBound += part[1];
            }
            bounds[0] = valueBound;
            bounds[1] = gradientBound;
            return value;
        }
    }

    private volatile Joint joint;
    private volatile boolean jointTried;

    /** The joint form of a rectangle's faces, built on first use; null where a side of either axis has no lifted form. */
    private Joint joint() {
        if (jointTried) {
            return joint;
        }
        synchronized (this) {
            if (!jointTried) {
                joint = buildJoint();
                jointTried = true;
            }
            return joint;
        }
    }

    private Joint buildJoint() {
        if (d != 2) {
            return null;
        }
        for (int first = 0; first < 2; first++) {
            List<Lifted> lifts = new ArrayList<>();
            boolean all = true;
            for (Face f : faces) {
                if (f.axis == first) {
                    Lifted l = f.lifted();
                    all &= l != null;
                    if (l != null) {
                        lifts.add(l);
                    }
                }
            }
            if (!all || lifts.isEmpty()) {
                continue;
            }
            int other = 1 - first;
            List<Face> joined = new ArrayList<>();
            for (int e = 0; e < 2; e++) {
                double[] c = new double[6];
                boolean any = false;
                for (Lifted l : lifts) {
                    if (l.endData[e] != null) {
                        any = true;
                        for (int j = 0; j < l.endData[e].length; j++) {
                            c[j] += l.endData[e][j];
                        }
                    }
                }
                Face own = null;
                for (Face f : faces) {
                    if (f.axis == other && f.side == e) {
                        own = f;
                    }
                }
                if (!any) {
                    if (own != null) {
                        joined.add(own);
                    }
                    continue;
                }
                Face j = new Face(other, e, null, polynomialOver(c, first));
                if (j.present) {
                    joined.add(j);
                }
            }
            return new Joint(lifts, joined);
        }
        return null;
    }

    /**
     * The faces' series at a point (or a cell's mean), {@code budget} each, into grad and bounds {value, gradient}:
     * face by face, or where that is refused next to a rectangle's corner, by the {@link Joint} form.
     */
    private double addFaces(double[] p, int o, double[] hi, double budget, double[] grad, double[] bounds) {
        double[] g = grad == null ? null : new double[d];
        double[] part = bounds;
        double value = 0;
        double valueBound = 0;
        double gradientBound = 0;
        try {
            for (Face f : faces) {
                value += f.add(p, o, hi, budget, g, part, 0);
                valueBound += part[0];
                gradientBound += part[1];
            }
        } catch (OracleException e) {
            Joint j = e.reason() == Reason.TOO_MANY_MODES ? joint() : null;
            if (j == null) {
                throw e;
            }
            g = grad == null ? null : new double[d];
            try {
                value = j.add(p, o, hi, budget * faces.size(), g, part);
            } catch (OracleException again) {
                // next to a corner where the data disagree the side's own refusal names that corner
                throw again.reason() == Reason.TOO_MANY_MODES ? e : again;
            }
            valueBound = part[0];
            gradientBound = part[1];
        }
        if (grad != null) {
            for (int i = 0; i < d; i++) {
                grad[i] += g[i];
            }
        }
        bounds[0] = valueBound;
        bounds[1] = gradientBound;
        return value;
    }

    /**
     * An upper bound of max |sum_j c_j x^j| over [0, length]: the largest of 1025 samples plus half their spacing
     * times a bound of the slope (sum_j j |c_j| length^(j - 1)).
     */
    private static double polynomialMax(double[] c, double length) {
        double max = 0;
        for (int i = 0; i <= 1024; i++) {
            max = Math.max(max, Math.abs(polynomialAt(c, length * i / 1024)));
        }
        double slope = 0;
        for (int j = 1; j < c.length; j++) {
            slope += j * Math.abs(c[j]) * Math.pow(length, j - 1);
        }
        return (max + 0.5 * length / 1024 * slope) * (1 + 1e-12);
    }

    private static double polynomialAt(double[] c, double x) {
        double v = 0;
        for (int j = c.length - 1; j >= 0; j--) {
            v = v * x + c[j];
        }
        return v;
    }

    /** sum_j |c_j x^j|, for rounding bounds. */
    private static double polynomialSize(double[] c, double x) {
        double size = 0;
        double power = 1;
        for (double cj : c) {
            size += Math.abs(cj * power);
            power *= x;
        }
        return size;
    }

    /** The coefficients of p'. */
    private static double[] derivative(double[] c) {
        if (c.length <= 1) {
            return new double[] {0};
        }
        double[] d = new double[c.length - 1];
        for (int j = 1; j < c.length; j++) {
            d[j - 1] = j * c[j];
        }
        return d;
    }

    /** The coefficients of the antiderivative of p that vanishes at 0. */
    private static double[] integral(double[] c) {
        double[] d = new double[c.length + 1];
        for (int j = 0; j < c.length; j++) {
            d[j + 1] = c[j] / (j + 1);
        }
        return d;
    }

    /** {c0, c1} of a face condition B u = c0 u + c1 du/dx_axis at that face (c1 carries k and the normal's sign). */
    private double[] conditionWeights(int axis, int side) {
        double sign = side == 0 ? -1 : 1;
        return switch (type[axis][side]) {
            case DIRICHLET -> new double[] {1, 0};
            case NEUMANN -> new double[] {0, sign * k};
            default -> new double[] {h[axis][side], sign * k};
        };
    }

    /** B at a face of axis {@code axis} of the polynomial sum_j c_j x^j. */
    private double conditionOf(int axis, int side, double[] c) {
        double[] w = conditionWeights(axis, side);
        double x = side == 0 ? 0 : len[axis];
        return w[0] * polynomialAt(c, x) + w[1] * polynomialAt(derivative(c), x);
    }

    /** {p(x), p'(x)} of p = sum_j c_j x^j into out, by Horner's scheme (no allocation: a lag profile's modes). */
    private static void polynomial(double[] c, double x, double[] out) {
        double value = 0;
        double slope = 0;
        for (int j = c.length - 1; j >= 0; j--) {
            value = value * x + c[j];
            if (j > 0) {
                slope = slope * x + j * c[j];
            }
        }
        out[0] = value;
        out[1] = slope;
    }

    /** The inverse of the two faces' conditions on c + c' x along an axis, or null when no line meets both. */
    private double[][] lineInverse(int axis) {
        double[][] rows = new double[2][];
        for (int side = 0; side < 2; side++) {
            rows[side] = new double[] {conditionOf(axis, side, new double[] {1}), conditionOf(axis, side, new double[] {0, 1})};
        }
        double det = rows[0][0] * rows[1][1] - rows[0][1] * rows[1][0];
        double size = Math.abs(rows[0][0] * rows[1][1]) + Math.abs(rows[0][1] * rows[1][0]);
        if (!(Math.abs(det) > 1e-10 * size)) {
            return null;
        }
        return new double[][] {{rows[1][1] / det, -rows[0][1] / det}, {-rows[1][0] / det, rows[0][0] / det}};
    }

    /**
     * The lifted form of a rectangle side's series ({@link Lifted}), or null where there is none: a box, a
     * schedule's shape, data that may be non-smooth, a body insulated or flux-driven on every side, or a side
     * whose far side is insulated or flux-driven as well as itself (no line across meets both). A source with a
     * blend leaves the side data alone (its parts and remainder meet every side's condition), so it is lifted.
     */
    private Lifted lift(Face f) {
        int a = f.axis;
        int t = f.tangential[0];
        if (d != 2 || f.shape != null || allFlux || !pairs.isEmpty()
            || !Double.isFinite(f.variation)) {
            return null;
        }
        double[][] acrossInverse = lineInverse(a);
        if (acrossInverse == null && !(type[a][0] == NEUMANN && type[a][1] == NEUMANN)) {
            return null;
        }
        double[][] alongInverse = lineInverse(t);
        int own = type[a][f.side];
        double dataWeight = own == ROBIN ? h[a][f.side] : 1;
        double partWeight = own == DIRICHLET ? 1 : own == ROBIN ? h[a][f.side] : 0;
        Expression along = data[a][f.side];
        if (along.variables().contains("t")) {
            along = along.substitute("t", 0);
        }
        if (along.variables().contains(NAMES[a])) {
            along = along.substitute(NAMES[a], f.side == 0 ? 0 : len[a]);
        }
        along = along.over(NAMES[t]);
        Expression slope = along.derivative(NAMES[t]);
        Expression curvature = slope.derivative(NAMES[t]);
        // the compatible part's source: -k (G - l)'' = -k w data'' + w_P k P'' + k l'' = -k w data'' - w_P Q_t + k l''
        Expression source = curvature.linear(-k * dataWeight, curvature, 0);
        Expression extraSlope = f.extra == null ? null : f.extra.derivative(NAMES[t]);
        Expression extraCurvature = f.extra == null ? null : extraSlope.derivative(NAMES[t]);
        if (extraCurvature != null) {
            source = source.linear(1, extraCurvature, -k);
        }
        SlabSolver.Slice part = partWeight == 0 ? null : sourceSlices[t];
        if (part != null) {
            source = source.linear(1, sourcePart(t), -partWeight);
        }
        double[] g = new double[2];
        double[] dg = new double[2];
        double[] valueError = new double[2];
        double[] slopeError = new double[2];
        double[] point = new double[d];
        point[a] = f.side == 0 ? 0 : len[a];
        for (int e = 0; e < 2; e++) {
            double y = e == 0 ? 0 : len[t];
            point[t] = y;
            g[e] = f.boundaryData(point);
            dg[e] = dataWeight * slope.value(y) + (extraSlope == null ? 0 : extraSlope.value(y));
            if (part != null) {
                Evaluation flux = part.heatFlux(y);
                dg[e] += partWeight * flux.value() / k; // G' = w data' - w_P P', P' = -flux / k
                valueError[e] = partWeight * part.temperature(y).bound();
                slopeError[e] = partWeight * flux.bound() / k;
            }
        }
        double[] line;
        double lineBound;
        double lt = len[t];
        if (alongInverse != null) {
            // l'' = 2 c2 + 6 c3 y meets the ends' conditions as G'' does, then c0 + c1 y the rest of l's
            Expression third = curvature.derivative(NAMES[t]);
            Expression q = part == null ? null : sourcePart(t);
            Expression dq = q == null ? null : q.derivative(NAMES[t]);
            double[] rhs = new double[2];
            for (int e = 0; e < 2; e++) {
                double y = e == 0 ? 0 : len[t];
                // G'' = w data'' - w_P P'' = w data'' + w_P Q / k, and G''' likewise
                double g2 = dataWeight * curvature.value(y) + (q == null ? 0 : partWeight * q.value(y) / k)
                    + (extraCurvature == null ? 0 : extraCurvature.value(y));
                double g3 = dataWeight * third.value(y) + (dq == null ? 0 : partWeight * dq.value(y) / k)
                    + (extraCurvature == null ? 0 : extraCurvature.derivative(NAMES[t]).value(y));
                double[] w = conditionWeights(t, e);
                rhs[e] = w[0] * g2 + w[1] * g3;
            }
            double a2 = alongInverse[0][0] * rhs[0] + alongInverse[0][1] * rhs[1];
            double a3 = alongInverse[1][0] * rhs[0] + alongInverse[1][1] * rhs[1];
            line = new double[] {0, 0, a2 / 2, a3 / 6};
            double[] mismatch = new double[2];
            for (int e = 0; e < 2; e++) {
                double[] w = conditionWeights(t, e);
                rhs[e] = w[0] * g[e] + w[1] * dg[e] - conditionOf(t, e, line);
                mismatch[e] = Math.abs(w[0]) * valueError[e] + Math.abs(w[1]) * slopeError[e];
            }
            line[0] = alongInverse[0][0] * rhs[0] + alongInverse[0][1] * rhs[1];
            line[1] = alongInverse[1][0] * rhs[0] + alongInverse[1][1] * rhs[1];
            double c0 = Math.abs(alongInverse[0][0]) * mismatch[0] + Math.abs(alongInverse[0][1]) * mismatch[1];
            double c1 = Math.abs(alongInverse[1][0]) * mismatch[0] + Math.abs(alongInverse[1][1]) * mismatch[1];
            lineBound = c0 + c1 * lt;
            Expression y = Expression.parse(NAMES[t], NAMES[t]);
            source = source.linear(1, Expression.constant(1, NAMES[t]), 2 * k * line[2]).linear(1, y, 6 * k * line[3]);
        } else {
            // both ends insulated or flux-driven: l' meets G' at both, and l has G's mean
            double b = (dg[1] - dg[0]) / (2 * lt);
            double[] at = new double[d];
            at[a] = f.side == 0 ? 0 : len[a];
            double mean = meanAlong(t, y -> {
                at[t] = y;
                return f.boundaryData(at);
            });
            line = new double[] {mean - dg[0] * lt / 2 - b * lt * lt / 3, dg[0], b, 0};
            source = source.linear(1, Expression.constant(1, NAMES[t]), 2 * k * b);
            lineBound = 2.5 * (slopeError[0] + slopeError[1]) * lt + Math.max(valueError[0], valueError[1]);
        }
        double lineError = lineBound / (own == ROBIN ? h[a][f.side] : 1);
        double[] across;
        double[] cubic;
        double[] chi;
        double depth = len[a];
        if (acrossInverse != null) {
            across = new double[] {acrossInverse[0][f.side], acrossInverse[1][f.side]};
            // psi = p x^2 / 2 + q x^3 / 6 + r + s x with B psi = 0 on both sides across
            cubic = new double[] {0, 0, across[0] / 2, across[1] / 6};
            double[] rhsAcross = {-conditionOf(a, 0, cubic), -conditionOf(a, 1, cubic)};
            cubic[0] = acrossInverse[0][0] * rhsAcross[0] + acrossInverse[0][1] * rhsAcross[1];
            cubic[1] = acrossInverse[1][0] * rhsAcross[0] + acrossInverse[1][1] * rhsAcross[1];
            chi = new double[] {0};
        } else {
            // both faces across insulated or flux-driven: phi = (x - x_far)^2 / (2 k D) (k phi' = 1 at the side, 0
            // at the far one), psi'' = phi - D / (6 k) with psi' = 0 at both, and chi'' = -(l / (k D) + D l'' / (6 k)),
            // so that Laplace (phi l - psi l'' + chi) = 0
            double far = f.side == 0 ? depth : 0;
            across = new double[] {far * far / (2 * k * depth), -far / (k * depth), 1 / (2 * k * depth)};
            double[] level = across.clone();
            level[0] -= depth / (6 * k);
            cubic = integral(integral(level));
            double[] bent = derivative(derivative(line));
            double[] rest = new double[line.length];
            for (int j = 0; j < line.length; j++) {
                rest[j] = -(line[j] / (k * depth) + (j < bent.length ? depth * bent[j] / (6 * k) : 0));
            }
            chi = integral(integral(rest));
        }
        List<Face> ends = new ArrayList<>();
        double[][] endData = new double[2][];
        for (int e = 0; e < 2; e++) {
            // B_e L = phi(x) B_e l - psi(x) B_e l'' + B_e chi; the end side's series takes minus that (over h if
            // convective)
            double bl = conditionOf(t, e, line);
            double bc = conditionOf(t, e, derivative(derivative(line)));
            double bchi = conditionOf(t, e, chi);
            double over = type[t][e] == ROBIN ? h[t][e] : 1;
            int degree = Math.max(across.length, cubic.length);
            double[] c = new double[degree];
            boolean zero = true;
            for (int j = 0; j < degree; j++) {
                double phiJ = j < across.length ? across[j] : 0;
                double psiJ = j < cubic.length ? cubic[j] : 0;
                c[j] = -(bl * phiJ - bc * psiJ + (j == 0 ? bchi : 0));
                zero &= c[j] == 0;
            }
            if (zero) {
                continue;
            }
            endData[e] = c.clone();
            for (int j = 0; j < degree; j++) {
                c[j] /= over;
            }
            Face end = new Face(t, e, polynomialOver(c, a));
            if (end.present) {
                ends.add(end);
            }
        }
        BlendCorrection compatible = blendCorrection(a, f.side, t, source, -1, tolerance * scale / (8 * faces.size()), null);
        return new Lifted(f, line, across, cubic, chi, compatible, ends, endData, lineError);
    }

    /** The source's part along an axis, Q_i, as an expression of that coordinate alone (at t = 0). */
    private Expression sourcePart(int axis) {
        Expression q = sourceParts[axis];
        if (q.variables().contains("t")) {
            q = q.substitute("t", 0);
        }
        if (axis != 0) {
            q = q.renamed("x", NAMES[axis]);
        }
        return q.over(NAMES[axis]);
    }


    private record GradientBox(int[] m, double[] weighted, double bound) {
    }

    /** The state at one time. */
    private final class TensorSlice implements Slice {
        private final double t;
        private final int[] m;
        private final double[] weighted; // c_J exp(-alpha lambda_J t)
        private final double modalBound;
        private final double modalGradientBound;
        private final int modes;
        private final double budget;
        private final double levelNow;
        private final double slopeNow;
        // the particular part converges more slowly in gradients: a wider box, built on the first request
        private final int[] transientOnly;
        private volatile GradientBox gradientBox;
        private double particularGradientOnValueBox;
        // the side terms' theta(t) and theta'(t)
        private final double[] thetaNow = new double[moving.size()];
        private final double[] thetaSlopeNow = new double[moving.size()];
        private final double[] thetaCurvatureNow = new double[moving.size()];
        // the source terms' theta(t)
        private final double[] sourceThetaNow = new double[sourceTerms.size()];
        private double scheduledDrift;
        private double scheduledDriftBound;

        TensorSlice(double t) {
            this.t = t;
            this.budget = tolerance * scale;
            boolean levelMoves = level != null && t > 0 && t < Double.POSITIVE_INFINITY;
            this.levelNow = levelMoves ? level.level(t) : 0;
            this.slopeNow = levelMoves ? level.rate(t) : 0;
            if (t > 0 && t < Double.POSITIVE_INFINITY) {
                for (int k = 0; k < thetaNow.length; k++) {
                    thetaNow[k] = moving.get(k).schedule().theta.value(t);
                    thetaSlopeNow[k] = moving.get(k).schedule().slope.value(t);
                    thetaCurvatureNow[k] = moving.get(k).schedule().curvature.value(t);
                    if (allFlux) {
                        // a flux face's term adds theta(t) G_0 / (D rho c) to the mean's rate
                        double[] integral = moving.get(k).schedule().integral(t);
                        double input = moving.get(k).input();
                        scheduledDrift += input * integral[0];
                        scheduledDriftBound += Math.abs(input) * integral[1] + 4 * EPS * Math.abs(input * integral[0]);
                    }
                }
                for (int k = 0; k < sourceThetaNow.length; k++) {
                    sourceThetaNow[k] = sourceTerms.get(k).theta.value(t);
                }
                if (heatingOnly != null) {
                    double[] integral = SideSchedule.integral(heatingOnly, t);
                    scheduledDrift += integral[0];
                    scheduledDriftBound += integral[1] + 4 * EPS * Math.abs(integral[0]);
                }
            }
            if (t == Double.POSITIVE_INFINITY || t == 0) {
                transientOnly = null;
                m = null;
                weighted = null;
                modalBound = 0;
                modalGradientBound = 0;
                modes = 0;
                return;
            }
            double[] a = new double[d];
            double[] sums = new double[d];
            double[] weightedSums = new double[d];
            for (int i = 0; i < d; i++) {
                a[i] = alpha * t * Math.PI * Math.PI / (len[i] * len[i]);
                sums[i] = gaussTail(a[i], 0, 0);
                weightedSums[i] = Math.PI / len[i] * gaussTail(a[i], 0, 1);
            }
            // first pass with a rough coefficient bound to size the modes, then with the real one
            int[] needed = new int[d];
            Modal mod = null;
            double tailC = 0;
            for (int pass = 0; pass < 2; pass++) {
                tailC = pass == 0 ? roughTailCoefficient() : mod.tailCoefficient;
                for (int i = 0; i < d; i++) {
                    double others = 1;
                    for (int j = 0; j < d; j++) {
                        if (j != i) {
                            others *= sums[j];
                        }
                    }
                    if (a[i] * transientCap * transientCap < 1) {
                        throw new OracleException(Reason.TOO_MANY_MODES, "oracle: at t = " + t + " s the transient"
                            + " needs more than " + transientCap + " modes along " + NAMES[i] + " (alpha t/L^2 = "
                            + alpha * t / (len[i] * len[i]) + " is too small for this version)");
                    }
                    double logs = Math.log(Math.max(1.0001, tailC * 4 * d / budget));
                    int mi = Math.max(1, (int) (0.7 * Math.sqrt(logs / a[i])));
                    while (tailC * others * gaussTail(a[i], mi, 0) > budget / (4 * d)
                        || tailC * gradientOthers(i, mi, a, sums, weightedSums) > budget / (4 * d * lengthScale)) {
                        mi = mi < 16 ? mi + 1 : mi + mi / 8;
                        if (mi > transientCap) {
                            throw new OracleException(Reason.TOO_MANY_MODES, "oracle: at t = " + t + " s the"
                                + " transient needs more than " + transientCap + " modes along " + NAMES[i]
                                + " (alpha t/L^2 = " + alpha * t / (len[i] * len[i]) + " is too small for this version)");
                        }
                    }
                    needed[i] = Math.max(needed[i], mi);
                }
                mod = modal(needed);
            }
            // with a moving level, the particular part's box joins the transient's
            int[] particular = levelMoves ? level.box(budget / 8, transientCap, t) : null;
            int[] scheduled = moving.isEmpty() ? null : scheduleBox(t, budget / 8, Double.POSITIVE_INFINITY);
            int[] sourced = sourceTerms.isEmpty() ? null : sourceBox(t, budget / 8, false);
            int[] transientBox = needed.clone();
            this.transientOnly = transientBox;
            m = needed.clone();
            int count = 1;
            for (int i = 0; i < d; i++) {
                if (particular != null) {
                    m[i] = Math.max(m[i], particular[i]);
                }
                if (scheduled != null) {
                    m[i] = Math.max(m[i], scheduled[i]);
                }
                if (sourced != null) {
                    m[i] = Math.max(m[i], sourced[i]);
                }
                count *= m[i];
            }
            modes = count;
            weighted = new double[count];
            double[][] decay = new double[d][];
            for (int i = 0; i < d; i++) {
                decay[i] = new double[m[i]];
                for (int j = 0; j < m[i]; j++) {
                    double mu = axes[i].mu[j];
                    decay[i][j] = Math.exp(-alpha * mu * mu * t);
                }
            }
            int[] index = new int[d];
            double decaySum = 0;
            for (int c = 0; c < count; c++) {
                unflatten(c, m, index);
                double e = 1;
                int source = 0;
                boolean inside = true;
                for (int i = 0; i < d; i++) {
                    inside &= index[i] < transientBox[i];
                    if (!inside) {
                        break;
                    }
                    e *= decay[i][index[i]];
                    source = source * mod.m[i] + index[i];
                }
                if (inside) {
                    weighted[c] = mod.c[source] * e;
                    decaySum += e;
                }
            }
            double particularBound = 0;
            double particularGradientBound = 0;
            if (particular != null) {
                double quadrature = level.addParticular(t, m, weighted);
                // the box is sized on a narrower explicit region; the bounds reported use the widest
                double[] truncation = level.truncation(m, level.explicitCutoff(true), t);
                double maxMuAll = 0;
                for (int i = 0; i < d; i++) {
                    maxMuAll = Math.max(maxMuAll, axes[i].mu[m[i] - 1]);
                }
                particularBound = truncation[0] + quadrature;
                particularGradientBound = truncation[1] + quadrature * maxMuAll * d;
            }
            double tail = 0;
            double gradientTail = 0;
            for (int i = 0; i < d; i++) {
                double others = 1;
                for (int j = 0; j < d; j++) {
                    if (j != i) {
                        others *= sums[j];
                    }
                }
                tail += tailC * others * gaussTail(a[i], transientBox[i], 0);
                gradientTail += tailC * gradientOthers(i, transientBox[i], a, sums, weightedSums);
            }
            double maxMu = 0;
            for (int i = 0; i < d; i++) {
                maxMu = Math.max(maxMu, axes[i].mu[m[i] - 1]);
            }
            double scheduleBound = 0;
            double scheduleGradientBound = 0;
            if (scheduled != null) {
                double quadrature = addScheduled(t, m, weighted);
                for (Moving mv : moving) {
                    double[] truncation = scheduleTruncation(mv, m, t);
                    scheduleBound += truncation[0];
                    scheduleGradientBound += truncation[1];
                }
                scheduleBound += quadrature;
                scheduleGradientBound += quadrature * maxMu * d;
            }
            if (sourced != null) {
                double quadrature = 0;
                for (SourceSchedule term : sourceTerms) {
                    quadrature += term.add(t, m, weighted);
                    double[] truncation = term.truncation(m, t);
                    scheduleBound += truncation[0];
                    scheduleGradientBound += truncation[1];
                }
                scheduleBound += quadrature;
                scheduleGradientBound += quadrature * maxMu * d;
            }
            modalBound = tail + mod.error * decaySum + particularBound + scheduleBound;
            modalGradientBound = gradientTail + mod.error * decaySum * maxMu * d + particularGradientBound
                + scheduleGradientBound;
            particularGradientOnValueBox = particularGradientBound + scheduleGradientBound;
        }

        /**
         * With a moving level whose particular part's gradient bound on the value box exceeds
         * {@code limit}: a box sized for gradients, its coefficients (the transient's entries copied from
         * the value box) and its bound; null when the value box suffices.
         */
        private GradientBox gradientBox(double limit) {
            boolean levelPart = level != null && level.curvatureMax > 0;
            if ((!levelPart && moving.isEmpty() && sourceTerms.isEmpty()) || transientOnly == null
                || modalGradientBound <= limit / 2) {
                return null;
            }
            GradientBox box = gradientBox;
            if (box != null) {
                return box;
            }
            synchronized (this) {
                if (gradientBox == null) {
                    int[] wide = levelPart ? level.gradientBox(limit / 2, transientCap, t) : m;
                    int[] sides = moving.isEmpty() ? m : scheduleBox(t, budget / 8, limit / 4);
                    int[] sourced = sourceTerms.isEmpty() ? m : sourceBox(t, limit / 4, true);
                    int[] union = new int[d];
                    int count = 1;
                    for (int i = 0; i < d; i++) {
                        union[i] = Math.max(Math.max(m[i], sourced[i]), Math.max(wide[i], sides[i]));
                        axes[i].ensure(union[i] + 1);
                        count *= union[i];
                    }
                    double[] w = new double[count];
                    // the transient's entries (inside transientOnly) from the value box, less its particular parts
                    double[] particularOnValueBox = new double[weighted.length];
                    if (levelPart) {
                        level.addParticular(t, m, particularOnValueBox);
                    }
                    if (!moving.isEmpty()) {
                        addScheduled(t, m, particularOnValueBox);
                    }
                    for (SourceSchedule term : sourceTerms) {
                        term.add(t, m, particularOnValueBox);
                    }
                    int[] index = new int[d];
                    for (int c = 0; c < weighted.length; c++) {
                        unflatten(c, m, index);
                        int target = 0;
                        for (int i = 0; i < d; i++) {
                            target = target * union[i] + index[i];
                        }
                        w[target] = weighted[c] - particularOnValueBox[c];
                    }
                    double quadrature = levelPart ? level.addParticular(t, union, w) : 0;
                    double truncation = levelPart ? level.truncation(union, level.explicitCutoff(true), t)[1] : 0;
                    if (!moving.isEmpty()) {
                        quadrature += addScheduled(t, union, w);
                        for (Moving mv : moving) {
                            truncation += scheduleTruncation(mv, union, t)[1];
                        }
                    }
                    for (SourceSchedule term : sourceTerms) {
                        quadrature += term.add(t, union, w);
                        truncation += term.truncation(union, t)[1];
                    }
                    double maxMu = 0;
                    for (int i = 0; i < d; i++) {
                        maxMu = Math.max(maxMu, axes[i].mu[union[i] - 1]);
                    }
                    double transientPart = modalGradientBound - particularGradientOnValueBox;
                    gradientBox = new GradientBox(union, w, transientPart + truncation + quadrature * maxMu * d);
                }
                return gradientBox;
            }
        }

        /** Tail of the gradient: the complement's part with j_i >= m_i, weighted by mu along every axis. */
        private double gradientOthers(int i, int mi, double[] a, double[] sums, double[] weightedSums) {
            double total = 0;
            for (int w = 0; w < d; w++) {
                double product = 1;
                for (int j = 0; j < d; j++) {
                    if (j == i) {
                        product *= w == j ? Math.PI / len[j] * gaussTail(a[j], mi, 1) : gaussTail(a[j], mi, 0);
                    } else {
                        product *= w == j ? weightedSums[j] : sums[j];
                    }
                }
                total += product;
            }
            return total;
        }

        @Override
        public int modes() {
            return modes;
        }

        /** What part {@code order} of side term k is multiplied by at this time: theta, theta' / alpha, theta'' / alpha^2. */
        private double sideFactor(int k, int order) {
            return order == 0 ? thetaNow[k] : order == 1 ? thetaSlopeNow[k] / alpha
                : thetaCurvatureNow[k] / (alpha * alpha);
        }

        /** The mean's rise by time t on a body insulated or flux-driven on every face (0 otherwise). */
        private double drift() {
            return allFlux ? driftRate * t + scheduledDrift : 0;
        }

        private double driftBound() {
            return allFlux ? driftError * t + scheduledDriftBound : 0;
        }

        @Override
        public Evaluation temperature(double[] p, int o) {
            return temperature(p, o, null);
        }

        @Override
        public Evaluation temperature(double[] p, int o, Evaluation[] steadyParts) {
            checkPoint(p, o);
            if (t == 0) {
                return initialValue(p, o);
            }
            Evaluation onFace = onDirichletFace(p, o);
            if (onFace != null) {
                return onFace;
            }
            Evaluation part = steadyParts != null ? steadyParts[0] : steadyTemperature(p, o);
            double value = part.value() + drift();
            double bound = part.bound() + driftBound();
            if (levelNow != 0 || slopeNow != 0) {
                value += levelNow;
                bound += 2 * EPS * Math.abs(levelNow);
                if (hasLag() && slopeNow != 0) {
                    Evaluation lagged = steadyParts != null ? steadyParts[1] : lagAt(p, o);
                    value -= slopeNow * lagged.value();
                    bound += Math.abs(slopeNow) * lagged.bound();
                }
            }
            int base = hasLag() ? 2 : 1;
            for (int k = 0; k < thetaNow.length; k++) {
                for (int order = 0; order < 3; order++) {
                    Evaluation e = steadyParts != null ? steadyParts[base + 3 * k + order]
                        : sidePart(k, order, p, o, null, null);
                    double c = sideFactor(k, order);
                    value += c * e.value();
                    bound += Math.abs(c) * e.bound();
                }
            }
            int first = base + 3 * thetaNow.length;
            for (int k = 0; k < sourceThetaNow.length; k++) {
                if (sourceThetaNow[k] != 0) {
                    Evaluation e = steadyParts != null ? steadyParts[first + k] : sourceResponse(k, p, o);
                    value += sourceThetaNow[k] * e.value();
                    bound += Math.abs(sourceThetaNow[k]) * e.bound() + 2 * EPS * Math.abs(sourceThetaNow[k] * e.value());
                }
            }
            if (weighted != null) {
                double[] vb = modalSum(p, o, null);
                value += vb[0];
                bound += vb[1] + modalBound;
            }
            if (!lenient && !(bound <= budget)) {
                throw notCertified("u", p, o, bound, budget);
            }
            return new Evaluation(value, bound);
        }

        @Override
        public double gradient(double[] p, int o, double[] out, int oo) {
            checkPoint(p, o);
            if (t == 0) {
                throw new OracleException(Reason.UNSUPPORTED, "oracle: the gradient at t = 0 is that of the initial"
                    + " temperature; ask for t > 0");
            }
            double[] g = new double[d];
            double bound = timeVariation / minLength();
            double[] bounds = new double[2];
            for (int sourceAxis = 0; sourceAxis < d; sourceAxis++) {
                if (sourceSlices[sourceAxis] == null) {
                    continue;
                }
                Evaluation flux = sourceSlices[sourceAxis].heatFlux(p[o + sourceAxis]);
                g[sourceAxis] += -flux.value() / k;
                bound += flux.bound() / k;
            }
            for (PairTerm term : pairs) {
                double[] gv = new double[2];
                double w = term.w(p[o + term.c()]);
                bound += Math.abs(w) * term.slice().gradient(new double[] {p[o + term.a()], p[o + term.b()]}, 0, gv, 0);
                g[term.a()] += w * gv[0];
                g[term.b()] += w * gv[1];
                if (term.w1() != 0) {
                    Evaluation e = term.at(p[o + term.a()], p[o + term.b()]);
                    g[term.c()] += term.w1() * e.value();
                    bound += Math.abs(term.w1()) * e.bound();
                }
            }
            if (pairDataError > 0) {
                bound += pairGradientError(p, o);
            }
            double blendBudget = budget / (16 * Math.max(1, blends.size()));
            for (Blend b : blends) {
                if (b.slice() != null) {
                    Evaluation e = b.slice().temperature(p[o + b.along()]);
                    Evaluation flux = b.slice().heatFlux(p[o + b.along()]);
                    double psi = b.psi(p[o + b.axis()]);
                    g[b.axis()] += b.c1() * e.value();
                    g[b.along()] += -psi * flux.value() / k;
                    bound += Math.abs(b.c1()) * e.bound() + Math.abs(psi) * flux.bound() / k;
                }
                if (b.correction() == null) {
                    continue;
                }
                double s = b.side() == 0 ? p[o + b.axis()] : len[b.axis()] - p[o + b.axis()];
                double[] gc = new double[2];
                double[] c = b.correction().add(p[o + b.along()], s, Double.NaN, Double.NaN, blendBudget,
                    blendBudget / lengthScale, gc);
                g[b.along()] += gc[0];
                g[b.axis()] += (b.side() == 0 ? 1 : -1) * gc[1];
                bound += c[2];
            }
            RemainderSeries[] gradientSeries = withProducts(remainder != null ? remainderGradients() : null);
            for (int part = 0; part < productParts.size(); part++) {
                gradientSeries[part + 1] = productGradients(part);
            }
            for (RemainderSeries r : gradientSeries) {
                if (r != null) {
                    double[] vb = sumModes(p, o, null, g, r.m(), r.weights());
                    bound += vb[2] + r.gradientBound();
                }
            }
            addFaces(p, o, null, budget / (4 * faces.size()), g, bounds);
            bound += bounds[1];
            if (hasLag() && slopeNow != 0) {
                double[] lagged = new double[d];
                bound += Math.abs(slopeNow) * lagGradient(p, o, lagged);
                for (int i = 0; i < d; i++) {
                    g[i] -= slopeNow * lagged[i];
                }
            }
            double[] part = new double[d];
            for (int k = 0; k < thetaNow.length; k++) {
                for (int order = 0; order < 3; order++) {
                    java.util.Arrays.fill(part, 0);
                    double b = sidePart(k, order, p, o, null, part).bound();
                    double c = sideFactor(k, order);
                    for (int i = 0; i < d; i++) {
                        g[i] += c * part[i];
                    }
                    bound += Math.abs(c) * b;
                }
            }
            for (int k = 0; k < sourceThetaNow.length; k++) {
                if (sourceThetaNow[k] != 0) {
                    java.util.Arrays.fill(part, 0);
                    double b = sourceResponseGradient(k, p, o, part);
                    for (int i = 0; i < d; i++) {
                        g[i] += sourceThetaNow[k] * part[i];
                    }
                    bound += Math.abs(sourceThetaNow[k]) * b;
                }
            }
            if (weighted != null) {
                GradientBox box = gradientBox(budget / (8 * lengthScale));
                double[] vb = box == null ? modalSum(p, o, g) : sumModes(p, o, null, g, box.m, box.weighted);
                bound += vb[2] + (box == null ? modalGradientBound : box.bound);
            }
            double limit = budget / lengthScale;
            if (!lenient && !(bound <= limit)) {
                throw notCertified("grad u", p, o, bound, limit);
            }
            System.arraycopy(g, 0, out, oo, d);
            return bound;
        }

        @Override
        public Evaluation average(double[] lo, double[] hi) {
            checkPoint(lo, 0);
            checkPoint(hi, 0);
            for (int i = 0; i < d; i++) {
                if (!(hi[i] > lo[i])) {
                    throw new OracleException(Reason.OUTSIDE_DOMAIN, "oracle: the cell's " + NAMES[i] + " range ["
                        + lo[i] + ", " + hi[i] + "] m is empty; give lo < hi along every axis");
                }
            }
            if (t == 0) {
                throw new OracleException(Reason.UNSUPPORTED, "oracle: the cell average at t = 0 is that of the"
                    + " initial temperature; ask for t > 0");
            }
            double value = shift;
            double bound = timeVariation + 2 * EPS * Math.abs(shift);
            double[] bounds = new double[2];
            for (int i = 0; i < d; i++) {
                if (sourceSlices[i] != null) {
                    Evaluation e = sourceSlices[i].cellAverage(lo[i], hi[i]);
                    value += e.value();
                    bound += e.bound();
                }
            }
            for (PairTerm term : pairs) {
                // V does not vary along the third axis: its mean over the cell is its mean over the cell's face
                Evaluation e = term.slice().average(new double[] {lo[term.a()], lo[term.b()]},
                    new double[] {hi[term.a()], hi[term.b()]});
                double w = term.wMean(lo[term.c()], hi[term.c()]);
                value += w * e.value();
                bound += Math.abs(w) * e.bound() + (term.w1() == 0 ? 0 : 2 * EPS * Math.abs(w * e.value()));
            }
            bound += pairDataError;
            double blendBudget = budget / (16 * Math.max(1, blends.size()));
            for (Blend b : blends) {
                if (b.slice() != null) {
                    Evaluation e = b.slice().cellAverage(lo[b.along()], hi[b.along()]);
                    double psi = b.psiMean(lo[b.axis()], hi[b.axis()]);
                    value += psi * e.value();
                    bound += Math.abs(psi) * e.bound() + 2 * EPS * Math.abs(psi * e.value());
                }
                if (b.correction() == null) {
                    continue;
                }
                int a = b.axis();
                double s0 = b.side() == 0 ? lo[a] : len[a] - hi[a];
                double s1 = b.side() == 0 ? hi[a] : len[a] - lo[a];
                double[] c = b.correction().add(lo[b.along()], s0, hi[b.along()], s1, blendBudget, 0, null);
                value += c[0];
                bound += c[1];
            }
            for (RemainderSeries r : withProducts(remainderValues)) {
                if (r != null) {
                    double[] vb = sumModes(lo, 0, hi, null, r.m(), r.weights());
                    value += vb[0];
                    bound += vb[1] + r.bound();
                }
            }
            value += addFaces(lo, 0, hi, budget / (4 * faces.size()), null, bounds);
            bound += bounds[0];
            value += levelNow + drift();
            bound += 2 * EPS * Math.abs(levelNow) + driftBound();
            if (hasLag() && slopeNow != 0) {
                Evaluation lagged = lagSeries != null
                    ? lagSeries.average(lo, hi, tolerance * scale / (8 * level.rateMax)) : lag.average(lo, hi);
                value -= slopeNow * lagged.value();
                bound += Math.abs(slopeNow) * lagged.bound();
            }
            for (int k = 0; k < thetaNow.length; k++) {
                for (int order = 0; order < 3; order++) {
                    Evaluation e = sidePart(k, order, lo, 0, hi, null);
                    double c = sideFactor(k, order);
                    value += c * e.value();
                    bound += Math.abs(c) * e.bound();
                }
            }
            for (int k = 0; k < sourceThetaNow.length; k++) {
                if (sourceThetaNow[k] != 0) {
                    Evaluation e = sourceTerms.get(k).steady.average(lo, hi);
                    value += sourceThetaNow[k] * e.value();
                    bound += Math.abs(sourceThetaNow[k]) * e.bound() + 2 * EPS * Math.abs(sourceThetaNow[k] * e.value());
                }
            }
            if (weighted != null) {
                double[] vb = modalSum(lo, 0, hi, null);
                value += vb[0];
                bound += vb[1] + modalBound;
            }
            if (!lenient && !(bound <= budget)) {
                throw notCertified("the cell mean", lo, 0, bound, budget);
            }
            return new Evaluation(value, bound);
        }

        /** {value, value rounding bound, gradient rounding bound}; adds the gradient into g if not null. */
        private double[] modalSum(double[] p, int o, double[] g) {
            return sumModes(p, o, null, g, m, weighted);
        }

        private double[] modalSum(double[] p, int o, double[] hi, double[] g) {
            return sumModes(p, o, hi, g, m, weighted);
        }

        private Evaluation initialValue(double[] p, int o) {
            double[] point = new double[d];
            System.arraycopy(p, o, point, 0, d);
            double g = valueAt(initial, point);
            for (int i = 0; i < d; i++) {
                for (int s = 0; s < 2; s++) {
                    boolean on = s == 0 ? point[i] == 0 : point[i] == len[i];
                    if (on && type[i][s] == DIRICHLET && Math.abs(faceData(i, s, point) - g) > budget) {
                        throw new OracleException(Reason.NOT_CERTIFIED, "oracle: at t = 0 on face " + SIDES[i][s].key()
                            + " the initial temperature " + g + " and the face temperature " + faceData(i, s, point)
                            + " disagree; u jumps there at t = 0+, so ask for t > 0");
                    }
                }
            }
            return new Evaluation(g, 4 * EPS * Math.max(Math.abs(g), 1e-3 * scale));
        }

        /** u is the data on a Dirichlet face, once t > 0 (or in the steady state). */
        private Evaluation onDirichletFace(double[] p, int o) {
            for (int i = 0; i < d; i++) {
                for (int s = 0; s < 2; s++) {
                    boolean on = s == 0 ? p[o + i] == 0 : p[o + i] == len[i];
                    if (on && type[i][s] == DIRICHLET) {
                        double[] point = new double[d];
                        System.arraycopy(p, o, point, 0, d);
                        // the data as given, at this time (the level's or the side terms' change included)
                        double g = t == Double.POSITIVE_INFINITY ? faceData(i, s, point) : valueAt(original[i][s], point, t);
                        return new Evaluation(g, 4 * EPS * Math.max(Math.abs(g), 1e-3 * scale));
                    }
                }
            }
            return null;
        }
    }

    /**
     * sum_J w_J X_J(p), or with {@code hi} not null its mean over the cell from p to hi, over modes
     * 0..m[i]-1: {value, value rounding bound, gradient rounding bound}; adds the gradient into g if not null.
     */
    private double[] sumModes(double[] p, int o, double[] hi, double[] g, int[] m, double[] weighted) {
        double[][] xs = new double[d][];
        double[][] dxs = g == null ? null : new double[d][];
        for (int i = 0; i < d; i++) {
            AxisModes ax = axes[i];
            xs[i] = new double[m[i]];
            if (g != null) {
                dxs[i] = new double[m[i]];
            }
            double x = p[o + i];
            for (int j = 0; j < m[i]; j++) {
                double arg = ax.mu[j] * x + ax.phase[j];
                xs[i][j] = hi == null ? Math.sin(arg) : meanOfMode(ax.mu[j], ax.phase[j], x, hi[i]);
                if (g != null) {
                    dxs[i][j] = ax.mu[j] * Math.cos(arg);
                }
            }
        }
        double value = 0;
        double magnitude = 0;
        double gMagnitude = 0;
        if (d == 2) {
            int m1 = m[1];
            for (int a = 0; a < m[0]; a++) {
                double inner = 0;
                double innerAbs = 0;
                double innerD = 0;
                int row = a * m1;
                for (int b = 0; b < m1; b++) {
                    double c = weighted[row + b];
                    inner += c * xs[1][b];
                    innerAbs += Math.abs(c);
                    if (g != null) {
                        innerD += c * dxs[1][b];
                    }
                }
                value += xs[0][a] * inner;
                magnitude += innerAbs;
                if (g != null) {
                    g[0] += dxs[0][a] * inner;
                    g[1] += xs[0][a] * innerD;
                    gMagnitude += innerAbs * (axes[0].mu[a] + axes[1].mu[m1 - 1]);
                }
            }
        } else {
            int m1 = m[1];
            int m2 = m[2];
            for (int a = 0; a < m[0]; a++) {
                for (int b = 0; b < m1; b++) {
                    int row = (a * m1 + b) * m2;
                    double inner = 0;
                    double innerAbs = 0;
                    double innerD = 0;
                    for (int c = 0; c < m2; c++) {
                        double w = weighted[row + c];
                        inner += w * xs[2][c];
                        innerAbs += Math.abs(w);
                        if (g != null) {
                            innerD += w * dxs[2][c];
                        }
                    }
                    double xy = xs[0][a] * xs[1][b];
                    value += xy * inner;
                    magnitude += innerAbs;
                    if (g != null) {
                        g[0] += dxs[0][a] * xs[1][b] * inner;
                        g[1] += xs[0][a] * dxs[1][b] * inner;
                        g[2] += xy * innerD;
                        gMagnitude += innerAbs * (axes[0].mu[a] + axes[1].mu[b] + axes[2].mu[m2 - 1]);
                    }
                }
            }
        }
        return new double[] {value, 16 * EPS * magnitude, 16 * EPS * gMagnitude};
    }

    /** sum_{j >= from} (j + 1)^power exp(-a j^2), summed to underflow (terms decrease past the peak). */
    static double gaussTail(double a, int from, int power) {
        boolean weighted = power > 0;
        double sum = 0;
        for (int j = from; ; j++) {
            double e = a * (double) j * j;
            if (e > 745) {
                break;
            }
            double term = Math.exp(-e) * (power == 0 ? 1 : power == 1 ? j + 1 : (j + 1.0) * (j + 1));
            sum += term;
            if (term < 1e-30 * sum && (weighted ? 2 * a * j * j > power : true) && j > from + 2) {
                // the remaining terms decrease at least geometrically with ratio exp(-a (2j + 1)) <= 1/2
                if (Math.exp(-a * (2 * j + 1)) <= 0.5) {
                    sum += term;
                    break;
                }
            }
        }
        return sum;
    }

    /** Coefficient bound for sizing the modes before they are computed: ||g|| + 2 ||U|| from samples. */
    private double roughTailCoefficient() {
        double volume = 1;
        double normLower = 1;
        for (int i = 0; i < d; i++) {
            volume *= len[i];
            normLower *= len[i] * (0.5 - 0.5 / Math.PI);
        }
        return 4 * scale * Math.sqrt(volume / normLower);
    }

    private void checkPoint(double[] p, int o) {
        for (int i = 0; i < d; i++) {
            double x = p[o + i];
            if (!(x >= 0 && x <= len[i])) {
                throw new OracleException(Reason.OUTSIDE_DOMAIN, "oracle: " + NAMES[i] + " = " + x + " m is outside [0, "
                    + len[i] + "] m");
            }
        }
    }

    private OracleException notCertified(String what, double[] p, int o, double bound, double limit) {
        double[] point = new double[d];
        System.arraycopy(p, o, point, 0, d);
        return new OracleException(Reason.NOT_CERTIFIED, "oracle: " + what + " at " + java.util.Arrays.toString(point)
            + " has bound " + bound + " > " + limit + " (tolerance times the scale); loosen the tolerance or move the"
            + " point away from the faces and edges");
    }
}

package eigencheck.oracle;

import eigencheck.oracle.problem.Box;
import eigencheck.oracle.problem.Cylinder;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Rectangle;
import eigencheck.oracle.problem.Slab;
import eigencheck.oracle.problem.Sphere;
import eigencheck.oracle.series.RadialSolver;
import eigencheck.oracle.series.SlabSolver;
import eigencheck.oracle.series.SpatialSolver;
import eigencheck.oracle.series.SphereMapping;
import eigencheck.oracle.series.TensorSolver;
import java.util.Arrays;
import java.util.stream.IntStream;

/**
 * Reference solutions of rho c u_t = k lap(u) + Q with certified error bounds, by eigenfunction
 * expansion. Prepare once per problem and time horizon, then evaluate as often as needed; instances
 * are immutable to callers and thread-safe.
 *
 * <h2>Tolerance and temperature scale</h2>
 * The tolerance (default {@value #DEFAULT_TOLERANCE}) is relative to the problem's temperature scale
 * U ({@link #temperatureScale()}): the largest of |initial temperature|, |Dirichlet and ambient data|
 * over the horizon, |Q| L^2/k, |q| L/k for Neumann data, and, with Neumann at both faces, the mean
 * rise |q_0 + q_L| T/(rho c L) and |Q| T/(rho c); U = 1 when all of these vanish. A temperature
 * is returned only when its bound is at most tolerance * U, a heat flux when its bound is at most
 * tolerance * U k / L; otherwise the oracle throws {@link OracleException} with the reason.
 *
 * <h2>What the bound consists of</h2>
 * <ul>
 * <li>Series truncation: rigorous, from integration by parts of the modal projections and the
 * Gaussian sum bound of the decaying modes (no fitted constants).</li>
 * <li>Representation of the data by Chebyshev series (in t) and piecewise Chebyshev series (in x):
 * measured at random points against the expressions and multiplied by a safety factor 10; this part
 * rests on the smoothness of the data between the panels the fit found and is checked by tests, not
 * proved.</li>
 * <li>Gauss-Legendre projection and Duhamel quadrature: node counts chosen for machine precision
 * (checked by tests against doubled rules), plus the exp(-40) window cut-off.</li>
 * <li>Rounding: (64 + 2 n_t) ulps times the sum of the magnitudes of the terms.</li>
 * </ul>
 *
 * <h2>Rectangle, box and cylinder</h2>
 * The rectangle and box are solved by superposition of a source part, one elliptic series per face
 * with data and a decaying tensor-product transient; the cylinder by its J0 modes about the steady
 * state. Both take source and face data constant in time in this version; how they are bounded is on
 * {@code TensorSolver} and {@code RadialSolver}. Points are given as arrays of their coordinates
 * (x, y[, z] or r); gradients are certified to tolerance * U / L.
 *
 * @since 0.1
 */
public final class Oracle {
    /** Default relative tolerance. */
    public static final double DEFAULT_TOLERANCE = 1e-10;

    private final Problem problem;
    private final SlabSolver slab;
    private final double tolerance;
    private final boolean sphere;
    private final SpatialSolver spatial;

    private Oracle(Problem problem, SlabSolver slab, double tolerance, boolean sphere) {
        this.problem = problem;
        this.slab = slab;
        this.tolerance = tolerance;
        this.sphere = sphere;
        this.spatial = null;
    }

    private Oracle(Problem problem, SpatialSolver spatial, double tolerance) {
        this.problem = problem;
        this.slab = null;
        this.tolerance = tolerance;
        this.sphere = false;
        this.spatial = spatial;
    }

    /**
     * Prepares the series of {@code problem} for times 0 <= t <= timeHorizon.
     *
     * @throws OracleException if the problem's data are not finite, too rough, or of a kind not solved
     * @throws IllegalArgumentException if {@code tolerance} is not in (0, 1) or the horizon is negative
     */
    public static Oracle prepare(Problem problem, double timeHorizon, double tolerance) {
        if (problem.domain() instanceof Sphere sphereDomain && RadialSolver.prefersSphere(problem)) {
            // a flux surface or a small Biot number with data constant in time: the direct radial series
            return new Oracle(problem, new RadialSolver(problem, timeHorizon, tolerance), tolerance);
        }
        if (problem.domain() instanceof Sphere) {
            // u = w/r with w the solution of the mapped slab problem
            return new Oracle(problem, SphereMapping.solver(problem, timeHorizon, tolerance), tolerance, true);
        }
        if (problem.domain() instanceof Rectangle || problem.domain() instanceof Box) {
            return new Oracle(problem, new TensorSolver(problem, timeHorizon, tolerance), tolerance);
        }
        if (problem.domain() instanceof Cylinder) {
            return new Oracle(problem, new RadialSolver(problem, timeHorizon, tolerance), tolerance);
        }
        if (!(problem.domain() instanceof Slab)) {
            throw new OracleException(OracleException.Reason.UNSUPPORTED,
                "oracle: " + problem.domain() + " is not solved by this version");
        }
        return new Oracle(problem, new SlabSolver(problem, timeHorizon, tolerance), tolerance, false);
    }

    /** The problem this oracle solves. */
    public Problem problem() {
        return problem;
    }

    /** Relative tolerance. */
    public double tolerance() {
        return tolerance;
    }

    /**
     * Temperature scale U the tolerance is relative to (see the class documentation); for a sphere,
     * the mapped slab's scale divided by the radius.
     */
    public double temperatureScale() {
        if (spatial != null) {
            return spatial.scale();
        }
        return sphere ? slab.scale() / ((Sphere) problem.domain()).radius() : slab.scale();
    }

    /** Time horizon T prepared for. */
    public double timeHorizon() {
        return spatial != null ? spatial.horizon() : slab.horizon();
    }

    /** Number of coordinates of a point: 1 for the slab, cylinder and sphere, 2 or 3 for the rectangle and box. */
    public int dimension() {
        return spatial != null ? spatial.dimension() : 1;
    }

    /** Number of modes the series sums at time t (for the rectangle and box, of the transient part). */
    public int modesUsed(double t) {
        return spatial != null ? spatial.at(t).modes() : slab.at(t).modes();
    }

    /** Number of quasi-static subtractions applied (0 to 2); each speeds the tail by n^-2. */
    public int quasiStaticSubtractions() {
        return spatial != null ? 0 : slab.subtractions();
    }

    /** u(x, t) (for a sphere or cylinder, x is the radius r). @throws OracleException if outside the domain or not certified */
    public Evaluation temperature(double x, double t) {
        if (spatial != null) {
            return temperature(new double[] {x}, t);
        }
        return value(slab.at(t), x, t);
    }

    /**
     * u at a point given by its {@link #dimension()} coordinates (x, y[, z] or r).
     *
     * @throws OracleException if outside the domain or not certified
     */
    public Evaluation temperature(double[] point, double t) {
        requireDimension(point);
        if (spatial == null) {
            return temperature(point[0], t);
        }
        return spatial.at(t).temperature(point, 0);
    }

    /**
     * grad u at a point (K/m), each component with the same bound (certified to tolerance * U / L).
     *
     * @throws OracleException if outside the domain, at t = 0, or not certified
     */
    public Evaluation[] gradient(double[] point, double t) {
        requireDimension(point);
        double[] g = new double[point.length];
        double bound;
        if (spatial != null) {
            bound = spatial.at(t).gradient(point, 0, g, 0);
        } else {
            bound = oneDimensionalGradient(point[0], t, g);
        }
        Evaluation[] out = new Evaluation[g.length];
        for (int i = 0; i < g.length; i++) {
            out[i] = new Evaluation(g[i], bound);
        }
        return out;
    }

    private double oneDimensionalGradient(double x, double t, double[] g) {
        double k = problem.material().conductivity();
        if (sphere) {
            Evaluation e = SphereMapping.gradient(slab.at(t), x, ((Sphere) problem.domain()).radius(),
                tolerance * temperatureScale());
            g[0] = e.value();
            return e.bound();
        }
        Evaluation flux = slab.at(t).heatFlux(x);
        g[0] = -flux.value() / k;
        return flux.bound() / k;
    }

    private void requireDimension(double[] point) {
        if (point.length != dimension()) {
            throw new IllegalArgumentException("a point of " + problem.domain() + " has " + dimension()
                + " coordinates " + problem.domain().coordinates() + ", not " + point.length);
        }
    }

    /**
     * Evaluates many points of any body: {@code points} holds {@link #dimension()} coordinates per
     * point. Groups by time like {@link #evaluate}; {@code gradient} (n * dimension values, one bound
     * per point in {@code gradientBound}) may be null.
     *
     * @throws OracleException for the first point (lowest index) that is refused, "point i: ..."
     */
    public void evaluatePoints(double[] points, double[] t, double[] value, double[] bound, double[] gradient,
                               double[] gradientBound) {
        int dim = dimension();
        int n = t.length;
        if (points.length != n * dim || value.length < n || bound.length < n
            || (gradient != null && (gradient.length < n * dim || gradientBound.length < n))) {
            throw new IllegalArgumentException("points must hold " + dim + " coordinates per time, and the outputs"
                + " room for them");
        }
        if (spatial == null) {
            double[] x = points;
            evaluate(Quantity.TEMPERATURE, x, t, value, bound);
            if (gradient != null) {
                for (int i = 0; i < n; i++) {
                    double[] g = new double[1];
                    try {
                        gradientBound[i] = oneDimensionalGradient(x[i], t[i], g);
                    } catch (OracleException e) {
                        throw new OracleException(e.reason(), "point " + i + ": " + e.getMessage());
                    }
                    gradient[i] = g[0];
                }
            }
            return;
        }
        Integer[] order = byTime(t);
        int[] starts = runs(order, t);
        int runCount = starts.length - 1;
        int[] failed = {Integer.MAX_VALUE};
        OracleException[] failure = new OracleException[1];
        int[] first = runCount > 1 && spatial.steadyPart() != null ? firstOccurrence(points, dim, n) : null;
        Evaluation[][] shared = first == null ? null : sharedSteadyPart(points, dim, first);
        IntStream.range(0, runCount).parallel().forEach(r -> {
            int from = starts[r];
            int to = starts[r + 1];
            SpatialSolver.Slice slice;
            try {
                slice = spatial.at(t[order[from]]);
            } catch (OracleException e) {
                record(failed, failure, minIndex(order, from, to), e);
                return;
            }
            // points of one time in parallel blocks
            int blocks = Math.max(1, Math.min(64, (to - from) / 256));
            IntStream.range(0, blocks).parallel().forEach(b -> {
                int lo = from + (int) ((long) (to - from) * b / blocks);
                int hi = from + (int) ((long) (to - from) * (b + 1) / blocks);
                for (int i = lo; i < hi; i++) {
                    int p = order[i];
                    try {
                        Evaluation ev = shared == null ? slice.temperature(points, p * dim)
                            : slice.temperature(points, p * dim, shared[first[p]]);
                        value[p] = ev.value();
                        bound[p] = ev.bound();
                        if (gradient != null) {
                            gradientBound[p] = slice.gradient(points, p * dim, gradient, p * dim);
                        }
                    } catch (OracleException e) {
                        record(failed, failure, p, e);
                    }
                }
            });
        });
        if (failure[0] != null) {
            throw new OracleException(failure[0].reason(), "point " + failed[0] + ": " + failure[0].getMessage());
        }
    }

    /**
     * The time-independent part of u for each distinct point, computed once, when the points recur
     * at several times and the solver has such a part; null otherwise. An entry is null where that
     * part cannot be certified on its own (a point on a Dirichlet face, say): the slice then answers
     * alone and reports any refusal itself.
     */
    private Evaluation[][] sharedSteadyPart(double[] points, int dim, int[] first) {
        SpatialSolver.Steady part = spatial.steadyPart();
        int n = first.length;
        int[] distinct = IntStream.range(0, n).filter(p -> first[p] == p).toArray();
        if (part == null || distinct.length == n) {
            return null;
        }
        Evaluation[][] shared = new Evaluation[n][];
        IntStream.range(0, distinct.length).parallel().forEach(i -> {
            int q = distinct[i];
            try {
                shared[q] = part.temperature(points, q * dim);
            } catch (OracleException refused) {
                shared[q] = null;
            }
        });
        return shared;
    }

    /** For each point, the lowest index with bit-identical coordinates (open addressing on the bits). */
    static int[] firstOccurrence(double[] points, int dim, int n) {
        int size = Integer.highestOneBit(Math.max(2, 2 * n - 1)) << 1;
        int[] table = new int[size];
        Arrays.fill(table, -1);
        int[] first = new int[n];
        for (int p = 0; p < n; p++) {
            long h = 1125899906842597L;
            for (int i = 0; i < dim; i++) {
                h = 31 * h + Double.doubleToLongBits(points[p * dim + i]);
            }
            int slot = (int) (h ^ (h >>> 29) ^ (h >>> 47)) & (size - 1);
            while (true) {
                int q = table[slot];
                if (q < 0) {
                    table[slot] = p;
                    first[p] = p;
                    break;
                }
                if (sameCoordinates(points, dim, p, q)) {
                    first[p] = q;
                    break;
                }
                slot = (slot + 1) & (size - 1);
            }
        }
        return first;
    }

    private static boolean sameCoordinates(double[] points, int dim, int p, int q) {
        for (int i = 0; i < dim; i++) {
            if (Double.doubleToLongBits(points[p * dim + i]) != Double.doubleToLongBits(points[q * dim + i])) {
                return false;
            }
        }
        return true;
    }

    private static Integer[] byTime(double[] t) {
        Integer[] order = new Integer[t.length];
        for (int i = 0; i < t.length; i++) {
            order[i] = i;
        }
        Arrays.sort(order, (a, b) -> Double.compare(t[a], t[b]));
        return order;
    }

    private static int[] runs(Integer[] order, double[] t) {
        int n = order.length;
        int[] starts = new int[n + 1];
        int runs = 0;
        for (int i = 0; i < n; i++) {
            if (i == 0 || Double.compare(t[order[i]], t[order[i - 1]]) != 0) {
                starts[runs++] = i;
            }
        }
        starts[runs] = n;
        return Arrays.copyOf(starts, runs + 1);
    }

    private Evaluation value(SlabSolver.Slice slice, double x, double t) {
        if (!sphere) {
            return slice.temperature(x);
        }
        if (t == 0 && !problem.steady()) {
            // the initial temperature itself, where it is finite
            double g = problem.initial().value(x);
            if (!Double.isFinite(g)) {
                throw new OracleException(OracleException.Reason.DATA_NOT_FINITE, "oracle: initial is " + g + " at r = "
                    + x);
            }
            slice.temperature(x); // the mapped problem's checks (a jump of w at t = 0)
            return new Evaluation(g, 4 * Math.ulp(1.0) * Math.max(Math.abs(g), 1e-3 * temperatureScale()));
        }
        return slice.valueOverX(x);
    }

    /** Heat flux -k du/dx (W/m^2, positive in +x). @throws OracleException if not certified */
    public Evaluation heatFlux(double x, double t) {
        if (spatial != null) {
            throw new OracleException(OracleException.Reason.UNSUPPORTED, "oracle: heatFlux(x, t) is the slab's; use"
                + " gradient(point, t) for " + problem.domain());
        }
        requireSlab("heat flux");
        return slab.at(t).heatFlux(x);
    }

    /**
     * Exact mean of u over the axis-aligned cell from the corner {@code lo} to {@code hi} (rectangle,
     * box), or the shell lo[0] < r < hi[0] (cylinder, sphere; weight r or r^2), or [lo, hi] (slab).
     * Cells that touch a face with data are refused in the rectangle and box.
     *
     * @throws OracleException if not certified
     */
    public Evaluation cellAverage(double[] lo, double[] hi, double t) {
        requireDimension(lo);
        requireDimension(hi);
        if (spatial == null || spatial.dimension() == 1) {
            return cellAverage(lo[0], hi[0], t);
        }
        return spatial.at(t).average(lo, hi);
    }

    /** Exact mean of u over [x0, x1] (for a cylinder or sphere the shell x0 < r < x1). @throws OracleException if not certified */
    public Evaluation cellAverage(double x0, double x1, double t) {
        if (sphere) {
            return SphereMapping.shellAverage(slab.at(t), x0, x1, tolerance * temperatureScale());
        }
        if (spatial != null) {
            if (spatial.dimension() != 1) {
                throw new OracleException(OracleException.Reason.UNSUPPORTED, "oracle: the cell of " + problem.domain()
                    + " has " + spatial.dimension() + " coordinates; use cellAverage(lo, hi, t)");
            }
            return spatial.at(t).average(new double[] {x0}, new double[] {x1});
        }
        requireSlab("cell average");
        return slab.at(t).cellAverage(x0, x1);
    }

    private void requireSlab(String what) {
        if (sphere) {
            throw new OracleException(OracleException.Reason.UNSUPPORTED, "oracle: the " + what + " of a sphere is not"
                + " in this version; the temperature is");
        }
    }

    /** Which quantity a bulk evaluation computes. */
    public enum Quantity { TEMPERATURE, HEAT_FLUX }

    /**
     * Evaluates many points: groups them by time (the time-dependent part is computed once per
     * distinct t) and sums in parallel.
     *
     * @param x coordinates (m)
     * @param t times (s), same length
     * @param value receives the values
     * @param bound receives the bounds
     * @throws OracleException for the first point (lowest index) that is refused; its message starts
     *     with "point i: " (0-based)
     */
    public void evaluate(Quantity quantity, double[] x, double[] t, double[] value, double[] bound) {
        int n = x.length;
        if (t.length != n || value.length < n || bound.length < n) {
            throw new IllegalArgumentException("x, t, value and bound must have the same length");
        }
        if (spatial != null) {
            if (spatial.dimension() != 1 || quantity != Quantity.TEMPERATURE) {
                throw new OracleException(OracleException.Reason.UNSUPPORTED, "oracle: evaluate(x, t) is for one"
                    + " coordinate and the temperature; use evaluatePoints for " + problem.domain());
            }
            evaluatePoints(x, t, value, bound, null, null);
            return;
        }
        Integer[] order = byTime(t);
        int[] starts = runs(order, t); // runs of equal time
        int[] failed = {Integer.MAX_VALUE};
        OracleException[] failure = new OracleException[1];
        final int runCount = starts.length - 1;
        IntStream.range(0, runCount).parallel().forEach(r -> {
            int from = starts[r];
            int to = starts[r + 1];
            SlabSolver.Slice slice;
            try {
                slice = slab.at(t[order[from]]);
            } catch (OracleException e) {
                record(failed, failure, minIndex(order, from, to), e);
                return;
            }
            for (int i = from; i < to; i++) {
                int p = order[i];
                try {
                    if (sphere && quantity == Quantity.HEAT_FLUX) {
                        requireSlab("heat flux");
                    }
                    Evaluation ev = quantity == Quantity.TEMPERATURE ? value(slice, x[p], t[p]) : slice.heatFlux(x[p]);
                    value[p] = ev.value();
                    bound[p] = ev.bound();
                } catch (OracleException e) {
                    record(failed, failure, p, e);
                }
            }
        });
        if (failure[0] != null) {
            throw new OracleException(failure[0].reason(), "point " + failed[0] + ": " + failure[0].getMessage());
        }
    }

    private static int minIndex(Integer[] order, int from, int to) {
        int m = Integer.MAX_VALUE;
        for (int i = from; i < to; i++) {
            m = Math.min(m, order[i]);
        }
        return m;
    }

    private static synchronized void record(int[] failed, OracleException[] failure, int index, OracleException e) {
        if (index < failed[0]) {
            failed[0] = index;
            failure[0] = e;
        }
    }
}

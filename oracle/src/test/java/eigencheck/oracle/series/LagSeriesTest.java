package eigencheck.oracle.series;

import static eigencheck.oracle.testing.NumericAssertions.assertWithin;
import static org.junit.jupiter.api.Assertions.assertTrue;

import eigencheck.oracle.Evaluation;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Rectangle;
import eigencheck.oracle.problem.Side;
import java.util.EnumMap;
import java.util.Map;
import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;

/** P, with -alpha Laplace P = 1, as one series with closed-form profiles. */
class LagSeriesTest {
    private static final double INF = Double.POSITIVE_INFINITY;

    @Test
    void unitSquarePoissonCentreValueAlongEitherAxis() {
        // the classical double-series value of the unit square's centre, 0.0736713532814 (recalled from memory)
        AxisModes[] axes = {new AxisModes(1, INF, INF), new AxisModes(1, INF, INF)};
        LagSeries p = new LagSeries(axes, 1, new double[][] {{INF, INF}, {INF, INF}});
        for (int along = 0; along < 2; along++) {
            Evaluation e = p.value(new double[] {0.5, 0.5}, 0, 1e-11, along);
            assertWithin(0.0736713532814, e, 2e-11, "centre, modes along axis " + along);
            assertWithin(0, p.value(new double[] {0.5, 0}, 0, 1e-11, along), 2e-11, "on the side y = 0");
        }
    }

    @Test
    void bothExpansionsAgreeOnTheSidesAndMatchTheFaceSeriesInside() {
        // Dirichlet x = 0, Robin x = L (h/k = 3), Neumann y = 0, Robin y = L (h/k = 0.5): the expansion along x
        // (profiles in y) and along y (profiles in x) are different representations of one P; inside, so is the
        // rectangle solver's source part plus face series for the steady problem -k Laplace P = rho c
        double lx = 0.7;
        double ly = 0.45;
        double alpha = 0.8;
        double[][] hOverK = {{INF, 3}, {0, 0.5}};
        AxisModes[] axes = {new AxisModes(lx, INF, 3), new AxisModes(ly, 0, 0.5)};
        LagSeries p = new LagSeries(axes, alpha, hOverK);
        double budget = 1e-11;
        for (double[] q : new double[][] {{0.3, 0}, {0.3, ly}, {lx, 0.2}, {0, 0.1}, {lx, ly}, {0.01, 0.44}}) {
            Evaluation a = p.value(q, 0, budget, 0);
            Evaluation b = p.value(q, 0, budget, 1);
            assertTrue(Math.abs(a.value() - b.value()) <= a.bound() + b.bound(), "P at " + q[0] + ", " + q[1] + ": "
                + a.value() + " +- " + a.bound() + " along x, " + b.value() + " +- " + b.bound() + " along y");
        }
        Map<Side, BoundaryCondition> faces = new EnumMap<>(Side.class);
        double k = 2;
        faces.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("0", "y", "t")));
        faces.put(Side.XMAX, new BoundaryCondition.Robin(3 * k, Expression.parse("0", "y", "t")));
        faces.put(Side.YMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        faces.put(Side.YMAX, new BoundaryCondition.Robin(0.5 * k, Expression.parse("0", "x", "t")));
        Problem steady = new Problem(new Rectangle(lx, ly), new Material(k, k / alpha), Expression.parse("0", "x", "y"),
            Expression.parse(String.valueOf(k / alpha), "x", "y", "t"), faces, true);
        SpatialSolver.Slice solver = new TensorSolver(steady, 0, 1e-11).at(Double.POSITIVE_INFINITY);
        SplittableRandom random = new SplittableRandom(4);
        for (int i = 0; i < 40; i++) {
            double[] q = {(0.05 + 0.9 * random.nextDouble()) * lx, (0.05 + 0.9 * random.nextDouble()) * ly};
            Evaluation a = p.value(q, 0, budget);
            Evaluation b = solver.temperature(q, 0);
            assertTrue(Math.abs(a.value() - b.value()) <= a.bound() + b.bound(), "P at " + q[0] + ", " + q[1] + ": "
                + a.value() + " +- " + a.bound() + " by one series, " + b.value() + " +- " + b.bound() + " by the solver");
        }
    }
    @Test
    void closedFormSplitMatchesBothPlainExpansionsAndTheFaceSeriesGradient() {
        // the split form (the one-dimensional quadratic plus exponentially decaying corrections) against the plain
        // expansions, near sides and corners included, and its gradient against the rectangle solver's inside
        double lx = 0.7;
        double ly = 0.45;
        double alpha = 0.8;
        double k = 2;
        double[][] hOverK = {{INF, 3}, {0, 0.5}};
        AxisModes[] axes = {new AxisModes(lx, INF, 3), new AxisModes(ly, 0, 0.5)};
        LagSeries p = new LagSeries(axes, alpha, hOverK);
        double budget = 1e-11;
        double[] bounds = new double[2];
        double[][] points = {{0.3, 1e-4}, {0.004, 0.002}, {lx, 0.2}, {0.69, 0.44}, {0.35, 0.2}, {0, ly}, {1e-6, 0.3}};
        for (double[] q : points) {
            double split = p.evaluate(q, 0, budget, null, bounds);
            for (int along = 0; along < 2; along++) {
                Evaluation plain = p.value(q, 0, budget, along);
                assertTrue(Math.abs(split - plain.value()) <= bounds[0] + plain.bound(), "P at " + q[0] + ", " + q[1]
                    + ": split " + split + " +- " + bounds[0] + ", plain along " + along + " " + plain.value() + " +- "
                    + plain.bound());
            }
        }
        Map<Side, BoundaryCondition> faces = new EnumMap<>(Side.class);
        faces.put(Side.XMIN, new BoundaryCondition.Dirichlet(Expression.parse("0", "y", "t")));
        faces.put(Side.XMAX, new BoundaryCondition.Robin(3 * k, Expression.parse("0", "y", "t")));
        faces.put(Side.YMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        faces.put(Side.YMAX, new BoundaryCondition.Robin(0.5 * k, Expression.parse("0", "x", "t")));
        Problem steady = new Problem(new Rectangle(lx, ly), new Material(k, k / alpha), Expression.parse("0", "x", "y"),
            Expression.parse(String.valueOf(k / alpha), "x", "y", "t"), faces, true);
        SpatialSolver.Slice solver = new TensorSolver(steady, 0, 1e-11).at(Double.POSITIVE_INFINITY);
        SplittableRandom random = new SplittableRandom(9);
        double[] g = new double[2];
        double[] reference = new double[2];
        for (int i = 0; i < 30; i++) {
            double[] q = {(0.05 + 0.9 * random.nextDouble()) * lx, (0.05 + 0.9 * random.nextDouble()) * ly};
            p.evaluate(q, 0, budget, g, bounds);
            double referenceBound = solver.gradient(q, 0, reference, 0);
            for (int c = 0; c < 2; c++) {
                assertTrue(Math.abs(g[c] - reference[c]) <= bounds[1] + referenceBound, "dP/dx" + c + " at " + q[0] + ", "
                    + q[1] + ": " + g[c] + " +- " + bounds[1] + " by the split, " + reference[c] + " +- " + referenceBound);
            }
        }
        // cell means (a cell at a corner included) against a 12 x 12 Gauss-Legendre rule on the split values
        GaussLegendre rule = GaussLegendre.of(12);
        double[][][] cells = {{{0, 0}, {0.05, 0.04}}, {{0.3, 0.1}, {0.45, 0.3}}, {{0.6, 0.4}, {lx, ly}}};
        for (double[][] cell : cells) {
            double[] lo = cell[0];
            double[] hi = cell[1];
            double mean = 0;
            double quadratureBound = 0;
            for (int a = 0; a < 12; a++) {
                for (int b = 0; b < 12; b++) {
                    double[] q = {lo[0] + (hi[0] - lo[0]) * 0.5 * (rule.nodes[a] + 1),
                        lo[1] + (hi[1] - lo[1]) * 0.5 * (rule.nodes[b] + 1)};
                    double w = 0.25 * rule.weights[a] * rule.weights[b];
                    mean += w * p.evaluate(q, 0, budget, null, bounds);
                    quadratureBound += w * bounds[0];
                }
            }
            Evaluation exact = p.average(lo, hi, budget);
            assertTrue(Math.abs(mean - exact.value()) <= exact.bound() + quadratureBound + 1e-12 * Math.abs(mean),
                "mean over " + java.util.Arrays.toString(lo) + " - " + java.util.Arrays.toString(hi) + ": " + exact.value()
                    + " +- " + exact.bound() + ", by the rule " + mean);
        }
        // on the Neumann side y = 0 the normal derivative vanishes; on the Dirichlet side x = 0, P does
        p.evaluate(new double[] {0.3, 0}, 0, budget, g, bounds);
        assertTrue(Math.abs(g[1]) <= bounds[1], "dP/dy on y = 0: " + g[1] + " +- " + bounds[1]);
        double onDirichlet = p.evaluate(new double[] {0, 0.2}, 0, budget, null, bounds);
        assertTrue(Math.abs(onDirichlet) <= bounds[0], "P on x = 0: " + onDirichlet + " +- " + bounds[0]);
    }
}

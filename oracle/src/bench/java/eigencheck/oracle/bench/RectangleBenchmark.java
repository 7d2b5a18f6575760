package eigencheck.oracle.bench;

import eigencheck.oracle.Oracle;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Rectangle;
import eigencheck.oracle.problem.Side;
import java.util.EnumMap;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

/**
 * A steel plate 0.2 m x 0.1 m convecting on all four sides (h = 40, 200, 60, 100 W/(m^2 K), ambient 0:
 * temperatures relative to the ambient) with a heat source peaked along x and a non-uniform initial
 * temperature, at 10^5 points (cell centres of a 400 x 250 grid) and 10 times, to tolerance 1e-8.
 * Target (issue 5): under 3 s on 2 cores. The source's part gives the y sides data h P(x), so each y
 * side carries an elliptic series, which needs thousands of modes for the cell centres nearest to it.
 * That series does not change in time: one bulk call computes it once per distinct point and shares it
 * among the 10 times. The variant {@code insulatedSides} makes the y sides insulated (no face series:
 * the source part and the transient alone); {@code risingAmbient} keeps the four convective sides and
 * lets their common ambient rise as 300 (1 - exp(-t/200)), a moving level: the lag P and the particular
 * modes join, and P's series at the cell centres nearest the sides is shared among the times too.
 * {@code ownSchedules} gives two sides ambients of their own that change in time: x = 0 follows
 * 300 (1 - exp(-t/200)), y = 0 follows 100 (1 - exp(-t/100)) (1 + 5 x); each side term's shape series and
 * two lags are shared among the times, its particular modes are computed once per time.
 * {@code spotSource} keeps the four convective sides and makes the source a spot peaked in x and y,
 * 2e5 exp(-((x - 0.06)^2 + (y - 0.04)^2)/4e-4), not a sum of one-coordinate terms: the remainder's
 * double series joins the steady part (shared among the times) and the transient subtracts its projection.
 * {@code switchedSpot} switches that spot on, 2e5 exp(...) (1 - exp(-t/120)), from a plate with no
 * source at t = 0: one term shape x schedule, whose steady response V is shared among the times and whose
 * modes -V_J E_J(t) are computed once per time.
 *
 * <pre>mvn -q -pl oracle -Pbenchmark test-compile exec:exec -Dbench.args="RectangleBenchmark"</pre>
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(value = 1, jvmArgs = {"-Xmx4g"})
@Warmup(iterations = 2)
@Measurement(iterations = 5)
public class RectangleBenchmark {
    static final int NX = 400;
    static final int NY = 250;
    static final int TIMES = 10;

    @Param({"convecting", "insulatedSides", "risingAmbient", "ownSchedules", "spotSource", "switchedSpot"})
    String sides;

    Problem problem;
    Oracle oracle;
    double[] points;
    double[] t;
    double[] value;
    double[] bound;

    static Problem problem(String sides) {
        boolean insulated = "insulatedSides".equals(sides);
        String ambient = "risingAmbient".equals(sides) ? "300*(1 - exp(-t/200))" : "0";
        boolean own = "ownSchedules".equals(sides);
        Map<Side, BoundaryCondition> faces = new EnumMap<>(Side.class);
        faces.put(Side.XMIN, new BoundaryCondition.Robin(40, Expression.parse(own ? "300*(1 - exp(-t/200))" : ambient,
            "y", "t")));
        faces.put(Side.XMAX, new BoundaryCondition.Robin(200, Expression.parse(ambient, "y", "t")));
        if (insulated) {
            faces.put(Side.YMIN, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
            faces.put(Side.YMAX, new BoundaryCondition.Neumann(Expression.parse("0", "x", "t")));
        } else {
            faces.put(Side.YMIN, new BoundaryCondition.Robin(60, Expression.parse(own
                ? "100*(1 - exp(-t/100))*(1 + 5*x)" : ambient, "x", "t")));
            faces.put(Side.YMAX, new BoundaryCondition.Robin(100, Expression.parse(ambient, "x", "t")));
        }
        return new Problem(new Rectangle(0.2, 0.1), new Material(15, 4e6),
            Expression.parse("20 + 300*x*y", "x", "y"),
            Expression.parse("spotSource".equals(sides) ? "2e5*exp(-((x - 0.06)^2 + (y - 0.04)^2)/4e-4)"
                : "switchedSpot".equals(sides) ? "2e5*exp(-((x - 0.06)^2 + (y - 0.04)^2)/4e-4)*(1 - exp(-t/120))"
                : "2e5*exp(-(x - 0.06)^2/4e-4)", "x", "y", "t"), faces);
    }

    static double time(int j) {
        return 60.0 * (j + 1);
    }

    @Setup(Level.Trial)
    public void setUp() {
        problem = problem(sides);
        oracle = Oracle.prepare(problem, time(TIMES - 1), 1e-8);
        int n = NX * NY * TIMES;
        points = new double[2 * n];
        t = new double[n];
        value = new double[n];
        bound = new double[n];
        int p = 0;
        for (int j = 0; j < TIMES; j++) {
            for (int a = 0; a < NX; a++) {
                for (int b = 0; b < NY; b++) {
                    points[2 * p] = 0.2 * (a + 0.5) / NX;
                    points[2 * p + 1] = 0.1 * (b + 0.5) / NY;
                    t[p] = time(j);
                    p++;
                }
            }
        }
        oracle.evaluatePoints(points, t, value, bound, null, null);
        double worst = 0;
        for (double v : bound) {
            worst = Math.max(worst, v);
        }
        System.err.printf("transient modes at t = %.0f s: %d, at %.0f s: %d; scale %.4g; largest bound %.2e%n", time(0),
            oracle.modesUsed(time(0)), time(TIMES - 1), oracle.modesUsed(time(TIMES - 1)), oracle.temperatureScale(),
            worst);
    }

    /** 10^5 points at 10 times on a prepared oracle. */
    @Benchmark
    public double evaluate() {
        oracle.evaluatePoints(points, t, value, bound, null, null);
        return value[value.length / 2];
    }

    /** Preparation and evaluation together, as one eval command does. */
    @Benchmark
    public double prepareAndEvaluate() {
        Oracle o = Oracle.prepare(problem, time(TIMES - 1), 1e-8);
        o.evaluatePoints(points, t, value, bound, null, null);
        return value[value.length / 2];
    }
}

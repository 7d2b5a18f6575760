package eigencheck.oracle.bench;

import eigencheck.oracle.Oracle;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Cylinder;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
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
 * A steel rod of radius 20 mm heated along its axis by a core 6 mm wide whose power ramps up and
 * pulses, 4e7 exp(-(r/0.006)^2) (1 - exp(-t/20)) (1 + 0.5 sin(t/15)) W/m^3 (a change in time that differs from
 * radius to radius), convecting at h = 150 W/(m^2 K) to 20 degC; 10^6 (r, t) points (10^4 radii at 100 times
 * from 3 s to 300 s) at the tolerance given.
 *
 * <pre>mvn -q -pl oracle -Pbenchmark test-compile exec:exec -Dbench.args="RodBenchmark"</pre>
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(value = 1, jvmArgs = {"-Xmx2g"})
@Warmup(iterations = 2)
@Measurement(iterations = 3)
public class RodBenchmark {
    static final int TIMES = 100;
    static final int RADII = 10_000;

    @Param({"1e-8", "1e-10"})
    double tolerance;

    Problem problem;
    Oracle oracle;
    double[] r;
    double[] t;
    double[] value;
    double[] bound;

    @Setup(Level.Trial)
    public void setUp() {
        problem = new Problem(new Cylinder(0.02), new Material(45, 3.8e6), Expression.parse("20", "r"),
            Expression.parse("4e7*exp(-(r/0.006)^2)*(1 - exp(-t/20))*(1 + 0.5*sin(t/15))", "r", "t"),
            Map.of(Side.SURFACE, new BoundaryCondition.Robin(150, Expression.parse("20", "t"))));
        oracle = Oracle.prepare(problem, 300, tolerance);
        int n = TIMES * RADII;
        r = new double[n];
        t = new double[n];
        value = new double[n];
        bound = new double[n];
        for (int j = 0; j < TIMES; j++) {
            for (int i = 0; i < RADII; i++) {
                r[j * RADII + i] = 0.02 * i / (RADII - 1);
                t[j * RADII + i] = 3.0 * (j + 1);
            }
        }
        oracle.evaluate(Oracle.Quantity.TEMPERATURE, r, t, value, bound);
        double largest = 0;
        for (double b : bound) {
            largest = Math.max(largest, b);
        }
        System.err.printf("modes at t = 3 s: %d, at 300 s: %d; largest bound %.3g, scale %.4g%n", oracle.modesUsed(3),
            oracle.modesUsed(300), largest, oracle.temperatureScale());
    }

    /** 10^6 points on a prepared oracle. */
    @Benchmark
    public double evaluateMillionPoints() {
        oracle.evaluate(Oracle.Quantity.TEMPERATURE, r, t, value, bound);
        return value[value.length / 2];
    }

    /** Preparing the oracle and evaluating 10^6 points. */
    @Benchmark
    public double prepareAndEvaluate() {
        Oracle.prepare(problem, 300, tolerance).evaluate(Oracle.Quantity.TEMPERATURE, r, t, value, bound);
        return value[value.length / 2];
    }
}

package eigencheck.oracle.bench;

import eigencheck.oracle.Oracle;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Sphere;
import java.util.Map;
import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Level;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;

/**
 * A sphere of radius 30 mm quenched by convection (Bi = 2.4) with a time-varying ambient and a
 * uniform source, at 10^6 (r, t) points (10^4 radii at 100 times) to tolerance 1e-10.
 * Target (issue 5): under 2 s on 2 cores.
 *
 * <pre>mvn -q -pl oracle -Pbenchmark test-compile exec:exec -Dbench.args="SphereBenchmark"</pre>
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(value = 1, jvmArgs = {"-Xmx2g"})
@Warmup(iterations = 3)
@Measurement(iterations = 5)
public class SphereBenchmark {
    static final int TIMES = 100;
    static final int RADII = 10_000;

    Oracle oracle;
    double[] r;
    double[] t;
    double[] value;
    double[] bound;

    @Setup(Level.Trial)
    public void setUp() {
        Problem p = new Problem(new Sphere(0.03), new Material(20, 3.6e6), Expression.parse("400", "r"),
            Expression.parse("5e4", "r", "t"), Map.of(Side.SURFACE, new BoundaryCondition.Robin(1600,
            Expression.parse("20 + 10*sin(0.01*t)", "t"))));
        oracle = Oracle.prepare(p, 1000, 1e-10);
        int n = TIMES * RADII;
        r = new double[n];
        t = new double[n];
        value = new double[n];
        bound = new double[n];
        for (int j = 0; j < TIMES; j++) {
            for (int i = 0; i < RADII; i++) {
                r[j * RADII + i] = 0.03 * i / (RADII - 1);
                t[j * RADII + i] = 10.0 * (j + 1);
            }
        }
        System.err.printf("modes at t = 10 s: %d, at 1000 s: %d%n", oracle.modesUsed(10), oracle.modesUsed(1000));
    }

    /** 10^6 points on a prepared oracle. */
    @Benchmark
    public double evaluateMillionPoints() {
        oracle.evaluate(Oracle.Quantity.TEMPERATURE, r, t, value, bound);
        return value[value.length / 2];
    }
}

package eigencheck.oracle.bench;

import eigencheck.oracle.Oracle;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Material;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Slab;
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
 * A Robin-Dirichlet steel wall (L = 50 mm) with a moving, non-separable heat source and time-varying
 * face data, evaluated at 10^6 (x, t) points (10^4 nodes at 100 output times) to tolerance 1e-10.
 * Target (issue 2): under 2 s on 2 cores after warm-up.
 *
 * <pre>mvn -q -pl oracle -Pbenchmark test-compile exec:exec -Dbench.args="SlabBenchmark"</pre>
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(value = 1, jvmArgs = {"-Xmx2g"})
@Warmup(iterations = 3)
@Measurement(iterations = 5)
public class SlabBenchmark {
    static final int TIMES = 100;
    static final int NODES = 10_000;

    Problem problem;
    Oracle oracle;
    double[] x;
    double[] t;
    double[] value;
    double[] bound;

    static Problem problem() {
        return new Problem(new Slab(0.05), new Material(15, 4e6), Expression.parse("20 + 600*x", "x"),
            Expression.parse("2e5*exp(-(x - 0.01 - 1e-5*t)^2/1e-4)", "x", "t"),
            Map.of(Side.XMIN, new BoundaryCondition.Robin(40, Expression.parse("20 + 5*sin(0.002*t)", "t")),
                Side.XMAX, new BoundaryCondition.Dirichlet(Expression.parse("50 + 0.01*t", "t"))));
    }

    @Setup(Level.Trial)
    public void setUp() {
        problem = problem();
        oracle = Oracle.prepare(problem, 3000, 1e-10);
        int n = TIMES * NODES;
        x = new double[n];
        t = new double[n];
        value = new double[n];
        bound = new double[n];
        for (int j = 0; j < TIMES; j++) {
            for (int i = 0; i < NODES; i++) {
                x[j * NODES + i] = 0.05 * i / (NODES - 1);
                t[j * NODES + i] = 30.0 * (j + 1);
            }
        }
        int fewest = Integer.MAX_VALUE;
        int most = 0;
        for (int j = 0; j < TIMES; j++) {
            int m = oracle.modesUsed(30.0 * (j + 1));
            fewest = Math.min(fewest, m);
            most = Math.max(most, m);
        }
        System.err.printf("modes per time: %d to %d; quasi-static subtractions %d; scale %.4g%n", fewest, most,
            oracle.quasiStaticSubtractions(), oracle.temperatureScale());
    }

    /** 10^6 points on a prepared oracle (the time-dependent part once per distinct t). */
    @Benchmark
    public double evaluateMillionPoints() {
        oracle.evaluate(Oracle.Quantity.TEMPERATURE, x, t, value, bound);
        return value[value.length / 2];
    }

    /** Preparation alone: data fits, projections, closed forms. */
    @Benchmark
    public Oracle prepare() {
        return Oracle.prepare(problem, 3000, 1e-10);
    }
}

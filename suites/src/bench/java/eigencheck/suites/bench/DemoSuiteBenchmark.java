package eigencheck.suites.bench;

import eigencheck.suites.Results;
import eigencheck.suites.Suite;
import eigencheck.suites.SuiteRunner;
import eigencheck.suites.files.SuiteFile;
import eigencheck.suites.report.Reports;
import java.nio.file.Files;
import java.nio.file.Path;
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
 * The demo suite's harness time: everything but the solver processes (issue 4 target: under 10 s on
 * 2 cores). The set-up runs the suite once so that every level is cached; each measured run then
 * reads the outputs, evaluates the oracle, computes the norms and the analysis, and writes all reports.
 *
 * <pre>mvn -q -pl suites -am -DskipTests install && mvn -q -pl suites -Pbenchmark test-compile exec:exec \
 *   -Dbench.args=DemoSuiteBenchmark</pre>
 */
@State(Scope.Benchmark)
@BenchmarkMode(Mode.SingleShotTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Fork(1)
@Warmup(iterations = 2)
@Measurement(iterations = 5)
public class DemoSuiteBenchmark {
    Suite suite;
    Path report;

    @Setup(Level.Trial)
    public void runOnce() throws Exception {
        Path file = Path.of(System.getProperty("demo.suite", "../reference-data/demo/suite.yaml"));
        suite = SuiteFile.read(file);
        report = Files.createTempDirectory("eigencheck-demo-bench");
        SuiteRunner.run(suite, report, 2);
    }

    @Benchmark
    public Results.SuiteResult harnessTime() throws Exception {
        Results.SuiteResult r = SuiteRunner.run(suite, report, 2);
        Reports.writeAll(suite, r, report);
        return r;
    }
}

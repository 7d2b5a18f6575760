package eigencheck.suites.junit;

import eigencheck.adapters.InputException;
import eigencheck.suites.Results;
import eigencheck.suites.Suite;
import eigencheck.suites.SuiteRunner;
import eigencheck.suites.Verdict;
import eigencheck.suites.files.SuiteFile;
import eigencheck.suites.report.Reports;
import eigencheck.suites.run.LevelRunner;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.stream.Stream;
import org.junit.jupiter.api.Assertions;
import org.junit.jupiter.api.DynamicTest;

/**
 * A suite file as JUnit 5 dynamic tests, one per case, for a team's own Maven build:
 * <pre>
 * &#64;TestFactory
 * Stream&lt;DynamicTest&gt; convergence() throws InputException {
 *     return SuiteTests.of(Path.of("src/test/suites/solver.yaml"), Path.of("target/eigencheck"));
 * }
 * </pre>
 * A failed case fails its test with the numbers; a case that cannot be run fails with the log tail.
 * Allure's JUnit 5 integration picks the tests up as usual; the file reports are written too.
 *
 * @since 0.1
 */
public final class SuiteTests {
    private SuiteTests() {
    }

    /**
     * @param reportDir folder for the level runs and the reports
     * @throws InputException if the suite file is wrong (reported before any test runs)
     */
    public static Stream<DynamicTest> of(Path suiteFile, Path reportDir) throws InputException {
        Suite suite = SuiteFile.read(suiteFile);
        List<DynamicTest> tests = new ArrayList<>();
        List<Results.CaseResult> done = new ArrayList<>();
        for (Suite.Case c : suite.cases()) {
            tests.add(DynamicTest.dynamicTest(c.name(), suiteFile.toUri(), () -> {
                List<LevelRunner.Outcome> runs = new ArrayList<>();
                for (Suite.Level l : c.levels()) {
                    runs.add(LevelRunner.run(suite, c, l, reportDir.resolve("runs").resolve(c.name())
                        .resolve("level-" + l.index())));
                }
                Results.CaseResult r = SuiteRunner.analyse(c, runs);
                synchronized (done) {
                    done.add(r);
                    if (done.size() == suite.cases().size()) {
                        try {
                            Reports.writeAll(suite, new Results.SuiteResult(suite.name(), suiteFile.toString(),
                                java.time.Instant.now().toString(), 0, List.copyOf(done), java.util.Map.of()), reportDir);
                        } catch (IOException e) {
                            throw new UncheckedIOException(e);
                        }
                    }
                }
                if (r.verdict() != Verdict.PASSED) {
                    Assertions.fail(c.name() + " " + r.verdict() + ": " + r.message());
                }
            }));
        }
        return tests.stream();
    }
}

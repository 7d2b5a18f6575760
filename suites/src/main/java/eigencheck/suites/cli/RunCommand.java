package eigencheck.suites.cli;

import eigencheck.suites.Results;
import eigencheck.suites.Suite;
import eigencheck.suites.SuiteRunner;
import eigencheck.suites.Verdict;
import eigencheck.suites.files.SuiteFile;
import eigencheck.suites.report.Baseline;
import eigencheck.suites.report.ConsoleReport;
import eigencheck.suites.report.Reports;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code eigencheck run SUITE [--report DIR] [--baseline RESULTS.json] [--jobs N]}: the main job. */
@Command(name = "run", mixinStandardHelpOptions = true,
    description = {"Run a refinement suite: run or read every level, compare with the certified reference, analyse",
        "the convergence, judge each case, and write the reports (console, results.json, junit.xml, allure-results/,",
        "report.html). Exit 0 when every case passes, 1 when a case fails or errs or a regression is found."})
final class RunCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "SUITE", description = "suite file (.yaml, .yml or .json)")
    Path suiteFile;

    @Option(names = "--report", paramLabel = "DIR", defaultValue = "eigencheck-report",
        description = "folder for the reports and the level runs (default ${DEFAULT-VALUE})")
    Path report;

    @Option(names = "--baseline", paramLabel = "RESULTS.json", description = "results.json of an earlier run: a norm"
        + " that grew beyond the case's slack, or a fitted order that fell, fails the run")
    Path baseline;

    @Option(names = "--jobs", paramLabel = "N", defaultValue = "1", description = "levels and cases run in parallel"
        + " (default ${DEFAULT-VALUE})")
    int jobs;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        if (jobs < 1) {
            throw new picocli.CommandLine.ParameterException(spec.commandLine(), "--jobs " + jobs + " must be >= 1");
        }
        Suite suite = SuiteFile.read(suiteFile);
        Results.SuiteResult result = SuiteRunner.run(suite, report, jobs);
        PrintWriter out = spec.commandLine().getOut();
        ConsoleReport.print(result, out);
        Reports.writeAll(suite, result, report);
        out.println("reports: " + report.resolve("report.html") + ", results.json, junit.xml, allure-results/");
        boolean ok = result.count(Verdict.FAILED) == 0 && result.count(Verdict.ERROR) == 0;
        if (baseline != null) {
            List<String> regressions = Baseline.regressions(result, suite, baseline);
            if (regressions.isEmpty()) {
                out.println("baseline " + baseline + ": no regression");
            } else {
                out.println("baseline " + baseline + ": " + regressions.size() + " regression(s)");
                regressions.forEach(r -> out.println("  regression: " + r));
                ok = false;
            }
        }
        out.flush();
        return ok ? Main.OK : Main.FAILED;
    }
}

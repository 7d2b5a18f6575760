package eigencheck.suites.report;

import eigencheck.suites.Results;
import eigencheck.suites.Verdict;
import io.qameta.allure.AllureLifecycle;
import io.qameta.allure.FileSystemResultsWriter;
import io.qameta.allure.model.Label;
import io.qameta.allure.model.Parameter;
import io.qameta.allure.model.Status;
import io.qameta.allure.model.StatusDetails;
import io.qameta.allure.model.StepResult;
import io.qameta.allure.model.TestResult;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.UUID;

/**
 * allure-results/: one Allure test result per case, written with the Allure Java API, with a step
 * per level, the case's parameters, and the convergence plot and error table as attachments;
 * {@code allure serve DIR/allure-results} shows them.
 */
public final class AllureReport {
    private AllureReport() {
    }

    public static void write(Results.SuiteResult r, Map<String, double[]> sizes, Map<String, Double> orders, Path dir) {
        AllureLifecycle lifecycle = new AllureLifecycle(new FileSystemResultsWriter(dir));
        for (Results.CaseResult c : r.cases()) {
            String uuid = UUID.randomUUID().toString();
            TestResult t = new TestResult().setUuid(uuid).setName(c.name()).setFullName(r.suite() + "." + c.name())
                .setHistoryId(r.suite() + "/" + c.name()).setDescription(c.description().isEmpty() ? c.problem()
                    : c.description() + "\n\n" + c.problem())
                .setLabels(List.of(new Label().setName("suite").setValue(r.suite()),
                    new Label().setName("framework").setValue("eigencheck")))
                .setParameters(List.of(new Parameter().setName("rule").setValue(c.rule()),
                    new Parameter().setName("levels").setValue(Integer.toString(c.levels().size()))));
            lifecycle.scheduleTestCase(t);
            lifecycle.startTestCase(uuid);
            for (Results.LevelResult l : c.levels()) {
                String step = UUID.randomUUID().toString();
                lifecycle.startStep(uuid, step, new StepResult().setName(String.format(Locale.ROOT,
                    "level %d: h = %.4e, dt = %s", l.index(), l.cellSize(), Double.isNaN(l.timeStep()) ? "-"
                        : String.format(Locale.ROOT, "%.4e", l.timeStep())))
                    .setParameters(List.of(new Parameter().setName("status").setValue(l.status()))));
                lifecycle.updateStep(step, s -> s.setStatus(l.status().equals("error") ? Status.BROKEN : Status.PASSED)
                    .setStatusDetails(new StatusDetails().setMessage(l.log())));
                lifecycle.stopStep(step);
            }
            if (!c.metrics().isEmpty()) {
                lifecycle.addAttachment("convergence plot", "image/svg+xml", "svg",
                    Plot.svg(c, sizes.get(c.name()), orders.getOrDefault(c.name(), Double.NaN))
                        .getBytes(StandardCharsets.UTF_8));
                lifecycle.addAttachment("error table", "text/html", "html",
                    HtmlReport.table(c).getBytes(StandardCharsets.UTF_8));
            }
            Status status = c.verdict() == Verdict.PASSED ? Status.PASSED : c.verdict() == Verdict.FAILED
                ? Status.FAILED : Status.BROKEN;
            lifecycle.updateTestCase(uuid, x -> x.setStatus(status).setStatusDetails(new StatusDetails()
                .setMessage(c.message())));
            lifecycle.stopTestCase(uuid);
            lifecycle.writeTestCase(uuid);
        }
    }
}

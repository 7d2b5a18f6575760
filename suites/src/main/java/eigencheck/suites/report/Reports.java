package eigencheck.suites.report;

import eigencheck.suites.Results;
import eigencheck.suites.Suite;
import java.io.IOException;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.Map;

/** Writes all file reports of a run into one folder: results.json, junit.xml, allure-results/, report.html. */
public final class Reports {
    private Reports() {
    }

    public static void writeAll(Suite suite, Results.SuiteResult r, Path dir) throws IOException {
        Map<String, double[]> sizes = new LinkedHashMap<>();
        Map<String, Double> orders = new LinkedHashMap<>();
        for (Suite.Case c : suite.cases()) {
            sizes.put(c.name(), c.levels().stream().mapToDouble(Suite.Level::cellSize).toArray());
            orders.put(c.name(), c.expect() == null ? Double.NaN : c.expect().order());
        }
        JsonReport.write(r, dir.resolve("results.json"));
        JunitXmlReport.write(r, dir.resolve("junit.xml"));
        AllureReport.write(r, sizes, orders, dir.resolve("allure-results"));
        HtmlReport.write(r, sizes, orders, dir.resolve("report.html"));
    }
}

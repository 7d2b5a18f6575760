package eigencheck.suites;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import eigencheck.adapters.InputException;
import eigencheck.suites.cli.Main;
import eigencheck.suites.files.SuiteFile;
import eigencheck.suites.junit.SuiteTests;
import eigencheck.suites.report.Baseline;
import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.net.URISyntaxException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.stream.Collectors;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.DynamicTest;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * End to end: a suite of a test-double solver whose error is exactly 0.3 h^2 sin(pi x) (so the max
 * error is 0.3 h^2 at x = 1/2 and the order is 2 by construction), plus levels that crash, hang,
 * write nothing or write NaN. The good case passes, the too-strict one fails with its numbers, and
 * every misbehaving level makes its case an ERROR with the log, while the suite goes on.
 */
class SuiteRunIT {
    @TempDir
    static Path work;
    static Path suiteFile;
    static Path report;
    static Results.SuiteResult result;

    @BeforeAll
    static void run() throws Exception {
        Path src = Path.of(SuiteRunIT.class.getResource("/eigencheck/suites/fake/suite.yaml").toURI()).getParent();
        for (String f : List.of("suite.yaml", "steady.yaml", "FakeSolver.java")) {
            Files.copy(src.resolve(f), work.resolve(f));
        }
        suiteFile = work.resolve("suite.yaml");
        report = work.resolve("report");
        Suite suite = SuiteFile.read(suiteFile);
        result = SuiteRunner.run(suite, report, 2);
        eigencheck.suites.report.Reports.writeAll(suite, result, report);
    }

    private static Results.CaseResult c(String name) {
        return result.cases().stream().filter(k -> k.name().equals(name)).findFirst().orElseThrow();
    }

    @Test
    void goodCasePassesWithTheConstructedOrder() {
        Results.CaseResult ok = c("ok");
        assertEquals(Verdict.PASSED, ok.verdict(), ok.message());
        Results.Metric max = ok.metrics().get(0);
        for (int i = 0; i < 3; i++) {
            double h = 1.0 / (4 << i);
            // tolerance: the oracle's certified bound (1e-10 of the scale) and the output's rounding
            assertEquals(0.3 * h * h, max.errors()[i], 1e-9, "max error at level " + i);
        }
        assertEquals(2, max.pairOrders()[1], 1e-6);
        assertEquals(2, max.fit().order(), 1e-6);
        assertTrue(ok.assessment().startsWith("asymptotic"), ok.assessment());
    }

    @Test
    void manufacturedCaseUsesTheExpressionAndWritesTheDerivedProblem() throws IOException {
        Results.CaseResult m = c("manufactured");
        assertEquals(Verdict.PASSED, m.verdict(), m.message());
        // the same planted error 0.3 h^2 sin(pi x) against u = x(1-x) itself
        assertEquals(0.3 / 256, m.metrics().get(0).errors()[2], 1e-15);
        // flux error at x = 0 of the boundary element: k |(u_h(h) - u_h(0))/h - u'(0)| = h - 0.3 h sin(pi h)
        double h = 1.0 / 16;
        assertEquals(Math.abs(-h + 0.3 * h * Math.sin(Math.PI * h)), m.metrics().stream()
            .filter(q -> q.name().startsWith("flux xmin")).findFirst().orElseThrow().errors()[2], 1e-12);
        String derived = Files.readString(report.resolve("runs/manufactured/level-0/problem.json"));
        assertTrue(derived.contains("\"robin\"") && derived.contains("\"source\""), derived);
    }

    @Test
    void tooStrictRuleFailsWithItsNumbers() {
        Results.CaseResult f = c("too-strict");
        assertEquals(Verdict.FAILED, f.verdict());
        assertTrue(f.message().contains("observed max order 2.000 on the finest pair is below 3.00 - 0.100"), f.message());
    }

    @Test
    void misbehavingLevelsAreErrorsWithTheirLogAndTheSuiteGoesOn() {
        assertEquals(Verdict.ERROR, c("crash").verdict());
        assertTrue(c("crash").message().contains("exited with code 3"), c("crash").message());
        assertTrue(c("crash").message().contains("matrix is singular at row 7"), "the log tail");
        assertTrue(c("hang").message().contains("did not finish within 3.0 s"), c("hang").message());
        assertTrue(c("empty").message().contains("wrote nothing"), c("empty").message());
        assertTrue(c("empty").message().contains("done (but wrote nothing)"), "stdout tail");
        assertTrue(c("garbage").message().contains("NaN is not finite"), c("garbage").message());
        assertEquals(3, result.count(Verdict.PASSED) + result.count(Verdict.FAILED));
    }

    @Test
    void reportsAreWrittenAndCarryTheNumbers() throws IOException {
        JsonNode json = new ObjectMapper().readTree(Files.readAllBytes(report.resolve("results.json")));
        assertEquals(Results.SCHEMA_VERSION, json.get("schemaVersion").asInt());
        assertEquals(7, json.get("cases").size());
        assertEquals("passed", json.get("cases").get(0).get("verdict").asText());
        String junit = Files.readString(report.resolve("junit.xml"));
        assertTrue(junit.contains("tests=\"7\" failures=\"1\" errors=\"4\""), junit);
        assertTrue(junit.contains("<failure message=\"observed max order 2.000"), junit);
        String html = Files.readString(report.resolve("report.html"));
        assertTrue(html.contains("<svg") && html.contains("do not validate a design"), "plot and caution");
        List<Path> allure;
        try (var s = Files.list(report.resolve("allure-results"))) {
            allure = s.collect(Collectors.toList());
        }
        assertEquals(7, allure.stream().filter(p -> p.toString().endsWith("-result.json")).count());
        assertTrue(allure.stream().anyMatch(p -> p.toString().endsWith(".svg")), "plot attachment");
    }

    @Test
    void unchangedLevelsAreNotRunAgain() {
        Suite suite;
        try {
            suite = SuiteFile.read(suiteFile);
        } catch (InputException e) {
            throw new AssertionError(e);
        }
        Suite only = new Suite(suite.name(), suite.file(), suite.directory(), List.of(suite.cases().get(0)));
        Results.SuiteResult again = SuiteRunner.run(only, report, 1);
        assertTrue(again.cases().get(0).levels().stream().allMatch(l -> l.status().equals("cached")),
            again.cases().get(0).levels().toString());
    }

    @Test
    void baselineFindsAGrownError() throws Exception {
        Suite suite = SuiteFile.read(suiteFile);
        JsonNode json = new ObjectMapper().readTree(Files.readAllBytes(report.resolve("results.json")));
        // an earlier run whose finest max error was half of today's
        var errors = (com.fasterxml.jackson.databind.node.ArrayNode) json.get("cases").get(0).get("metrics").get(0)
            .get("errors");
        errors.set(2, errors.get(2).asDouble() / 2);
        Path old = work.resolve("old.json");
        new ObjectMapper().writeValue(old.toFile(), json);
        List<String> regressions = Baseline.regressions(result, suite, old);
        assertEquals(1, regressions.size(), regressions.toString());
        assertTrue(regressions.get(0).startsWith("ok: max@t=1 on the finest level grew"), regressions.get(0));
        assertTrue(Baseline.regressions(result, suite, report.resolve("results.json")).isEmpty());
    }

    @Test
    void junitEntryPointTurnsCasesIntoDynamicTests() throws Throwable {
        Path dir = work.resolve("junit");
        List<DynamicTest> tests = SuiteTests.of(suiteFile, dir).collect(Collectors.toList());
        assertEquals(7, tests.size());
        assertEquals("ok", tests.get(0).getDisplayName());
        tests.get(0).getExecutable().execute();
        assertThrows(AssertionError.class, () -> tests.get(1).getExecutable().execute());
    }

    @Test
    void suiteFileErrorsNameThePathAndPlace() throws IOException {
        Path bad = work.resolve("bad.yaml");
        Files.writeString(bad, """
            suite: bad
            cases:
              - name: a
                problem: steady.yaml
                levels: {cells: [8, 8], output: [a.csv, b.csv]}
                compare: {times: [1], norms: [max, linf]}
                expect: {norm: max, order: 2, outcome: maybe}
            """);
        InputException e = assertThrows(InputException.class, () -> SuiteFile.read(bad));
        String m = e.getMessage();
        assertTrue(m.contains("bad.yaml:5:13: cases[0].levels: levels 0 and 1 have the same or a larger cell size"), m);
        assertTrue(m.contains("bad.yaml:6:40: cases[0].compare.norms[1]: norm \"linf\""), m);
        assertTrue(m.contains("cases[0].expect.outcome: outcome \"maybe\""), m);
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        int code = Main.run(new String[] {"run", bad.toString(), "--report", work.resolve("r2").toString()},
            new PrintWriter(out, true), new PrintWriter(err, true));
        assertEquals(2, code);
        assertTrue(err.toString().contains("norm \"linf\""), err.toString());
    }

    static Path resource(String name) throws URISyntaxException {
        return Path.of(SuiteRunIT.class.getResource(name).toURI());
    }
}

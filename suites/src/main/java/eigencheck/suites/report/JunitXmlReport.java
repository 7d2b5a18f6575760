package eigencheck.suites.report;

import eigencheck.suites.Results;
import eigencheck.suites.Verdict;
import java.io.IOException;
import java.nio.file.Path;
import java.util.Locale;

/** junit.xml: one test case per case; the failure or error message carries the numbers. */
public final class JunitXmlReport {
    private JunitXmlReport() {
    }

    public static void write(Results.SuiteResult r, Path file) throws IOException {
        StringBuilder b = new StringBuilder("<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n");
        b.append(String.format(Locale.ROOT, "<testsuite name=\"%s\" tests=\"%d\" failures=\"%d\" errors=\"%d\" skipped=\"0\""
            + " time=\"%.3f\" timestamp=\"%s\">%n", xml(r.suite()), r.cases().size(), r.count(Verdict.FAILED),
            r.count(Verdict.ERROR), r.seconds(), xml(r.started())));
        for (Results.CaseResult c : r.cases()) {
            double time = c.levels().stream().mapToDouble(Results.LevelResult::runSeconds).sum();
            b.append(String.format(Locale.ROOT, "  <testcase classname=\"eigencheck.%s\" name=\"%s\" time=\"%.3f\"",
                xml(r.suite().replaceAll("[^A-Za-z0-9_.-]", "_")), xml(c.name()), time));
            if (c.verdict() == Verdict.PASSED) {
                b.append(">\n    <system-out>").append(xml(c.message())).append("</system-out>\n  </testcase>\n");
            } else {
                String tag = c.verdict() == Verdict.FAILED ? "failure" : "error";
                b.append(">\n    <").append(tag).append(" message=\"").append(xml(firstLine(c.message())))
                    .append("\" type=\"eigencheck.").append(tag).append("\">").append(xml(c.message() + "\nrule: " + c.rule()
                        + "\n" + c.assessment())).append("</").append(tag).append(">\n  </testcase>\n");
            }
        }
        b.append("</testsuite>\n");
        Files2.write(file, b.toString());
    }

    private static String firstLine(String s) {
        int cut = s.indexOf('\n');
        return cut < 0 ? s : s.substring(0, cut);
    }

    static String xml(String s) {
        StringBuilder b = new StringBuilder();
        for (char ch : s.toCharArray()) {
            switch (ch) {
                case '<' -> b.append("&lt;");
                case '>' -> b.append("&gt;");
                case '&' -> b.append("&amp;");
                case '"' -> b.append("&quot;");
                default -> {
                    if (ch >= 0x20 || ch == '\n' || ch == '\t' || ch == '\r') {
                        b.append(ch);
                    }
                }
            }
        }
        return b.toString();
    }
}

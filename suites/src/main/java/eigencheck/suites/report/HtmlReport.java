package eigencheck.suites.report;

import eigencheck.suites.Results;
import eigencheck.suites.Verdict;
import java.io.IOException;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/** report.html: one self-contained page, per case a log-log plot, the tables, the verdict, the problem. */
public final class HtmlReport {
    /** Said in every report: verification of a code is not validation of a design. */
    public static final String CAUTION = "These results verify that a code solves the diffusion equation it claims to"
        + " solve, at the rate it claims. They do not validate a design: whether the equation, its data and its"
        + " boundary conditions describe a real pressure vessel, fire barrier or medical heating device is a separate"
        + " question. Where results feed safety decisions, follow the applicable design codes and standards and"
        + " licensed engineering practice.";

    private HtmlReport() {
    }

    public static void write(Results.SuiteResult r, Map<String, double[]> sizes, Map<String, Double> orders, Path file)
        throws IOException {
        StringBuilder b = new StringBuilder();
        b.append("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\"><title>eigencheck: ")
            .append(esc(r.suite())).append("</title>\n<style>body{font-family:sans-serif;margin:2em;max-width:75em}"
                + "table{border-collapse:collapse;margin:.5em 0}td,th{border:1px solid #ccc;padding:.2em .5em;"
                + "text-align:right;font-family:monospace}th{background:#f4f4f4}.passed{color:#060}.failed{color:#a00}"
                + ".error{color:#a50}.caution{border:2px solid #a50;padding:.6em;background:#fff8ee}"
                + "pre{white-space:pre-wrap}</style></head><body>\n");
        b.append("<h1>eigencheck suite ").append(esc(r.suite())).append("</h1>\n");
        b.append(String.format(Locale.ROOT, "<p><b>%d passed, %d failed, %d errors</b> of %d cases, %.1f s, started %s"
            + "</p>%n", r.count(Verdict.PASSED), r.count(Verdict.FAILED), r.count(Verdict.ERROR), r.cases().size(),
            r.seconds(), esc(r.started())));
        b.append("<p class=\"caution\">").append(esc(CAUTION)).append("</p>\n");
        b.append("<h2>Environment</h2><table>");
        for (Map.Entry<String, String> e : r.environment().entrySet()) {
            b.append("<tr><th>").append(esc(e.getKey())).append("</th><td style=\"text-align:left\">")
                .append(esc(e.getValue())).append("</td></tr>");
        }
        b.append("<tr><th>suite file</th><td style=\"text-align:left\">").append(esc(r.file())).append("</td></tr>");
        b.append("</table>\n");
        for (Results.CaseResult c : r.cases()) {
            String cls = c.verdict().name().toLowerCase(Locale.ROOT);
            b.append("<h2 id=\"").append(esc(c.name())).append("\">").append(esc(c.name())).append(": <span class=\"")
                .append(cls).append("\">").append(c.verdict() == Verdict.PASSED && c.expectFail()
                    ? "PASSED (planted defect caught)" : c.verdict()).append("</span></h2>\n");
            if (!c.description().isEmpty()) {
                b.append("<p>").append(esc(c.description())).append("</p>\n");
            }
            b.append("<p><b>Problem:</b> ").append(esc(c.problem())).append("</p>\n");
            b.append("<p><b>Rule:</b> ").append(esc(c.rule())).append("</p>\n");
            b.append("<p><b>Verdict:</b> </p><pre>").append(esc(c.message())).append("</pre>\n");
            if (!c.assessment().isEmpty()) {
                b.append("<p><b>Asymptotic range:</b> ").append(esc(c.assessment())).append("</p>\n");
            }
            for (String n : c.notes()) {
                b.append("<p><b>Note:</b> ").append(esc(n)).append("</p>\n");
            }
            if (!c.metrics().isEmpty()) {
                b.append(Plot.svg(c, sizes.get(c.name()), orders.getOrDefault(c.name(), Double.NaN))).append('\n');
            }
            b.append(table(c));
        }
        b.append("</body></html>\n");
        Files2.write(file, b.toString());
    }

    /** The error table of a case as HTML (also attached to the Allure results). */
    static String table(Results.CaseResult c) {
        StringBuilder b = new StringBuilder("<table><tr><th>level</th><th>h</th><th>dt</th><th>status</th>");
        List<Results.Metric> ms = c.metrics();
        for (Results.Metric m : ms) {
            b.append("<th>").append(esc(m.name())).append("</th><th>order</th>");
        }
        b.append("</tr>\n");
        for (int i = 0; i < c.levels().size(); i++) {
            Results.LevelResult l = c.levels().get(i);
            b.append(String.format(Locale.ROOT, "<tr><td>%d</td><td>%.4e</td><td>%s</td><td>%s</td>", l.index(),
                l.cellSize(), Double.isNaN(l.timeStep()) ? "-" : String.format(Locale.ROOT, "%.4e", l.timeStep()),
                esc(l.status())));
            for (Results.Metric m : ms) {
                b.append(String.format(Locale.ROOT, "<td>%.6e</td><td>%s</td>", m.errors()[i],
                    i == 0 ? "" : String.format(Locale.ROOT, "%.3f", m.pairOrders()[i - 1])));
            }
            b.append("</tr>\n");
        }
        if (!ms.isEmpty()) {
            b.append("<tr><th colspan=\"4\">fitted order [95 % interval]</th>");
            for (Results.Metric m : ms) {
                b.append("<td colspan=\"2\">").append(m.fit() == null ? "n/a" : Double.isNaN(m.fit().lower())
                    ? String.format(Locale.ROOT, "%.3f", m.fit().order())
                    : String.format(Locale.ROOT, "%.3f [%.3f, %.3f]", m.fit().order(), m.fit().lower(), m.fit().upper()))
                    .append("</td>");
            }
            b.append("</tr>\n");
        }
        return b.append("</table>\n").toString();
    }

    static String esc(String s) {
        return s == null ? "" : s.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;").replace("\"", "&quot;");
    }
}

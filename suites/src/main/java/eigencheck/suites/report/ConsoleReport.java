package eigencheck.suites.report;

import eigencheck.suites.Results;
import eigencheck.suites.Verdict;
import java.io.PrintWriter;
import java.util.Locale;

/** The console: a table per case and a closing line counting passed, failed and errored cases. */
public final class ConsoleReport {
    private ConsoleReport() {
    }

    public static void print(Results.SuiteResult r, PrintWriter out) {
        out.printf(Locale.ROOT, "eigencheck suite %s (%s)%n%n", r.suite(), r.file());
        for (Results.CaseResult c : r.cases()) {
            out.printf(Locale.ROOT, "case %s: %s%n", c.name(), c.verdict() == Verdict.PASSED && c.expectFail()
                ? "PASSED (planted defect caught)" : c.verdict().toString());
            if (!c.description().isEmpty()) {
                out.printf("  %s%n", c.description());
            }
            out.printf("  rule: %s%n", c.rule());
            StringBuilder head = new StringBuilder(String.format(Locale.ROOT, "  %5s %11s %11s %7s", "level", "h", "dt",
                "run"));
            for (Results.Metric m : c.metrics()) {
                head.append(String.format(Locale.ROOT, " %20s %6s", shorten(m.name()), "order"));
            }
            out.println(head);
            for (int i = 0; i < c.levels().size(); i++) {
                Results.LevelResult l = c.levels().get(i);
                StringBuilder row = new StringBuilder(String.format(Locale.ROOT, "  %5d %11.4e %11s %7s", l.index(),
                    l.cellSize(), Double.isNaN(l.timeStep()) ? "-" : String.format(Locale.ROOT, "%.4e", l.timeStep()),
                    l.status().equals("ok") ? String.format(Locale.ROOT, "%.1fs", l.runSeconds()) : l.status()));
                for (Results.Metric m : c.metrics()) {
                    row.append(String.format(Locale.ROOT, " %20.6e %6s", m.errors()[i],
                        i == 0 ? "" : String.format(Locale.ROOT, "%.3f", m.pairOrders()[i - 1])));
                }
                out.println(row);
            }
            if (!c.metrics().isEmpty()) {
                StringBuilder fit = new StringBuilder("  fitted order        ");
                for (Results.Metric m : c.metrics()) {
                    fit.append(" ").append(m.fit() == null ? "n/a" : Double.isNaN(m.fit().lower())
                        ? String.format(Locale.ROOT, "%.3f", m.fit().order())
                        : String.format(Locale.ROOT, "%.2f [%.2f,%.2f]", m.fit().order(), m.fit().lower(), m.fit().upper()));
                }
                out.println(fit);
            }
            if (!c.assessment().isEmpty()) {
                out.printf("  %s%n", c.assessment());
            }
            for (String n : c.notes()) {
                out.printf("  note: %s%n", n);
            }
            out.printf("  verdict: %s%n%n", c.message().replace("\n", "\n    "));
        }
        out.printf(Locale.ROOT, "%d passed, %d failed, %d errors (%d cases, %.1f s)%n", r.count(Verdict.PASSED),
            r.count(Verdict.FAILED), r.count(Verdict.ERROR), r.cases().size(), r.seconds());
        out.flush();
    }

    private static String shorten(String name) {
        return name.length() <= 20 ? name : name.substring(0, 20);
    }
}

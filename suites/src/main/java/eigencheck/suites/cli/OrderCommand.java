package eigencheck.suites.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import eigencheck.adapters.InputException;
import eigencheck.adapters.InputLocation;
import eigencheck.suites.convergence.GridConvergence;
import java.io.Reader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/** {@code eigencheck order --table FILE.csv [--json] [--formal P]}: Celik et al. (2008) for a user's numbers. */
@Command(name = "order", mixinStandardHelpOptions = true,
    description = {"Observed order, Richardson-extrapolated value and grid convergence index of a quantity without",
        "an exact solution, from a CSV table with the columns h,value (Celik et al., J. Fluids Eng. 130 (2008) 078001).",
        "Three or more rows: the three finest; two rows need --formal."})
final class OrderCommand implements Callable<Integer> {
    @Option(names = "--table", required = true, paramLabel = "FILE.csv", description = "columns h,value")
    Path table;

    @Option(names = "--json", description = "print one JSON object: order, extrapolated, approxRelError,"
        + " extrapRelError, gciFine, asymptoticRatio, convergence")
    boolean json;

    @Option(names = "--formal", paramLabel = "P", description = "formal order, for two grids (safety factor 3)")
    Double formal;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        List<double[]> rows = new ArrayList<>();
        if (!Files.isRegularFile(table)) {
            throw new InputException(InputException.Cause.UNREADABLE, InputLocation.of(table), "no such file; check the path");
        }
        try (Reader r = Files.newBufferedReader(table, StandardCharsets.UTF_8);
             CSVParser p = CSVParser.parse(r, CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true)
                 .setCommentMarker('#').setTrim(true).setIgnoreEmptyLines(true).get())) {
            if (!p.getHeaderMap().containsKey("h") || !p.getHeaderMap().containsKey("value")) {
                throw new InputException(InputException.Cause.MISSING, InputLocation.at(table, 1, 0, ""),
                    "the header " + p.getHeaderNames() + " needs the columns h,value");
            }
            for (CSVRecord rec : p) {
                int line = (int) p.getCurrentLineNumber();
                double[] v = new double[2];
                String[] names = {"h", "value"};
                for (int k = 0; k < 2; k++) {
                    String cell = rec.isSet(names[k]) ? rec.get(names[k]) : "";
                    try {
                        v[k] = Double.parseDouble(cell);
                    } catch (NumberFormatException e) {
                        throw new InputException(InputException.Cause.NOT_A_NUMBER, InputLocation.at(table, line,
                            p.getHeaderMap().get(names[k]) + 1, ""), "column \"" + names[k] + "\": \"" + cell
                            + "\" is not a number");
                    }
                    if (!Double.isFinite(v[k]) || (k == 0 && !(v[k] > 0))) {
                        throw new InputException(InputException.Cause.OUT_OF_RANGE, InputLocation.at(table, line,
                            p.getHeaderMap().get(names[k]) + 1, ""), names[k] + " = " + cell + " must be finite"
                            + (k == 0 ? " and > 0" : ""));
                    }
                }
                rows.add(v);
            }
        }
        rows.sort((a, b) -> Double.compare(a[0], b[0]));
        GridConvergence.Result g;
        try {
            if (rows.size() >= 3) {
                g = GridConvergence.threeGrids(new double[] {rows.get(0)[0], rows.get(1)[0], rows.get(2)[0]},
                    new double[] {rows.get(0)[1], rows.get(1)[1], rows.get(2)[1]});
            } else if (rows.size() == 2 && formal != null) {
                g = GridConvergence.twoGrids(new double[] {rows.get(0)[0], rows.get(1)[0]},
                    new double[] {rows.get(0)[1], rows.get(1)[1]}, formal);
            } else {
                throw new InputException(InputException.Cause.MISSING, InputLocation.of(table), rows.size()
                    + " rows; give three or more grids, or two with --formal P");
            }
        } catch (IllegalArgumentException e) {
            throw new InputException(InputException.Cause.INVALID_VALUE, InputLocation.of(table), e.getMessage());
        }
        if (json) {
            ObjectMapper m = new ObjectMapper();
            ObjectNode o = m.createObjectNode();
            o.put("order", g.order());
            o.put("extrapolated", g.extrapolated());
            o.put("approxRelError", g.approxRelError());
            o.put("extrapRelError", g.extrapRelError());
            o.put("gciFine", g.gciFine());
            if (Double.isFinite(g.asymptoticRatio())) {
                o.put("asymptoticRatio", g.asymptoticRatio());
            } else {
                o.putNull("asymptoticRatio");
            }
            if (g.convergence() == null) {
                o.putNull("convergence");
            } else {
                o.put("convergence", g.convergence().name().toLowerCase(Locale.ROOT));
            }
            spec.commandLine().getOut().println(m.writeValueAsString(o));
        } else {
            var out = spec.commandLine().getOut();
            out.printf(Locale.ROOT, "observed order        %.4f%n", g.order());
            out.printf(Locale.ROOT, "extrapolated value    %.6g%n", g.extrapolated());
            out.printf(Locale.ROOT, "approx. rel. error    %.3f %%%n", 100 * g.approxRelError());
            out.printf(Locale.ROOT, "extrap. rel. error    %.3f %%%n", 100 * g.extrapRelError());
            out.printf(Locale.ROOT, "GCI fine              %.3f %%%n", 100 * g.gciFine());
            out.printf(Locale.ROOT, "asymptotic ratio      %s%n", Double.isFinite(g.asymptoticRatio())
                ? String.format(Locale.ROOT, "%.4f (near 1 in the asymptotic range)", g.asymptoticRatio()) : "n/a");
            out.printf("convergence           %s%n", g.convergence() == null ? "n/a (two grids)"
                : g.convergence().name().toLowerCase(Locale.ROOT));
            out.flush();
        }
        return Main.OK;
    }
}

package eigencheck.suites.cli;

import eigencheck.adapters.InputException;
import eigencheck.adapters.InputLocation;
import eigencheck.oracle.Oracle;
import eigencheck.oracle.OracleException;
import eigencheck.oracle.problem.Problem;
import eigencheck.suites.files.ProblemFile;
import java.io.IOException;
import java.io.Reader;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import java.util.concurrent.Callable;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code eigencheck eval PROBLEM --points POINTS.csv [--tolerance T] [--out OUT.csv]}. */
@Command(name = "eval", mixinStandardHelpOptions = true,
    description = {"Evaluate the certified reference solution of a problem file at the points of a CSV file.",
        "POINTS.csv has a header with the domain's coordinate columns and t (extra columns are ignored);"
            + " the output repeats them and adds the value and its certified error bound."})
final class EvalCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "PROBLEM", description = "problem file (.yaml, .yml or .json)")
    Path problemFile;

    @Option(names = "--points", required = true, paramLabel = "POINTS.csv", description = "points to evaluate")
    Path pointsFile;

    @Option(names = "--tolerance", paramLabel = "T", defaultValue = "1e-10",
        description = "relative to the problem's temperature scale (default ${DEFAULT-VALUE})")
    double tolerance;

    @Option(names = "--out", paramLabel = "OUT.csv", description = "output file (default: standard output)")
    Path out;

    @Option(names = "--quantity", paramLabel = "Q", defaultValue = "temperature",
        description = "temperature (column u) or flux (column flux, -k du/dx in W/m^2)")
    String quantity;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        if (!(tolerance > 0 && tolerance < 1)) {
            throw new picocli.CommandLine.ParameterException(spec.commandLine(),
                "--tolerance " + tolerance + " must lie in (0, 1), for example 1e-10");
        }
        Oracle.Quantity q = switch (quantity.toLowerCase(Locale.ROOT)) {
            case "temperature", "u" -> Oracle.Quantity.TEMPERATURE;
            case "flux", "heatflux" -> Oracle.Quantity.HEAT_FLUX;
            default -> throw new picocli.CommandLine.ParameterException(spec.commandLine(),
                "--quantity " + quantity + " is not known; use temperature or flux");
        };
        long start = System.nanoTime();
        Problem problem = ProblemFile.read(problemFile);
        List<String> coordinates = problem.domain().coordinates();
        Points points = readPoints(pointsFile, coordinates);
        double horizon = 0;
        for (double t : points.t) {
            horizon = Math.max(horizon, t);
        }
        long read = System.nanoTime();
        Oracle oracle = Oracle.prepare(problem, horizon, tolerance);
        long prepared = System.nanoTime();
        int n = points.t.length;
        double[] value = new double[n];
        double[] bound = new double[n];
        try {
            oracle.evaluate(q, points.x, points.t, value, bound);
        } catch (OracleException e) {
            String message = e.getMessage();
            int colon = message.indexOf(": ");
            int index = Integer.parseInt(message.substring("point ".length(), colon));
            throw new OracleException(e.reason(), pointsFile + ":" + points.line[index] + ": "
                + message.substring(colon + 2));
        }
        long evaluated = System.nanoTime();
        String valueColumn = q == Oracle.Quantity.TEMPERATURE ? "u" : "flux";
        // numbers never need CSV quoting: one StringBuilder is several times faster than a printer
        StringBuilder text = new StringBuilder(n * 64);
        text.append(String.join(",", coordinates)).append(",t,").append(valueColumn).append(",bound\n");
        for (int i = 0; i < n; i++) {
            text.append(points.x[i]).append(',').append(points.t[i]).append(',').append(value[i]).append(',')
                .append(bound[i]).append('\n');
        }
        if (Boolean.getBoolean("eigencheck.debug")) {
            spec.commandLine().getErr().printf(Locale.ROOT, "eval: read %.0f ms, prepare %.0f ms, evaluate %.0f ms,"
                + " format %.0f ms%n", (read - start) / 1e6, (prepared - read) / 1e6, (evaluated - prepared) / 1e6,
                (System.nanoTime() - evaluated) / 1e6);
        }
        if (out == null) {
            spec.commandLine().getOut().print(text);
            spec.commandLine().getOut().flush();
        } else {
            writeAtomically(out, text);
            double worst = 0;
            for (double b : bound) {
                worst = Math.max(worst, b);
            }
            spec.commandLine().getErr().printf(Locale.ROOT, "eigencheck eval: %d points written to %s (largest bound"
                + " %.2e, tolerance %.1e of scale %.6g)%n", n, out, worst, tolerance, oracle.temperatureScale());
        }
        return Main.OK;
    }

    static void writeAtomically(Path target, CharSequence content) throws IOException {
        Path dir = target.toAbsolutePath().getParent();
        if (dir != null) {
            Files.createDirectories(dir);
        }
        Path tmp = Files.createTempFile(dir, ".eigencheck-", ".tmp");
        try (Writer w = Files.newBufferedWriter(tmp, StandardCharsets.UTF_8)) {
            w.append(content);
        }
        try {
            Files.move(tmp, target, StandardCopyOption.REPLACE_EXISTING, StandardCopyOption.ATOMIC_MOVE);
        } catch (IOException e) {
            Files.move(tmp, target, StandardCopyOption.REPLACE_EXISTING);
        }
    }

    /** Points read from a CSV file, with the line of each. */
    record Points(double[] x, double[] t, int[] line) {
    }

    static Points readPoints(Path file, List<String> coordinates) throws InputException {
        if (!Files.isRegularFile(file)) {
            throw new InputException(InputException.Cause.UNREADABLE, InputLocation.of(file),
                "no such file; check the path of --points");
        }
        List<InputException.Problem> problems = new ArrayList<>();
        List<double[]> rows = new ArrayList<>();
        List<Integer> lines = new ArrayList<>();
        CSVFormat format = CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true)
            .setCommentMarker('#').setIgnoreEmptyLines(true).setTrim(true).get();
        try (Reader reader = Files.newBufferedReader(file, StandardCharsets.UTF_8);
             CSVParser parser = CSVParser.parse(reader, format)) {
            Map<String, Integer> columns = new TreeMap<>(String.CASE_INSENSITIVE_ORDER);
            columns.putAll(parser.getHeaderMap());
            List<String> needed = new ArrayList<>(coordinates);
            needed.add("t");
            int[] index = new int[needed.size()];
            for (int j = 0; j < needed.size(); j++) {
                Integer i = columns.get(needed.get(j));
                if (i == null) {
                    problems.add(new InputException.Problem(InputException.Cause.MISSING, InputLocation.at(file, 1, 0, ""),
                        "no column \"" + needed.get(j) + "\" in the header " + parser.getHeaderNames()
                            + "; the points file needs the columns " + String.join(",", needed)));
                } else {
                    index[j] = i;
                }
            }
            if (!problems.isEmpty()) {
                throw new InputException(problems);
            }
            for (CSVRecord record : parser) {
                int line = (int) parser.getCurrentLineNumber();
                double[] row = new double[needed.size()];
                boolean good = true;
                for (int j = 0; j < needed.size(); j++) {
                    int i = index[j];
                    String name = needed.get(j);
                    if (i >= record.size()) {
                        problems.add(new InputException.Problem(InputException.Cause.MISSING,
                            InputLocation.at(file, line, i + 1, ""), "column \"" + name + "\" is missing on this row (it has "
                                + record.size() + " fields); give every row all columns"));
                        good = false;
                        continue;
                    }
                    String cell = record.get(i);
                    double v;
                    try {
                        v = Double.parseDouble(cell);
                    } catch (NumberFormatException e) {
                        problems.add(new InputException.Problem(InputException.Cause.NOT_A_NUMBER,
                            InputLocation.at(file, line, i + 1, ""), "column \"" + name + "\": \"" + cell
                                + "\" is not a number; write plain decimal numbers such as 0.05 or 1e-3"));
                        good = false;
                        continue;
                    }
                    if (!Double.isFinite(v)) {
                        problems.add(new InputException.Problem(InputException.Cause.NOT_A_NUMBER,
                            InputLocation.at(file, line, i + 1, ""), "column \"" + name + "\": " + cell
                                + " is not finite; give finite numbers"));
                        good = false;
                    } else if (name.equals("t") && v < 0) {
                        problems.add(new InputException.Problem(InputException.Cause.OUT_OF_RANGE,
                            InputLocation.at(file, line, i + 1, ""), "t = " + cell + " s is negative; times must be >= 0"));
                        good = false;
                    }
                    row[j] = v;
                }
                if (good) {
                    rows.add(row);
                    lines.add(line);
                }
                if (problems.size() >= 20) {
                    break;
                }
            }
        } catch (IOException | IllegalArgumentException | IllegalStateException e) {
            String message = e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
            problems.add(new InputException.Problem(e instanceof IOException && !(e.getCause() != null)
                ? InputException.Cause.UNREADABLE : InputException.Cause.MALFORMED, InputLocation.of(file),
                "cannot read the points: " + message));
        }
        if (!problems.isEmpty()) {
            throw new InputException(problems);
        }
        if (rows.isEmpty()) {
            throw new InputException(InputException.Cause.MISSING, InputLocation.of(file),
                "no points; add rows below the header");
        }
        if (coordinates.size() != 1) {
            throw new InputException(InputException.Cause.INVALID_VALUE, InputLocation.of(file),
                "this version evaluates slabs only (columns x,t)");
        }
        double[] x = new double[rows.size()];
        double[] t = new double[rows.size()];
        int[] line = new int[rows.size()];
        for (int i = 0; i < rows.size(); i++) {
            x[i] = rows.get(i)[0];
            t[i] = rows.get(i)[1];
            line[i] = lines.get(i);
        }
        return new Points(x, t, line);
    }
}

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
        description = "temperature (column u) or flux: the heat flux -k grad u in W/m^2, column flux (-k du/dx)"
            + " for a slab, qx,qy[,qz] for a rectangle or box, qr (radial, outward) for a cylinder or sphere")
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
        Points points = readPoints(pointsFile, coordinates, !problem.steady());
        double horizon = 0;
        for (double t : points.t) {
            horizon = Math.max(horizon, t);
        }
        long read = System.nanoTime();
        Oracle oracle;
        try {
            oracle = Oracle.prepare(problem, horizon, tolerance);
        } catch (OracleException e) {
            throw new OracleException(e.reason(), problemFile + ": " + e.getMessage());
        }
        long prepared = System.nanoTime();
        int n = points.t.length;
        double[] value = new double[n];
        double[] bound = new double[n];
        boolean slab = problem.domain() instanceof eigencheck.oracle.problem.Slab;
        // the heat flux of a rectangle, box, cylinder or sphere: -k grad u from the certified gradient
        int components = q == Oracle.Quantity.HEAT_FLUX && !slab ? oracle.dimension() : 0;
        double[] flux = components == 0 ? null : new double[n * components];
        try {
            if (slab) {
                oracle.evaluate(q, points.x, points.t, value, bound);
            } else if (flux != null) {
                double[] gradientBound = new double[n];
                oracle.evaluatePoints(points.x, points.t, value, new double[n], flux, gradientBound);
                double k = problem.material().conductivity();
                for (int i = 0; i < flux.length; i++) {
                    flux[i] *= -k;
                }
                for (int i = 0; i < n; i++) {
                    bound[i] = k * gradientBound[i];
                }
            } else {
                oracle.evaluatePoints(points.x, points.t, value, bound, null, null);
            }
        } catch (OracleException e) {
            String message = e.getMessage();
            int colon = message.indexOf(": ");
            int index = Integer.parseInt(message.substring("point ".length(), colon));
            throw new OracleException(e.reason(), pointsFile + ":" + points.line[index] + ": "
                + message.substring(colon + 2));
        }
        long evaluated = System.nanoTime();
        String valueColumn = q == Oracle.Quantity.TEMPERATURE ? "u" : flux == null ? "flux"
            : components == 1 ? "qr" : components == 2 ? "qx,qy" : "qx,qy,qz";
        // x and t are echoed as the user wrote them; rows are formatted in parallel blocks
        int blocks = Math.max(1, Math.min(64, n / 20_000));
        StringBuilder[] parts = new StringBuilder[blocks];
        java.util.stream.IntStream.range(0, blocks).parallel().forEach(block -> {
            int from = (int) ((long) n * block / blocks);
            int to = (int) ((long) n * (block + 1) / blocks);
            StringBuilder b = new StringBuilder((to - from) * 48);
            for (int i = from; i < to; i++) {
                b.append(points.xText[i]).append(',');
                if (!points.tText[i].isEmpty()) {
                    b.append(points.tText[i]).append(',');
                }
                if (flux == null) {
                    b.append(value[i]).append(',');
                } else {
                    for (int c = 0; c < components; c++) {
                        b.append(flux[i * components + c]).append(',');
                    }
                }
                appendBound(b, bound[i]);
                b.append('\n');
            }
            parts[block] = b;
        });
        StringBuilder text = new StringBuilder();
        boolean timed = points.tText.length == 0 || !points.tText[0].isEmpty();
        text.append(String.join(",", coordinates)).append(timed ? ",t," : ",").append(valueColumn).append(",bound\n");
        for (StringBuilder part : parts) {
            text.append(part);
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

    /** A bound with three significant digits, for example 2.85e-10 (bounds need no more). */
    static void appendBound(StringBuilder b, double bound) {
        if (!(bound > 0)) {
            b.append('0');
            return;
        }
        int exponent = (int) Math.floor(Math.log10(bound));
        long mantissa = Math.round(bound / Math.pow(10, exponent - 2));
        if (mantissa >= 1000) {
            mantissa /= 10;
            exponent++;
        }
        b.append(mantissa / 100).append('.');
        long rest = mantissa % 100;
        if (rest < 10) {
            b.append('0');
        }
        b.append(rest).append('e').append(exponent);
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

    /**
     * Points read from a CSV file, with the line and the original text of each: {@code x} holds the
     * d coordinates of each point in turn, {@code xText} the coordinate cells of each row joined by commas.
     */
    record Points(double[] x, double[] t, int[] line, String[] xText, String[] tText) {
    }

    /** @param timeRequired false for a steady problem: the t column may be left out */
    static Points readPoints(Path file, List<String> coordinates, boolean timeRequired) throws InputException {
        if (!Files.isRegularFile(file)) {
            throw new InputException(InputException.Cause.UNREADABLE, InputLocation.of(file),
                "no such file; check the path of --points");
        }
        int d = coordinates.size();
        List<String> needed = new ArrayList<>(coordinates);
        needed.add("t");
        List<String[]> cells = new ArrayList<>();
        List<Integer> lines = new ArrayList<>();
        List<InputException.Problem> problems = new ArrayList<>();
        int[] index = new int[needed.size()];
        CSVFormat format = CSVFormat.DEFAULT.builder().setHeader().setSkipHeaderRecord(true)
            .setCommentMarker('#').setIgnoreEmptyLines(true).setTrim(true).get();
        try (Reader reader = Files.newBufferedReader(file, StandardCharsets.UTF_8);
             CSVParser parser = CSVParser.parse(reader, format)) {
            Map<String, Integer> columns = new TreeMap<>(String.CASE_INSENSITIVE_ORDER);
            columns.putAll(parser.getHeaderMap());
            if (!timeRequired && !columns.containsKey("t")) {
                needed.remove("t");
            }
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
            int width = 0;
            for (int j = 0; j < needed.size(); j++) {
                width = Math.max(width, index[j] + 1);
            }
            for (CSVRecord record : parser) {
                int line = (int) parser.getCurrentLineNumber();
                if (record.size() < width) {
                    problems.add(new InputException.Problem(InputException.Cause.MISSING, InputLocation.at(file, line, 0, ""),
                        "the row has " + record.size() + " fields, fewer than the header's columns " + needed
                            + " need; give every row all columns"));
                    if (problems.size() >= 20) {
                        break;
                    }
                    continue;
                }
                String[] row = new String[d + 1];
                for (int j = 0; j < needed.size(); j++) {
                    row[j] = record.get(index[j]);
                }
                if (needed.size() == d) {
                    row[d] = "";
                }
                cells.add(row);
                lines.add(line);
            }
        } catch (IOException | IllegalArgumentException | IllegalStateException e) {
            String message = e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
            problems.add(new InputException.Problem(InputException.Cause.MALFORMED, InputLocation.of(file),
                "cannot read the points: " + message));
        }
        int n = cells.size();
        boolean timed = needed.size() > d;
        double[] x = new double[n * d];
        double[] t = new double[n];
        boolean[] bad = new boolean[n];
        java.util.stream.IntStream.range(0, n).parallel().forEach(i -> {
            String[] row = cells.get(i);
            boolean b = false;
            for (int j = 0; j < d; j++) {
                x[i * d + j] = parse(row[j]);
                b |= !Double.isFinite(x[i * d + j]);
            }
            t[i] = timed ? parse(row[d]) : 0;
            bad[i] = b || !(t[i] >= 0) || !Double.isFinite(t[i]);
        });
        int[] line = new int[n];
        String[] xText = new String[n];
        String[] tText = new String[n];
        for (int i = 0; i < n; i++) {
            line[i] = lines.get(i);
            String[] row = cells.get(i);
            xText[i] = d == 1 ? row[0] : String.join(",", java.util.Arrays.copyOf(row, d));
            tText[i] = row[d];
            if (bad[i] && problems.size() < 20) {
                for (int j = 0; j < needed.size(); j++) {
                    InputLocation at = InputLocation.at(file, line[i], index[j] + 1, "");
                    String name = needed.get(j);
                    double value = parse(row[j]);
                    if (Double.isNaN(value) && !row[j].equalsIgnoreCase("nan")) {
                        problems.add(new InputException.Problem(InputException.Cause.NOT_A_NUMBER, at, "column \""
                            + name + "\": \"" + row[j] + "\" is not a number; write plain decimal numbers such as"
                            + " 0.05 or 1e-3"));
                    } else if (!Double.isFinite(value)) {
                        problems.add(new InputException.Problem(InputException.Cause.NOT_A_NUMBER, at, "column \""
                            + name + "\": " + row[j] + " is not finite; give finite numbers"));
                    } else if (j == d && value < 0) {
                        problems.add(new InputException.Problem(InputException.Cause.OUT_OF_RANGE, at, "t = " + row[j]
                            + " s is negative; times must be >= 0"));
                    }
                }
            }
        }
        if (!problems.isEmpty()) {
            throw new InputException(problems);
        }
        if (n == 0) {
            throw new InputException(InputException.Cause.MISSING, InputLocation.of(file),
                "no points; add rows below the header");
        }
        return new Points(x, t, line, xText, tText);
    }

    /** Double.parseDouble, with NaN for text that is not a number (reported by the caller). */
    private static double parse(String text) {
        try {
            return Double.parseDouble(text);
        } catch (NumberFormatException e) {
            return Double.NaN;
        }
    }
}

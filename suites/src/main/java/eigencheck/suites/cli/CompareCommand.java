package eigencheck.suites.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ObjectNode;
import eigencheck.adapters.DataArray;
import eigencheck.adapters.Field;
import eigencheck.adapters.FieldSeries;
import eigencheck.adapters.InputException;
import eigencheck.adapters.InputLocation;
import eigencheck.adapters.ReadOptions;
import eigencheck.adapters.Readers;
import eigencheck.oracle.Oracle;
import eigencheck.oracle.OracleException;
import eigencheck.oracle.problem.Problem;
import eigencheck.suites.files.ProblemFile;
import eigencheck.suites.norms.ErrorNorms;
import eigencheck.suites.norms.SlabReference;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;

/** {@code eigencheck compare PROBLEM OUTPUT [--time T] [--field NAME] [--json]}: error norms of one output. */
@Command(name = "compare", mixinStandardHelpOptions = true,
    description = {"Error norms of one solver output against the certified reference solution of a problem:",
        "the number of points, the max and rms nodal errors and, where the output has cells, the L2 norm and H1"
            + " seminorm of the error of the finite-element function on the solver's own cells; for cell data,"
            + " errors against the exact cell averages."})
final class CompareCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "PROBLEM", description = "problem file (.yaml, .yml or .json)")
    Path problemFile;

    @Parameters(index = "1", paramLabel = "OUTPUT", description = "solver output (.csv, .json, .vtk, .vtu, .pvd,"
        + " or a glob such as 'out_*.csv' for a set of files)")
    Path output;

    @Option(names = "--time", paramLabel = "T", description = "time of the output to compare (s); needed when the"
        + " output holds several times or none")
    Double time;

    @Option(names = "--field", paramLabel = "NAME", description = "array or column to compare (default: the only"
        + " one, or T, u, temperature)")
    String field;

    @Option(names = "--format", paramLabel = "F", description = "csv, json, vtk, vtu or pvd (default: by extension)")
    String format;

    @Option(names = "--axis", paramLabel = "A", defaultValue = "x", description = "output coordinate read as the"
        + " slab's x: x, y or z (default ${DEFAULT-VALUE})")
    String axis;

    @Option(names = "--unit", paramLabel = "COL=UNIT", description = "unit of a CSV column, converted to SI or as"
        + " FROM->TO, for example x=mm or T=K->degC (repeatable)")
    List<String> units = new ArrayList<>();

    @Option(names = "--tolerance", paramLabel = "T", defaultValue = "1e-10", description = "oracle tolerance"
        + " (default ${DEFAULT-VALUE})")
    double tolerance;

    @Option(names = "--json", description = "print one JSON object with the keys points, max, rms, l2, h1semi")
    boolean json;

    @picocli.CommandLine.Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() throws Exception {
        int axisIndex = switch (axis.toLowerCase(Locale.ROOT)) {
            case "x" -> 0;
            case "y" -> 1;
            case "z" -> 2;
            default -> throw new picocli.CommandLine.ParameterException(spec.commandLine(), "--axis " + axis
                + " is not x, y or z");
        };
        Map<String, String> unitMap = new LinkedHashMap<>();
        for (String u : units) {
            int eq = u.indexOf('=');
            if (eq <= 0) {
                throw new picocli.CommandLine.ParameterException(spec.commandLine(), "--unit " + u
                    + " must be COLUMN=UNIT, for example x=mm");
            }
            unitMap.put(u.substring(0, eq).trim(), u.substring(eq + 1).trim());
        }
        Problem problem = ProblemFile.read(problemFile);
        ReadOptions options = ReadOptions.defaults().withFormat(format).withField(field).withUnits(unitMap);
        FieldSeries series = Readers.read(output, options);
        Field f = select(series);
        double t = time != null ? time : f.time();
        if (!(t >= 0)) {
            throw new InputException(InputException.Cause.MISSING, InputLocation.of(output),
                "the output gives no time; say which with --time");
        }
        boolean slab = problem.domain() instanceof eigencheck.oracle.problem.Slab;
        if (slab) {
            checkAxis(f, axisIndex);
        }
        Oracle oracle;
        try {
            oracle = Oracle.prepare(problem, t, tolerance);
        } catch (OracleException e) {
            throw new OracleException(e.reason(), problemFile + ": " + e.getMessage());
        }
        eigencheck.suites.norms.Reference reference = slab ? new SlabReference(oracle, t, axisIndex)
            : eigencheck.suites.SuiteRunner.referenceOf(oracle, t);
        String name = fieldName(f);
        ErrorNorms.Result r;
        try {
            if (f.pointData().containsKey(name)) {
                r = ErrorNorms.ofPointData(f, f.pointData().get(name), reference);
            } else {
                DataArray cellValues = f.cellData().get(name);
                r = ErrorNorms.ofCellData(f, cellValues, reference);
            }
        } catch (OracleException e) {
            throw new OracleException(e.reason(), output + ": " + e.getMessage()
                + (e.reason() == OracleException.Reason.OUTSIDE_DOMAIN
                ? "; check the output's units (--unit x=mm) and --axis" : ""));
        }
        if (json) {
            ObjectMapper mapper = new ObjectMapper();
            ObjectNode o = mapper.createObjectNode();
            o.put("points", r.count());
            o.put("max", r.max());
            o.put("rms", r.rms());
            if (r.l2() == null) {
                o.putNull("l2");
            } else {
                o.put("l2", r.l2());
            }
            if (r.h1semi() == null) {
                o.putNull("h1semi");
            } else {
                o.put("h1semi", r.h1semi());
            }
            spec.commandLine().getOut().println(mapper.writeValueAsString(o));
        } else {
            var out = spec.commandLine().getOut();
            out.printf(Locale.ROOT, "%s: field %s at t = %s s against %s%n", output, name, t, problemFile);
            out.printf(Locale.ROOT, "  %-7s %d%n", r.location(), r.count());
            out.printf(Locale.ROOT, "  max     %.6e%n", r.max());
            out.printf(Locale.ROOT, "  rms     %.6e%n", r.rms());
            out.printf(Locale.ROOT, "  l2      %s%n", r.l2() == null ? "(no cells)" : String.format(Locale.ROOT, "%.6e",
                r.l2()));
            out.printf(Locale.ROOT, "  h1semi  %s%n", r.h1semi() == null ? (r.location().equals("cells")
                ? "(cell data)" : r.l2() != null ? "(no gradient of this reference)" : "(no cells)")
                : String.format(Locale.ROOT, "%.6e", r.h1semi()));
            out.flush();
        }
        return Main.OK;
    }

    private Field select(FieldSeries series) throws InputException {
        if (time != null) {
            if (series.fields().size() == 1 && Double.isNaN(series.fields().get(0).time())) {
                return series.fields().get(0);
            }
            Field f = series.at(time);
            if (f == null) {
                throw new InputException(InputException.Cause.INVALID_VALUE, InputLocation.of(output), "no output at t = "
                    + time + " s; the output holds " + java.util.Arrays.toString(series.times()));
            }
            return f;
        }
        if (series.fields().size() > 1) {
            throw new InputException(InputException.Cause.INVALID_VALUE, InputLocation.of(output), "the output holds "
                + series.fields().size() + " times " + java.util.Arrays.toString(series.times()) + "; pick one with --time");
        }
        return series.fields().get(0);
    }

    private String fieldName(Field f) throws InputException {
        if (field != null) {
            if (!f.pointData().containsKey(field) && !f.cellData().containsKey(field)) {
                throw new InputException(InputException.Cause.MISSING, InputLocation.of(output), "no array \"" + field
                    + "\"; the output has " + f.arrayNames());
            }
            return field;
        }
        List<String> names = f.arrayNames();
        if (names.size() == 1) {
            return names.get(0);
        }
        for (String candidate : new String[] {"T", "u", "temperature", "Temperature", "U"}) {
            if (names.contains(candidate)) {
                return candidate;
            }
        }
        throw new InputException(InputException.Cause.INVALID_VALUE, InputLocation.of(output), "the output has the"
            + " arrays " + names + "; name the one to compare with --field");
    }

    /** A slab output without cells of dimension 2 or 3 must vary along one axis only. */
    private void checkAxis(Field f, int axisIndex) throws InputException {
        if (axisIndex >= f.dimension()) {
            throw new InputException(InputException.Cause.INVALID_VALUE, InputLocation.of(output), "--axis "
                + axis + " but the output has " + f.dimension() + " coordinate(s)");
        }
        boolean area = false;
        if (f.cells() != null) {
            for (int c = 0; c < f.cells().size(); c++) {
                var type = eigencheck.adapters.CellType.of(f.cells().type(c));
                if (type != null && type.dimension() >= 2) {
                    area = true;
                    break;
                }
            }
        }
        if (area) {
            return; // a slab solution compared on a 2D or 3D mesh of a block: constant across
        }
        for (int a = 0; a < f.dimension(); a++) {
            if (a == axisIndex) {
                continue;
            }
            double first = f.coordinate(0, a);
            for (int i = 1; i < f.size(); i++) {
                if (Math.abs(f.coordinate(i, a) - first) > 1e-12 * Math.max(1, Math.abs(first))) {
                    throw new InputException(InputException.Cause.INVALID_VALUE, InputLocation.of(output), "point " + i
                        + " has " + "xyz".charAt(a) + " = " + f.coordinate(i, a) + " while point 0 has " + first
                        + "; a slab output varies along one axis: name it with --axis");
                }
            }
        }
    }
}

package eigencheck.suites.files;

import eigencheck.adapters.InputException;
import eigencheck.adapters.InputException.Cause;
import eigencheck.adapters.InputLocation;
import eigencheck.adapters.ReadOptions;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Slab;
import eigencheck.suites.Suite;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Reads a suite file (YAML or JSON; format in the README, "Suite files"). Every problem is reported
 * at once with its field path and line:column.
 *
 * @since 0.1
 */
public final class SuiteFile {
    private static final List<String> TOP = List.of("suite", "description", "cases");
    private static final List<String> CASE = List.of("name", "description", "problem", "manufactured", "solver", "read",
        "levels", "compare", "expect");
    private static final List<String> NORMS = List.of("max", "rms", "l2", "h1semi");

    private SuiteFile() {
    }

    public static Suite read(Path file) throws InputException {
        Node root = TreeReader.read(file);
        Checker c = new Checker();
        Node.Obj top = c.object(root, "a suite file is a mapping with suite and cases");
        c.throwIfAny();
        c.allowOnly(top, TOP);
        Path dir = file.toAbsolutePath().getParent();
        String name = top.fields().containsKey("suite") ? c.text(top.fields().get("suite"), "the suite's name")
            : file.getFileName().toString();
        List<Suite.Case> cases = new ArrayList<>();
        Node casesNode = c.required(top, "cases", "give a list of cases");
        if (casesNode instanceof Node.Arr arr) {
            java.util.Set<String> names = new java.util.HashSet<>();
            for (Node n : arr.items()) {
                Suite.Case k = caseOf(c, n, dir);
                if (k != null) {
                    if (!names.add(k.name())) {
                        c.problem(Cause.INVALID_VALUE, n.location(), "a second case named \"" + k.name()
                            + "\"; give each case its own name");
                    }
                    cases.add(k);
                }
            }
            if (arr.items().isEmpty()) {
                c.problem(Cause.MISSING, arr.location(), "no cases; add at least one");
            }
        } else if (casesNode != null) {
            c.problem(Cause.INVALID_VALUE, casesNode.location(), "expected a list of cases, found " + casesNode.kind());
        }
        c.throwIfAny();
        return new Suite(name, file, dir, cases);
    }

    private static Suite.Case caseOf(Checker c, Node n, Path dir) throws InputException {
        Node.Obj o = c.object(n, "a case is a mapping with name, problem, levels, compare and expect");
        if (o == null) {
            return null;
        }
        c.allowOnly(o, CASE);
        Map<String, Node> f = o.fields();
        Node nameNode = c.required(o, "name", "give the case a name");
        String name = nameNode == null ? "?" : c.text(nameNode, "the case's name");
        if (name != null && !name.matches("[A-Za-z0-9._-]+")) {
            c.problem(Cause.INVALID_VALUE, nameNode.location(), "case name \"" + name + "\" may use letters, digits,"
                + " '.', '_' and '-' only (it names folders)");
        }
        String description = f.containsKey("description") ? c.text(f.get("description"), "text") : "";
        // problem: a path or an inline mapping
        Problem problem = null;
        Path problemFile = null;
        eigencheck.oracle.expr.Expression manufactured = null;
        double manufacturedLength = Double.NaN;
        Node p = f.get("problem");
        if (f.containsKey("manufactured")) {
            if (p != null) {
                c.problem(Cause.INVALID_VALUE, o.keys().get("manufactured"), "give problem or manufactured, not both");
            }
            Object[] m = manufactured(c, f.get("manufactured"));
            if (m != null) {
                problem = (Problem) m[0];
                manufactured = (eigencheck.oracle.expr.Expression) m[1];
                manufacturedLength = ((double[]) m[2])[0];
            }
            p = null;
        } else if (p == null) {
            c.required(o, "problem", "give a problem file (path), the problem inline, or manufactured: {solution: ...}");
        }
        if (p instanceof Node.Scalar s && s.value() instanceof String path) {
            problemFile = dir.resolve(path).normalize();
            if (!Files.isRegularFile(problemFile)) {
                c.problem(Cause.UNREADABLE, p.location(), "no problem file " + problemFile + "; check the path (relative"
                    + " to the suite file)");
            } else {
                try {
                    problem = ProblemFile.read(problemFile);
                } catch (InputException e) {
                    for (InputException.Problem q : e.problems()) {
                        c.problem(q.cause(), q.location(), q.message());
                    }
                }
            }
        } else if (p instanceof Node.Obj) {
            try {
                problem = ProblemFile.fromTree(p);
            } catch (InputException e) {
                for (InputException.Problem q : e.problems()) {
                    c.problem(q.cause(), q.location(), q.message());
                }
            }
        } else if (p != null) {
            c.problem(Cause.INVALID_VALUE, p.location(), "expected a path or a mapping, found " + p.kind());
        }
        Suite.Solver solver = f.containsKey("solver") ? solver(c, f.get("solver")) : null;
        ReadOptions read = f.containsKey("read") ? read(c, f.get("read")) : ReadOptions.defaults();
        // h = L / cells: the slab's length, the x edge of a rectangle or box, the radius of a cylinder or sphere
        double length = problem == null ? manufacturedLength : problem.domain() instanceof Slab slab ? slab.length()
            : problem.domain().lengths().length > 0 ? problem.domain().lengths()[0]
            : problem.domain().characteristicLength();
        String[] path = {null};
        List<Suite.Level> levels = new ArrayList<>();
        Node levelsNode = c.required(o, "levels", "give the refinement levels");
        if (levelsNode != null) {
            levels = levels(c, levelsNode, dir, length, solver != null, path);
        }
        Suite.Compare compare = compare(c, f.get("compare"), o.location());
        List<Suite.Expect> rules = new ArrayList<>();
        Node expectNode = f.get("expect");
        if (expectNode instanceof Node.Arr arr && !arr.items().isEmpty()) {
            for (Node item : arr.items()) {
                rules.add(expect(c, item, compare));
            }
            boolean fail = rules.stream().anyMatch(x -> x != null && x.fail());
            if (fail && rules.stream().anyMatch(x -> x != null && !x.fail())) {
                c.problem(Cause.INVALID_VALUE, arr.location(), "give outcome: fail on every rule of a planted-defect case,"
                    + " or on none");
            }
        } else {
            rules.add(expect(c, expectNode, compare));
        }
        if (name == null || rules.contains(null)) {
            return null;
        }
        return new Suite.Case(name, description, problem, problemFile, solver, read, levels, compare, rules, path[0],
            manufactured);
    }

    /**
     * {solution: "u(x,t)", domain: {shape: slab, length}, material: {...}, boundary: {xmin: dirichlet |
     * neumann | {robin: h}, xmax: ...}}: the problem whose exact solution is u (source and face data
     * derived exactly).
     */
    private static Object[] manufactured(Checker c, Node n) {
        Node.Obj o = c.object(n, "give {solution, domain, material, boundary}");
        if (o == null) {
            return null;
        }
        c.allowOnly(o, List.of("solution", "domain", "material", "boundary"));
        Node sol = c.required(o, "solution", "the manufactured solution u(x, t), an expression");
        String shapeName = o.fields().get("domain") instanceof Node.Obj d0 && d0.fields().get("shape") instanceof Node.Scalar s0
            && s0.value() instanceof String text ? text : "slab";
        boolean planar = shapeName.equals("rectangle") || shapeName.equals("box");
        boolean radial = shapeName.equals("cylinder") || shapeName.equals("sphere");
        eigencheck.oracle.expr.Expression u = sol == null ? null : planar ? eigencheck.oracle.expr.Expression.parse("0")
            : radial ? c.expression(sol, new String[] {"r", "t"}, "u is an expression of r and t")
            : c.expression(sol, new String[] {"x", "t"}, "u is an expression of x and t");
        Node domain = c.required(o, "domain", "for example {shape: slab, length: 1} or {shape: rectangle, lengthX: 1,"
            + " lengthY: 0.5}");
        Node material = c.required(o, "material", "{conductivity, volumetricHeatCapacity} or {diffusivity}");
        if (u == null || domain == null || material == null) {
            return null;
        }
        if (planar) {
            // u(x, y[, z], t): the expression is the reference; with boundary kinds the source and side data are
            // derived for the solver (the {problem} placeholder), without them the solver encodes its own data
            boolean box = shapeName.equals("box");
            String[] vars = box ? new String[] {"x", "y", "z", "t"} : new String[] {"x", "y", "t"};
            List<String> sideNames = box ? List.of("xmin", "xmax", "ymin", "ymax", "zmin", "zmax")
                : List.of("xmin", "xmax", "ymin", "ymax");
            eigencheck.oracle.expr.Expression surface = c.expression(sol, vars, "u is an expression of "
                + String.join(", ", vars));
            Problem carrier = carrier(c, o, domain, material, sideNames);
            if (carrier == null || surface == null) {
                return null;
            }
            double[] lengths = carrier.domain().lengths();
            if (!o.fields().containsKey("boundary")) {
                return new Object[] {null, surface, lengths};
            }
            Map<eigencheck.oracle.problem.Side, eigencheck.oracle.problem.Manufactured.Face> kinds =
                faceKinds(c, o.fields().get("boundary"), sideNames, "{xmin: dirichlet | neumann | {robin: h}, ...}");
            if (kinds == null) {
                return null;
            }
            Problem derived = eigencheck.oracle.problem.Manufactured.cartesian(surface, carrier.domain(),
                carrier.material(), kinds);
            return new Object[] {derived, surface, lengths};
        }
        if (radial) {
            // u(r, t) on a cylinder or sphere: the source and surface data derived for the solver
            Node boundary = c.required(o, "boundary", "the kind of the surface: {surface: dirichlet | neumann"
                + " | {robin: h}}");
            Problem carrier = boundary == null ? null : carrier(c, o, domain, material, List.of("surface"));
            if (carrier == null) {
                return null;
            }
            Map<eigencheck.oracle.problem.Side, eigencheck.oracle.problem.Manufactured.Face> kinds = faceKinds(c,
                boundary, List.of("surface"), "{surface: dirichlet | neumann | {robin: h}}");
            if (kinds == null) {
                return null;
            }
            Problem derived = eigencheck.oracle.problem.Manufactured.radial(u, carrier.domain(), carrier.material(),
                kinds.get(eigencheck.oracle.problem.Side.SURFACE));
            return new Object[] {derived, u, new double[] {carrier.domain().characteristicLength()}};
        }
        Node boundary = c.required(o, "boundary", "the kind of each face: {xmin: dirichlet, xmax: {robin: 25}}");
        if (boundary == null) {
            return null;
        }
        List<String> slabSides = List.of("xmin", "xmax");
        Problem carrier = carrier(c, o, domain, material, slabSides);
        if (carrier == null) {
            return null;
        }
        Map<eigencheck.oracle.problem.Side, eigencheck.oracle.problem.Manufactured.Face> kinds = faceKinds(c, boundary,
            slabSides, "{xmin: dirichlet | neumann | {robin: h}, xmax: ...}");
        if (kinds == null) {
            return null;
        }
        Problem derived = eigencheck.oracle.problem.Manufactured.slab(u, (Slab) carrier.domain(), carrier.material(),
            kinds.get(eigencheck.oracle.problem.Side.XMIN), kinds.get(eigencheck.oracle.problem.Side.XMAX));
        return new Object[] {derived, u, new double[] {((Slab) carrier.domain()).length()}};
    }

    /** The domain and material of a manufactured case, read through the problem-file checks. */
    private static Problem carrier(Checker c, Node.Obj o, Node domain, Node material, List<String> sideNames) {
        Map<String, Node> fields = new LinkedHashMap<>();
        fields.put("domain", domain);
        fields.put("material", material);
        fields.put("initial", new Node.Scalar(o.location(), "0", false));
        Map<String, Node> faces = new LinkedHashMap<>();
        Map<String, InputLocation> faceKeys = new LinkedHashMap<>();
        Node zero = new Node.Obj(o.location(), Map.of("dirichlet", new Node.Scalar(o.location(), "0", false)),
            Map.of("dirichlet", o.location()));
        for (String side : sideNames) {
            faces.put(side, zero);
            faceKeys.put(side, o.location());
        }
        fields.put("boundary", new Node.Obj(o.location(), faces, faceKeys));
        try {
            return ProblemFile.fromTree(new Node.Obj(o.location(), fields, Map.of()));
        } catch (InputException e) {
            for (InputException.Problem q : e.problems()) {
                c.problem(q.cause(), q.location(), q.message());
            }
            return null;
        }
    }

    /** {side: dirichlet | neumann | {robin: h}} for every side, or null after reporting. */
    private static Map<eigencheck.oracle.problem.Side, eigencheck.oracle.problem.Manufactured.Face> faceKinds(
            Checker c, Node boundary, List<String> sideNames, String hint) {
        Node.Obj b = c.object(boundary, hint);
        if (b == null) {
            return null;
        }
        c.allowOnly(b, sideNames);
        Map<eigencheck.oracle.problem.Side, eigencheck.oracle.problem.Manufactured.Face> kinds =
            new java.util.EnumMap<>(eigencheck.oracle.problem.Side.class);
        boolean ok = true;
        for (String side : sideNames) {
            Node face = c.required(b, side, "dirichlet, neumann or {robin: h}");
            eigencheck.oracle.problem.Manufactured.Face kind = null;
            if (face instanceof Node.Scalar s && "dirichlet".equals(s.value())) {
                kind = eigencheck.oracle.problem.Manufactured.Face.dirichlet();
            } else if (face instanceof Node.Scalar s && "neumann".equals(s.value())) {
                kind = eigencheck.oracle.problem.Manufactured.Face.neumann();
            } else if (face instanceof Node.Obj r && r.fields().containsKey("robin")) {
                double h = c.positive(r.fields().get("robin"), "the heat transfer coefficient h in W/(m^2 K)");
                if (!Double.isNaN(h)) {
                    kind = eigencheck.oracle.problem.Manufactured.Face.robin(h);
                }
            } else if (face != null) {
                c.problem(Cause.INVALID_VALUE, face.location(), "a face kind is dirichlet, neumann or {robin: h}");
            }
            if (kind == null) {
                ok = false;
            } else {
                kinds.put(eigencheck.oracle.problem.Side.valueOf(side.toUpperCase(java.util.Locale.ROOT)), kind);
            }
        }
        return ok ? kinds : null;
    }

    private static Suite.Solver solver(Checker c, Node n) {
        Node.Obj o = c.object(n, "give {command: [...], output: FILE, timeout: SECONDS}");
        if (o == null) {
            return null;
        }
        c.allowOnly(o, List.of("command", "output", "timeout"));
        Node cmd = c.required(o, "command", "the solver's argument list, for example [java, Solver.java, --cells,"
            + " \"{cells}\", --out, \"{output}\"] (no shell)");
        List<String> args = new ArrayList<>();
        if (cmd instanceof Node.Arr arr && !arr.items().isEmpty()) {
            for (Node a : arr.items()) {
                if (a instanceof Node.Scalar s && s.value() != null && !(s.value() instanceof Boolean)) {
                    args.add(s.value().toString());
                } else {
                    c.problem(Cause.INVALID_VALUE, a.location(), "an argument must be text or a number");
                }
            }
        } else if (cmd != null) {
            c.problem(Cause.INVALID_VALUE, cmd.location(), "expected a non-empty list of arguments (no shell: a string"
                + " is not split)");
        }
        String output = o.fields().containsKey("output") ? c.text(o.fields().get("output"), "the output file name")
            : "output.csv";
        double timeout = o.fields().containsKey("timeout") ? c.positive(o.fields().get("timeout"), "seconds") : 600;
        if (!args.isEmpty() && args.stream().noneMatch(a -> a.contains("{output}"))) {
            c.problem(Cause.INVALID_VALUE, cmd.location(), "no argument contains {output}; tell the solver where to"
                + " write, for example --out \"{output}\"");
        }
        return new Suite.Solver(args, output, Double.isNaN(timeout) ? 600 : timeout);
    }

    private static ReadOptions read(Checker c, Node n) {
        Node.Obj o = c.object(n, "adapter options, for example {format: csv, field: T}");
        if (o == null) {
            return ReadOptions.defaults();
        }
        c.allowOnly(o, List.of("format", "field", "coordinates", "time", "delimiter", "comment", "units", "pointers",
            "timeFromName", "timeScale"));
        Map<String, Node> f = o.fields();
        String format = f.containsKey("format") ? c.text(f.get("format"), "csv, json, vtk, vtu or pvd") : null;
        String field = f.containsKey("field") ? c.text(f.get("field"), "the array or column name") : null;
        List<String> coordinates = new ArrayList<>();
        if (f.get("coordinates") instanceof Node.Arr arr) {
            for (Node a : arr.items()) {
                coordinates.add(c.text(a, "a column name"));
            }
        }
        String time = f.containsKey("time") ? c.text(f.get("time"), "the time column") : null;
        Character delimiter = f.containsKey("delimiter") ? first(c, f.get("delimiter")) : null;
        Character comment = f.containsKey("comment") ? first(c, f.get("comment")) : null;
        Map<String, String> units = strings(c, f.get("units"));
        Map<String, String> pointers = strings(c, f.get("pointers"));
        String timeFromName = f.containsKey("timeFromName") ? c.text(f.get("timeFromName"), "a regular expression") : null;
        Double timeScale = f.containsKey("timeScale") ? c.positive(f.get("timeScale"), "a factor") : null;
        return new ReadOptions(format, field, coordinates, time, delimiter, comment, units, pointers, timeFromName,
            timeScale);
    }

    private static Character first(Checker c, Node n) {
        String s = c.text(n, "one character");
        if (s == null || s.length() != 1) {
            c.problem(Cause.INVALID_VALUE, n.location(), "expected one character");
            return null;
        }
        return s.charAt(0);
    }

    private static Map<String, String> strings(Checker c, Node n) {
        Map<String, String> m = new LinkedHashMap<>();
        if (n == null) {
            return m;
        }
        Node.Obj o = c.object(n, "a mapping of names to text");
        if (o != null) {
            for (Map.Entry<String, Node> e : o.fields().entrySet()) {
                String v = c.text(e.getValue(), "text");
                if (v != null) {
                    m.put(e.getKey(), v);
                }
            }
        }
        return m;
    }

    private static List<Suite.Level> levels(Checker c, Node n, Path dir, double length, boolean hasSolver,
                                            String[] refinementPath) {
        List<Suite.Level> out = new ArrayList<>();
        if (n instanceof Node.Arr arr) {
            int i = 0;
            for (Node item : arr.items()) {
                Node.Obj o = c.object(item, "a level is a mapping with cellSize or cells, timeStep, and output");
                if (o == null) {
                    continue;
                }
                Map<String, String> values = new LinkedHashMap<>();
                for (Map.Entry<String, Node> e : o.fields().entrySet()) {
                    if (e.getValue() instanceof Node.Scalar s && s.value() != null) {
                        values.put(e.getKey(), s.value().toString());
                    }
                }
                Integer cells = null;
                double h = Double.NaN;
                if (o.fields().containsKey("cells")) {
                    double v = c.positive(o.fields().get("cells"), "a whole number of cells");
                    if (v == Math.rint(v)) {
                        cells = (int) v;
                        h = length / v;
                    } else if (!Double.isNaN(v)) {
                        c.problem(Cause.INVALID_VALUE, o.fields().get("cells").location(), "cells must be a whole number");
                    }
                }
                if (o.fields().containsKey("cellSize")) {
                    h = c.positive(o.fields().get("cellSize"), "the cell size h in m");
                }
                if (Double.isNaN(h) && !o.fields().containsKey("cells") && !o.fields().containsKey("cellSize")) {
                    c.problem(Cause.MISSING, o.location(), "give cells or cellSize for this level");
                }
                double dt = o.fields().containsKey("timeStep") ? c.positive(o.fields().get("timeStep"), "s") : Double.NaN;
                Path output = null;
                if (o.fields().containsKey("output")) {
                    String s = c.text(o.fields().get("output"), "the output file of this level");
                    if (s != null) {
                        output = dir.resolve(s).normalize();
                    }
                } else if (!hasSolver) {
                    c.problem(Cause.MISSING, o.location(), "give the level's output file, or a solver command for the case");
                }
                values.putIfAbsent("cellSize", Double.toString(h));
                out.add(new Suite.Level(i++, h, dt, cells, output, values));
            }
        } else if (n instanceof Node.Obj o) {
            // compact form: cells: [..] or cellSize: [..]; timeStep: {coarsest, path} or [..]; other keys lists
            c.allowOnly(o, o.fields().keySet().stream().toList());
            Node cellsNode = o.fields().get("cells");
            Node sizeNode = o.fields().get("cellSize");
            List<Double> sizes = new ArrayList<>();
            List<Integer> counts = new ArrayList<>();
            if (cellsNode instanceof Node.Arr arr) {
                for (Node item : arr.items()) {
                    double v = c.positive(item, "a whole number of cells");
                    counts.add((int) v);
                    sizes.add(length / v);
                }
            } else if (sizeNode instanceof Node.Arr arr) {
                for (Node item : arr.items()) {
                    sizes.add(c.positive(item, "a cell size in m"));
                    counts.add(null);
                }
            } else {
                c.problem(Cause.MISSING, o.location(), "give cells: [...] or cellSize: [...], coarsest first");
                return out;
            }
            double[] dts = new double[sizes.size()];
            java.util.Arrays.fill(dts, Double.NaN);
            Node dtNode = o.fields().get("timeStep");
            if (dtNode instanceof Node.Obj d) {
                c.allowOnly(d, List.of("coarsest", "path"));
                Node coarsest = c.required(d, "coarsest", "the time step of the coarsest level, s");
                Node pathNode = c.required(d, "path", "fixed, h or h2: how the time step follows the cell size");
                double dt0 = coarsest == null ? Double.NaN : c.positive(coarsest, "s");
                String path = pathNode == null ? null : c.text(pathNode, "fixed, h or h2");
                if (path != null && !List.of("fixed", "h", "h2").contains(path)) {
                    c.problem(Cause.INVALID_VALUE, pathNode.location(), "path \"" + path + "\"; allowed: fixed, h, h2");
                    path = null;
                }
                refinementPath[0] = path;
                for (int i = 0; i < dts.length && path != null; i++) {
                    double ratio = sizes.get(0) / sizes.get(i);
                    dts[i] = switch (path) {
                        case "fixed" -> dt0;
                        case "h" -> dt0 / ratio;
                        default -> dt0 / (ratio * ratio);
                    };
                }
            } else if (dtNode instanceof Node.Arr arr) {
                for (int i = 0; i < Math.min(dts.length, arr.items().size()); i++) {
                    dts[i] = c.positive(arr.items().get(i), "s");
                }
                if (arr.items().size() != dts.length) {
                    c.problem(Cause.INVALID_VALUE, arr.location(), arr.items().size() + " time steps for " + dts.length
                        + " levels");
                }
            }
            for (int i = 0; i < sizes.size(); i++) {
                Map<String, String> values = new LinkedHashMap<>();
                for (Map.Entry<String, Node> e : o.fields().entrySet()) {
                    if (e.getValue() instanceof Node.Arr arr && arr.items().size() == sizes.size()
                        && arr.items().get(i) instanceof Node.Scalar s && s.value() != null) {
                        values.put(e.getKey(), s.value().toString());
                    } else if (e.getValue() instanceof Node.Arr arr && arr.items().size() != sizes.size()
                        && !e.getKey().equals("timeStep")) {
                        c.problem(Cause.INVALID_VALUE, arr.location(), e.getKey() + " has " + arr.items().size()
                            + " entries for " + sizes.size() + " levels");
                    }
                }
                values.put("cellSize", Double.toString(sizes.get(i)));
                if (!Double.isNaN(dts[i])) {
                    values.put("timeStep", Double.toString(dts[i]));
                }
                Path output = null;
                if (values.containsKey("output")) {
                    output = dir.resolve(values.get("output")).normalize();
                } else if (!hasSolver) {
                    c.problem(Cause.MISSING, o.location(), "give output: [...] files, or a solver command for the case");
                }
                out.add(new Suite.Level(i, sizes.get(i), dts[i], counts.get(i), output, values));
            }
        } else {
            c.problem(Cause.INVALID_VALUE, n.location(), "levels: a list of levels, or {cells: [...], timeStep: ...}");
        }
        for (int i = 1; i < out.size(); i++) {
            double r = out.get(i - 1).cellSize() / out.get(i).cellSize();
            if (!(r > 1.0001)) {
                c.problem(Cause.INVALID_VALUE, n.location(), String.format(java.util.Locale.ROOT, "levels %d and %d have"
                    + " the same or a larger cell size (r = %.2f); list the levels coarsest first, each finer", i - 1, i, r));
            }
        }
        if (out.size() < 2) {
            c.problem(Cause.INVALID_VALUE, n.location(), "a refinement study needs at least two levels (three or more"
                + " to see whether the levels are asymptotic)");
        }
        return out;
    }

    private static Suite.Compare compare(Checker c, Node n, InputLocation at) {
        if (n == null) {
            c.problem(Cause.MISSING, at, "compare: missing; give {times: [...], norms: [...]}");
            return new Suite.Compare(List.of(), "points", List.of("max"), List.of(), false, List.of());
        }
        Node.Obj o = c.object(n, "give {times: [...], norms: [max, rms, l2, h1semi], location: points|cells}");
        if (o == null) {
            return new Suite.Compare(List.of(), "points", List.of("max"), List.of(), false, List.of());
        }
        c.allowOnly(o, List.of("times", "norms", "location", "probes", "heatContent", "flux"));
        List<Double> times = new ArrayList<>();
        if (o.fields().get("times") instanceof Node.Arr arr) {
            for (Node t : arr.items()) {
                times.add(c.number(t, "a time in s"));
            }
        } else if (o.fields().containsKey("times")) {
            times.add(c.number(o.fields().get("times"), "a time in s"));
        }
        String location = o.fields().containsKey("location") ? c.text(o.fields().get("location"), "points or cells")
            : "points";
        if (location != null && !List.of("points", "cells").contains(location)) {
            c.problem(Cause.INVALID_VALUE, o.fields().get("location").location(), "location \"" + location
                + "\"; allowed: points (nodal values), cells (cell values against exact cell averages)");
        }
        List<String> norms = new ArrayList<>();
        if (o.fields().get("norms") instanceof Node.Arr arr) {
            for (Node t : arr.items()) {
                String s = c.text(t, "a norm");
                if (s != null && !NORMS.contains(s)) {
                    c.problem(Cause.INVALID_VALUE, t.location(), "norm \"" + s + "\"; allowed: " + String.join(", ", NORMS));
                } else if (s != null) {
                    norms.add(s);
                }
            }
        } else {
            norms.add("max");
        }
        List<Double> probes = new ArrayList<>();
        if (o.fields().get("probes") instanceof Node.Arr arr) {
            for (Node t : arr.items()) {
                probes.add(c.number(t, "a probe coordinate x in m"));
            }
        }
        boolean heat = o.fields().get("heatContent") instanceof Node.Scalar s && Boolean.TRUE.equals(s.value());
        List<String> flux = new ArrayList<>();
        if (o.fields().get("flux") instanceof Node.Arr arr) {
            for (Node t : arr.items()) {
                String face = c.text(t, "xmin or xmax");
                if (face != null && !List.of("xmin", "xmax").contains(face)) {
                    c.problem(Cause.INVALID_VALUE, t.location(), "face \"" + face + "\"; allowed: xmin, xmax");
                } else if (face != null) {
                    flux.add(face);
                }
            }
        }
        return new Suite.Compare(times, location == null ? "points" : location, norms, probes, heat, flux);
    }

    private static Suite.Expect expect(Checker c, Node n, Suite.Compare compare) {
        if (n == null) {
            return new Suite.Expect(compare.norms().isEmpty() ? "max" : compare.norms().get(0), Double.NaN, 0, null, null,
                Double.NaN, Double.NaN, false, 0.1);
        }
        Node.Obj o = c.object(n, "give {norm, order, deficit, band, ceiling, outcome, slack}");
        if (o == null) {
            return null;
        }
        c.allowOnly(o, List.of("norm", "order", "deficit", "band", "ceiling", "outcome", "slack"));
        Map<String, Node> f = o.fields();
        String norm = f.containsKey("norm") ? c.text(f.get("norm"), "the norm the rule applies to")
            : compare.norms().isEmpty() ? "max" : compare.norms().get(0);
        if (norm != null && !compare.norms().contains(norm) && !norm.startsWith("probe") && !norm.equals("heatContent")
            && !norm.startsWith("flux")) {
            c.problem(Cause.INVALID_VALUE, f.containsKey("norm") ? f.get("norm").location() : o.location(), "norm \"" + norm
                + "\" is not among compare.norms " + compare.norms());
        }
        Node orderNode = c.required(o, "order", "the expected (formal) order of convergence of that norm");
        double order = orderNode == null ? Double.NaN : c.positive(orderNode, "an order, for example 2");
        double deficit = f.containsKey("deficit") ? c.number(f.get("deficit"), "the allowed shortfall, for example 0.2")
            : 0.2;
        double[] band = null;
        if (f.get("band") instanceof Node.Arr arr && arr.items().size() == 2) {
            band = new double[] {c.number(arr.items().get(0), "lower order"), c.number(arr.items().get(1), "upper order")};
        } else if (f.containsKey("band")) {
            c.problem(Cause.INVALID_VALUE, f.get("band").location(), "band: [lower, upper] orders");
        }
        double[] ceilings = null;
        double cc = Double.NaN;
        double cp = Double.NaN;
        Node ceiling = f.get("ceiling");
        if (ceiling instanceof Node.Arr arr) {
            ceilings = new double[arr.items().size()];
            for (int i = 0; i < ceilings.length; i++) {
                ceilings[i] = c.positive(arr.items().get(i), "an error ceiling");
            }
        } else if (ceiling instanceof Node.Obj co) {
            c.allowOnly(co, List.of("constant", "order"));
            Node cn = c.required(co, "constant", "C of e <= C h^p");
            Node pn = c.required(co, "order", "p of e <= C h^p");
            cc = cn == null ? Double.NaN : c.positive(cn, "C");
            cp = pn == null ? Double.NaN : c.positive(pn, "p");
        } else if (ceiling != null) {
            c.problem(Cause.INVALID_VALUE, ceiling.location(), "ceiling: a list per level, or {constant: C, order: p}");
        }
        boolean fail = false;
        if (f.containsKey("outcome")) {
            String outcome = c.text(f.get("outcome"), "pass or fail");
            if ("fail".equals(outcome)) {
                fail = true;
            } else if (!"pass".equals(outcome)) {
                c.problem(Cause.INVALID_VALUE, f.get("outcome").location(), "outcome \"" + outcome + "\"; allowed: pass,"
                    + " fail (a planted defect that the check must catch)");
            }
        }
        double slack = f.containsKey("slack") ? c.positive(f.get("slack"), "a fraction, for example 0.1") : 0.1;
        return new Suite.Expect(norm, order, deficit, band, ceilings, cc, cp, fail, slack);
    }
}

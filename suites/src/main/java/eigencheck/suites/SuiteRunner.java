package eigencheck.suites;

import eigencheck.adapters.DataArray;
import eigencheck.adapters.Field;
import eigencheck.adapters.FieldSeries;
import eigencheck.adapters.InputException;
import eigencheck.adapters.Readers;
import eigencheck.oracle.Oracle;
import eigencheck.oracle.OracleException;
import eigencheck.oracle.problem.BoundaryCondition;
import eigencheck.oracle.problem.Problem;
import eigencheck.oracle.problem.Side;
import eigencheck.oracle.problem.Slab;
import eigencheck.suites.Results.CaseResult;
import eigencheck.suites.Results.LevelResult;
import eigencheck.suites.Results.Metric;
import eigencheck.suites.convergence.Convergence;
import eigencheck.suites.norms.ErrorNorms;
import eigencheck.suites.norms.SlabReference;
import eigencheck.suites.run.LevelRunner;
import java.nio.file.Path;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;

/**
 * Runs a suite: every level of every case (in parallel up to {@code jobs}), then per case the error
 * of each compared quantity per level, the convergence analysis and the verdict. A level that cannot
 * be run or read makes its case an ERROR and the suite goes on.
 *
 * @since 0.1
 */
public final class SuiteRunner {
    private SuiteRunner() {
    }

    /** Runs the suite with level folders under {@code reportDir/runs}. */
    public static Results.SuiteResult run(Suite suite, Path reportDir, int jobs) {
        long start = System.nanoTime();
        String started = Instant.now().toString();
        Map<String, List<Future<LevelRunner.Outcome>>> outcomes = new LinkedHashMap<>();
        ExecutorService pool = Executors.newFixedThreadPool(Math.max(1, jobs));
        try {
            for (Suite.Case c : suite.cases()) {
                List<Future<LevelRunner.Outcome>> list = new ArrayList<>();
                for (Suite.Level level : c.levels()) {
                    Path dir = reportDir.resolve("runs").resolve(c.name()).resolve("level-" + level.index());
                    list.add(pool.submit(() -> LevelRunner.run(suite, c, level, dir)));
                }
                outcomes.put(c.name(), list);
            }
            List<CaseResult> cases = new ArrayList<>();
            for (Suite.Case c : suite.cases()) {
                List<LevelRunner.Outcome> done = new ArrayList<>();
                for (Future<LevelRunner.Outcome> f : outcomes.get(c.name())) {
                    try {
                        done.add(f.get());
                    } catch (Exception e) {
                        done.add(new LevelRunner.Outcome(false, false, 0, null, "the run failed: " + e));
                    }
                }
                cases.add(analyse(c, done));
            }
            return new Results.SuiteResult(suite.name(), suite.file().toString(), started,
                (System.nanoTime() - start) / 1e9, cases, environment());
        } finally {
            pool.shutdownNow();
        }
    }

    static Map<String, String> environment() {
        Map<String, String> env = new LinkedHashMap<>();
        env.put("eigencheck", "0.1.0");
        env.put("java", System.getProperty("java.version") + " (" + System.getProperty("java.vendor") + ")");
        env.put("os", System.getProperty("os.name") + " " + System.getProperty("os.version") + " "
            + System.getProperty("os.arch"));
        env.put("processors", Integer.toString(Runtime.getRuntime().availableProcessors()));
        return env;
    }

    /** Errors per metric for each level, the analysis and the verdict of one case. */
    public static CaseResult analyse(Suite.Case c, List<LevelRunner.Outcome> runs) {
        List<LevelResult> levels = new ArrayList<>();
        List<String> errors = new ArrayList<>();
        for (int i = 0; i < runs.size(); i++) {
            Suite.Level l = c.levels().get(i);
            LevelRunner.Outcome o = runs.get(i);
            String status = !o.ok() ? "error" : o.cached() ? "cached" : "ok";
            levels.add(new LevelResult(l.index(), l.cellSize(), l.timeStep(), l.cells(), status, o.seconds(),
                o.message(), o.output() == null ? null : o.output().toString()));
            if (!o.ok()) {
                errors.add("level " + i + " (h = " + fmt(l.cellSize()) + "): " + o.message());
            }
        }
        String problem = c.problem() != null ? summary(c.problem())
            : "manufactured solution u = " + c.manufactured().source() + " (the reference is u itself)";
        List<String> notes = notes(c);
        String rule = rules(c);
        if (!errors.isEmpty()) {
            return new CaseResult(c.name(), c.description(), Verdict.ERROR, String.join("\n", errors), problem, levels,
                List.of(), rule, c.expectFail(), "", notes);
        }
        Map<String, double[]> values = new LinkedHashMap<>();
        double horizon = c.compare().times().stream().mapToDouble(Double::doubleValue).max().orElse(0);
        Oracle oracle = null;
        try {
            if (c.manufactured() == null) {
                oracle = Oracle.prepare(c.problem(), horizon, Oracle.DEFAULT_TOLERANCE);
            }
        } catch (OracleException e) {
            return new CaseResult(c.name(), c.description(), Verdict.ERROR, "the oracle cannot prepare the problem: "
                + e.getMessage(), problem, levels, List.of(), rule, c.expectFail(), "", notes);
        }
        for (int i = 0; i < runs.size(); i++) {
            try {
                FieldSeries series = Readers.read(runs.get(i).output(), c.read());
                Map<String, Double> m = measure(c, series, oracle);
                for (Map.Entry<String, Double> e : m.entrySet()) {
                    values.computeIfAbsent(e.getKey(), k -> {
                        double[] a = new double[runs.size()];
                        Arrays.fill(a, Double.NaN);
                        return a;
                    })[i] = e.getValue();
                }
            } catch (InputException | OracleException | IllegalArgumentException e) {
                errors.add("level " + i + " (h = " + fmt(c.levels().get(i).cellSize()) + "): the output cannot be"
                    + " compared: " + e.getMessage());
            }
        }
        if (!errors.isEmpty()) {
            return new CaseResult(c.name(), c.description(), Verdict.ERROR, String.join("\n", errors), problem, levels,
                List.of(), rule, c.expectFail(), "", notes);
        }
        double[] h = c.levels().stream().mapToDouble(Suite.Level::cellSize).toArray();
        List<Metric> metrics = new ArrayList<>();
        for (Map.Entry<String, double[]> e : values.entrySet()) {
            double[] err = e.getValue();
            double[] pair = new double[h.length - 1];
            for (int i = 0; i + 1 < h.length; i++) {
                pair[i] = Convergence.pairOrder(h[i], err[i], h[i + 1], err[i + 1]);
            }
            Convergence.Fit fit;
            try {
                fit = Convergence.fit(h, err);
            } catch (IllegalArgumentException ex) {
                fit = null;
            }
            metrics.add(new Metric(e.getKey(), err, pair, fit));
        }
        return verdict(c, levels, metrics, problem, rule, notes);
    }

    private static CaseResult verdict(Suite.Case c, List<LevelResult> levels, List<Metric> metrics, String problem,
                                      String rule, List<String> notes) {
        double[] h = c.levels().stream().mapToDouble(Suite.Level::cellSize).toArray();
        List<String> failures = new ArrayList<>();
        List<String> numbers = new ArrayList<>();
        String assessment = "";
        for (Suite.Expect x : c.rules()) {
            String key = x.norm() + "@t=" + fmt(c.compare().times().isEmpty() ? 0 : c.compare().times().get(0));
            Metric m = metrics.stream().filter(q -> q.name().equals(key)).findFirst().orElse(null);
            if (m == null) {
                return new CaseResult(c.name(), c.description(), Verdict.ERROR, "no metric " + key + " was computed; the"
                    + " output has no cells for l2/h1semi?", problem, levels, metrics, rule, c.expectFail(), "", notes);
            }
            failures.addAll(check(x, m, h));
            if (assessment.isEmpty()) {
                assessment = assessment(m, x.order());
            }
            numbers.add(String.format(Locale.ROOT, "%s errors %s; pair orders %s; fitted order %s", x.norm(),
                list(m.errors(), "%.3e"), list(m.pairOrders(), "%.3f"), m.fit() == null ? "n/a"
                    : Double.isNaN(m.fit().lower()) ? String.format(Locale.ROOT, "%.3f", m.fit().order())
                    : String.format(Locale.ROOT, "%.3f [%.3f, %.3f]", m.fit().order(), m.fit().lower(), m.fit().upper())));
        }
        String figures = String.join("; ", numbers);
        boolean checkFailed = !failures.isEmpty();
        Verdict verdict;
        String message;
        if (c.expectFail()) {
            verdict = checkFailed ? Verdict.PASSED : Verdict.FAILED;
            message = checkFailed ? "planted defect caught: " + String.join("; ", failures) + ". " + figures
                : "planted defect NOT caught: the rule " + rule + " holds although this case must fail. " + figures;
        } else {
            verdict = checkFailed ? Verdict.FAILED : Verdict.PASSED;
            message = (checkFailed ? String.join("; ", failures) + ". " : "") + figures;
            if (checkFailed && notes.stream().anyMatch(n -> n.startsWith("incompatible"))) {
                message += " The data are incompatible at t = 0, which lowers the order near t = 0 for every solver;"
                    + " compare at a later time.";
            }
        }
        return new CaseResult(c.name(), c.description(), verdict, message, problem, levels, metrics, rule,
            c.expectFail(), assessment, notes);
    }

    private static List<String> check(Suite.Expect x, Metric m, double[] h) {
        List<String> failures = new ArrayList<>();
        double finest = m.pairOrders()[m.pairOrders().length - 1];
        if (!Double.isNaN(x.order()) && !(finest >= x.order() - x.deficit())) {
            failures.add(String.format(Locale.ROOT, "observed %s order %.3f on the finest pair is below %.3g - %.3g",
                x.norm(), finest, x.order(), x.deficit()));
        }
        if (x.band() != null && !(finest >= x.band()[0] && finest <= x.band()[1])) {
            failures.add(String.format(Locale.ROOT, "observed %s order %.3f is outside the band [%.3g, %.3g]", x.norm(),
                finest, x.band()[0], x.band()[1]));
        }
        for (int i = 0; i < h.length; i++) {
            double e = m.errors()[i];
            if (x.ceilings() != null && i < x.ceilings().length && !(e <= x.ceilings()[i])) {
                failures.add(String.format(Locale.ROOT, "level %d: %s error %.3e above its ceiling %.3e", i, x.norm(), e,
                    x.ceilings()[i]));
            }
            if (!Double.isNaN(x.ceilingConstant())) {
                double limit = x.ceilingConstant() * Math.pow(h[i], x.ceilingOrder());
                if (!(e <= limit)) {
                    failures.add(String.format(Locale.ROOT, "level %d: %s error %.3e above C h^p = %.3e", i, x.norm(), e,
                        limit));
                }
            }
        }
        return failures;
    }

    static String rules(Suite.Case c) {
        List<String> r = new ArrayList<>();
        for (Suite.Expect x : c.rules()) {
            r.add(rule(x));
        }
        return String.join("; ", r);
    }

    private static String assessment(Metric m, double expected) {
        double[] p = m.pairOrders();
        if (p.length < 2) {
            return "two levels only: the asymptotic range cannot be judged; add a level";
        }
        double a = p[p.length - 1];
        double b = p[p.length - 2];
        double scale = Math.max(1, Math.abs(Double.isNaN(expected) ? a : expected));
        if (Math.abs(a - b) <= 0.05 * scale) {
            return String.format(Locale.ROOT, "asymptotic: the two finest pair orders agree (%.3f, %.3f)", b, a);
        }
        return String.format(Locale.ROOT, "not yet asymptotic: the pair orders %s still drift; refine further",
            list(p, "%.3f"));
    }

    /** Errors of the compared quantities of one output (names: norm@t=T, probe x=X@t=T, heatContent@t=T). */
    static Map<String, Double> measure(Suite.Case c, FieldSeries series, Oracle oracle) throws InputException {
        Map<String, Double> out = new LinkedHashMap<>();
        for (double t : c.compare().times()) {
            Field f = series.fields().size() == 1 && Double.isNaN(series.fields().get(0).time()) ? series.fields().get(0)
                : series.at(t);
            if (f == null) {
                throw new IllegalArgumentException("no output at t = " + t + " s; it holds "
                    + Arrays.toString(series.times()));
            }
            String name = fieldName(c, f);
            eigencheck.suites.norms.Reference ref = c.manufactured() != null
                ? new eigencheck.suites.norms.ManufacturedReference(c.manufactured(), t, 0,
                    c.problem() != null && c.problem().domain() instanceof eigencheck.oracle.problem.Cylinder)
                : referenceOf(oracle, t);
            boolean slabProblem = c.problem() != null && c.problem().domain() instanceof Slab;
            String suffix = "@t=" + fmt(t);
            ErrorNorms.Result r;
            if (c.compare().location().equals("cells") && !f.cellData().containsKey(name) && !slabProblem) {
                throw new IllegalArgumentException("compare.location cells with cell-centre values needs a slab problem");
            } else if (c.compare().location().equals("cells") && !f.cellData().containsKey(name)) {
                r = cellCentres(f, f.pointData().get(name), ref, ((Slab) c.problem().domain()).length());
            } else if (f.cellData().containsKey(name)) {
                r = ErrorNorms.ofCellData(f, f.cellData().get(name), ref);
            } else {
                boolean elementNorms = c.compare().norms().contains("l2") || c.compare().norms().contains("h1semi");
                r = ErrorNorms.ofPointData(f, f.pointData().get(name), ref, elementNorms);
            }
            for (String norm : c.compare().norms()) {
                Double v = switch (norm) {
                    case "max" -> r.max();
                    case "rms" -> r.rms();
                    case "l2" -> r.l2();
                    default -> r.h1semi();
                };
                if (v != null) {
                    out.put(norm + suffix, v);
                }
            }
            DataArray values = f.pointData().containsKey(name) ? f.pointData().get(name) : null;
            for (double x : c.compare().probes()) {
                if (values != null) {
                    double[] exact = new double[1];
                    ref.evaluate(new double[] {x, 0, 0}, exact, null);
                    out.put("probe x=" + fmt(x) + suffix, Math.abs(interpolate(f, values, x) - exact[0]));
                }
            }
            for (String face : c.compare().flux()) {
                if (values != null && slabProblem) {
                    double length = ((Slab) c.problem().domain()).length();
                    double x = face.equals("xmin") ? 0 : length;
                    double exact = -c.problem().material().conductivity() * exactGradient(ref, x);
                    double computed = -c.problem().material().conductivity() * boundaryGradient(f, values, face);
                    out.put("flux " + face + suffix, Math.abs(computed - exact));
                }
            }
            if (c.compare().heatContent() && values != null && slabProblem) {
                double length = ((Slab) c.problem().domain()).length();
                double rhoC = c.problem().material().volumetricHeatCapacity();
                double exact = rhoC * length * ref.segmentAverage(0, length);
                double h = heatContent(f, values, length, c.compare().location().equals("cells")) * rhoC;
                out.put("heatContent" + suffix, Math.abs(h - exact) / Math.abs(exact));
            }
        }
        return out;
    }

    /** The oracle's reference at time t, read the way its body needs (slab along x, radial, Cartesian). */
    public static eigencheck.suites.norms.Reference referenceOf(Oracle oracle, double t) {
        eigencheck.oracle.problem.Domain d = oracle.problem().domain();
        if (d instanceof eigencheck.oracle.problem.Sphere || d instanceof eigencheck.oracle.problem.Cylinder) {
            return new eigencheck.suites.norms.RadialReference(oracle, t);
        }
        if (d instanceof Slab) {
            return new SlabReference(oracle, t, 0);
        }
        return new eigencheck.suites.norms.CartesianReference(oracle, t);
    }

    private static String fieldName(Suite.Case c, Field f) {
        if (c.read().field() != null) {
            if (!f.pointData().containsKey(c.read().field()) && !f.cellData().containsKey(c.read().field())) {
                throw new IllegalArgumentException("no array \"" + c.read().field() + "\"; the output has "
                    + f.arrayNames());
            }
            return c.read().field();
        }
        List<String> names = f.arrayNames();
        if (names.size() == 1) {
            return names.get(0);
        }
        for (String s : new String[] {"T", "u", "temperature"}) {
            if (names.contains(s)) {
                return s;
            }
        }
        throw new IllegalArgumentException("the output has the arrays " + names + "; name one with read.field");
    }

    /**
     * Cell values of a 1D finite-volume output given at the cell centres: the faces lie half way
     * between centres and at the slab's ends; each value is compared with the exact average over its
     * cell (like with like).
     */
    private static ErrorNorms.Result cellCentres(Field f, DataArray values, eigencheck.suites.norms.Reference ref,
                                                 double length) {
        int n = f.size();
        Integer[] order = new Integer[n];
        for (int i = 0; i < n; i++) {
            order[i] = i;
        }
        Arrays.sort(order, (a, b) -> Double.compare(f.coordinate(a, 0), f.coordinate(b, 0)));
        double max = 0;
        double sum = 0;
        double l2 = 0;
        for (int k = 0; k < n; k++) {
            double x = f.coordinate(order[k], 0);
            double left = k == 0 ? 0 : 0.5 * (x + f.coordinate(order[k - 1], 0));
            double right = k == n - 1 ? length : 0.5 * (x + f.coordinate(order[k + 1], 0));
            double e = values.value(order[k]) - ref.segmentAverage(left, right);
            max = Math.max(max, Math.abs(e));
            sum += e * e;
            l2 += (right - left) * e * e;
        }
        return new ErrorNorms.Result("cells", n, max, Math.sqrt(sum / n), Math.sqrt(l2), null);
    }

    private static double exactGradient(eigencheck.suites.norms.Reference ref, double x) {
        double[] v = new double[1];
        double[] g = new double[3];
        ref.evaluate(new double[] {x, 0, 0}, v, g);
        return g[0];
    }

    /** du/dx of the linear interpolant on the element at the face (the two outermost nodes). */
    private static double boundaryGradient(Field f, DataArray values, String face) {
        int n = f.size();
        Integer[] order = new Integer[n];
        for (int i = 0; i < n; i++) {
            order[i] = i;
        }
        Arrays.sort(order, (a, b) -> Double.compare(f.coordinate(a, 0), f.coordinate(b, 0)));
        int a = face.equals("xmin") ? order[0] : order[n - 2];
        int b = face.equals("xmin") ? order[1] : order[n - 1];
        return (values.value(b) - values.value(a)) / (f.coordinate(b, 0) - f.coordinate(a, 0));
    }

    private static double interpolate(Field f, DataArray values, double x) {
        int n = f.size();
        int below = -1;
        int above = -1;
        for (int i = 0; i < n; i++) {
            double xi = f.coordinate(i, 0);
            if (xi == x) {
                return values.value(i);
            }
            if (xi < x && (below < 0 || xi > f.coordinate(below, 0))) {
                below = i;
            }
            if (xi > x && (above < 0 || xi < f.coordinate(above, 0))) {
                above = i;
            }
        }
        if (below < 0 || above < 0) {
            throw new IllegalArgumentException("probe x = " + x + " is outside the output's points");
        }
        double xa = f.coordinate(below, 0);
        double xb = f.coordinate(above, 0);
        return values.value(below) + (values.value(above) - values.value(below)) * (x - xa) / (xb - xa);
    }

    private static double heatContent(Field f, DataArray values, double length, boolean cells) {
        int n = f.size();
        double[][] p = new double[n][];
        for (int i = 0; i < n; i++) {
            p[i] = new double[] {f.coordinate(i, 0), values.value(i)};
        }
        Arrays.sort(p, (a, b) -> Double.compare(a[0], b[0]));
        double s = 0;
        if (cells) {
            for (int k = 0; k < n; k++) {
                double left = k == 0 ? 0 : 0.5 * (p[k][0] + p[k - 1][0]);
                double right = k == n - 1 ? length : 0.5 * (p[k][0] + p[k + 1][0]);
                s += (right - left) * p[k][1];
            }
            return s;
        }
        for (int k = 0; k + 1 < n; k++) {
            s += 0.5 * (p[k + 1][0] - p[k][0]) * (p[k][1] + p[k + 1][1]);
        }
        return s;
    }

    private static List<String> notes(Suite.Case c) {
        List<String> notes = new ArrayList<>();
        Problem p = c.problem();
        if (p == null) {
            return notes;
        }
        if (p.domain() instanceof Slab slab) {
            for (Side s : List.of(Side.XMIN, Side.XMAX)) {
                if (p.condition(s) instanceof BoundaryCondition.Dirichlet d) {
                    double x = s == Side.XMIN ? 0 : slab.length();
                    double g = p.initial().value(x);
                    double f = d.temperature().value(0.0);
                    if (Math.abs(g - f) > 1e-9 * Math.max(1, Math.abs(g) + Math.abs(f))) {
                        notes.add("incompatible data: at t = 0 the " + s.key() + " temperature " + fmt(f)
                            + " differs from the initial " + fmt(g) + "; every solver loses order near t = 0");
                    }
                }
            }
        }
        if (c.refinementPath() != null) {
            notes.add("refinement path: time step " + switch (c.refinementPath()) {
                case "fixed" -> "fixed (the time error does not fall: space orders only while it is small)";
                case "h" -> "proportional to h";
                default -> "proportional to h^2";
            });
        }
        return notes;
    }

    static String rule(Suite.Expect x) {
        if (x == null || Double.isNaN(x.order())) {
            return "no order rule";
        }
        String s = String.format(Locale.ROOT, "%s order >= %.3g - %.3g on the finest pair", x.norm(), x.order(),
            x.deficit());
        if (x.band() != null) {
            s += String.format(Locale.ROOT, ", within [%.3g, %.3g]", x.band()[0], x.band()[1]);
        }
        if (!Double.isNaN(x.ceilingConstant())) {
            s += String.format(Locale.ROOT, ", error <= %.3g h^%.3g", x.ceilingConstant(), x.ceilingOrder());
        }
        if (x.ceilings() != null) {
            s += ", per-level ceilings " + list(x.ceilings(), "%.3e");
        }
        return s + (x.fail() ? " (must FAIL: planted defect)" : "");
    }

    private static String summary(Problem p) {
        if (p == null) {
            return "";
        }
        StringBuilder b = new StringBuilder();
        if (p.domain() instanceof Slab s) {
            b.append("slab L = ").append(fmt(s.length())).append(" m");
        } else if (p.domain().lengths().length > 1) {
            double[] l = p.domain().lengths();
            b.append(l.length == 2 ? "rectangle " : "box ");
            for (int i = 0; i < l.length; i++) {
                b.append(i == 0 ? "" : " x ").append(fmt(l[i]));
            }
            b.append(" m");
        } else {
            b.append(p.domain() instanceof eigencheck.oracle.problem.Cylinder ? "cylinder" : "sphere").append(" R = ")
                .append(fmt(p.domain().characteristicLength())).append(" m");
        }
        b.append(String.format(Locale.ROOT, ", k = %s W/(m K), rho c = %s J/(m^3 K) (alpha = %.4g m^2/s)",
            fmt(p.material().conductivity()), fmt(p.material().volumetricHeatCapacity()), p.material().diffusivity()));
        b.append("; initial ").append(p.initial().source()).append("; source ").append(p.source().source());
        for (Map.Entry<Side, BoundaryCondition> e : p.boundary().entrySet()) {
            b.append("; ").append(e.getKey().key()).append(": ");
            BoundaryCondition bc = e.getValue();
            if (bc instanceof BoundaryCondition.Dirichlet d) {
                b.append("u = ").append(d.temperature().source());
            } else if (bc instanceof BoundaryCondition.Neumann n) {
                b.append("k du/dn = ").append(n.heatFlux().source());
            } else if (bc instanceof BoundaryCondition.Robin r) {
                b.append("-k du/dn = ").append(fmt(r.heatTransferCoefficient())).append(" (u - (").append(r.ambient().source())
                    .append("))");
            }
        }
        return b.toString();
    }

    static String fmt(double v) {
        if (v == Math.rint(v) && Math.abs(v) < 1e15) {
            return Long.toString((long) v);
        }
        return String.format(Locale.ROOT, "%.6g", v);
    }

    static String list(double[] v, String format) {
        StringBuilder b = new StringBuilder("[");
        for (int i = 0; i < v.length; i++) {
            b.append(i == 0 ? "" : ", ").append(String.format(Locale.ROOT, format, v[i]));
        }
        return b.append(']').toString();
    }
}

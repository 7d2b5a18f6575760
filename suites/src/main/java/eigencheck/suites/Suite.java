package eigencheck.suites;

import eigencheck.adapters.ReadOptions;
import eigencheck.oracle.problem.Problem;
import java.nio.file.Path;
import java.util.List;
import java.util.Map;

/**
 * A refinement suite: cases, each a problem, a way to get the solver's output per level (an
 * existing file or a command template), what to compare, and the acceptance rule. Made by
 * {@link eigencheck.suites.files.SuiteFile}.
 *
 * @param directory the suite file's folder: relative paths and commands start there
 * @since 0.1
 */
public record Suite(String name, Path file, Path directory, List<Case> cases) {
    public Suite {
        cases = List.copyOf(cases);
    }

    /** One case of a suite. */
    public record Case(String name, String description, Problem problem, Path problemFile, Solver solver,
                       ReadOptions read, List<Level> levels, Compare compare, List<Expect> rules,
                       String refinementPath, eigencheck.oracle.expr.Expression manufactured) {
        public Case {
            levels = List.copyOf(levels);
            rules = List.copyOf(rules);
        }

        /** The first rule (whose norm and order the plots use). */
        public Expect expect() {
            return rules.get(0);
        }

        /** True when the case exists to be caught (a planted defect). */
        public boolean expectFail() {
            return rules.stream().anyMatch(Expect::fail);
        }
    }

    /**
     * A solver command template: arguments (no shell) with placeholders {@code {cells}},
     * {@code {cellSize}}, {@code {timeStep}}, {@code {output}}, {@code {level}}, {@code {dir}} and any
     * key of the level; {@code output} is the file name the solver writes inside its level folder.
     */
    public record Solver(List<String> command, String output, double timeoutSeconds) {
        public Solver {
            command = List.copyOf(command);
        }
    }

    /**
     * One refinement level: its mesh measure (cell size h), time step (NaN if none), optional cell
     * count, an existing output file (or null when a solver makes it), and the placeholder values.
     */
    public record Level(int index, double cellSize, double timeStep, Integer cells, Path output,
                        Map<String, String> values) {
        public Level {
            values = Map.copyOf(values);
        }
    }

    /**
     * What to compare: the field at given times (norms), probe points, the heat content, and the heat
     * flux through faces ({@code xmin}, {@code xmax}) from the derivative of the output's boundary
     * element.
     */
    public record Compare(List<Double> times, String location, List<String> norms, List<Double> probes,
                          boolean heatContent, List<String> flux) {
        public Compare {
            times = List.copyOf(times);
            norms = List.copyOf(norms);
            probes = List.copyOf(probes);
            flux = List.copyOf(flux);
        }
    }

    /**
     * The acceptance rule on one metric (norm at the first compared time): the observed order of the
     * finest pair at least {@code order - deficit} (and within {@code band} when given), optional
     * ceilings (per level, or C h^p), and whether the case exists to be caught ({@code fail}).
     *
     * @param slack allowed relative growth of the finest-level error against a baseline
     */
    public record Expect(String norm, double order, double deficit, double[] band, double[] ceilings,
                         double ceilingConstant, double ceilingOrder, boolean fail, double slack) {
    }
}

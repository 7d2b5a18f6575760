package eigencheck.suites;

import eigencheck.suites.convergence.Convergence;
import java.util.List;
import java.util.Map;

/**
 * Everything a suite run found, as the reports need it (results.json is this, with a schema version).
 *
 * @since 0.1
 */
public final class Results {
    private Results() {
    }

    /** Schema version of results.json. */
    public static final int SCHEMA_VERSION = 1;

    public record SuiteResult(String suite, String file, String started, double seconds, List<CaseResult> cases,
                              Map<String, String> environment) {
        public long count(Verdict v) {
            return cases.stream().filter(c -> c.verdict() == v).count();
        }
    }

    public record CaseResult(String name, String description, Verdict verdict, String message, String problem,
                             List<LevelResult> levels, List<Metric> metrics, String rule, boolean expectFail,
                             String assessment, List<String> notes) {
    }

    /** One level: what ran and how. status is ok, cached or error. */
    public record LevelResult(int index, double cellSize, double timeStep, Integer cells, String status,
                              double runSeconds, String log, String output) {
    }

    /** One compared quantity across the levels, with its convergence analysis. */
    public record Metric(String name, double[] errors, double[] pairOrders, Convergence.Fit fit) {
    }
}

package eigencheck.suites.report;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import eigencheck.adapters.InputException;
import eigencheck.adapters.InputLocation;
import eigencheck.suites.Results;
import eigencheck.suites.Suite;
import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/**
 * Regressions against an earlier results.json: a metric whose finest-level error grew by more than
 * the case's slack (expect.slack, default 10 %), or whose fitted order fell by more than 0.1.
 */
public final class Baseline {
    private Baseline() {
    }

    public static List<String> regressions(Results.SuiteResult now, Suite suite, Path baseline) throws InputException {
        JsonNode old;
        try {
            old = new ObjectMapper().readTree(Files.readAllBytes(baseline));
        } catch (IOException e) {
            throw new InputException(InputException.Cause.UNREADABLE, InputLocation.of(baseline),
                "cannot read the baseline (" + e.getMessage() + "); give a results.json of an earlier run");
        }
        if (old == null || old.path("schemaVersion").asInt(-1) != Results.SCHEMA_VERSION) {
            throw new InputException(InputException.Cause.INVALID_VALUE, new InputLocation(baseline, 0, 0, -1,
                "$.schemaVersion"), "expected schema version " + Results.SCHEMA_VERSION + "; rerun the baseline with"
                + " this version");
        }
        List<String> out = new ArrayList<>();
        for (Results.CaseResult c : now.cases()) {
            JsonNode oc = null;
            for (JsonNode n : old.path("cases")) {
                if (n.path("name").asText().equals(c.name())) {
                    oc = n;
                }
            }
            if (oc == null) {
                continue;
            }
            double slack = suite.cases().stream().filter(k -> k.name().equals(c.name())).findFirst()
                .map(k -> k.expect().slack()).orElse(0.1);
            for (Results.Metric m : c.metrics()) {
                for (JsonNode om : oc.path("metrics")) {
                    if (!om.path("name").asText().equals(m.name())) {
                        continue;
                    }
                    JsonNode errors = om.path("errors");
                    int last = m.errors().length - 1;
                    if (errors.size() == m.errors().length && errors.get(last).isNumber()) {
                        double before = errors.get(last).asDouble();
                        double after = m.errors()[last];
                        if (after > before * (1 + slack)) {
                            out.add(String.format(Locale.ROOT, "%s: %s on the finest level grew from %.4e to %.4e (+%.1f %%,"
                                + " slack %.0f %%)", c.name(), m.name(), before, after, 100 * (after / before - 1),
                                100 * slack));
                        }
                    }
                    JsonNode fit = om.path("fit").path("order");
                    if (fit.isNumber() && m.fit() != null && m.fit().order() < fit.asDouble() - 0.1) {
                        out.add(String.format(Locale.ROOT, "%s: the fitted order of %s fell from %.3f to %.3f", c.name(),
                            m.name(), fit.asDouble(), m.fit().order()));
                    }
                }
            }
        }
        return out;
    }
}

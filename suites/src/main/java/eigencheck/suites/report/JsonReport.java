package eigencheck.suites.report;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import eigencheck.suites.Results;
import java.io.IOException;
import java.nio.file.Path;
import java.util.Map;

/** results.json: everything needed to re-plot and to compare with a later run, with a schema version. */
public final class JsonReport {
    private static final ObjectMapper MAPPER = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);

    private JsonReport() {
    }

    public static JsonNode toJson(Results.SuiteResult r) {
        ObjectNode root = MAPPER.createObjectNode();
        root.put("schemaVersion", Results.SCHEMA_VERSION);
        root.put("suite", r.suite());
        root.put("file", r.file());
        root.put("started", r.started());
        root.put("seconds", r.seconds());
        ObjectNode env = root.putObject("environment");
        for (Map.Entry<String, String> e : r.environment().entrySet()) {
            env.put(e.getKey(), e.getValue());
        }
        ArrayNode cases = root.putArray("cases");
        for (Results.CaseResult c : r.cases()) {
            ObjectNode o = cases.addObject();
            o.put("name", c.name());
            o.put("description", c.description());
            o.put("verdict", c.verdict().name().toLowerCase(java.util.Locale.ROOT));
            o.put("expectFail", c.expectFail());
            o.put("rule", c.rule());
            o.put("message", c.message());
            o.put("assessment", c.assessment());
            o.put("problem", c.problem());
            ArrayNode notes = o.putArray("notes");
            c.notes().forEach(notes::add);
            ArrayNode levels = o.putArray("levels");
            for (Results.LevelResult l : c.levels()) {
                ObjectNode lo = levels.addObject();
                lo.put("index", l.index());
                number(lo, "cellSize", l.cellSize());
                number(lo, "timeStep", l.timeStep());
                if (l.cells() != null) {
                    lo.put("cells", l.cells());
                }
                lo.put("status", l.status());
                lo.put("runSeconds", l.runSeconds());
                if (!l.log().isEmpty()) {
                    lo.put("log", l.log());
                }
                if (l.output() != null) {
                    lo.put("output", l.output());
                }
            }
            ArrayNode metrics = o.putArray("metrics");
            for (Results.Metric m : c.metrics()) {
                ObjectNode mo = metrics.addObject();
                mo.put("name", m.name());
                ArrayNode errors = mo.putArray("errors");
                for (double e : m.errors()) {
                    add(errors, e);
                }
                ArrayNode pairs = mo.putArray("pairOrders");
                for (double p : m.pairOrders()) {
                    add(pairs, p);
                }
                if (m.fit() != null) {
                    ObjectNode fit = mo.putObject("fit");
                    number(fit, "order", m.fit().order());
                    number(fit, "lower", m.fit().lower());
                    number(fit, "upper", m.fit().upper());
                    number(fit, "constant", m.fit().constant());
                    fit.put("levels", m.fit().levels());
                }
            }
        }
        return root;
    }

    public static void write(Results.SuiteResult r, Path file) throws IOException {
        Files2.write(file, MAPPER.writeValueAsBytes(toJson(r)));
    }

    private static void number(ObjectNode o, String key, double v) {
        if (Double.isFinite(v)) {
            o.put(key, v);
        } else {
            o.putNull(key);
        }
    }

    private static void add(ArrayNode a, double v) {
        if (Double.isFinite(v)) {
            a.add(v);
        } else {
            a.addNull();
        }
    }
}

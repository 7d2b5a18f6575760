package eigencheck.adapters.json;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonPointer;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.json.JsonReadFeature;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.json.JsonMapper;
import eigencheck.adapters.Field;
import eigencheck.adapters.FieldReader;
import eigencheck.adapters.FieldSeries;
import eigencheck.adapters.InputException;
import eigencheck.adapters.InputException.Cause;
import eigencheck.adapters.InputLocation;
import eigencheck.adapters.ReadOptions;
import eigencheck.adapters.internal.Duplicates;
import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;

/**
 * JSON through Jackson. The layout of our own (README, "Solver output"):
 * <pre>
 * {"time": 0.5,
 *  "points": [[0.0], [0.05], [0.1]],            or "x": [...], "y": [...], "z": [...]
 *  "cells": {"types": [3, 3], "connectivity": [[0, 1], [1, 2]]},      optional
 *  "pointData": {"T": [20.0, 21.5, 23.0]},
 *  "cellData": {"q": [1.0, 2.0]}}                 optional
 * </pre>
 * or {@code {"fields": [ ... ]}} with one such object per time. For other layouts, JSON Pointers
 * (RFC 6901) per role: {@code x}, {@code y}, {@code z} or {@code points}, {@code values} (the
 * field, named by the field option or "values"), and {@code time}.
 */
public final class JsonFieldReader implements FieldReader {
    private static final ObjectMapper MAPPER = JsonMapper.builder(JsonFactory.builder()
        .enable(JsonReadFeature.ALLOW_NON_NUMERIC_NUMBERS).build()).build();

    @Override
    public String format() {
        return "json";
    }

    @Override
    public List<String> extensions() {
        return List.of("json");
    }

    @Override
    public FieldSeries read(Path file, byte[] content, ReadOptions options) throws InputException {
        JsonNode root;
        try {
            root = MAPPER.readTree(content);
        } catch (JsonProcessingException e) {
            JsonLocation at = e.getLocation();
            throw new InputException(Cause.MALFORMED, at == null ? InputLocation.of(file)
                : InputLocation.at(file, at.getLineNr(), at.getColumnNr(), ""), "not well-formed JSON: "
                + firstLine(e.getOriginalMessage()));
        } catch (IOException e) {
            throw new InputException(Cause.UNREADABLE, InputLocation.of(file), e.getMessage());
        }
        if (root == null || root.isMissingNode()) {
            throw new InputException(Cause.MISSING, InputLocation.of(file), "the file is empty; the solver wrote nothing?");
        }
        if (!options.pointers().isEmpty()) {
            return FieldSeries.of(mapped(file, root, options));
        }
        if (!root.isObject()) {
            throw problem(file, "$", "expected an object, found " + root.getNodeType());
        }
        if (root.has("fields")) {
            JsonNode fields = root.get("fields");
            if (!fields.isArray() || fields.isEmpty()) {
                throw problem(file, "$.fields", "expected a non-empty list of fields");
            }
            List<Field> list = new ArrayList<>();
            for (int i = 0; i < fields.size(); i++) {
                list.add(own(file, fields.get(i), "$.fields[" + i + "]"));
            }
            return new FieldSeries(list);
        }
        return FieldSeries.of(own(file, root, "$"));
    }

    private static String firstLine(String m) {
        int cut = m == null ? -1 : m.indexOf('\n');
        return m == null ? "unreadable" : cut < 0 ? m : m.substring(0, cut);
    }

    private static InputException problem(Path file, String path, String message) {
        return new InputException(Cause.INVALID_VALUE, new InputLocation(file, 0, 0, -1, path), message);
    }

    private static Field own(Path file, JsonNode f, String path) throws InputException {
        if (!f.isObject()) {
            throw problem(file, path, "expected an object with points and pointData");
        }
        for (Iterator<String> it = f.fieldNames(); it.hasNext(); ) {
            String k = it.next();
            if (!List.of("time", "points", "x", "y", "z", "cells", "pointData", "cellData").contains(k)) {
                throw new InputException(Cause.UNKNOWN_FIELD, new InputLocation(file, 0, 0, -1, path + "." + k),
                    "unknown key; allowed: time, points or x/y/z, cells, pointData, cellData");
            }
        }
        double[] coordinates;
        int dimension;
        if (f.has("points")) {
            JsonNode pts = f.get("points");
            if (!pts.isArray() || pts.isEmpty()) {
                throw problem(file, path + ".points", "expected a non-empty list of coordinate lists");
            }
            dimension = pts.get(0).isArray() ? pts.get(0).size() : 1;
            if (dimension < 1 || dimension > 3) {
                throw problem(file, path + ".points[0]", "a point has 1 to 3 coordinates, found " + dimension);
            }
            coordinates = new double[pts.size() * dimension];
            for (int i = 0; i < pts.size(); i++) {
                JsonNode p = pts.get(i);
                if (dimension == 1 && !p.isArray()) {
                    coordinates[i] = number(file, p, path + ".points[" + i + "]");
                    continue;
                }
                if (!p.isArray() || p.size() != dimension) {
                    throw problem(file, path + ".points[" + i + "]", "expected " + dimension + " coordinates like the first"
                        + " point, found " + (p.isArray() ? p.size() : p.getNodeType().toString()));
                }
                for (int a = 0; a < dimension; a++) {
                    coordinates[i * dimension + a] = number(file, p.get(a), path + ".points[" + i + "][" + a + "]");
                }
            }
        } else if (f.has("x")) {
            List<double[]> axes = new ArrayList<>();
            for (String a : new String[] {"x", "y", "z"}) {
                if (f.has(a)) {
                    axes.add(numbers(file, f.get(a), path + "." + a, -1));
                }
            }
            dimension = axes.size();
            int n = axes.get(0).length;
            coordinates = new double[n * dimension];
            for (int a = 0; a < dimension; a++) {
                if (axes.get(a).length != n) {
                    throw problem(file, path + "." + "xyz".charAt(a), "has " + axes.get(a).length + " values, x has " + n);
                }
                for (int i = 0; i < n; i++) {
                    coordinates[i * dimension + a] = axes.get(a)[i];
                }
            }
        } else {
            throw new InputException(Cause.MISSING, new InputLocation(file, 0, 0, -1, path + ".points"),
                "missing; give points: [[x], ...] or x: [...]");
        }
        int n = coordinates.length / dimension;
        int[] dup = Duplicates.find(coordinates, dimension);
        if (dup != null) {
            throw problem(file, path + ".points[" + dup[1] + "]", "repeats point " + dup[0] + "; each point once");
        }
        Field.Builder b = new Field.Builder(dimension, coordinates);
        if (f.has("time")) {
            b.time(number(file, f.get("time"), path + ".time"));
        }
        int cellCount = 0;
        if (f.has("cells")) {
            cellCount = cells(file, f.get("cells"), path + ".cells", n, b);
        }
        if (!f.has("pointData") && !f.has("cellData")) {
            throw new InputException(Cause.MISSING, new InputLocation(file, 0, 0, -1, path + ".pointData"),
                "missing; give pointData: {\"T\": [...]} with one value per point");
        }
        arrays(file, f.get("pointData"), path + ".pointData", n, b, true);
        arrays(file, f.get("cellData"), path + ".cellData", cellCount, b, false);
        return b.build();
    }

    private static int cells(Path file, JsonNode c, String path, int points, Field.Builder b) throws InputException {
        if (!c.isObject() || !c.has("types") || !c.has("connectivity")) {
            throw problem(file, path, "expected {types: [...], connectivity: [[...], ...]}");
        }
        double[] typeValues = numbers(file, c.get("types"), path + ".types", -1);
        JsonNode conn = c.get("connectivity");
        if (!conn.isArray() || conn.size() != typeValues.length) {
            throw problem(file, path + ".connectivity", "expected one node list per cell (" + typeValues.length + ")");
        }
        byte[] types = new byte[typeValues.length];
        int[] offsets = new int[types.length + 1];
        List<Integer> flat = new ArrayList<>();
        for (int i = 0; i < types.length; i++) {
            double t = typeValues[i];
            if (t != Math.rint(t) || t < 1 || t > 255) {
                throw problem(file, path + ".types[" + i + "]", "a VTK cell type number, found " + t);
            }
            types[i] = (byte) t;
            JsonNode nodes = conn.get(i);
            double[] ids = numbers(file, nodes, path + ".connectivity[" + i + "]", -1);
            for (double id : ids) {
                if (id != Math.rint(id) || id < 0 || id >= points) {
                    throw problem(file, path + ".connectivity[" + i + "]", "node " + id + " is not a point index in [0, "
                        + points + ")");
                }
                flat.add((int) id);
            }
            offsets[i + 1] = flat.size();
        }
        int[] connectivity = flat.stream().mapToInt(Integer::intValue).toArray();
        try {
            b.cells(types, offsets, connectivity);
        } catch (IllegalArgumentException e) {
            throw problem(file, path, e.getMessage());
        }
        return types.length;
    }

    private static void arrays(Path file, JsonNode data, String path, int count, Field.Builder b, boolean points)
        throws InputException {
        if (data == null) {
            return;
        }
        if (!data.isObject()) {
            throw problem(file, path, "expected an object of named arrays");
        }
        for (Iterator<Map.Entry<String, JsonNode>> it = data.fields(); it.hasNext(); ) {
            Map.Entry<String, JsonNode> e = it.next();
            String p = path + "." + e.getKey();
            JsonNode arr = e.getValue();
            if (!arr.isArray() || arr.size() != count) {
                throw problem(file, p, "expected " + count + " values (one per " + (points ? "point" : "cell")
                    + "), found " + (arr.isArray() ? arr.size() : arr.getNodeType().toString()));
            }
            int components = arr.size() > 0 && arr.get(0).isArray() ? arr.get(0).size() : 1;
            double[] v = new double[count * components];
            for (int i = 0; i < count; i++) {
                JsonNode item = arr.get(i);
                if (components == 1 && !item.isArray()) {
                    v[i] = number(file, item, p + "[" + i + "]");
                } else {
                    double[] tuple = numbers(file, item, p + "[" + i + "]", components);
                    System.arraycopy(tuple, 0, v, i * components, components);
                }
            }
            if (points) {
                b.pointData(e.getKey(), components, v);
            } else {
                b.cellData(e.getKey(), components, v);
            }
        }
    }

    private static double number(Path file, JsonNode n, String path) throws InputException {
        if (n == null || !n.isNumber()) {
            throw new InputException(Cause.NOT_A_NUMBER, new InputLocation(file, 0, 0, -1, path), "expected a number, found "
                + (n == null ? "nothing" : n.isTextual() ? "\"" + n.asText() + "\"" : n.getNodeType().toString()));
        }
        double v = n.doubleValue();
        if (!Double.isFinite(v)) {
            throw new InputException(Cause.NOT_A_NUMBER, new InputLocation(file, 0, 0, -1, path), v
                + " is not finite; the solver diverged or wrote a placeholder");
        }
        return v;
    }

    private static double[] numbers(Path file, JsonNode n, String path, int expected) throws InputException {
        if (n == null || !n.isArray() || (expected >= 0 && n.size() != expected)) {
            throw problem(file, path, "expected a list of " + (expected >= 0 ? expected + " " : "") + "numbers");
        }
        double[] v = new double[n.size()];
        for (int i = 0; i < v.length; i++) {
            v[i] = number(file, n.get(i), path + "[" + i + "]");
        }
        return v;
    }

    /** A layout of another tool, mapped by JSON Pointers. */
    private static Field mapped(Path file, JsonNode root, ReadOptions o) throws InputException {
        Map<String, String> p = o.pointers();
        for (String k : p.keySet()) {
            if (!List.of("x", "y", "z", "points", "values", "time").contains(k)) {
                throw new InputException(Cause.UNKNOWN_FIELD, new InputLocation(file, 0, 0, -1, "pointers." + k),
                    "unknown role; allowed: x, y, z, points, values, time");
            }
        }
        if (!p.containsKey("values")) {
            throw new InputException(Cause.MISSING, new InputLocation(file, 0, 0, -1, "pointers.values"),
                "missing; give the JSON Pointer of the field's values, for example /solution/T");
        }
        double[] values = numbers(file, at(file, root, p.get("values")), p.get("values"), -1);
        int n = values.length;
        double[] coordinates;
        int dimension;
        if (p.containsKey("points")) {
            JsonNode pts = at(file, root, p.get("points"));
            if (!pts.isArray() || pts.size() != n) {
                throw problem(file, p.get("points"), "expected " + n + " points (one per value)");
            }
            dimension = pts.get(0).isArray() ? pts.get(0).size() : 1;
            coordinates = new double[n * dimension];
            for (int i = 0; i < n; i++) {
                double[] c = dimension == 1 && !pts.get(i).isArray()
                    ? new double[] {number(file, pts.get(i), p.get("points") + "/" + i)}
                    : numbers(file, pts.get(i), p.get("points") + "/" + i, dimension);
                System.arraycopy(c, 0, coordinates, i * dimension, dimension);
            }
        } else {
            List<double[]> axes = new ArrayList<>();
            for (String a : new String[] {"x", "y", "z"}) {
                if (p.containsKey(a)) {
                    double[] v = numbers(file, at(file, root, p.get(a)), p.get(a), n);
                    axes.add(v);
                }
            }
            if (axes.isEmpty()) {
                throw new InputException(Cause.MISSING, new InputLocation(file, 0, 0, -1, "pointers.x"),
                    "missing; give the pointer of the coordinates (x, y, z or points)");
            }
            dimension = axes.size();
            coordinates = new double[n * dimension];
            for (int a = 0; a < dimension; a++) {
                for (int i = 0; i < n; i++) {
                    coordinates[i * dimension + a] = axes.get(a)[i];
                }
            }
        }
        int[] dup = Duplicates.find(coordinates, dimension);
        if (dup != null) {
            throw problem(file, p.getOrDefault("points", p.get("x")), "point " + dup[1] + " repeats point " + dup[0]);
        }
        Field.Builder b = new Field.Builder(dimension, coordinates);
        b.pointData(o.field() == null ? "values" : o.field(), 1, values);
        if (p.containsKey("time")) {
            b.time(number(file, at(file, root, p.get("time")), p.get("time")));
        }
        return b.build();
    }

    private static JsonNode at(Path file, JsonNode root, String pointer) throws InputException {
        JsonPointer ptr;
        try {
            ptr = JsonPointer.compile(pointer);
        } catch (IllegalArgumentException e) {
            throw problem(file, pointer, "not a JSON Pointer (RFC 6901): " + e.getMessage() + "; write it like /a/b/0");
        }
        JsonNode n = root.at(ptr);
        if (n.isMissingNode()) {
            throw new InputException(Cause.MISSING, new InputLocation(file, 0, 0, -1, pointer),
                "the pointer finds nothing in the file; check it against the file's layout");
        }
        return n;
    }
}

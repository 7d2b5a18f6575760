package eigencheck.adapters;

import java.util.List;
import java.util.Map;

/**
 * How to read a solver's output; one value type that suite files embed. Every part may be null (or
 * empty) for "choose the default":
 *
 * @param format {@code csv}, {@code json}, {@code vtk} (legacy), {@code vtu} or {@code pvd}; null: by
 *     extension
 * @param field name of the field array or column to compare; null: the only one, or u, T,
 *     temperature
 * @param coordinates CSV/JSON column names of the coordinates; empty: those of x, y, z present
 * @param time CSV column holding the time; null: t or time when present
 * @param delimiter CSV delimiter; null: ','
 * @param comment CSV comment marker; null: '#'
 * @param units per column: a unit converted to SI ({@code mm}, {@code cm}, {@code um}, {@code km},
 *     {@code ms}, {@code min}, {@code h}) or an explicit conversion {@code FROM->TO} between
 *     {@code degC}, {@code K} and {@code degF}, or lengths and times
 * @param pointers JSON Pointer (RFC 6901) per role for layouts of other tools: {@code x}, {@code y},
 *     {@code z}, {@code points} (array of coordinate tuples), {@code values}, {@code time}
 * @param timeFromName a regular expression with one group: the number in a file name that, times
 *     {@code timeScale}, is the file's time (for sets of files without a time column)
 * @param timeScale factor for {@code timeFromName}; null: 1
 * @since 0.1
 */
public record ReadOptions(String format, String field, List<String> coordinates, String time, Character delimiter,
                          Character comment, Map<String, String> units, Map<String, String> pointers,
                          String timeFromName, Double timeScale) {
    public ReadOptions {
        coordinates = coordinates == null ? List.of() : List.copyOf(coordinates);
        units = units == null ? Map.of() : Map.copyOf(units);
        pointers = pointers == null ? Map.of() : Map.copyOf(pointers);
        if (timeScale != null && !(timeScale > 0 && timeScale < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("timeScale " + timeScale + " must be finite and > 0");
        }
    }

    /** All defaults. */
    public static ReadOptions defaults() {
        return new ReadOptions(null, null, null, null, null, null, null, null, null, null);
    }

    public ReadOptions withFormat(String f) {
        return new ReadOptions(f, field, coordinates, time, delimiter, comment, units, pointers, timeFromName, timeScale);
    }

    public ReadOptions withField(String f) {
        return new ReadOptions(format, f, coordinates, time, delimiter, comment, units, pointers, timeFromName, timeScale);
    }

    public ReadOptions withUnits(Map<String, String> u) {
        return new ReadOptions(format, field, coordinates, time, delimiter, comment, u, pointers, timeFromName, timeScale);
    }

    public ReadOptions withPointers(Map<String, String> p) {
        return new ReadOptions(format, field, coordinates, time, delimiter, comment, units, p, timeFromName, timeScale);
    }

    public ReadOptions withDelimiter(char d) {
        return new ReadOptions(format, field, coordinates, time, d, comment, units, pointers, timeFromName, timeScale);
    }

    public ReadOptions withTimeFromName(String regex, double scale) {
        return new ReadOptions(format, field, coordinates, time, delimiter, comment, units, pointers, regex, scale);
    }

    public ReadOptions withColumns(List<String> coords, String timeColumn) {
        return new ReadOptions(format, field, coords, timeColumn, delimiter, comment, units, pointers, timeFromName,
            timeScale);
    }
}

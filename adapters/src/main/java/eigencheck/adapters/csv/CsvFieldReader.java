package eigencheck.adapters.csv;

import eigencheck.adapters.Field;
import eigencheck.adapters.FieldReader;
import eigencheck.adapters.FieldSeries;
import eigencheck.adapters.InputException;
import eigencheck.adapters.InputException.Cause;
import eigencheck.adapters.InputLocation;
import eigencheck.adapters.ReadOptions;
import eigencheck.adapters.internal.DoubleList;
import eigencheck.adapters.internal.Duplicates;
import eigencheck.adapters.internal.Unit;
import java.io.ByteArrayInputStream;
import java.io.IOException;
import java.io.InputStreamReader;
import java.io.Reader;
import java.io.UncheckedIOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.apache.commons.csv.CSVFormat;
import org.apache.commons.csv.CSVParser;
import org.apache.commons.csv.CSVRecord;

/**
 * CSV through Apache Commons CSV: a header names the columns; coordinates (x, y, z by default, or
 * the option's), an optional time column (t or time) whose distinct values make the time levels,
 * and every other column a point-data array. Comment lines, another delimiter and per-column unit
 * conversion by option.
 */
public final class CsvFieldReader implements FieldReader {
    private static final List<String> DEFAULT_COORDINATES = List.of("x", "y", "z");
    private static final List<String> DEFAULT_TIMES = List.of("t", "time");

    @Override
    public String format() {
        return "csv";
    }

    @Override
    public List<String> extensions() {
        return List.of("csv", "txt", "dat");
    }

    @Override
    public FieldSeries read(Path file, ReadOptions options) throws InputException {
        long size;
        try {
            size = Files.size(file);
        } catch (IOException e) {
            throw new InputException(Cause.UNREADABLE, InputLocation.of(file), Files.exists(file)
                ? "cannot read the file (" + e.getMessage() + ")" : "no such file; check the path");
        }
        try (Reader r = Files.newBufferedReader(file, StandardCharsets.UTF_8)) {
            return parse(file, r, size, options);
        } catch (IOException e) {
            throw new InputException(Cause.UNREADABLE, InputLocation.of(file), "cannot read the file (" + e.getMessage()
                + ")");
        }
    }

    @Override
    public FieldSeries read(Path file, byte[] content, ReadOptions options) throws InputException {
        try (Reader r = new InputStreamReader(new ByteArrayInputStream(content), StandardCharsets.UTF_8)) {
            return parse(file, r, content.length, options);
        } catch (IOException e) {
            throw new InputException(Cause.UNREADABLE, InputLocation.of(file), e.getMessage());
        }
    }

    private static FieldSeries parse(Path file, Reader reader, long size, ReadOptions o) throws InputException {
        char delimiter = o.delimiter() == null ? ',' : o.delimiter();
        char comment = o.comment() == null ? '#' : o.comment();
        CSVFormat format = CSVFormat.DEFAULT.builder().setDelimiter(delimiter).setCommentMarker(comment)
            .setHeader().setSkipHeaderRecord(true).setIgnoreEmptyLines(true).setTrim(true).get();
        CSVParser parser;
        try {
            parser = CSVParser.parse(reader, format);
        } catch (IOException | IllegalArgumentException | UncheckedIOException e) {
            throw new InputException(Cause.MALFORMED, InputLocation.at(file, 1, 0, ""), "cannot read the header: "
                + firstLine(e.getMessage()) + "; the first line (after comments) must name the columns");
        }
        try (parser) {
            List<String> header = parser.getHeaderNames();
            if (header.isEmpty()) {
                throw new InputException(Cause.MISSING, InputLocation.at(file, 1, 0, ""),
                    "no header; the first line must name the columns, for example x,T");
            }
            Columns lower = new Columns();
            for (int i = 0; i < header.size(); i++) {
                String h = header.get(i);
                if (h.isEmpty()) {
                    throw new InputException(Cause.MALFORMED, InputLocation.at(file, 1, i + 1, ""),
                        "column " + (i + 1) + " of the header has no name; name every column");
                }
                if (!lower.add(h, i)) {
                    throw new InputException(Cause.MALFORMED, InputLocation.at(file, 1, i + 1, ""),
                        "the header names \"" + h + "\" twice; give each column its own name");
                }
            }
            List<Integer> coordinateColumns = new ArrayList<>();
            List<String> wanted = o.coordinates().isEmpty() ? DEFAULT_COORDINATES : o.coordinates();
            for (String c : wanted) {
                Integer i = lower.get(c);
                if (i != null) {
                    coordinateColumns.add(i);
                } else if (!o.coordinates().isEmpty()) {
                    throw new InputException(Cause.MISSING, InputLocation.at(file, 1, 0, ""), "no coordinate column \""
                        + c + "\" in the header " + header + "; fix the coordinates option");
                }
            }
            if (coordinateColumns.isEmpty() && o.coordinates().isEmpty() && lower.get("r") != null) {
                coordinateColumns.add(lower.get("r")); // a radial output: r is the coordinate
            }
            if (coordinateColumns.isEmpty()) {
                throw new InputException(Cause.MISSING, InputLocation.at(file, 1, 0, ""), "no coordinate column (x, y,"
                    + " z, or r for a radial output) in the header " + header + "; name them, or give the coordinates"
                    + " option");
            }
            int timeColumn = -1;
            if (o.time() != null) {
                Integer i = lower.get(o.time());
                if (i == null) {
                    throw new InputException(Cause.MISSING, InputLocation.at(file, 1, 0, ""), "no time column \""
                        + o.time() + "\" in the header " + header + "; fix the time option");
                }
                timeColumn = i;
            } else {
                for (String t : DEFAULT_TIMES) {
                    Integer i = lower.exact.get(t);
                    if (i != null && !coordinateColumns.contains(i)) {
                        timeColumn = i;
                        break;
                    }
                }
            }
            List<Integer> dataColumns = new ArrayList<>();
            if (o.field() != null) {
                Integer i = lower.get(o.field());
                if (i == null) {
                    throw new InputException(Cause.MISSING, InputLocation.at(file, 1, 0, ""), "no column \""
                        + o.field() + "\" in the header " + header + "; fix the field option");
                }
                dataColumns.add(i);
            } else {
                for (int i = 0; i < header.size(); i++) {
                    if (!coordinateColumns.contains(i) && i != timeColumn) {
                        dataColumns.add(i);
                    }
                }
            }
            Unit[] units = new Unit[header.size()];
            for (int i = 0; i < units.length; i++) {
                units[i] = Unit.IDENTITY;
            }
            for (Map.Entry<String, String> e : o.units().entrySet()) {
                Integer i = lower.get(e.getKey());
                if (i == null) {
                    throw new InputException(Cause.MISSING, InputLocation.at(file, 1, 0, ""), "units name the column \""
                        + e.getKey() + "\", which the header " + header + " does not have");
                }
                try {
                    units[i] = Unit.parse(e.getValue());
                } catch (IllegalArgumentException ex) {
                    throw new InputException(Cause.INVALID_VALUE, InputLocation.at(file, 1, i + 1, ""), ex.getMessage());
                }
            }
            int dimension = coordinateColumns.size();
            // rows rarely take less than 5 bytes a column: no growth (and no copy) for typical files
            int expectedRows = (int) Math.min(Integer.MAX_VALUE - 16, size / Math.max(4, 5L * header.size()) + 16);
            Levels levels = new Levels(dimension, dataColumns.size(), expectedRows);
            int needed = header.size();
            double[] row = new double[needed];
            for (CSVRecord record : parser) {
                int line = (int) parser.getCurrentLineNumber();
                if (record.size() != needed) {
                    throw new InputException(Cause.MALFORMED, InputLocation.at(file, line, 0, ""), "the row has "
                        + record.size() + " fields, the header " + needed + "; give every row one value per column"
                        + (record.size() < needed ? " (a truncated file?)" : ""));
                }
                for (int k = 0; k < coordinateColumns.size(); k++) {
                    int i = coordinateColumns.get(k);
                    row[i] = number(file, line, i, header.get(i), record.get(i), units[i]);
                }
                if (timeColumn >= 0) {
                    row[timeColumn] = number(file, line, timeColumn, header.get(timeColumn), record.get(timeColumn),
                        units[timeColumn]);
                }
                for (int i : dataColumns) {
                    row[i] = number(file, line, i, header.get(i), record.get(i), units[i]);
                }
                levels.add(timeColumn >= 0 ? row[timeColumn] : Double.NaN, row, coordinateColumns, dataColumns, line);
            }
            if (levels.isEmpty()) {
                throw new InputException(Cause.MISSING, InputLocation.of(file), "no data rows below the header; the"
                    + " solver wrote nothing?");
            }
            List<String> names = new ArrayList<>();
            for (int i : dataColumns) {
                names.add(header.get(i));
            }
            return levels.build(file, names);
        } catch (IOException | UncheckedIOException | IllegalStateException | IllegalArgumentException e) {
            throw new InputException(Cause.MALFORMED, InputLocation.at(file, (int) parser.getCurrentLineNumber(), 0, ""),
                "not well-formed CSV: " + firstLine(e.getMessage()) + "; check the quotes and delimiters");
        }
    }

    private static String firstLine(String m) {
        if (m == null) {
            return "unreadable";
        }
        int cut = m.indexOf('\n');
        return cut < 0 ? m : m.substring(0, cut);
    }

    private static double number(Path file, int line, int column, String name, String text, Unit unit)
        throws InputException {
        double v;
        try {
            v = Double.parseDouble(text);
        } catch (NumberFormatException e) {
            throw new InputException(Cause.NOT_A_NUMBER, InputLocation.at(file, line, column + 1, ""), "column \"" + name
                + "\": \"" + text + "\" is not a number; fix the solver's number format"
                + (text.indexOf(',') >= 0 || text.indexOf(';') >= 0 ? " or the delimiter option" : ""));
        }
        if (!Double.isFinite(v)) {
            throw new InputException(Cause.NOT_A_NUMBER, InputLocation.at(file, line, column + 1, ""), "column \"" + name
                + "\": " + text + " is not finite; the solver diverged or wrote a placeholder");
        }
        return unit.apply(v);
    }

    /**
     * Header names: exact match first (t and T are different columns), else a case-insensitive
     * match when exactly one column fits.
     */
    private static final class Columns {
        private final Map<String, Integer> exact = new LinkedHashMap<>();

        boolean add(String name, int index) {
            return exact.putIfAbsent(name, index) == null;
        }

        Integer get(String name) {
            Integer i = exact.get(name);
            if (i != null) {
                return i;
            }
            Integer found = null;
            for (Map.Entry<String, Integer> e : exact.entrySet()) {
                if (e.getKey().equalsIgnoreCase(name)) {
                    if (found != null) {
                        return null;
                    }
                    found = e.getValue();
                }
            }
            return found;
        }
    }

    /** Rows grouped by time level, in order of first appearance. */
    private static final class Levels {
        private final int dimension;
        private final int arrays;
        private final int capacity;
        private final Map<Double, Level> byTime = new LinkedHashMap<>();
        private Level last;

        Levels(int dimension, int arrays, int capacity) {
            this.dimension = dimension;
            this.arrays = arrays;
            this.capacity = capacity;
        }

        boolean isEmpty() {
            return byTime.isEmpty();
        }

        void add(double time, double[] row, List<Integer> coordinateColumns, List<Integer> dataColumns, int line) {
            Level level = last != null && Double.compare(last.time, time) == 0 ? last
                : byTime.computeIfAbsent(time, t -> new Level(t, dimension, arrays, byTime.isEmpty() ? capacity : 16));
            last = level;
            for (int i : coordinateColumns) {
                level.coordinates.add(row[i]);
            }
            for (int k = 0; k < dataColumns.size(); k++) {
                level.data[k].add(row[dataColumns.get(k)]);
            }
            level.lines.add(line);
        }

        FieldSeries build(Path file, List<String> names) throws InputException {
            List<Field> fields = new ArrayList<>();
            for (Level level : byTime.values()) {
                double[] c = level.coordinates.toArray();
                int[] dup = Duplicates.find(c, dimension);
                if (dup != null) {
                    throw new InputException(Cause.INVALID_VALUE, InputLocation.at(file, level.lines.get(dup[1]), 0,
                        ""), "this row repeats the point of line " + level.lines.get(dup[0])
                        + (Double.isNaN(level.time) ? "" : " at t = " + level.time)
                        + "; each point once per time level (a time column missing from the options?)");
                }
                Field.Builder b = new Field.Builder(dimension, c).time(level.time);
                for (int k = 0; k < names.size(); k++) {
                    b.pointData(names.get(k), 1, level.data[k].toArray());
                }
                fields.add(b.build());
            }
            return new FieldSeries(fields);
        }
    }

    private static final class Level {
        final double time;
        final DoubleList coordinates;
        final DoubleList[] data;
        final eigencheck.adapters.internal.IntList lines;

        Level(double time, int dimension, int arrays, int capacity) {
            this.time = time;
            this.coordinates = new DoubleList(capacity * dimension);
            this.data = new DoubleList[arrays];
            for (int k = 0; k < arrays; k++) {
                data[k] = new DoubleList(capacity);
            }
            this.lines = new eigencheck.adapters.internal.IntList(capacity);
        }
    }
}

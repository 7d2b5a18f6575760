package eigencheck.adapters;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.ServiceLoader;

/**
 * The adapters' facade: picks the reader by the option's format or by the file's extension.
 *
 * @since 0.1
 */
public final class Readers {
    private static final List<FieldReader> READERS = load();

    private Readers() {
    }

    private static List<FieldReader> load() {
        List<FieldReader> list = new ArrayList<>();
        for (FieldReader r : ServiceLoader.load(FieldReader.class, Readers.class.getClassLoader())) {
            list.add(r);
        }
        return List.copyOf(list);
    }

    /** Formats known, in the order readers were found. */
    public static List<String> formats() {
        return READERS.stream().map(FieldReader::format).toList();
    }

    /** Reads a file with the reader chosen by {@code options.format()} or the extension. */
    public static FieldSeries read(Path file, ReadOptions options) throws InputException {
        String name = file.getFileName() == null ? "" : file.getFileName().toString();
        if (name.contains("*") || name.contains("?")) {
            return readSet(file, options);
        }
        FieldSeries s = choose(file, options).read(file, options);
        return withTimesFromName(List.of(file), List.of(s), options);
    }

    /** A set of files named by a glob in the last path element, each one time level. */
    private static FieldSeries readSet(Path pattern, ReadOptions options) throws InputException {
        Path dir = pattern.getParent() == null ? Path.of(".") : pattern.getParent();
        String glob = pattern.getFileName().toString();
        List<Path> files = new ArrayList<>();
        try (var stream = Files.newDirectoryStream(dir, glob)) {
            for (Path p : stream) {
                files.add(p);
            }
        } catch (IOException e) {
            throw new InputException(InputException.Cause.UNREADABLE, InputLocation.of(pattern),
                "cannot list " + dir + " (" + e.getMessage() + "); check the folder");
        }
        if (files.isEmpty()) {
            throw new InputException(InputException.Cause.UNREADABLE, InputLocation.of(pattern),
                "no file matches " + glob + " in " + dir + "; check the pattern");
        }
        files.sort(null);
        List<FieldSeries> parts = new ArrayList<>();
        for (Path f : files) {
            parts.add(choose(f, options).read(f, options));
        }
        return withTimesFromName(files, parts, options);
    }

    private static FieldSeries withTimesFromName(List<Path> files, List<FieldSeries> parts, ReadOptions options)
        throws InputException {
        List<Field> all = new ArrayList<>();
        java.util.regex.Pattern regex = options.timeFromName() == null ? null
            : java.util.regex.Pattern.compile(options.timeFromName());
        double scale = options.timeScale() == null ? 1 : options.timeScale();
        for (int i = 0; i < files.size(); i++) {
            for (Field f : parts.get(i).fields()) {
                if (regex != null) {
                    String name = files.get(i).getFileName().toString();
                    var m = regex.matcher(name);
                    if (!m.find() || m.groupCount() < 1) {
                        throw new InputException(InputException.Cause.INVALID_VALUE, InputLocation.of(files.get(i)),
                            "the file name does not match timeFromName " + options.timeFromName()
                                + " with one group; fix the pattern");
                    }
                    try {
                        f = f.withTime(Double.parseDouble(m.group(1)) * scale);
                    } catch (NumberFormatException e) {
                        throw new InputException(InputException.Cause.NOT_A_NUMBER, InputLocation.of(files.get(i)),
                            "timeFromName matched \"" + m.group(1) + "\", not a number; fix the pattern");
                    }
                }
                all.add(f);
            }
        }
        if (files.size() > 1) {
            java.util.Set<Double> seen = new java.util.HashSet<>();
            for (Field f : all) {
                if (!Double.isNaN(f.time()) && !seen.add(f.time())) {
                    throw new InputException(InputException.Cause.INVALID_VALUE, InputLocation.of(files.get(0)),
                        "two files have the time " + f.time() + "; give each file its own time (timeFromName)");
                }
            }
        }
        return new FieldSeries(all);
    }

    /** Reads bytes already in memory (tests, collections). */
    public static FieldSeries read(Path file, byte[] content, ReadOptions options) throws InputException {
        return choose(file, options).read(file, content, options);
    }

    static FieldReader choose(Path file, ReadOptions options) throws InputException {
        if (options.format() != null) {
            for (FieldReader r : READERS) {
                if (r.format().equals(options.format())) {
                    return r;
                }
            }
            throw new InputException(InputException.Cause.INVALID_VALUE, InputLocation.of(file), "format \""
                + options.format() + "\" is not known; use one of " + String.join(", ", formats()));
        }
        String name = file.getFileName() == null ? "" : file.getFileName().toString().toLowerCase(Locale.ROOT);
        int dot = name.lastIndexOf('.');
        String extension = dot < 0 ? "" : name.substring(dot + 1);
        for (FieldReader r : READERS) {
            if (r.extensions().contains(extension)) {
                return r;
            }
        }
        throw new InputException(InputException.Cause.INVALID_VALUE, InputLocation.of(file), "cannot tell the format"
            + " from the extension \"" + extension + "\"; name the format (one of " + String.join(", ", formats()) + ")");
    }
}

package eigencheck.adapters;

import java.nio.file.Path;

/**
 * Reads one solver's output format into fields; implementations are listed in
 * {@code META-INF/services/eigencheck.adapters.FieldReader}. Stable SPI.
 *
 * @since 0.1
 */
public interface FieldReader {
    /** The name suite files use: "csv", "json", "vtk", "vtu", "pvd". */
    String format();

    /** File name extensions (lower case, without the dot) this reader takes by default. */
    java.util.List<String> extensions();

    /**
     * Reads {@code file}, whose bytes are {@code content} (the caller has read them; {@code file}
     * names them in messages and locates files a collection refers to).
     *
     * @throws InputException naming the file, the line and column or byte offset, what was expected
     *     and what was found
     */
    FieldSeries read(Path file, byte[] content, ReadOptions options) throws InputException;

    /**
     * Reads {@code file} from disk; the default reads all its bytes first, a reader that can stream
     * (CSV) overrides this to keep memory low.
     */
    default FieldSeries read(Path file, ReadOptions options) throws InputException {
        byte[] content;
        try {
            content = java.nio.file.Files.readAllBytes(file);
        } catch (java.io.IOException e) {
            throw new InputException(InputException.Cause.UNREADABLE, InputLocation.of(file),
                java.nio.file.Files.exists(file) ? "cannot read the file (" + e.getMessage() + ")"
                    : "no such file; check the path");
        }
        return read(file, content, options);
    }
}

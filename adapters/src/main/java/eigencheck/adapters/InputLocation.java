package eigencheck.adapters;

import java.nio.file.Path;
import java.util.Objects;

/**
 * Where in an input file something is: the file, a 1-based line and column (0 when unknown), a
 * byte offset for binary data (-1 when not used), and a field path such as {@code boundary.xmin}
 * or {@code $.fields[0].time} (empty when not used).
 *
 * @since 0.1
 */
public record InputLocation(Path file, int line, int column, long byteOffset, String path) {
    public InputLocation {
        Objects.requireNonNull(file, "file");
        Objects.requireNonNull(path, "path");
    }

    /** A line and column in a text file, with the field path. */
    public static InputLocation at(Path file, int line, int column, String path) {
        return new InputLocation(file, line, column, -1, path);
    }

    /** A whole file. */
    public static InputLocation of(Path file) {
        return new InputLocation(file, 0, 0, -1, "");
    }

    /** The same place shifted by {@code columns} to the right (for a position inside a value). */
    public InputLocation plusColumns(int columns) {
        return new InputLocation(file, line, column + columns, byteOffset, path);
    }

    /** file:line:column (or file:line, file@offset, file), followed by ": path" when there is one. */
    @Override
    public String toString() {
        StringBuilder b = new StringBuilder(file.toString());
        if (line > 0) {
            b.append(':').append(line);
            if (column > 0) {
                b.append(':').append(column);
            }
        } else if (byteOffset >= 0) {
            b.append(" at byte ").append(byteOffset);
        }
        if (!path.isEmpty()) {
            b.append(": ").append(path);
        }
        return b.toString();
    }
}

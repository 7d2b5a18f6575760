package eigencheck.oracle.problem;

import java.util.Locale;

/**
 * A boundary part, as problem files name it: the faces of a slab, rectangle or box
 * ({@code xmin}, {@code xmax}, ...) or the surface of a cylinder or sphere.
 *
 * @since 0.1
 */
public enum Side {
    XMIN, XMAX, YMIN, YMAX, ZMIN, ZMAX, SURFACE;

    /** The name used in problem files. */
    public String key() {
        return name().toLowerCase(Locale.ROOT);
    }
}

package eigencheck.adapters;

/**
 * Cell types by their numbers in the VTK file formats ("VTK File Formats", Kitware, VTK User's
 * Guide, 11th ed., 2010, ch. 19, figures 19-2 and 19-3), with node counts and dimension.
 *
 * @since 0.1
 */
public enum CellType {
    VERTEX(1, 1, 0), POLY_VERTEX(2, -1, 0), LINE(3, 2, 1), POLY_LINE(4, -1, 1), TRIANGLE(5, 3, 2),
    TRIANGLE_STRIP(6, -1, 2), POLYGON(7, -1, 2), PIXEL(8, 4, 2), QUAD(9, 4, 2), TETRA(10, 4, 3), VOXEL(11, 8, 3),
    HEXAHEDRON(12, 8, 3), WEDGE(13, 6, 3), PYRAMID(14, 5, 3), QUADRATIC_EDGE(21, 3, 1), QUADRATIC_TRIANGLE(22, 6, 2),
    QUADRATIC_QUAD(23, 8, 2), QUADRATIC_TETRA(24, 10, 3), QUADRATIC_HEXAHEDRON(25, 20, 3);

    private final int id;
    private final int nodes;
    private final int dimension;

    CellType(int id, int nodes, int dimension) {
        this.id = id;
        this.nodes = nodes;
        this.dimension = dimension;
    }

    /** The VTK cell-type number. */
    public int id() {
        return id;
    }

    /** Node count, or -1 for the variable-size types (poly-vertex, poly-line, strip, polygon). */
    public int nodes() {
        return nodes;
    }

    /** Topological dimension (0 to 3). */
    public int dimension() {
        return dimension;
    }

    /** The type with VTK number {@code id}, or null when eigencheck does not know it. */
    public static CellType of(int id) {
        for (CellType t : values()) {
            if (t.id == id) {
                return t;
            }
        }
        return null;
    }
}

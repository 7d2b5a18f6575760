package eigencheck.adapters;

import java.util.Arrays;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * One solver output at one time: points with 1 to 3 coordinates (flat, point i axis a at
 * {@code coordinates[i * dimension + a]}), optional cells, named point-data and cell-data arrays,
 * and the time (NaN when the file gives none). Immutable; large arrays are handed over by
 * {@link Builder} without a copy and copied on the way out only by the bulk accessors.
 *
 * @since 0.1
 */
public final class Field {
    private final int dimension;
    private final double[] coordinates;
    private final Cells cells;
    private final Map<String, DataArray> pointData;
    private final Map<String, DataArray> cellData;
    private final double time;

    private Field(Builder b) {
        this.dimension = b.dimension;
        this.coordinates = b.coordinates;
        this.cells = b.cells;
        this.pointData = Collections.unmodifiableMap(new LinkedHashMap<>(b.pointData));
        this.cellData = Collections.unmodifiableMap(new LinkedHashMap<>(b.cellData));
        this.time = b.time;
    }

    /** Coordinates per point, 1 to 3. */
    public int dimension() {
        return dimension;
    }

    /** Number of points. */
    public int size() {
        return coordinates.length / dimension;
    }

    /** Coordinate {@code axis} (0 = x) of point i. */
    public double coordinate(int i, int axis) {
        return coordinates[i * dimension + axis];
    }

    /** A copy of the flat coordinates. */
    public double[] coordinates() {
        return coordinates.clone();
    }

    /** Coordinate {@code axis} of every point, as a new array. */
    public double[] axis(int axis) {
        int n = size();
        double[] r = new double[n];
        for (int i = 0; i < n; i++) {
            r[i] = coordinates[i * dimension + axis];
        }
        return r;
    }

    /** The cells, or null when the output has none. */
    public Cells cells() {
        return cells;
    }

    public Map<String, DataArray> pointData() {
        return pointData;
    }

    public Map<String, DataArray> cellData() {
        return cellData;
    }

    /** Time of this output (s), NaN when unknown. */
    public double time() {
        return time;
    }

    /** The same field at another time (a file whose time comes from a collection or an option). */
    public Field withTime(double t) {
        Builder b = new Builder(dimension, coordinates);
        b.cells = cells;
        b.pointData.putAll(pointData);
        b.cellData.putAll(cellData);
        b.time = t;
        return new Field(b);
    }

    /** Names of all arrays, point data first. */
    public List<String> arrayNames() {
        List<String> names = new java.util.ArrayList<>(pointData.keySet());
        names.addAll(cellData.keySet());
        return names;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Field f && f.dimension == dimension && Arrays.equals(f.coordinates, coordinates)
            && java.util.Objects.equals(f.cells, cells) && f.pointData.equals(pointData) && f.cellData.equals(cellData)
            && Double.compare(f.time, time) == 0;
    }

    @Override
    public int hashCode() {
        return Arrays.hashCode(coordinates) * 31 + pointData.hashCode();
    }

    @Override
    public String toString() {
        return "Field[" + size() + " points in " + dimension + "D, " + (cells == null ? "no" : cells.size())
            + " cells, point data " + pointData.keySet() + ", cell data " + cellData.keySet() + ", t = " + time + "]";
    }

    /**
     * Assembles a field; the arrays given are owned by the field afterwards (no copy), so a reader
     * must not touch them again.
     */
    public static final class Builder {
        private final int dimension;
        private final double[] coordinates;
        private Cells cells;
        private final Map<String, DataArray> pointData = new LinkedHashMap<>();
        private final Map<String, DataArray> cellData = new LinkedHashMap<>();
        private double time = Double.NaN;

        /** @param coordinates flat, n * dimension values, handed over */
        public Builder(int dimension, double[] coordinates) {
            if (dimension < 1 || dimension > 3 || coordinates.length % dimension != 0) {
                throw new IllegalArgumentException("field: " + coordinates.length + " coordinates are not points of "
                    + "dimension " + dimension + " (1 to 3)");
            }
            this.dimension = dimension;
            this.coordinates = coordinates;
        }

        /** Connectivity arrays, handed over. */
        public Builder cells(byte[] types, int[] offsets, int[] connectivity) {
            this.cells = new Cells(types, offsets, connectivity, coordinates.length / dimension, true);
            return this;
        }

        /** A point-data array (n tuples), handed over. */
        public Builder pointData(String name, int components, double[] values) {
            DataArray a = new DataArray(name, components, values, true);
            if (a.size() != coordinates.length / dimension) {
                throw new IllegalArgumentException("point data " + name + " has " + a.size() + " tuples for "
                    + coordinates.length / dimension + " points");
            }
            pointData.put(name, a);
            return this;
        }

        /** A cell-data array (one tuple per cell), handed over; cells must be set first. */
        public Builder cellData(String name, int components, double[] values) {
            DataArray a = new DataArray(name, components, values, true);
            if (cells == null || a.size() != cells.size()) {
                throw new IllegalArgumentException("cell data " + name + " has " + a.size() + " tuples for "
                    + (cells == null ? 0 : cells.size()) + " cells");
            }
            cellData.put(name, a);
            return this;
        }

        public Builder time(double t) {
            this.time = t;
            return this;
        }

        public Field build() {
            return new Field(this);
        }
    }
}

package eigencheck.adapters;

import java.util.Arrays;
import java.util.Objects;

/**
 * A named array of tuples: {@code components} values per point or cell, stored flat
 * (tuple i, component c at {@code values[i * components + c]}). Immutable.
 *
 * @since 0.1
 */
public final class DataArray {
    private final String name;
    private final int components;
    private final double[] values;

    public DataArray(String name, int components, double[] values) {
        this(name, components, values.clone(), true);
    }

    DataArray(String name, int components, double[] values, boolean owned) {
        Objects.requireNonNull(name, "name");
        if (components < 1 || values.length % components != 0) {
            throw new IllegalArgumentException("array " + name + ": " + values.length + " values are not a whole number"
                + " of " + components + "-component tuples");
        }
        this.name = name;
        this.components = components;
        this.values = values;
    }

    public String name() {
        return name;
    }

    public int components() {
        return components;
    }

    /** Number of tuples. */
    public int size() {
        return values.length / components;
    }

    /** Component c of tuple i. */
    public double value(int i, int c) {
        return values[i * components + c];
    }

    /** Component 0 of tuple i. */
    public double value(int i) {
        return values[i * components];
    }

    /** A copy of the flat values. */
    public double[] values() {
        return values.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof DataArray d && d.name.equals(name) && d.components == components
            && Arrays.equals(d.values, values);
    }

    @Override
    public int hashCode() {
        return name.hashCode() * 31 + Arrays.hashCode(values);
    }

    @Override
    public String toString() {
        return "DataArray[" + name + ", " + size() + " x " + components + "]";
    }
}

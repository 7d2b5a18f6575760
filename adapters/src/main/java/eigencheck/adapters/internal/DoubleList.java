package eigencheck.adapters.internal;

import java.util.Arrays;

/** A growable double array; {@link #toArray()} hands out an exact-size array. */
public final class DoubleList {
    private double[] data;
    private int size;

    public DoubleList(int capacity) {
        data = new double[Math.max(16, capacity)];
    }

    public void add(double v) {
        if (size == data.length) {
            data = Arrays.copyOf(data, data.length + (data.length >> 1) + 16);
        }
        data[size++] = v;
    }

    public int size() {
        return size;
    }

    public double get(int i) {
        return data[i];
    }

    /** The values, without a copy when the capacity is exact. */
    public double[] toArray() {
        return size == data.length ? data : Arrays.copyOf(data, size);
    }
}

package eigencheck.adapters.internal;

import java.util.Arrays;

/** A growable int array. */
public final class IntList {
    private int[] data;
    private int size;

    public IntList(int capacity) {
        data = new int[Math.max(16, capacity)];
    }

    public void add(int v) {
        if (size == data.length) {
            data = Arrays.copyOf(data, data.length + (data.length >> 1) + 16);
        }
        data[size++] = v;
    }

    public int get(int i) {
        return data[i];
    }

    public int size() {
        return size;
    }
}

package eigencheck.adapters.internal;

import java.util.ArrayList;
import java.util.List;

/**
 * A growable double array kept in chunks of 2^16 values: growing never copies, and
 * {@link #toArray()} copies each chunk once into an exact-size array and lets the chunk go, so a
 * reader's peak memory stays near one copy of its data.
 */
public final class DoubleList {
    private static final int CHUNK = 1 << 16;
    private final List<double[]> chunks = new ArrayList<>();
    private double[] current;
    private int used;
    private int size;

    /** @param capacity ignored beyond the first chunk; kept for call sites that know a size */
    public DoubleList(int capacity) {
        current = new double[Math.min(CHUNK, Math.max(16, capacity))];
    }

    public void add(double v) {
        if (used == current.length) {
            chunks.add(current);
            current = new double[CHUNK];
            used = 0;
        }
        current[used++] = v;
        size++;
    }

    public int size() {
        return size;
    }

    /** The values in one exact-size array; the list is empty afterwards. */
    public double[] toArray() {
        double[] r = new double[size];
        int k = 0;
        for (int c = 0; c < chunks.size(); c++) {
            double[] chunk = chunks.get(c);
            System.arraycopy(chunk, 0, r, k, chunk.length);
            k += chunk.length;
            chunks.set(c, null);
        }
        System.arraycopy(current, 0, r, k, used);
        chunks.clear();
        current = new double[16];
        used = 0;
        size = 0;
        return r;
    }
}

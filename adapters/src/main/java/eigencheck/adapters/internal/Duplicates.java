package eigencheck.adapters.internal;

import java.util.Arrays;

/** Finds two points with identical coordinates: sort of 64-bit hashes, then an exact check. */
public final class Duplicates {
    private Duplicates() {
    }

    /** Indices {i, j} of two points at the same place, or null. */
    public static int[] find(double[] coordinates, int dimension) {
        int n = coordinates.length / dimension;
        if (n < 2) {
            return null;
        }
        long[] keys = new long[n];
        for (int i = 0; i < n; i++) {
            long h = 0x9E3779B97F4A7C15L;
            for (int a = 0; a < dimension; a++) {
                double c = coordinates[i * dimension + a];
                long bits = Double.doubleToLongBits(c == 0.0 ? 0.0 : c); // -0.0 equals 0.0
                h = (h ^ bits) * 0xBF58476D1CE4E5B9L;
                h ^= h >>> 31;
            }
            // high 44 bits hash, low 20 bits... keep the index separately: sort pairs via a second array
            keys[i] = h;
        }
        long[] sorted = keys.clone();
        Arrays.sort(sorted);
        for (int k = 1; k < n; k++) {
            if (sorted[k] == sorted[k - 1]) {
                int[] pair = exactPair(coordinates, dimension, keys, sorted[k]);
                if (pair != null) {
                    return pair;
                }
            }
        }
        return null;
    }

    private static int[] exactPair(double[] c, int dimension, long[] keys, long key) {
        int first = -1;
        for (int i = 0; i < keys.length; i++) {
            if (keys[i] != key) {
                continue;
            }
            if (first < 0) {
                first = i;
                continue;
            }
            boolean same = true;
            for (int a = 0; a < dimension; a++) {
                if (c[first * dimension + a] != c[i * dimension + a]) {
                    same = false;
                    break;
                }
            }
            if (same) {
                return new int[] {first, i};
            }
        }
        return null;
    }
}

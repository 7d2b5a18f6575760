package eigencheck.adapters.internal;

import java.util.Arrays;

/** Finds two points with identical coordinates: sort of 64-bit hashes, then an exact check. */
public final class Duplicates {
    private Duplicates() {
    }

    /** Indices {i, j} of two points at the same place, or null. One long[] of hashes, sorted in place. */
    public static int[] find(double[] coordinates, int dimension) {
        int n = coordinates.length / dimension;
        if (n < 2) {
            return null;
        }
        long[] keys = new long[n];
        for (int i = 0; i < n; i++) {
            keys[i] = hash(coordinates, dimension, i);
        }
        Arrays.sort(keys);
        for (int k = 1; k < n; k++) {
            if (keys[k] == keys[k - 1]) {
                int[] pair = exactPair(coordinates, dimension, keys[k]);
                if (pair != null) {
                    return pair;
                }
            }
        }
        return null;
    }

    private static long hash(double[] c, int dimension, int i) {
        long h = 0x9E3779B97F4A7C15L;
        for (int a = 0; a < dimension; a++) {
            double v = c[i * dimension + a];
            long bits = Double.doubleToLongBits(v == 0.0 ? 0.0 : v); // -0.0 equals 0.0
            h = (h ^ bits) * 0xBF58476D1CE4E5B9L;
            h ^= h >>> 31;
        }
        return h;
    }

    /** Among the points with this hash, two with equal coordinates (hash collisions are rare). */
    private static int[] exactPair(double[] c, int dimension, long key) {
        int n = c.length / dimension;
        java.util.List<Integer> same = new java.util.ArrayList<>();
        for (int i = 0; i < n; i++) {
            if (hash(c, dimension, i) == key) {
                same.add(i);
            }
        }
        for (int p = 0; p < same.size(); p++) {
            for (int q = p + 1; q < same.size(); q++) {
                boolean equal = true;
                for (int a = 0; a < dimension; a++) {
                    double u = c[same.get(p) * dimension + a];
                    double v = c[same.get(q) * dimension + a];
                    if (u != v) {
                        equal = false;
                        break;
                    }
                }
                if (equal) {
                    return new int[] {same.get(p), same.get(q)};
                }
            }
        }
        return null;
    }
}

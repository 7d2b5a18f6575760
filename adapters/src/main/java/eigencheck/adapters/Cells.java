package eigencheck.adapters;

import java.util.Arrays;

/**
 * Cell connectivity in the layout of VTK XML files: cell i has the nodes
 * {@code connectivity[offsets[i] .. offsets[i+1])} and the VTK type number {@code types[i]}.
 * Immutable: arrays are copied in and out.
 *
 * @since 0.1
 */
public final class Cells {
    private final byte[] types;
    private final int[] offsets;
    private final int[] connectivity;

    /**
     * @param offsets n+1 non-decreasing offsets starting at 0 and ending at connectivity.length
     * @throws IllegalArgumentException if the arrays disagree or a node index is outside [0, points)
     */
    public Cells(byte[] types, int[] offsets, int[] connectivity, int points) {
        this(types.clone(), offsets.clone(), connectivity.clone(), points, true);
    }

    Cells(byte[] types, int[] offsets, int[] connectivity, int points, boolean owned) {
        int n = types.length;
        if (offsets.length != n + 1 || offsets[0] != 0 || offsets[n] != connectivity.length) {
            throw new IllegalArgumentException("cells: " + n + " types need " + (n + 1) + " offsets from 0 to "
                + connectivity.length);
        }
        for (int i = 0; i < n; i++) {
            int count = offsets[i + 1] - offsets[i];
            if (count < 1) {
                throw new IllegalArgumentException("cells: cell " + i + " has " + count + " nodes");
            }
            CellType t = CellType.of(types[i] & 0xff);
            if (t != null && t.nodes() > 0 && t.nodes() != count) {
                throw new IllegalArgumentException("cells: cell " + i + " of type " + t + " has " + count
                    + " nodes, not " + t.nodes());
            }
        }
        for (int i = 0; i < connectivity.length; i++) {
            if (connectivity[i] < 0 || connectivity[i] >= points) {
                throw new IllegalArgumentException("cells: node index " + connectivity[i] + " at position " + i
                    + " is outside [0, " + points + ")");
            }
        }
        this.types = types;
        this.offsets = offsets;
        this.connectivity = connectivity;
    }

    /** Number of cells. */
    public int size() {
        return types.length;
    }

    /** VTK type number of cell i. */
    public int type(int i) {
        return types[i] & 0xff;
    }

    /** Number of nodes of cell i. */
    public int nodeCount(int i) {
        return offsets[i + 1] - offsets[i];
    }

    /** Node k of cell i. */
    public int node(int i, int k) {
        return connectivity[offsets[i] + k];
    }

    public byte[] types() {
        return types.clone();
    }

    public int[] offsets() {
        return offsets.clone();
    }

    public int[] connectivity() {
        return connectivity.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof Cells c && Arrays.equals(types, c.types) && Arrays.equals(offsets, c.offsets)
            && Arrays.equals(connectivity, c.connectivity);
    }

    @Override
    public int hashCode() {
        return Arrays.hashCode(types) * 31 + Arrays.hashCode(connectivity);
    }

    @Override
    public String toString() {
        return "Cells[" + types.length + " cells, " + connectivity.length + " node references]";
    }
}

package eigencheck.oracle.problem;

import java.util.List;

/**
 * Plane wall {@code 0 < x < length} (m), faces {@code xmin} at x = 0 and {@code xmax} at x = length.
 *
 * @since 0.1
 */
public record Slab(double length) implements Domain {
    public Slab {
        if (!(length > 0 && length < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("slab: length = " + length + " m must be finite and > 0");
        }
    }

    @Override
    public List<Side> sides() {
        return List.of(Side.XMIN, Side.XMAX);
    }

    @Override
    public List<String> coordinates() {
        return List.of("x");
    }

    @Override
    public double characteristicLength() {
        return length;
    }

    @Override
    public double[] lengths() {
        return new double[] {length};
    }
}

package eigencheck.oracle.problem;

import java.util.List;

/**
 * Box {@code 0 < x < lengthX, 0 < y < lengthY, 0 < z < lengthZ} (m) with the six faces
 * {@code xmin} ... {@code zmax}. Face data are expressions of the coordinates along the face and t.
 *
 * @since 0.2
 */
public record Box(double lengthX, double lengthY, double lengthZ) implements Domain {
    public Box {
        requireLength("box: lengthX", lengthX);
        requireLength("box: lengthY", lengthY);
        requireLength("box: lengthZ", lengthZ);
    }

    static void requireLength(String what, double value) {
        if (!(value > 0 && value < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException(what + " = " + value + " m must be finite and > 0");
        }
    }

    @Override
    public List<Side> sides() {
        return List.of(Side.XMIN, Side.XMAX, Side.YMIN, Side.YMAX, Side.ZMIN, Side.ZMAX);
    }

    @Override
    public List<String> coordinates() {
        return List.of("x", "y", "z");
    }

    @Override
    public double characteristicLength() {
        return Math.max(lengthX, Math.max(lengthY, lengthZ));
    }

    @Override
    public double[] lengths() {
        return new double[] {lengthX, lengthY, lengthZ};
    }
}

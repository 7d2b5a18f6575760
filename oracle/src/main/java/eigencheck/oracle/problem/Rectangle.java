package eigencheck.oracle.problem;

import java.util.List;

/**
 * Rectangle {@code 0 < x < lengthX, 0 < y < lengthY} (m) with the four sides {@code xmin} (x = 0),
 * {@code xmax}, {@code ymin} and {@code ymax}. Side data are expressions of the coordinates along the
 * side (the normal coordinate is fixed there) and t.
 *
 * @since 0.2
 */
public record Rectangle(double lengthX, double lengthY) implements Domain {
    public Rectangle {
        Box.requireLength("rectangle: lengthX", lengthX);
        Box.requireLength("rectangle: lengthY", lengthY);
    }

    @Override
    public List<Side> sides() {
        return List.of(Side.XMIN, Side.XMAX, Side.YMIN, Side.YMAX);
    }

    @Override
    public List<String> coordinates() {
        return List.of("x", "y");
    }

    @Override
    public double characteristicLength() {
        return Math.max(lengthX, lengthY);
    }

    @Override
    public double[] lengths() {
        return new double[] {lengthX, lengthY};
    }
}

package eigencheck.oracle.problem;

import java.util.List;

/**
 * Solid sphere {@code 0 <= r < radius} (m), symmetric about its centre: one coordinate r, one
 * boundary part, the {@code surface}.
 *
 * @since 0.1
 */
public record Sphere(double radius) implements Domain {
    public Sphere {
        if (!(radius > 0 && radius < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("sphere: radius = " + radius + " m must be finite and > 0");
        }
    }

    @Override
    public List<Side> sides() {
        return List.of(Side.SURFACE);
    }

    @Override
    public List<String> coordinates() {
        return List.of("r");
    }

    @Override
    public double characteristicLength() {
        return radius;
    }
}

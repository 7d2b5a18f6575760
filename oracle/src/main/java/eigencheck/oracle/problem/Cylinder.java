package eigencheck.oracle.problem;

import java.util.List;

/**
 * Solid cylinder {@code 0 <= r < radius} (m), infinitely long or with insulated ends, so that u
 * depends on r and t alone: one coordinate r, one boundary part, the {@code surface}.
 *
 * @since 0.2
 */
public record Cylinder(double radius) implements Domain {
    public Cylinder {
        if (!(radius > 0 && radius < Double.POSITIVE_INFINITY)) {
            throw new IllegalArgumentException("cylinder: radius = " + radius + " m must be finite and > 0");
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

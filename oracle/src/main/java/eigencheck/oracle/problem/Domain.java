package eigencheck.oracle.problem;

import java.util.List;

/**
 * The body the diffusion equation holds on.
 *
 * @since 0.1
 */
public sealed interface Domain permits Slab, Rectangle, Box, Cylinder, Sphere {
    /** The sides that need a boundary condition, in problem-file order. */
    List<Side> sides();

    /** Coordinate names, as expressions and point files use them. */
    List<String> coordinates();

    /** Characteristic length L (m): the diffusion time scale is L^2/alpha. */
    double characteristicLength();

    /** Edge lengths along x, y (and z) for the slab, rectangle and box; empty for radial bodies. */
    default double[] lengths() {
        return new double[0];
    }
}

package eigencheck.oracle.series;

import eigencheck.oracle.Evaluation;

/**
 * A prepared series for a body in one to three coordinates (rectangle, box, cylinder): the state at
 * one time is a {@link Slice}, which evaluates many points. Implementations are immutable to callers
 * and thread-safe.
 */
public interface SpatialSolver {
    /** Number of coordinates of a point. */
    int dimension();

    /** Temperature scale U the tolerance is relative to. */
    double scale();

    /** Characteristic length L: gradients are certified to tolerance * U / L. */
    double length();

    /** Time horizon prepared for (+infinity for a steady problem). */
    double horizon();

    /** The state at time t. @throws eigencheck.oracle.OracleException if t is outside the horizon */
    Slice at(double t);

    /**
     * The part of u that does not change in time (the steady source and face parts), which slices
     * at different times may share for the same point; null when there is none worth sharing.
     */
    default Steady steadyPart() {
        return null;
    }

    /** The time-independent parts of u; see {@link #steadyPart()}. */
    interface Steady {
        /** Those parts at the point, each with its bound, in the solver's own order; not checked against the tolerance. */
        Evaluation[] temperature(double[] p, int offset);
    }

    /** Everything that depends on t alone. */
    interface Slice {
        /** Modes summed by the time-dependent part at this time (0 for a steady problem). */
        int modes();

        /** u at the point {@code p[offset .. offset + dimension)}, with its bound. */
        Evaluation temperature(double[] p, int offset);

        /**
         * As {@link #temperature(double[], int)}, given {@code steady}, what {@link #steadyPart()}
         * returned for the same point (null: compute it).
         */
        default Evaluation temperature(double[] p, int offset, Evaluation[] steady) {
            return temperature(p, offset);
        }

        /**
         * The gradient of u at the point into {@code out[outOffset ..]}; returns the bound on each
         * component.
         */
        double gradient(double[] p, int offset, double[] out, int outOffset);

        /**
         * The exact mean of u over the axis-aligned cell from {@code lo} to {@code hi} (rectangle, box),
         * or over the shell lo[0] < r < hi[0] (cylinder, weight r), with its bound.
         */
        Evaluation average(double[] lo, double[] hi);
    }
}

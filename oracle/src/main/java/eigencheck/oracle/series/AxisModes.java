package eigencheck.oracle.series;

import eigencheck.oracle.modes.SlabModes;
import java.util.Arrays;

/**
 * The modes of one axis of a rectangle or box, indexed from 0: \(X_j(x) = \sin(\mu_j x + \varphi_j)\),
 * with the zero mode of a Neumann-Neumann pair as j = 0 (\(\mu_0 = 0\), \(\varphi_0 = \pi/2\), so
 * \(X_0 = 1\)). In every case \(\mu_j \ge j\pi/L\) (the bracket of {@link SlabModes}), which the
 * truncation bounds use. Grown on demand; callers read the arrays after {@link #ensure}.
 */
final class AxisModes {
    final double length;
    final boolean zero;
    private final SlabModes modes;
    double[] mu = new double[0];
    double[] phase = new double[0];
    double[] norm = new double[0];

    AxisModes(double length, double leftH, double rightH) {
        this.length = length;
        this.modes = new SlabModes(length, leftH, rightH);
        this.zero = modes.hasZeroMode();
    }

    /** Makes modes 0 .. n-1 available. */
    synchronized void ensure(int n) {
        if (n <= mu.length) {
            return;
        }
        int size = Math.max(n, 2 * mu.length);
        double[] m = Arrays.copyOf(mu, size);
        double[] p = Arrays.copyOf(phase, size);
        double[] q = Arrays.copyOf(norm, size);
        for (int j = mu.length; j < size; j++) {
            if (zero && j == 0) {
                m[j] = 0;
                p[j] = Math.PI / 2;
                q[j] = length;
            } else {
                int n1 = zero ? j : j + 1;
                m[j] = modes.mu(n1);
                p[j] = modes.phase(n1);
                q[j] = modes.normSquared(n1);
            }
        }
        mu = m;
        phase = p;
        norm = q;
    }

    /** \(\int_0^L X_j\,dx\). */
    double integral(int j) {
        double m = mu[j];
        if (m == 0) {
            return length;
        }
        return (Math.cos(phase[j]) - Math.cos(m * length + phase[j])) / m;
    }

    /** {X_j, dX_j/ds} at end {@code side} (0: x = 0, 1: x = L), s the distance from that end inwards. */
    double[] atEnd(int j, int side) {
        double m = mu[j];
        if (side == 0) {
            return new double[] {Math.sin(phase[j]), m * Math.cos(phase[j])};
        }
        double arg = m * length + phase[j];
        return new double[] {Math.sin(arg), -m * Math.cos(arg)};
    }

    /** \(\int_0^L x\,X_j\,dx\). */
    double firstMoment(int j) {
        double m = mu[j];
        if (m == 0) {
            return 0.5 * length * length;
        }
        double arg = m * length + phase[j];
        return -length * Math.cos(arg) / m + (Math.sin(arg) - Math.sin(phase[j])) / (m * m);
    }

    /** A lower bound of \(\|X_j\|^2\) over all j >= 0: the computed minimum, and L(1/2 - 1/(2 pi)) beyond. */
    double normLowerBound(int computed) {
        double min = length * (0.5 - 0.5 / Math.PI);
        for (int j = 0; j < computed; j++) {
            min = Math.min(min, norm[j]);
        }
        return min;
    }
}

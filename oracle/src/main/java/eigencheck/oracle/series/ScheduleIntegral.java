package eigencheck.oracle.series;

import eigencheck.oracle.expr.Expression;
import java.util.HashMap;
import java.util.Map;

/**
 * Duhamel's integral of a smooth schedule, I(lambda, t) = int_0^t exp(-lambda (t - s)) f(s) ds, for
 * many decay rates lambda at one time t: on the window t / 2^k, the shortest of that form that covers
 * where the kernel exceeds exp(-40), by 20-point Gauss-Legendre rules on panels with lambda times the
 * panel's width at most 8 and at the density f itself needs (panels doubled until the integral of f^2
 * over [0, t] settles to 1e-14). Values of f are shared by every rate of one window. The quadrature
 * error is estimated on the slowest rate (the widest window) against doubled panels.
 */
final class ScheduleIntegral {
    private static final double WINDOW = 40; // exp(-40) < 4.3e-18
    private static final GaussLegendre RULE = GaussLegendre.of(20);

    private final Expression schedule;

    /** @param schedule f over the single variable t */
    ScheduleIntegral(Expression schedule) {
        this.schedule = schedule;
    }

    /** The integrals at time t > 0; not thread-safe (one per slice under construction). */
    At at(double t) {
        return new At(t);
    }

    final class At {
        private final double t;
        private final double density;
        private final Map<Integer, double[]> windows = new HashMap<>();

        private At(double t) {
            this.t = t;
            int basePanels = 1;
            double previous = squareIntegral(basePanels);
            while (basePanels < 4096) {
                double next = squareIntegral(2 * basePanels);
                basePanels *= 2;
                boolean settled = Math.abs(next - previous) <= 1e-14 * Math.max(next, 1e-300);
                previous = next;
                if (settled) {
                    break;
                }
            }
            this.density = basePanels / t;
        }

        /** I(lambda, t), lambda > 0. */
        double value(double lambda) {
            int k = window(lambda);
            double[] values = windows.get(k);
            if (values == null) {
                values = nodeValues(k, 1);
                windows.put(k, values);
            }
            return integral(lambda, k, 1, values);
        }

        /**
         * |I - I_doubled| / (fMax / lambda) at the slowest rate, plus 1e-14: the quadrature's relative
         * error, applied to every rate.
         */
        double relativeError(double lowest, double fMax) {
            if (!(fMax > 0) || lowest == Double.POSITIVE_INFINITY) {
                return 0;
            }
            int k = window(lowest);
            double coarse = integral(lowest, k, 1, nodeValues(k, 1));
            double fine = integral(lowest, k, 2, nodeValues(k, 2));
            return Math.abs(coarse - fine) / (fMax / lowest) + 1e-14;
        }

        private int window(double lambda) {
            return lambda * t <= WINDOW ? 0 : (int) Math.floor(Math.log(lambda * t / WINDOW) / Math.log(2));
        }

        private int panels(int k, int refine) {
            double width = t / Math.pow(2, k);
            return refine * (int) Math.max(10, Math.ceil(width * density));
        }

        private double[] nodeValues(int k, int refine) {
            double width = t / Math.pow(2, k);
            int panels = panels(k, refine);
            double h = width / panels;
            double a = t - width;
            int n = RULE.nodes.length;
            double[] v = new double[panels * n];
            for (int p = 0; p < panels; p++) {
                double mid = a + (p + 0.5) * h;
                for (int q = 0; q < n; q++) {
                    v[p * n + q] = schedule.value(mid + 0.5 * h * RULE.nodes[q]);
                }
            }
            return v;
        }

        private double integral(double lambda, int k, int refine, double[] values) {
            double width = t / Math.pow(2, k);
            int panels = panels(k, refine);
            double h = width / panels;
            double a = t - width;
            int n = RULE.nodes.length;
            double sum = 0;
            for (int p = 0; p < panels; p++) {
                double mid = a + (p + 0.5) * h;
                for (int q = 0; q < n; q++) {
                    double s = mid + 0.5 * h * RULE.nodes[q];
                    sum += RULE.weights[q] * Math.exp(-lambda * (t - s)) * values[p * n + q];
                }
            }
            return 0.5 * h * sum;
        }

        private double squareIntegral(int panels) {
            double h = t / panels;
            double sum = 0;
            for (int p = 0; p < panels; p++) {
                double mid = (p + 0.5) * h;
                for (int q = 0; q < RULE.nodes.length; q++) {
                    double v = schedule.value(mid + 0.5 * h * RULE.nodes[q]);
                    sum += RULE.weights[q] * v * v;
                }
            }
            return 0.5 * h * sum;
        }
    }
}

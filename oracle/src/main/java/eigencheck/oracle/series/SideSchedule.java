package eigencheck.oracle.series;

import eigencheck.oracle.expr.Expression;

/**
 * One term theta(t) phi(s) of the change in time of a rectangle side's or box face's data, g(s, t) = g(s, 0) +
 * sum_k theta_k(t) phi_k(s), theta_k(0) = 0: the schedule part (theta and its first three derivatives,
 * their sizes over the horizon, and Duhamel's integral of theta'''). The shape phi is the data of a
 * face series of its own in {@link TensorSolver}, whose two quasi-static lags use the resonant
 * profiles. Thread-safe.
 */
final class SideSchedule {
    final int axis;
    final int side;
    final Expression theta;
    final Expression slope;
    final Expression curvature;
    final Expression third;
    final double thetaMax;
    final double slopeMax;
    final double curvatureMax;
    final double thirdMax;
    final double initialSlope;
    final double initialCurvature;
    private final ScheduleIntegral duhamel;

    /**
     * @param theta the schedule over the single variable t, theta(0) = 0
     * @param what the side's field, for messages
     */
    SideSchedule(int axis, int side, Expression theta, double horizon, String what) {
        this.axis = axis;
        this.side = side;
        this.theta = theta;
        this.slope = theta.derivative("t");
        this.curvature = slope.derivative("t");
        this.third = curvature.derivative("t");
        double[] sizes = CommonLevel.sizes(theta, slope, curvature, horizon, what);
        this.thetaMax = sizes[0];
        this.slopeMax = sizes[1];
        this.curvatureMax = sizes[2];
        this.thirdMax = CommonLevel.sizes(slope, curvature, third, horizon, "the rate of " + what)[2];
        this.initialSlope = slope.value(0);
        this.initialCurvature = curvature.value(0);
        this.duhamel = new ScheduleIntegral(third);
    }

    /**
     * {int_0^t theta, a bound of its error}: 20-point Gauss-Legendre on 2^j panels, doubled until two
     * successive sums agree to 1e-15 of the integral of |theta| (at most 2^12 panels); the error is ten
     * times the last difference plus rounding.
     */
    double[] integral(double t) {
        return integral(theta, t);
    }

    /** As {@link #integral(double)} for any f over the single variable t. */
    static double[] integral(Expression f, double t) {
        if (!(t > 0)) {
            return new double[] {0, 0};
        }
        GaussLegendre rule = GaussLegendre.of(20);
        double previous = Double.NaN;
        double difference = Double.POSITIVE_INFINITY;
        double size = 0;
        for (int panels = 1; panels <= 4096; panels *= 2) {
            double h = t / panels;
            double sum = 0;
            double magnitude = 0;
            for (int p = 0; p < panels; p++) {
                double mid = (p + 0.5) * h;
                for (int q = 0; q < rule.nodes.length; q++) {
                    double v = rule.weights[q] * f.value(mid + 0.5 * h * rule.nodes[q]);
                    sum += v;
                    magnitude += Math.abs(v);
                }
            }
            sum *= 0.5 * h;
            size = 0.5 * h * magnitude;
            if (!Double.isNaN(previous)) {
                difference = Math.abs(sum - previous);
                if (difference <= 1e-15 * size) {
                    return new double[] {sum, 10 * difference + 1e-15 * size};
                }
            }
            previous = sum;
        }
        return new double[] {previous, 10 * difference + 1e-15 * size};
    }

    /** Duhamel's integrals of theta''' at time t (one per slice under construction). */
    ScheduleIntegral.At integrals(double t) {
        return duhamel.at(t);
    }

    /**
     * A bound M with |int_0^t exp(-lambda (t - s)) theta'''(s) ds| <= M / lambda for every rate of at
     * least {@code lambda}: min(max |theta'''|, 2 max_s |theta'''(s)| exp(-lambda (t - s) / 2)) over
     * 2049 samples of [0, t] with a 5 % margin (as the common level's).
     */
    double localThird(double t, double lambda) {
        return CommonLevel.localSize(third, thirdMax, t, lambda);
    }
}

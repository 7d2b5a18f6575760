package eigencheck.oracle.series;

import eigencheck.oracle.expr.Expression;
import org.apache.commons.math3.analysis.differentiation.DerivativeStructure;

/**
 * The harmonic correction of one blend part psi(x) beta(y) of a rectangle's source
 * ({@link SourceRemainder}): psi beta meets every side's condition but its own side's, where it leaves
 * B_f(psi beta) = F beta(y) (F = 1 on a Dirichlet side, -+k on a flux or convective one). With beta's
 * modes \(\beta_n = g_n / (k \nu_n^2)\) (g_n the projections of the slab's source G on the tangential
 * modes Y_n), the correction is \(H = -F \sum_n \beta_n a_n Y_n(y)\, y_n(s)\), s the distance from the
 * side, \(y_n = e^{-\nu_n s} + \rho_n e^{-\nu_n (2D - s)}\) with the far side's rho and
 * \(a_n = 1/B_f(y_n)\): harmonic, homogeneous on every other side, and -F beta on its own.
 *
 * <p>Unlike a face series of general data this one is certified on its own side too: its terms decay
 * like \(|g_n| a_n / \nu_n^2\) whatever s is, with |g_n| bounded by integrating by parts along the side
 * (\(|\langle G, Y\rangle| \le \min[(\nu E_0 + E_1 + \|G''\|_1)/\nu^2,\ (\nu E_0 + E_1)/\nu^2 +
 * (\nu E_{2D} + E_{2N} + \|G''''\|_1)/\nu^4]\), E_0 the |G| and E_{2D} the |G''| at the Dirichlet ends,
 * E_1 the |G' -+ (h/k) G| and E_{2N} the |G''' -+ (h/k) G''| at the others; the L1 norms on a
 * 2048-point Gauss rule, doubled: the bound rests on the source being smooth). Off the side the
 * profiles add exp(-nu s).
 */
final class BlendCorrection {
    private static final double EPS = Math.ulp(1.0);
    private static final int RULE = 2048;
    private final AxisModes along;
    private final double depth;
    private final int modes;
    /** -F a_n g_n / (k nu_n^2), rho_n, nu_n for n < modes. */
    private final double[] coef;
    /**
     * With psi = c0 + c1 x (x along the side's normal axis, {@code side} 0 or 1) not null, the part psi beta
     * itself joins as a series, g_n psi Y_n / (k nu_n^2): for a side whose tangential pair is insulated, where
     * beta has no slab (only the zero-mean part of G comes here; its mean goes to a slab along the normal).
     */
    private final double[] psi;
    private final double[] plain;
    private final int side;
    private final double[] flatValueTail;
    private final double[] flatGradientTail;
    private final double[] rho;
    /** Tails without the profile factor, from grid entry i = modes / 2^(levels - 1 - i) on: value and gradient. */
    private final int[] grid;
    private final double[] valueTail;
    private final double[] gradientTail;
    /** The projection error's share up to grid entry i (value, gradient). */
    private final double[] valueError;
    private final double[] gradientError;
    /** An L2 bound of the correction over the body. */
    final double norm;
    private final double maxCoefficientError;

    /**
     * @param g the coefficients g_n = (G, Y_n) / ||Y_n||^2 for n < g.length, with their largest error {@code error}
     * @param source G over the side's coordinate
     * @param alongHOverK the side's two ends: h/k of a convective end, 0 of a flux end, infinity of a Dirichlet end
     * @param ownType 0 Dirichlet, 1 flux, 2 convective (this side), with {@code ownH}; likewise the far side
     */
    BlendCorrection(AxisModes along, double alongLength, double[] alongHOverK, Expression source, double[] g,
                    double error, double depth, int ownType, double ownH, int farType, double farH, double k,
                    double factor, double otherLength, double[] psi, int side) {
        this.along = along;
        this.depth = depth;
        this.modes = g.length;
        this.psi = psi == null ? null : psi.clone();
        this.side = side;
        along.ensure(modes);
        coef = new double[modes];
        rho = new double[modes];
        plain = new double[modes];
        double psiMax = psi == null ? 0 : Math.max(Math.abs(psi[0]), Math.abs(psi[0] + psi[1] * depth));
        double psiSlope = psi == null ? 0 : Math.abs(psi[1]);
        double[] errorWeight = new double[modes];
        double normSum = 0;
        for (int n = 0; n < modes; n++) {
            double nu = along.mu[n];
            if (nu == 0) {
                continue; // the constant mode of an insulated pair: G's mean, which a slab along the normal takes
            }
            rho[n] = switch (farType) {
                case 0 -> -1;
                case 1 -> 1;
                default -> (k * nu - farH) / (k * nu + farH);
            };
            double e = rho[n] * Math.exp(-2 * nu * depth);
            double y0 = 1 + e;
            double dy0 = nu * (-1 + e);
            double b = switch (ownType) {
                case 0 -> y0;
                case 1 -> -k * dy0;
                default -> -k * dy0 + ownH * y0;
            };
            double w = -factor / (b * k * nu * nu);
            coef[n] = w * g[n];
            errorWeight[n] = Math.abs(w) * 2 + psiMax / (k * nu * nu);
            plain[n] = psi == null ? 0 : g[n] / (k * nu * nu);
            // ||Y_n y_n|| <= sqrt(L/2 + L/2) sqrt(2/nu) (|Y| <= 1, |y_n| <= exp(-nu s) + exp(-nu (2D - s)))
            normSum += Math.abs(coef[n]) * Math.sqrt(alongLength) * Math.sqrt(2 / nu) + errorWeight[n] * error
                + Math.abs(plain[n]) * psiMax * Math.sqrt(alongLength * depth);
        }
        this.norm = normSum * Math.sqrt(1 + otherLength);
        double worst = 0;
        for (double w : errorWeight) {
            worst = Math.max(worst, w * error / 2);
        }
        this.maxCoefficientError = worst;
        double[] c = seminorms(source, alongLength, alongHOverK, k);
        double normLower = along.normLowerBound(modes);
        // term bounds t_n (without the profile factor) for n >= 16, explicitly to 64 modes, then in closed form
        int levels = 0;
        while ((16 << levels) <= modes) {
            levels++;
        }
        grid = new int[levels];
        for (int i = 0; i < levels; i++) {
            grid[i] = 16 << i;
        }
        int far = 64 * modes;
        double[] suffixV = new double[levels];
        double[] suffixG = new double[levels];
        double[] flatV = new double[levels];
        double[] flatG = new double[levels];
        double runV = 0;
        double runG = 0;
        double runFlatV = 0;
        double runFlatG = 0;
        int next = levels - 1;
        double pil = Math.PI / alongLength;
        for (int n = far - 1; n >= 16; n--) {
            double nu = n < modes ? along.mu[n] : n * pil;
            double t = Math.abs(factor) * amplitude(ownType, ownH, nu, k) * coefficientBound(c, nu)
                / (normLower * k * nu * nu);
            runV += t;
            runG += 2 * nu * t;
            if (psi != null) {
                double plainBound = coefficientBound(c, nu) / (normLower * k * nu * nu);
                runFlatV += psiMax * plainBound;
                runFlatG += (psiMax * nu + psiSlope) * plainBound;
            }
            if (next >= 0 && n == grid[next]) {
                suffixV[next] = runV;
                suffixG[next] = runG;
                flatV[next] = runFlatV;
                flatG[next] = runFlatG;
                next--;
            }
        }
        // beyond 64 modes: the level-1 bound (nu E0 + E1 + ||G''||_1) / nu^2 and the amplitude at nu_far
        double nuFar = far * pil;
        double a = Math.abs(factor) * amplitude(ownType, ownH, nuFar, k) / (normLower * k);
        double l = 1 / pil;
        double farV = a * (c[0] * Math.pow(l, 3) / (2.0 * Math.pow(far - 1, 2)) + (c[1] + c[2]) * Math.pow(l, 4)
            / (3.0 * Math.pow(far - 1, 3)));
        double farG = 2 * a * (c[0] * l * l / (far - 1.0) + (c[1] + c[2]) * Math.pow(l, 3) / (2.0 * Math.pow(far - 1, 2)));
        // the psi part beyond 64 modes: (nu E0 + E1 + ||G''||_1) / nu^2 over k nu^2, times max |psi| (and nu, |psi'|)
        double b0 = 1 / (normLower * k);
        double flatFarV = psiMax * b0 * (c[0] * Math.pow(l, 3) / (2.0 * Math.pow(far - 1, 2)) + (c[1] + c[2])
            * Math.pow(l, 4) / (3.0 * Math.pow(far - 1, 3)));
        double flatFarG = psiMax * b0 * (c[0] * l * l / (far - 1.0) + (c[1] + c[2]) * Math.pow(l, 3)
            / (2.0 * Math.pow(far - 1, 2))) + psiSlope * b0 * (c[0] * Math.pow(l, 3) / (2.0 * Math.pow(far - 1, 2))
            + (c[1] + c[2]) * Math.pow(l, 4) / (3.0 * Math.pow(far - 1, 3)));
        flatValueTail = new double[levels];
        flatGradientTail = new double[levels];
        valueTail = new double[levels];
        gradientTail = new double[levels];
        valueError = new double[levels];
        gradientError = new double[levels];
        for (int i = 0; i < levels; i++) {
            valueTail[i] = suffixV[i] + farV;
            gradientTail[i] = suffixG[i] + farG;
            flatValueTail[i] = psi == null ? 0 : flatV[i] + flatFarV;
            flatGradientTail[i] = psi == null ? 0 : flatG[i] + flatFarG;
            double ev = 0;
            double eg = 0;
            for (int n = 0; n < grid[i]; n++) {
                ev += errorWeight[n] * error;
                eg += errorWeight[n] * error * 2 * along.mu[n];
            }
            valueError[i] = ev;
            gradientError[i] = eg;
        }
    }

    /** |a| <= base / (1 - exp(-2 nu D)), base 1, 1/(k nu), 1/(k nu + h) on a Dirichlet, flux, convective side. */
    private double amplitude(int ownType, double ownH, double nu, double k) {
        double base = switch (ownType) {
            case 0 -> 1;
            case 1 -> 1 / (k * nu);
            default -> 1 / (k * nu + ownH);
        };
        return base / -Math.expm1(-2 * nu * depth);
    }

    /** {E_0, E_1, ||G''||_1, E_2D, E_2N, ||G''''||_1} along the side. */
    private static double[] seminorms(Expression source, double length, double[] hOverK, double k) {
        double[] c = new double[6];
        for (int e = 0; e < 2; e++) {
            double[] d = derivatives(source, e == 0 ? 0 : length);
            if (hOverK[e] == Double.POSITIVE_INFINITY) {
                c[0] += Math.abs(d[0]);
                c[3] += Math.abs(d[2]);
            } else {
                double s = (e == 0 ? -1 : 1) * hOverK[e];
                c[1] += Math.abs(d[1] + s * d[0]);
                c[4] += Math.abs(d[3] + s * d[2]);
            }
        }
        double[][] r = GaussLegendre.onInterval(RULE, length);
        for (int q = 0; q < RULE; q++) {
            double[] d = derivatives(source, r[0][q]);
            c[2] += 2 * r[1][q] * Math.abs(d[2]);
            c[5] += 2 * r[1][q] * Math.abs(d[4]);
        }
        for (int i = 0; i < 6; i++) {
            if (!Double.isFinite(c[i])) {
                c[i] = Double.POSITIVE_INFINITY;
            }
        }
        return c;
    }

    private static double[] derivatives(Expression source, double x) {
        DerivativeStructure v = source.value(new DerivativeStructure(1, 4, 0, x));
        double[] d = new double[5];
        for (int i = 0; i <= 4; i++) {
            d[i] = v.getPartialDerivative(i);
        }
        return d;
    }

    /** The least of the two levels' bounds of |(G, Y)| at eigenvalue nu > 0. */
    private static double coefficientBound(double[] c, double nu) {
        double one = (nu * c[0] + c[1] + c[2]) / (nu * nu);
        double two = (nu * c[0] + c[1]) / (nu * nu) + (nu * c[3] + c[4] + c[5]) / (nu * nu * nu * nu);
        return Math.min(one, two);
    }

    /**
     * Adds the correction at a point (tangential coordinate y, distance s from the side), or with
     * {@code tangentialHi} and {@code sHi} not NaN its mean over the cell [y, tangentialHi] x [s, sHi];
     * with {@code grad} not null adds {d/dy, d/ds} into it. Returns {value, bound, gradient bound}: the
     * truncation within {@code budget} (and {@code gradientBudget}) where the modes allow, plus the
     * projection error and rounding.
     */
    double[] add(double y, double s, double tangentialHi, double sHi, double budget, double gradientBudget,
                 double[] grad) {
        // psi at the point (or its mean over the cell), x from the side's own end: s = x or D - x
        double psiHere = 0;
        if (psi != null) {
            double x0 = side == 0 ? s : depth - s;
            double x1 = Double.isNaN(sHi) ? x0 : side == 0 ? sHi : depth - sHi;
            psiHere = psi[0] + psi[1] * 0.5 * (x0 + x1);
        }
        boolean mean = !Double.isNaN(tangentialHi);
        double sNear = Math.max(0, s);
        int choice = grid.length - 1;
        for (int i = 0; i < grid.length; i++) {
            double nu = along.mu[grid[i] - 1];
            double profile = Math.exp(-nu * sNear) + Math.exp(-nu * (2 * depth - sNear));
            if (profile * valueTail[i] + flatValueTail[i] <= budget
                && (grad == null || profile * gradientTail[i] + flatGradientTail[i] <= gradientBudget)) {
                choice = i;
                break;
            }
        }
        int n = grid[choice];
        double nuN = along.mu[n - 1];
        double profileN = Math.exp(-nuN * sNear) + Math.exp(-nuN * (2 * depth - sNear));
        double value = 0;
        double magnitude = 0;
        double gy = 0;
        double gs = 0;
        for (int j = 0; j < n; j++) {
            double nu = along.mu[j];
            if (nu == 0) {
                continue;
            }
            double ph = along.phase[j];
            double ym = mean ? TensorSolver.meanOfMode(nu, ph, y, tangentialHi) : Math.sin(nu * y + ph);
            double p;
            double dp = 0;
            if (mean && sHi > s) {
                double w = sHi - s;
                p = (Math.exp(-nu * s) * -Math.expm1(-nu * w)
                    + rho[j] * Math.exp(-nu * (2 * depth - sHi)) * -Math.expm1(-nu * w)) / (nu * w);
            } else {
                double e1 = Math.exp(-nu * s);
                double e2 = rho[j] * Math.exp(-nu * (2 * depth - s));
                p = e1 + e2;
                dp = nu * (-e1 + e2);
            }
            double term = coef[j] * ym * p + plain[j] * ym * psiHere;
            value += term;
            magnitude += Math.abs(term);
            if (grad != null) {
                gy += (coef[j] * p + plain[j] * psiHere) * nu * Math.cos(nu * y + ph);
                // d/ds of psi: psi' ds/dx with ds/dx = +-1, so the caller's d/dx = (+-1) d/ds gives psi'
                double psiS = psi == null ? 0 : psi[1] * (side == 0 ? 1 : -1);
                gs += (coef[j] * dp + plain[j] * psiS) * Math.sin(nu * y + ph);
            }
        }
        if (grad != null) {
            grad[0] += gy;
            grad[1] += gs;
        }
        double bound = profileN * valueTail[choice] + flatValueTail[choice] + valueError[choice] + 16 * EPS * magnitude;
        double gradientBound = profileN * gradientTail[choice] + flatGradientTail[choice] + gradientError[choice]
            + 16 * EPS * magnitude * 2 * along.mu[n - 1];
        return new double[] {value, bound, gradientBound};
    }

    /**
     * The correction's coefficient of tangential mode q, coef_q; its projection on X_p(normal) Y_q(along) over
     * ||X_p||^2 ||Y_q||^2 is coef_q (y_q, X_p) / ||X_p||^2 by Green's identity (both meet the far side's
     * condition); 0 for q beyond the coefficients.
     */
    double coefficient(int q) {
        return q >= modes ? 0 : coef[q];
    }

    /** (y_q, X_p) / ||X_p||^2 for a unit coefficient; the projection is {@link #coefficient} times it. */
    double profileProjection(int q, AxisModes normal, int p, int side) {
        if (q >= modes || along.mu[q] == 0) {
            return 0;
        }
        double mu = normal.mu[p];
        double[] z = normal.atEnd(p, side);
        double z0 = z[0];
        double dz0 = z[1];
        double nu = along.mu[q];
        double e = rho[q] * Math.exp(-2 * nu * depth);
        double y0 = 1 + e;
        double dy0 = nu * (-1 + e);
        return (y0 * dz0 - dy0 * z0) / ((nu * nu + mu * mu) * normal.norm[p]);
    }

    /** g_q / (k nu_q^2), the psi part's coefficient of mode q (0 without a psi part or beyond the coefficients). */
    double plain(int q) {
        return q >= modes ? 0 : plain[q];
    }

    /** The largest error of a coefficient coef_q (from the projections of G). */
    double coefficientError() {
        return maxCoefficientError;
    }

    /** The number of coefficients. */
    int modes() {
        return modes;
    }

    /** The psi part's truncation bound of the whole table (value), which no profile decays. */
    double lastFlatTail() {
        return flatValueTail[grid.length - 1];
    }

    /** The truncation bound, without the profile factor, of the whole table (value, gradient). */
    double[] lastTails() {
        int last = grid.length - 1;
        return new double[] {valueTail[last] + flatValueTail[last], gradientTail[last] + flatGradientTail[last]};
    }
}

package eigencheck.oracle.expr;

import java.util.List;
import java.util.Set;
import org.apache.commons.math3.analysis.differentiation.DerivativeStructure;
import org.apache.commons.math3.special.Erf;
import org.apache.commons.math3.util.FastMath;

/** Expression tree. Package-private: callers see {@link Expression} only. */
abstract class Node {
    abstract double value(double[] v);

    abstract DerivativeStructure value(DerivativeStructure[] v);

    void collectVariables(List<String> names, Set<String> used) {
    }

    boolean mayBeNonSmooth() {
        return false;
    }

    /** True when an abs, step, min or max here takes an argument that uses the named variable. */
    boolean mayBeNonSmoothIn(List<String> names, String variable) {
        return false;
    }

    static final class Constant extends Node {
        final double c;

        Constant(double c) {
            this.c = c;
        }

        @Override
        double value(double[] v) {
            return c;
        }

        @Override
        DerivativeStructure value(DerivativeStructure[] v) {
            return new DerivativeStructure(v[0].getFreeParameters(), v[0].getOrder(), c);
        }
    }

    static final class Variable extends Node {
        final int index;

        Variable(int index) {
            this.index = index;
        }

        @Override
        double value(double[] v) {
            return v[index];
        }

        @Override
        DerivativeStructure value(DerivativeStructure[] v) {
            return v[index];
        }

        @Override
        void collectVariables(List<String> names, Set<String> used) {
            used.add(names.get(index));
        }
    }

    enum Op { ADD, SUB, MUL, DIV, POW }

    static final class Binary extends Node {
        final Op op;
        final Node a;
        final Node b;

        Binary(Op op, Node a, Node b) {
            this.op = op;
            this.a = a;
            this.b = b;
        }

        @Override
        double value(double[] v) {
            double x = a.value(v);
            double y = b.value(v);
            switch (op) {
                case ADD: return x + y;
                case SUB: return x - y;
                case MUL: return x * y;
                case DIV: return x / y;
                default: return power(x, y);
            }
        }

        private static double power(double x, double y) {
            if (y == 2) {
                return x * x;
            }
            if (y == 3) {
                return x * x * x;
            }
            return FastMath.pow(x, y);
        }

        @Override
        DerivativeStructure value(DerivativeStructure[] v) {
            DerivativeStructure x = a.value(v);
            if (op == Op.POW && b instanceof Constant c) {
                double p = c.c;
                if (p == Math.rint(p) && Math.abs(p) < 1 << 20) {
                    return x.pow((int) p);
                }
                return x.pow(p);
            }
            DerivativeStructure y = b.value(v);
            switch (op) {
                case ADD: return x.add(y);
                case SUB: return x.subtract(y);
                case MUL: return x.multiply(y);
                case DIV: return x.divide(y);
                default: return x.pow(y);
            }
        }

        @Override
        void collectVariables(List<String> names, Set<String> used) {
            a.collectVariables(names, used);
            b.collectVariables(names, used);
        }

        @Override
        boolean mayBeNonSmooth() {
            return a.mayBeNonSmooth() || b.mayBeNonSmooth();
        }

        @Override
        boolean mayBeNonSmoothIn(List<String> names, String variable) {
            return a.mayBeNonSmoothIn(names, variable) || b.mayBeNonSmoothIn(names, variable);
        }
    }

    static final class Negate extends Node {
        final Node a;

        Negate(Node a) {
            this.a = a;
        }

        @Override
        double value(double[] v) {
            return -a.value(v);
        }

        @Override
        DerivativeStructure value(DerivativeStructure[] v) {
            return a.value(v).negate();
        }

        @Override
        void collectVariables(List<String> names, Set<String> used) {
            a.collectVariables(names, used);
        }

        @Override
        boolean mayBeNonSmooth() {
            return a.mayBeNonSmooth();
        }

        @Override
        boolean mayBeNonSmoothIn(List<String> names, String variable) {
            return a.mayBeNonSmoothIn(names, variable);
        }
    }

    enum Function {
        SIN, COS, TAN, EXP, LOG, SQRT, ABS, SINH, COSH, TANH, ERF, ERFC, STEP, MIN, MAX;

        int arity() {
            return this == MIN || this == MAX ? 2 : 1;
        }

        boolean nonSmooth() {
            return this == ABS || this == STEP || this == MIN || this == MAX;
        }
    }

    static final class Call extends Node {
        final Function f;
        final Node a;
        final Node b;

        Call(Function f, Node a, Node b) {
            this.f = f;
            this.a = a;
            this.b = b;
        }

        @Override
        double value(double[] v) {
            double x = a.value(v);
            switch (f) {
                case SIN: return FastMath.sin(x);
                case COS: return FastMath.cos(x);
                case TAN: return FastMath.tan(x);
                case EXP: return FastMath.exp(x);
                case LOG: return FastMath.log(x);
                case SQRT: return FastMath.sqrt(x);
                case ABS: return Math.abs(x);
                case SINH: return FastMath.sinh(x);
                case COSH: return FastMath.cosh(x);
                case TANH: return FastMath.tanh(x);
                case ERF: return Erf.erf(x);
                case ERFC: return Erf.erfc(x);
                case STEP: return x > 0 ? 1 : x < 0 ? 0 : Double.isNaN(x) ? Double.NaN : 0.5;
                case MIN: return Math.min(x, b.value(v));
                default: return Math.max(x, b.value(v));
            }
        }

        @Override
        DerivativeStructure value(DerivativeStructure[] v) {
            DerivativeStructure x = a.value(v);
            switch (f) {
                case SIN: return x.sin();
                case COS: return x.cos();
                case TAN: return x.tan();
                case EXP: return x.exp();
                case LOG: return x.log();
                case SQRT: return x.sqrt();
                case ABS: return x.abs();
                case SINH: return x.sinh();
                case COSH: return x.cosh();
                case TANH: return x.tanh();
                case ERF: return erf(x, false);
                case ERFC: return erf(x, true);
                case STEP: {
                    double s = x.getValue();
                    double h = s > 0 ? 1 : s < 0 ? 0 : Double.isNaN(s) ? Double.NaN : 0.5;
                    return new DerivativeStructure(x.getFreeParameters(), x.getOrder(), h);
                }
                case MIN: {
                    DerivativeStructure y = b.value(v);
                    return x.getValue() <= y.getValue() ? x : y;
                }
                default: {
                    DerivativeStructure y = b.value(v);
                    return x.getValue() >= y.getValue() ? x : y;
                }
            }
        }

        /**
         * erf composed with x: d^(k+1)/dx^(k+1) erf(x) = (2/sqrt(pi)) (-1)^k H_k(x) exp(-x^2), H_k the
         * physicists' Hermite polynomials (Abramowitz and Stegun 7.1.19).
         */
        private static DerivativeStructure erf(DerivativeStructure x, boolean complement) {
            int order = x.getOrder();
            double s = x.getValue();
            double[] f = new double[order + 1];
            f[0] = complement ? Erf.erfc(s) : Erf.erf(s);
            double g = 2 / FastMath.sqrt(FastMath.PI) * FastMath.exp(-s * s);
            double[] hermite = new double[Math.max(order, 2)];
            hermite[0] = 1;
            hermite[1] = 2 * s;
            for (int k = 1; k + 1 < order; k++) {
                hermite[k + 1] = 2 * s * hermite[k] - 2 * k * hermite[k - 1];
            }
            for (int k = 0; k < order; k++) {
                double d = ((k & 1) == 0 ? 1 : -1) * hermite[k] * g;
                f[k + 1] = complement ? -d : d;
            }
            return x.compose(f);
        }

        @Override
        void collectVariables(List<String> names, Set<String> used) {
            a.collectVariables(names, used);
            if (b != null) {
                b.collectVariables(names, used);
            }
        }

        @Override
        boolean mayBeNonSmooth() {
            return f.nonSmooth() || a.mayBeNonSmooth() || (b != null && b.mayBeNonSmooth());
        }

        @Override
        boolean mayBeNonSmoothIn(List<String> names, String variable) {
            if (f.nonSmooth()) {
                Set<String> used = new java.util.TreeSet<>();
                collectVariables(names, used);
                if (used.contains(variable)) {
                    return true;
                }
            }
            return a.mayBeNonSmoothIn(names, variable) || (b != null && b.mayBeNonSmoothIn(names, variable));
        }
    }
}

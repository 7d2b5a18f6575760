package eigencheck.oracle.expr;

import java.util.List;

/**
 * Exact symbolic differentiation and substitution on expression trees, with folding of the
 * constants 0 and 1 so that repeated derivatives stay small. Package-private; reached through
 * {@link Expression#derivative(String)} and {@link Expression#substitute(String, double)}.
 */
final class Calculus {
    private Calculus() {
    }

    static Node derivative(Node n, int v) {
        if (n instanceof Node.Constant) {
            return zero();
        }
        if (n instanceof Node.Variable var) {
            return var.index == v ? one() : zero();
        }
        if (n instanceof Node.Negate neg) {
            return negate(derivative(neg.a, v));
        }
        if (n instanceof Node.Binary b) {
            Node da = derivative(b.a, v);
            Node db = derivative(b.b, v);
            switch (b.op) {
                case ADD:
                    return add(da, db);
                case SUB:
                    return sub(da, db);
                case MUL:
                    return add(mul(da, b.b), mul(b.a, db));
                case DIV:
                    return div(sub(mul(da, b.b), mul(b.a, db)), mul(b.b, b.b));
                default:
                    if (isZero(db)) {
                        if (b.b instanceof Node.Constant c) {
                            return mul(mul(constant(c.c), pow(b.a, constant(c.c - 1))), da);
                        }
                        return mul(mul(b.b, pow(b.a, sub(b.b, one()))), da);
                    }
                    // d(a^b) = a^b (b' ln a + b a'/a)
                    return mul(n, add(mul(db, call(Node.Function.LOG, b.a)), div(mul(b.b, da), b.a)));
            }
        }
        Node.Call c = (Node.Call) n;
        Node da = derivative(c.a, v);
        switch (c.f) {
            case SIN:
                return mul(call(Node.Function.COS, c.a), da);
            case COS:
                return negate(mul(call(Node.Function.SIN, c.a), da));
            case TAN: {
                Node cos = call(Node.Function.COS, c.a);
                return div(da, mul(cos, cos));
            }
            case EXP:
                return mul(n, da);
            case LOG:
                return div(da, c.a);
            case SQRT:
                return div(da, mul(constant(2), n));
            case ABS:
                // sign(a) = 2 step(a) - 1, away from a = 0
                return mul(sub(mul(constant(2), call(Node.Function.STEP, c.a)), one()), da);
            case SINH:
                return mul(call(Node.Function.COSH, c.a), da);
            case COSH:
                return mul(call(Node.Function.SINH, c.a), da);
            case TANH:
                return mul(sub(one(), mul(n, n)), da);
            case ERF:
            case ERFC: {
                Node g = mul(constant(2 / Math.sqrt(Math.PI)), call(Node.Function.EXP, negate(mul(c.a, c.a))));
                Node d = mul(g, da);
                return c.f == Node.Function.ERF ? d : negate(d);
            }
            case STEP:
                return zero();
            case MIN:
            case MAX: {
                Node db = derivative(c.b, v);
                Node aWins = c.f == Node.Function.MIN ? sub(c.b, c.a) : sub(c.a, c.b);
                Node wa = call(Node.Function.STEP, aWins);
                return add(mul(wa, da), mul(sub(one(), wa), db));
            }
            default:
                throw new IllegalStateException("no derivative rule for " + c.f);
        }
    }

    /** Replaces variable v by a constant and renumbers the others through {@code map}. */
    static Node substitute(Node n, int v, double value, int[] map) {
        if (n instanceof Node.Constant) {
            return n;
        }
        if (n instanceof Node.Variable var) {
            return var.index == v ? constant(value) : new Node.Variable(map[var.index]);
        }
        if (n instanceof Node.Negate neg) {
            return negate(substitute(neg.a, v, value, map));
        }
        if (n instanceof Node.Binary b) {
            return folded(new Node.Binary(b.op, substitute(b.a, v, value, map), substitute(b.b, v, value, map)), v);
        }
        Node.Call c = (Node.Call) n;
        return folded(new Node.Call(c.f, substitute(c.a, v, value, map),
            c.b == null ? null : substitute(c.b, v, value, map)), v);
    }

    /**
     * A node whose operands are all constants, as one constant, when a variable was substituted (v >= 0): an
     * expression at a fixed point of some coordinates then costs what its free part costs.
     */
    private static Node folded(Node n, int v) {
        if (v < 0) {
            return n;
        }
        boolean constant = n instanceof Node.Binary b ? b.a instanceof Node.Constant && b.b instanceof Node.Constant
            : n instanceof Node.Call c && c.a instanceof Node.Constant && (c.b == null || c.b instanceof Node.Constant);
        return constant ? new Node.Constant(n.value(new double[0])) : n;
    }

    /** Renumbers variables for a new variable list. */
    static Node remap(Node n, int[] map) {
        return substitute(n, -1, 0, map);
    }

    static String print(Node n, List<String> names) {
        if (n instanceof Node.Constant c) {
            if (c.c == Math.PI) {
                return "pi";
            }
            if (c.c == Math.rint(c.c) && Math.abs(c.c) < 1e15) {
                return c.c < 0 ? "(" + (long) c.c + ")" : Long.toString((long) c.c);
            }
            return c.c < 0 ? "(" + c.c + ")" : Double.toString(c.c);
        }
        if (n instanceof Node.Variable var) {
            return names.get(var.index);
        }
        if (n instanceof Node.Negate neg) {
            return "(-" + print(neg.a, names) + ")";
        }
        if (n instanceof Node.Binary b) {
            String op = switch (b.op) {
                case ADD -> "+";
                case SUB -> "-";
                case MUL -> "*";
                case DIV -> "/";
                default -> "^";
            };
            return "(" + print(b.a, names) + op + print(b.b, names) + ")";
        }
        Node.Call c = (Node.Call) n;
        String f = c.f.name().toLowerCase(java.util.Locale.ROOT);
        return f + "(" + print(c.a, names) + (c.b == null ? "" : "," + print(c.b, names)) + ")";
    }

    private static Node zero() {
        return new Node.Constant(0);
    }

    private static Node one() {
        return new Node.Constant(1);
    }

    private static Node constant(double c) {
        return new Node.Constant(c);
    }

    private static boolean isZero(Node n) {
        return n instanceof Node.Constant c && c.c == 0;
    }

    private static boolean isOne(Node n) {
        return n instanceof Node.Constant c && c.c == 1;
    }

    private static Node add(Node a, Node b) {
        if (isZero(a)) {
            return b;
        }
        if (isZero(b)) {
            return a;
        }
        if (a instanceof Node.Constant x && b instanceof Node.Constant y) {
            return constant(x.c + y.c);
        }
        return new Node.Binary(Node.Op.ADD, a, b);
    }

    private static Node sub(Node a, Node b) {
        if (isZero(b)) {
            return a;
        }
        if (isZero(a)) {
            return negate(b);
        }
        if (a instanceof Node.Constant x && b instanceof Node.Constant y) {
            return constant(x.c - y.c);
        }
        return new Node.Binary(Node.Op.SUB, a, b);
    }

    private static Node mul(Node a, Node b) {
        if (isZero(a) || isZero(b)) {
            return zero();
        }
        if (isOne(a)) {
            return b;
        }
        if (isOne(b)) {
            return a;
        }
        if (a instanceof Node.Constant x && b instanceof Node.Constant y) {
            return constant(x.c * y.c);
        }
        return new Node.Binary(Node.Op.MUL, a, b);
    }

    private static Node div(Node a, Node b) {
        if (isZero(a)) {
            return zero();
        }
        if (isOne(b)) {
            return a;
        }
        return new Node.Binary(Node.Op.DIV, a, b);
    }

    private static Node pow(Node a, Node b) {
        if (isZero(b)) {
            return one();
        }
        if (isOne(b)) {
            return a;
        }
        return new Node.Binary(Node.Op.POW, a, b);
    }

    private static Node negate(Node a) {
        if (isZero(a)) {
            return a;
        }
        if (a instanceof Node.Constant c) {
            return constant(-c.c);
        }
        return new Node.Negate(a);
    }

    private static Node call(Node.Function f, Node a) {
        return new Node.Call(f, a, null);
    }
}

package eigencheck.oracle.expr;

import java.util.List;
import java.util.Objects;
import java.util.Set;
import java.util.TreeSet;
import org.apache.commons.math3.analysis.differentiation.DerivativeStructure;

/**
 * A parsed arithmetic expression of named variables (the coordinates x, y, z or r, and the time t).
 *
 * <p>Grammar: numbers, {@code + - * / ^} (power, right-associative, binds tighter than unary minus:
 * {@code -x^2 = -(x^2)}), parentheses, the constants {@code pi} and {@code e}, the variables the
 * context allows, and the functions {@code sin cos tan exp log sqrt abs sinh cosh tanh erf erfc}
 * of one argument, {@code min max} of two, and {@code step} (Heaviside: 0 below zero, 1/2 at zero,
 * 1 above). {@code log} is the natural logarithm.
 *
 * <p>Evaluation on doubles is a tree walk without allocation; evaluation on Commons Math
 * {@link DerivativeStructure} gives exact derivatives (forward automatic differentiation), which the
 * manufactured-solution machinery uses. Instances are immutable and thread-safe.
 *
 * @since 0.1
 */
public final class Expression {
    private final String source;
    private final List<String> variables;
    private final Node root;

    private Expression(String source, List<String> variables, Node root) {
        this.source = source;
        this.variables = variables;
        this.root = root;
    }

    /**
     * Parses {@code source} with the given variable names, in the order {@link #value(double...)}
     * takes them.
     *
     * @throws ExpressionException with the column and what is allowed, if the text is malformed or
     *     names a variable not in {@code variables}
     */
    public static Expression parse(String source, String... variables) {
        Objects.requireNonNull(source, "expression");
        List<String> names = List.of(variables);
        Node root = new Parser(source, names).parseAll();
        return new Expression(source, names, root);
    }

    /** A constant expression; {@link #source()} is its decimal text. */
    public static Expression constant(double value, String... variables) {
        return new Expression(Double.toString(value), List.of(variables), new Node.Constant(value));
    }

    /** The text as given. */
    public String source() {
        return source;
    }

    /** Variable names in argument order. */
    public List<String> variables() {
        return variables;
    }

    /** Variables the expression actually uses. */
    public Set<String> usedVariables() {
        Set<String> used = new TreeSet<>();
        root.collectVariables(variables, used);
        return used;
    }

    /** True when the expression does not depend on the named variable. */
    public boolean isIndependentOf(String variable) {
        return !usedVariables().contains(variable);
    }

    /** True when the expression has no variables (a number, possibly written as arithmetic). */
    public boolean isConstant() {
        return usedVariables().isEmpty();
    }

    /**
     * True when the expression contains a function that may be discontinuous or have a kink
     * ({@code step abs min max}); the series code then expects panels to be split adaptively.
     */
    public boolean mayBeNonSmooth() {
        return root.mayBeNonSmooth();
    }

    /**
     * True when an abs, step, min or max takes an argument that uses {@code variable}: the expression may
     * then have a jump or kink along that variable (false for step(r - a) in an expression of r and t
     * asked about t).
     */
    public boolean mayBeNonSmoothIn(String variable) {
        return root.mayBeNonSmoothIn(variables, variable);
    }

    /** Value at the given variables, in {@link #variables()} order. */
    public double value(double... arguments) {
        if (arguments.length != variables.size()) {
            throw new IllegalArgumentException("expression \"" + source + "\" takes "
                + variables.size() + " arguments " + variables + ", got " + arguments.length);
        }
        return root.value(arguments);
    }

    /** Value and derivatives, with Commons Math's forward automatic differentiation. */
    public DerivativeStructure value(DerivativeStructure... arguments) {
        if (arguments.length != variables.size()) {
            throw new IllegalArgumentException("expression \"" + source + "\" takes "
                + variables.size() + " arguments " + variables + ", got " + arguments.length);
        }
        return root.value(arguments);
    }

    /**
     * The exact partial derivative with respect to {@code variable}, as a new expression over the
     * same variables (symbolic differentiation on the tree). Where abs, min, max or step make the
     * expression non-differentiable, the one-sided rule of the branch taken is used.
     *
     * @throws IllegalArgumentException if {@code variable} is not one of {@link #variables()}
     */
    public Expression derivative(String variable) {
        int v = indexOf(variable);
        Node d = Calculus.derivative(root, v);
        return new Expression("d/d" + variable + "[" + source + "]", variables, d);
    }

    /**
     * This expression with {@code variable} fixed at {@code value}, over the remaining variables in
     * their order.
     */
    public Expression substitute(String variable, double value) {
        int v = indexOf(variable);
        List<String> rest = new java.util.ArrayList<>(variables);
        rest.remove(v);
        int[] map = new int[variables.size()];
        for (int i = 0; i < map.length; i++) {
            map[i] = i < v ? i : i - 1;
        }
        return new Expression("[" + source + "] at " + variable + " = " + value, List.copyOf(rest),
            Calculus.substitute(root, v, value, map));
    }

    /**
     * The same expression over a wider (or reordered) variable list, for example a function of x
     * used where (x, t) are expected.
     *
     * @throws IllegalArgumentException if a used variable is missing from {@code newVariables}
     */
    public Expression over(String... newVariables) {
        List<String> names = List.of(newVariables);
        int[] map = new int[variables.size()];
        for (int i = 0; i < map.length; i++) {
            map[i] = names.indexOf(variables.get(i));
            if (map[i] < 0 && usedVariables().contains(variables.get(i))) {
                throw new IllegalArgumentException("expression \"" + source + "\" uses " + variables.get(i)
                    + ", which is not among " + names);
            }
        }
        return new Expression(source, names, Calculus.remap(root, map));
    }

    /** a*this + b*other over the same variables. */
    public Expression linear(double a, Expression other, double b) {
        if (!other.variables.equals(variables)) {
            throw new IllegalArgumentException("variables differ: " + variables + " and " + other.variables);
        }
        Node n = new Node.Binary(Node.Op.ADD, new Node.Binary(Node.Op.MUL, new Node.Constant(a), root),
            new Node.Binary(Node.Op.MUL, new Node.Constant(b), other.root));
        return new Expression(a + "*[" + source + "] + " + b + "*[" + other.source + "]", variables, n);
    }

    /**
     * The terms of the expression read as a sum: its top-level additions and subtractions flattened, a term
     * under a minus negated (a - (b - c) gives a, -b, c); the expression itself when it is not a sum. The
     * terms add up to the expression exactly in real arithmetic.
     */
    public List<Expression> terms() {
        List<Node> nodes = new java.util.ArrayList<>();
        collectTerms(root, false, nodes);
        List<Expression> out = new java.util.ArrayList<>();
        for (int i = 0; i < nodes.size(); i++) {
            out.add(nodes.size() == 1 ? this
                : new Expression("term " + (i + 1) + " of [" + source + "]", variables, nodes.get(i)));
        }
        return out;
    }

    private static void collectTerms(Node n, boolean negative, List<Node> out) {
        if (n instanceof Node.Binary b && (b.op == Node.Op.ADD || b.op == Node.Op.SUB)) {
            collectTerms(b.a, negative, out);
            collectTerms(b.b, negative ^ b.op == Node.Op.SUB, out);
        } else if (n instanceof Node.Negate g) {
            collectTerms(g.a, !negative, out);
        } else {
            out.add(negative ? new Node.Negate(n) : n);
        }
    }

    /** The same tree with one variable renamed (r read as x, say). */
    public Expression renamed(String from, String to) {
        int v = indexOf(from);
        List<String> names = new java.util.ArrayList<>(variables);
        names.set(v, to);
        return new Expression(source, List.copyOf(names), root);
    }

    /** this * other over the same variables. */
    public Expression times(Expression other) {
        if (!other.variables.equals(variables)) {
            throw new IllegalArgumentException("variables differ: " + variables + " and " + other.variables);
        }
        return new Expression("[" + source + "]*[" + other.source + "]", variables,
            new Node.Binary(Node.Op.MUL, root, other.root));
    }

    /** The tree written back as text in the expression language (fully parenthesised). */
    public String formula() {
        return Calculus.print(root, variables);
    }

    private int indexOf(String variable) {
        int v = variables.indexOf(variable);
        if (v < 0) {
            throw new IllegalArgumentException("expression \"" + source + "\" has no variable " + variable
                + "; its variables are " + variables);
        }
        return v;
    }

    @Override
    public String toString() {
        return source;
    }

    @Override
    public boolean equals(Object other) {
        return other instanceof Expression e && e.source.equals(source) && e.variables.equals(variables);
    }

    @Override
    public int hashCode() {
        return source.hashCode() * 31 + variables.hashCode();
    }
}

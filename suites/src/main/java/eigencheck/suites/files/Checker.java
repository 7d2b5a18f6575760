package eigencheck.suites.files;

import eigencheck.adapters.InputException;
import eigencheck.adapters.InputLocation;
import eigencheck.oracle.expr.Expression;
import eigencheck.oracle.expr.ExpressionException;
import java.util.ArrayList;
import java.util.Collection;
import java.util.List;

/**
 * Collects every problem of a file before failing (shared/STYLE.md section 5): typed access to
 * fields of a {@link Node} tree that records, rather than throws, what is wrong.
 */
public final class Checker {
    private final List<InputException.Problem> problems = new ArrayList<>();

    /** Records a problem. */
    public void problem(InputException.Cause cause, InputLocation at, String message) {
        problems.add(new InputException.Problem(cause, at, message));
    }

    /** True when nothing was recorded. */
    public boolean ok() {
        return problems.isEmpty();
    }

    /** Throws the collected problems, if any. */
    public void throwIfAny() throws InputException {
        if (!problems.isEmpty()) {
            problems.sort((a, b) -> a.location().line() != b.location().line()
                ? Integer.compare(a.location().line(), b.location().line())
                : Integer.compare(a.location().column(), b.location().column()));
            throw new InputException(problems);
        }
    }

    /** The node as an object, or null (recorded) when it is not one. */
    public Node.Obj object(Node n, String hint) {
        if (n instanceof Node.Obj o) {
            return o;
        }
        problem(InputException.Cause.INVALID_VALUE, n.location(), "expected a mapping, found " + n.kind() + "; " + hint);
        return null;
    }

    /** Records every key of {@code o} not in {@code allowed}, with a spelling suggestion. */
    public void allowOnly(Node.Obj o, Collection<String> allowed) {
        for (String key : o.fields().keySet()) {
            if (!allowed.contains(key)) {
                String near = nearest(key, allowed);
                problem(InputException.Cause.UNKNOWN_FIELD, o.keys().get(key), "unknown field \"" + key + "\""
                    + (near != null ? " (did you mean \"" + near + "\"?)" : "") + "; allowed here: "
                    + String.join(", ", allowed));
            }
        }
    }

    /** A required field, or null (recorded as missing). */
    public Node required(Node.Obj o, String key, String hint) {
        Node n = o.fields().get(key);
        if (n == null) {
            String path = o.location().path().isEmpty() ? key : o.location().path() + "." + key;
            problem(InputException.Cause.MISSING, new InputLocation(o.location().file(), o.location().line(),
                o.location().column(), -1, path), "missing; " + hint);
        }
        return n;
    }

    /** A finite number, or NaN (recorded) when the node is not one. */
    public double number(Node n, String hint) {
        if (n instanceof Node.Scalar s && s.value() instanceof Number num) {
            double v = num.doubleValue();
            if (Double.isFinite(v)) {
                return v;
            }
        }
        if (n instanceof Node.Scalar s && s.value() instanceof String text) {
            try {
                double v = Double.parseDouble(text.trim());
                if (Double.isFinite(v)) {
                    return v;
                }
            } catch (NumberFormatException e) {
                // reported below
            }
        }
        problem(InputException.Cause.NOT_A_NUMBER, n.location(), "expected a finite number, found "
            + describe(n) + "; " + hint);
        return Double.NaN;
    }

    /** A number > 0, or NaN (recorded). */
    public double positive(Node n, String hint) {
        double v = number(n, hint);
        if (Double.isNaN(v)) {
            return v;
        }
        if (!(v > 0)) {
            problem(InputException.Cause.OUT_OF_RANGE, n.location(), "must be > 0, found " + v + "; " + hint);
            return Double.NaN;
        }
        return v;
    }

    /** A text value, or null (recorded). */
    public String text(Node n, String hint) {
        if (n instanceof Node.Scalar s && s.value() instanceof String text) {
            return text;
        }
        problem(InputException.Cause.INVALID_VALUE, n.location(), "expected text, found " + n.kind() + "; " + hint);
        return null;
    }

    /**
     * An expression of the given variables (a number is accepted as a constant), or null (recorded,
     * with the column inside the file where the parser stopped).
     */
    public Expression expression(Node n, String[] variables, String hint) {
        String text;
        int shift = 0;
        if (n instanceof Node.Scalar s && s.value() instanceof Number num) {
            text = num.toString();
        } else if (n instanceof Node.Scalar s && s.value() instanceof String str) {
            text = str;
            shift = s.quoted() ? 1 : 0;
        } else {
            problem(InputException.Cause.INVALID_VALUE, n.location(), "expected an expression (text such as \"0\" or"
                + " \"100*sin(pi*t/40)\"), found " + n.kind() + "; " + hint);
            return null;
        }
        try {
            return Expression.parse(text, variables);
        } catch (ExpressionException e) {
            problem(InputException.Cause.BAD_EXPRESSION, n.location().plusColumns(shift + e.column() - 1),
                "expression \"" + text + "\": " + e.problem());
            return null;
        }
    }

    private static String describe(Node n) {
        if (n instanceof Node.Scalar s && s.value() instanceof String text) {
            return "\"" + text + "\"";
        }
        if (n instanceof Node.Scalar s && s.value() != null) {
            return s.value().toString();
        }
        return n.kind();
    }

    /** The allowed word within edit distance 2 of {@code key}, if exactly one is nearest. */
    static String nearest(String key, Collection<String> allowed) {
        String best = null;
        int bestDistance = 3;
        for (String a : allowed) {
            int d = distance(key.toLowerCase(java.util.Locale.ROOT), a.toLowerCase(java.util.Locale.ROOT));
            if (d < bestDistance) {
                bestDistance = d;
                best = a;
            }
        }
        return best;
    }

    private static int distance(String a, String b) {
        int[] prev = new int[b.length() + 1];
        int[] cur = new int[b.length() + 1];
        for (int j = 0; j <= b.length(); j++) {
            prev[j] = j;
        }
        for (int i = 1; i <= a.length(); i++) {
            cur[0] = i;
            for (int j = 1; j <= b.length(); j++) {
                int cost = a.charAt(i - 1) == b.charAt(j - 1) ? 0 : 1;
                cur[j] = Math.min(Math.min(cur[j - 1] + 1, prev[j] + 1), prev[j - 1] + cost);
            }
            int[] t = prev;
            prev = cur;
            cur = t;
        }
        return prev[b.length()];
    }
}

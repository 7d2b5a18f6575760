package eigencheck.oracle.expr;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;

/** Recursive-descent parser; every error names the 1-based column and what is allowed. */
final class Parser {
    private final String text;
    private final List<String> variables;
    private int pos;

    Parser(String text, List<String> variables) {
        this.text = text;
        this.variables = variables;
    }

    Node parseAll() {
        skipSpaces();
        if (pos >= text.length()) {
            throw error(pos, "empty expression; write a number or a formula, for example \"0\"");
        }
        Node n = parseSum();
        skipSpaces();
        if (pos < text.length()) {
            char c = text.charAt(pos);
            if (c == ')') {
                throw error(pos, "unmatched ')'; remove it or add '(' before");
            }
            throw error(pos, "unexpected '" + c + "' after a complete expression; "
                + "an operator (+ - * / ^) is missing or the character does not belong");
        }
        return n;
    }

    private Node parseSum() {
        Node left = parseProduct();
        while (true) {
            skipSpaces();
            if (peek('+')) {
                pos++;
                left = new Node.Binary(Node.Op.ADD, left, parseProduct());
            } else if (peek('-')) {
                pos++;
                left = new Node.Binary(Node.Op.SUB, left, parseProduct());
            } else {
                return left;
            }
        }
    }

    private Node parseProduct() {
        Node left = parseUnary();
        while (true) {
            skipSpaces();
            if (peek('*')) {
                pos++;
                left = new Node.Binary(Node.Op.MUL, left, parseUnary());
            } else if (peek('/')) {
                pos++;
                left = new Node.Binary(Node.Op.DIV, left, parseUnary());
            } else {
                return left;
            }
        }
    }

    private Node parseUnary() {
        skipSpaces();
        if (peek('-')) {
            pos++;
            return new Node.Negate(parseUnary());
        }
        if (peek('+')) {
            pos++;
            return parseUnary();
        }
        return parsePower();
    }

    private Node parsePower() {
        Node base = parseAtom();
        skipSpaces();
        if (peek('^')) {
            pos++;
            Node exponent = parseUnary(); // right-associative; allows 2^-x
            return new Node.Binary(Node.Op.POW, base, exponent);
        }
        return base;
    }

    private Node parseAtom() {
        skipSpaces();
        if (pos >= text.length()) {
            throw error(pos, "expression ends where a number, a name or '(' was expected");
        }
        char c = text.charAt(pos);
        if (c == '(') {
            int open = pos;
            pos++;
            Node inner = parseSum();
            skipSpaces();
            if (!peek(')')) {
                throw error(pos >= text.length() ? open : pos,
                    "'(' at column " + (open + 1) + " is not closed; add ')'");
            }
            pos++;
            return inner;
        }
        if (Character.isDigit(c) || c == '.') {
            return parseNumber();
        }
        if (Character.isLetter(c) || c == '_') {
            return parseName();
        }
        throw error(pos, "unexpected '" + c + "'; expected a number, a name or '('");
    }

    private Node parseNumber() {
        int start = pos;
        while (pos < text.length() && (Character.isDigit(text.charAt(pos)) || text.charAt(pos) == '.')) {
            pos++;
        }
        if (pos < text.length() && (text.charAt(pos) == 'e' || text.charAt(pos) == 'E')) {
            int save = pos;
            pos++;
            if (pos < text.length() && (text.charAt(pos) == '+' || text.charAt(pos) == '-')) {
                pos++;
            }
            if (pos < text.length() && Character.isDigit(text.charAt(pos))) {
                while (pos < text.length() && Character.isDigit(text.charAt(pos))) {
                    pos++;
                }
            } else {
                pos = save; // "2e" is 2 times the constant e only with an explicit '*'
            }
        }
        String literal = text.substring(start, pos);
        try {
            double value = Double.parseDouble(literal);
            if (pos < text.length() && (Character.isLetter(text.charAt(pos)) || text.charAt(pos) == '(')) {
                throw error(pos, "number \"" + literal + "\" followed by '" + text.charAt(pos)
                    + "'; write the multiplication explicitly, for example " + literal + "*"
                    + text.charAt(pos));
            }
            return new Node.Constant(value);
        } catch (NumberFormatException e) {
            throw error(start, "\"" + literal + "\" is not a number");
        }
    }

    private Node parseName() {
        int start = pos;
        while (pos < text.length()
            && (Character.isLetterOrDigit(text.charAt(pos)) || text.charAt(pos) == '_')) {
            pos++;
        }
        String name = text.substring(start, pos);
        skipSpaces();
        if (peek('(')) {
            Node.Function f = function(name, start);
            int open = pos;
            pos++;
            List<Node> args = new ArrayList<>();
            skipSpaces();
            if (!peek(')')) {
                args.add(parseSum());
                skipSpaces();
                while (peek(',')) {
                    pos++;
                    args.add(parseSum());
                    skipSpaces();
                }
            }
            if (!peek(')')) {
                throw error(pos >= text.length() ? open : pos,
                    "'(' of " + name + " at column " + (open + 1) + " is not closed; add ')'");
            }
            pos++;
            if (args.size() != f.arity()) {
                throw error(start, name + " takes " + f.arity() + " argument" + (f.arity() == 1 ? "" : "s")
                    + ", got " + args.size());
            }
            return new Node.Call(f, args.get(0), args.size() > 1 ? args.get(1) : null);
        }
        int index = variables.indexOf(name);
        if (index >= 0) {
            return new Node.Variable(index);
        }
        if (name.equals("pi")) {
            return new Node.Constant(Math.PI);
        }
        if (name.equals("e")) {
            return new Node.Constant(Math.E);
        }
        if (isFunction(name)) {
            throw error(start, "function " + name + " needs its argument in parentheses: " + name + "(...)");
        }
        throw error(start, "unknown name \"" + name + "\"; allowed here: "
            + (variables.isEmpty() ? "" : String.join(", ", variables) + ", ") + "pi, e and the functions "
            + functionList());
    }

    private Node.Function function(String name, int start) {
        if (isFunction(name)) {
            return Node.Function.valueOf(name.toUpperCase(Locale.ROOT));
        }
        throw error(start, "unknown function \"" + name + "\"; allowed: " + functionList());
    }

    private static boolean isFunction(String name) {
        for (Node.Function f : Node.Function.values()) {
            if (f.name().toLowerCase(Locale.ROOT).equals(name)) {
                return true;
            }
        }
        return false;
    }

    static String functionList() {
        StringBuilder b = new StringBuilder();
        for (Node.Function f : Node.Function.values()) {
            if (b.length() > 0) {
                b.append(' ');
            }
            b.append(f.name().toLowerCase(Locale.ROOT));
        }
        return b.toString();
    }

    private boolean peek(char c) {
        return pos < text.length() && text.charAt(pos) == c;
    }

    private void skipSpaces() {
        while (pos < text.length() && Character.isWhitespace(text.charAt(pos))) {
            pos++;
        }
    }

    private ExpressionException error(int at, String problem) {
        return new ExpressionException(text, Math.min(at, text.length()) + 1, problem);
    }
}

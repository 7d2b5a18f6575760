package eigencheck.oracle.expr;

/**
 * An expression that cannot be parsed or uses a name it may not use. Carries the source text and
 * the 1-based column of the offending character, so a caller can point at it inside a file.
 *
 * @since 0.1
 */
public final class ExpressionException extends IllegalArgumentException {
    private final String source;
    private final int column;
    private final String problem;

    ExpressionException(String source, int column, String problem) {
        super("expression \"" + source + "\" at column " + column + ": " + problem);
        this.source = source;
        this.column = column;
        this.problem = problem;
    }

    /** The expression text as given. */
    public String source() {
        return source;
    }

    /** 1-based column of the offending character inside {@link #source()}. */
    public int column() {
        return column;
    }

    /** What is wrong and what to do, without the location prefix. */
    public String problem() {
        return problem;
    }
}

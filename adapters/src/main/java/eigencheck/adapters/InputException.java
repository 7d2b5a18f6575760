package eigencheck.adapters;

import java.util.List;
import java.util.Objects;

/**
 * Bad input in a file: what is wrong, where, and what to do. One or more problems, each with its
 * location; the message lists them one per line as {@code where: what is wrong; what to do}.
 *
 * @since 0.1
 */
public final class InputException extends Exception {
    /** The kind of problem, for callers and tests that must not depend on wording. */
    public enum Cause {
        /** The file cannot be read (missing, unreadable). */
        UNREADABLE,
        /** Not well-formed in its format (YAML, JSON, CSV syntax). */
        MALFORMED,
        /** A required field or column is missing. */
        MISSING,
        /** A field the format does not know. */
        UNKNOWN_FIELD,
        /** A value of the wrong type or outside the allowed set. */
        INVALID_VALUE,
        /** A number that is not a number, or NaN or infinite. */
        NOT_A_NUMBER,
        /** A number outside its allowed range. */
        OUT_OF_RANGE,
        /** An expression that does not parse. */
        BAD_EXPRESSION
    }

    /** One problem at one place. */
    public record Problem(Cause cause, InputLocation location, String message) {
        public Problem {
            Objects.requireNonNull(cause, "cause");
            Objects.requireNonNull(location, "location");
            Objects.requireNonNull(message, "message");
        }

        @Override
        public String toString() {
            return location + ": " + message;
        }
    }

    private final List<Problem> problems;

    public InputException(List<Problem> problems) {
        super(render(problems));
        if (problems.isEmpty()) {
            throw new IllegalArgumentException("an input exception needs at least one problem");
        }
        this.problems = List.copyOf(problems);
    }

    public InputException(Cause cause, InputLocation location, String message) {
        this(List.of(new Problem(cause, location, message)));
    }

    /** The problems, in file order. */
    public List<Problem> problems() {
        return problems;
    }

    /** The first problem's cause. */
    public Cause cause() {
        return problems.get(0).cause();
    }

    private static String render(List<Problem> problems) {
        StringBuilder b = new StringBuilder();
        for (Problem p : problems) {
            if (b.length() > 0) {
                b.append('\n');
            }
            b.append(p);
        }
        return b.toString();
    }
}

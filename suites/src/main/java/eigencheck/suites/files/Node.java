package eigencheck.suites.files;

import eigencheck.adapters.InputLocation;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * A YAML or JSON value with the place it was read from: an object (ordered fields), an array, or a
 * scalar (string, number, boolean, null). Immutable.
 */
public sealed interface Node permits Node.Obj, Node.Arr, Node.Scalar {
    /** Where the value starts, with its field path. */
    InputLocation location();

    /** What kind of value this is, in the words of an error message. */
    String kind();

    /** An object: fields in file order, each key with the location of the key. */
    record Obj(InputLocation location, Map<String, Node> fields, Map<String, InputLocation> keys) implements Node {
        public Obj {
            fields = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(fields));
            keys = java.util.Collections.unmodifiableMap(new LinkedHashMap<>(keys));
        }

        @Override
        public String kind() {
            return "a mapping";
        }
    }

    /** An array. */
    record Arr(InputLocation location, List<Node> items) implements Node {
        public Arr {
            items = List.copyOf(items);
        }

        @Override
        public String kind() {
            return "a list";
        }
    }

    /**
     * A scalar. {@code value} is a String, a Number (Double or Long), a Boolean, or null;
     * {@code quoted} tells whether a string came quoted (its first character is then one column
     * after {@link #location()}).
     */
    record Scalar(InputLocation location, Object value, boolean quoted) implements Node {
        @Override
        public String kind() {
            if (value == null) {
                return "null";
            }
            if (value instanceof String) {
                return "text";
            }
            if (value instanceof Boolean) {
                return "true/false";
            }
            return "a number";
        }
    }
}

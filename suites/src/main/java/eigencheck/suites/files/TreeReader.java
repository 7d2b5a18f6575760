package eigencheck.suites.files;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import eigencheck.adapters.InputException;
import eigencheck.adapters.InputLocation;
import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * Reads a YAML or JSON file (by extension: .json is JSON, anything else YAML, of which JSON is a
 * subset) into a {@link Node} tree that remembers the line, column and field path of every value,
 * with Jackson's streaming parser, so that later checks can point at the offending field.
 */
public final class TreeReader {
    private final Path file;
    private final String[] lines;

    private TreeReader(Path file, String text) {
        this.file = file;
        this.lines = text.split("\n", -1);
    }

    /**
     * @throws InputException if the file cannot be read, is not well-formed, is empty, or repeats a key
     */
    public static Node read(Path file) throws InputException {
        if (!Files.isRegularFile(file)) {
            throw new InputException(InputException.Cause.UNREADABLE, InputLocation.of(file),
                "no such file; check the path");
        }
        String text;
        try {
            text = Files.readString(file, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new InputException(InputException.Cause.UNREADABLE, InputLocation.of(file),
                "cannot read the file (" + e.getClass().getSimpleName() + ": " + e.getMessage()
                    + "); check the path");
        }
        return parse(file, text);
    }

    /** Parses text that came from {@code file} (the name is used in messages only). */
    public static Node parse(Path file, String text) throws InputException {
        boolean json = file.getFileName() != null
            && file.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(".json");
        JsonFactory factory = json ? new JsonFactory() : new YAMLFactory();
        TreeReader reader = new TreeReader(file, text);
        try (JsonParser parser = factory.createParser(text)) {
            JsonToken first = parser.nextToken();
            if (first == null) {
                throw new InputException(InputException.Cause.MALFORMED, InputLocation.of(file),
                    "the file is empty; write the fields the format needs");
            }
            Node root = reader.value(parser, "");
            if (parser.nextToken() != null) {
                JsonLocation at = parser.currentTokenLocation();
                throw new InputException(InputException.Cause.MALFORMED,
                    InputLocation.at(file, at.getLineNr(), at.getColumnNr(), ""),
                    "more than one document in the file; keep one");
            }
            return root;
        } catch (JsonProcessingException e) {
            JsonLocation at = e.getLocation();
            String message = e.getOriginalMessage();
            int cut = message.indexOf('\n');
            if (cut > 0) {
                message = message.substring(0, cut);
            }
            throw new InputException(InputException.Cause.MALFORMED,
                at == null ? InputLocation.of(file) : InputLocation.at(file, at.getLineNr(), at.getColumnNr(), ""),
                "not well-formed " + (json ? "JSON" : "YAML") + ": " + message);
        } catch (IOException e) {
            throw new InputException(InputException.Cause.UNREADABLE, InputLocation.of(file),
                "cannot parse the file: " + e.getMessage());
        }
    }

    private InputLocation here(JsonParser parser, String path) {
        JsonLocation at = parser.currentTokenLocation();
        return InputLocation.at(file, at.getLineNr(), at.getColumnNr(), path);
    }

    private Node value(JsonParser parser, String path) throws IOException, InputException {
        JsonToken token = parser.currentToken();
        InputLocation location = here(parser, path);
        switch (token) {
            case START_OBJECT: {
                Map<String, Node> fields = new LinkedHashMap<>();
                Map<String, InputLocation> keys = new LinkedHashMap<>();
                while (parser.nextToken() == JsonToken.FIELD_NAME) {
                    String name = parser.currentName();
                    String childPath = path.isEmpty() ? name : path + "." + name;
                    InputLocation keyAt = here(parser, childPath);
                    if (fields.containsKey(name)) {
                        throw new InputException(InputException.Cause.MALFORMED, keyAt,
                            "the key \"" + name + "\" appears twice (first at line " + keys.get(name).line()
                                + "); keep one");
                    }
                    parser.nextToken();
                    fields.put(name, value(parser, childPath));
                    keys.put(name, keyAt);
                }
                return new Node.Obj(location, fields, keys);
            }
            case START_ARRAY: {
                List<Node> items = new ArrayList<>();
                int i = 0;
                while (parser.nextToken() != JsonToken.END_ARRAY) {
                    items.add(value(parser, path + "[" + i + "]"));
                    i++;
                }
                return new Node.Arr(location, items);
            }
            case VALUE_STRING:
                return new Node.Scalar(location, parser.getText(), isQuoted(location));
            case VALUE_NUMBER_INT:
                return new Node.Scalar(location, parser.getLongValue(), false);
            case VALUE_NUMBER_FLOAT:
                return new Node.Scalar(location, parser.getDoubleValue(), false);
            case VALUE_TRUE:
                return new Node.Scalar(location, Boolean.TRUE, false);
            case VALUE_FALSE:
                return new Node.Scalar(location, Boolean.FALSE, false);
            case VALUE_NULL:
                return new Node.Scalar(location, null, false);
            default:
                throw new InputException(InputException.Cause.MALFORMED, location,
                    "unexpected " + token + "; write a mapping, a list or a value");
        }
    }

    private boolean isQuoted(InputLocation at) {
        int line = at.line() - 1;
        int column = at.column() - 1;
        if (line < 0 || line >= lines.length || column < 0 || column >= lines[line].length()) {
            return false;
        }
        char c = lines[line].charAt(column);
        return c == '"' || c == '\'';
    }
}

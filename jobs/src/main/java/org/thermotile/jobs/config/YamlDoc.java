package org.thermotile.jobs.config;

import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import com.fasterxml.jackson.dataformat.yaml.YAMLFactory;
import java.io.IOException;
import java.util.ArrayList;
import java.util.HashMap;
import java.util.List;
import java.util.Map;

/**
 * A parsed YAML document as a Jackson tree, with the line and column of every key path, and the
 * list of problems found while reading and validating it.
 *
 * <p>The tree is built token by token (not with {@code ObjectMapper.readTree}) so that each
 * value keeps its position and a key given twice in one mapping is reported instead of silently
 * keeping the last value. Paths are written {@code outputs.maps[2]}; the root is "".
 */
final class YamlDoc {
    private static final JsonNodeFactory NODES = JsonNodeFactory.instance;

    final String file;
    final JsonNode root;
    private final Map<String, int[]> lineCol = new HashMap<>();
    private final List<String> problems = new ArrayList<>();

    private YamlDoc(String file, String text) {
        this.file = file;
        JsonNode r = null;
        try (JsonParser p = new YAMLFactory().createParser(text)) {
            JsonToken t = p.nextToken();
            if (t == null) {
                problems.add(file + ": the file is empty; write the YAML mapping described in the "
                        + "documentation");
            } else {
                r = readValue(p, "");
                if (p.nextToken() != null) {
                    at("", "holds more than one YAML document ('---'); keep one");
                }
            }
        } catch (JsonProcessingException e) {
            JsonLocation loc = e.getLocation();
            String where = loc == null ? "" : " line " + loc.getLineNr() + ", column " + loc.getColumnNr();
            problems.add(file + where + ": not valid YAML: " + e.getOriginalMessage()
                    + "; check indentation (spaces, not tabs), colons and quotes");
            r = null;
        } catch (IOException e) {
            problems.add(file + ": cannot be read: " + e.getMessage());
            r = null;
        }
        this.root = r;
    }

    /** Parses {@code text}; syntax errors become problems (then {@link #root} is null). */
    static YamlDoc parse(String file, String text) {
        return new YamlDoc(file, text);
    }

    private JsonNode readValue(JsonParser p, String path) throws IOException {
        JsonLocation loc = p.currentTokenLocation();
        lineCol.putIfAbsent(path, new int[] {loc.getLineNr(), loc.getColumnNr()});
        JsonToken t = p.currentToken();
        if (p instanceof com.fasterxml.jackson.dataformat.yaml.YAMLParser y && y.isCurrentAlias()) {
            // Jackson reads a scalar alias as its name's text ("*day" as "day"): refuse it, never use it.
            problems.add(file + " line " + loc.getLineNr() + ", column " + loc.getColumnNr() + ": " + path
                    + ": the YAML alias *" + p.getText() + " is not supported; write the value out in full");
            return NODES.nullNode();
        }
        switch (t) {
            case START_OBJECT: {
                ObjectNode obj = NODES.objectNode();
                while (p.nextToken() == JsonToken.FIELD_NAME) {
                    String key = p.currentName();
                    String child = path.isEmpty() ? key : path + "." + key;
                    JsonLocation keyLoc = p.currentTokenLocation();
                    p.nextToken();
                    boolean dup = obj.has(key);
                    int[] first = lineCol.get(child);
                    if (!dup) {
                        // Messages about a key point at the key itself, not at its value.
                        lineCol.put(child, new int[] {keyLoc.getLineNr(), keyLoc.getColumnNr()});
                    }
                    JsonNode v = readValue(p, child);
                    if (dup) {
                        problems.add(file + " line " + keyLoc.getLineNr() + ", column "
                                + keyLoc.getColumnNr() + ": " + child + ": key given twice (first on line "
                                + first[0] + "); keep one");
                    } else {
                        obj.set(key, v);
                    }
                }
                return obj;
            }
            case START_ARRAY: {
                ArrayNode arr = NODES.arrayNode();
                int i = 0;
                while (p.nextToken() != JsonToken.END_ARRAY) {
                    arr.add(readValue(p, path + "[" + i + "]"));
                    i++;
                }
                return arr;
            }
            case VALUE_STRING:
                return NODES.textNode(p.getText());
            case VALUE_NUMBER_INT:
                switch (p.getNumberType()) {
                    case INT:
                        return NODES.numberNode(p.getIntValue());
                    case LONG:
                        return NODES.numberNode(p.getLongValue());
                    default:
                        return NODES.numberNode(p.getBigIntegerValue());
                }
            case VALUE_NUMBER_FLOAT:
                return NODES.numberNode(p.getDoubleValue());
            case VALUE_TRUE:
                return NODES.booleanNode(true);
            case VALUE_FALSE:
                return NODES.booleanNode(false);
            case VALUE_NULL:
                return NODES.nullNode();
            default:
                return NODES.textNode(p.getText());
        }
    }

    /** "file line L, column C: path: message" for the value at {@code path} (or its nearest parent). */
    String where(String path) {
        String p = path;
        // The root's position is that of its first key, which says nothing useful.
        int[] lc = p.isEmpty() ? null : lineCol.get(p);
        while (lc == null && !p.isEmpty()) {
            p = parent(p);
            lc = p.isEmpty() ? null : lineCol.get(p);
        }
        StringBuilder sb = new StringBuilder(file);
        if (lc != null) {
            sb.append(" line ").append(lc[0]).append(", column ").append(lc[1]);
        }
        sb.append(": ").append(path.isEmpty() ? "top level" : path);
        return sb.toString();
    }

    static String parent(String path) {
        int dot = path.lastIndexOf('.');
        int br = path.lastIndexOf('[');
        int cut = Math.max(dot, br);
        return cut < 0 ? "" : path.substring(0, cut);
    }

    /** Records a problem at {@code path}; {@code message} says what is wrong and how to fix it. */
    void at(String path, String message) {
        problems.add(where(path) + ": " + message);
    }

    boolean hasProblems() {
        return !problems.isEmpty();
    }

    List<String> problems() {
        return problems;
    }

    /** The JSON type of a node in words, for "expected a number, got …". */
    static String describe(JsonNode n) {
        if (n == null || n.isMissingNode()) {
            return "nothing";
        }
        if (n.isNull()) {
            return "null";
        }
        if (n.isTextual()) {
            return "the text '" + n.asText() + "'";
        }
        if (n.isNumber()) {
            return "the number " + n.asText();
        }
        if (n.isBoolean()) {
            return "the boolean " + n.asText();
        }
        if (n.isArray()) {
            return "a list";
        }
        if (n.isObject()) {
            return "a mapping";
        }
        return n.getNodeType().toString().toLowerCase(java.util.Locale.ROOT);
    }
}

package org.thermotile.jobs.config;

import com.fasterxml.jackson.databind.JsonNode;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Map;

/**
 * One YAML mapping being read: typed getters that record a problem (with the key path, the bad
 * value and the fix) instead of throwing, so that every problem of a file is collected in one
 * pass. Getters return {@code null} when a key is absent, null, or of the wrong type.
 */
final class Section {
    final YamlDoc doc;
    final JsonNode node;
    final String path;

    private Section(YamlDoc doc, JsonNode node, String path) {
        this.doc = doc;
        this.node = node;
        this.path = path;
    }

    /** The mapping at {@code path}, or null (with a problem) if {@code node} is not a mapping. */
    static Section of(YamlDoc doc, JsonNode node, String path) {
        if (node == null || !node.isObject()) {
            doc.at(path, "expected a mapping of keys, got " + YamlDoc.describe(node)
                    + "; write 'key: value' lines indented under it");
            return null;
        }
        return new Section(doc, node, path);
    }

    String child(String key) {
        return path.isEmpty() ? key : path + "." + key;
    }

    String label() {
        return path.isEmpty() ? "at top level" : "in '" + path + "'";
    }

    /**
     * Reports every key not in {@code known} (and not in {@code alsoAccepted}), suggesting the
     * closest known key, or naming the section where the key belongs when {@code elsewhere} knows it.
     */
    void checkKeys(List<String> known, List<String> alsoAccepted, Map<String, String> elsewhere) {
        List<String> all = new ArrayList<>(known);
        all.addAll(alsoAccepted);
        for (Iterator<String> it = node.fieldNames(); it.hasNext(); ) {
            String key = it.next();
            if (all.contains(key)) {
                continue;
            }
            String hint = Suggest.didYouMean(key, all);
            if (hint.isEmpty() && elsewhere.containsKey(key)) {
                hint = "; '" + key + "' belongs under '" + elsewhere.get(key) + "'";
            }
            if (hint.isEmpty()) {
                hint = "; known keys here: " + String.join(", ", known);
            }
            doc.at(child(key), "unknown key '" + key + "' " + label() + hint);
        }
    }

    boolean has(String key) {
        JsonNode v = node.get(key);
        return v != null && !v.isNull();
    }

    JsonNode raw(String key) {
        return node.get(key);
    }

    void missing(String key, String fix) {
        doc.at(path, "required key '" + key + "' is missing; " + fix);
    }

    Section section(String key, boolean required, String fix) {
        if (!has(key)) {
            if (required) {
                missing(key, fix);
            }
            return null;
        }
        return of(doc, node.get(key), child(key));
    }

    String text(String key, boolean required, String fix) {
        JsonNode v = node.get(key);
        if (v == null || v.isNull()) {
            if (required) {
                missing(key, fix);
            }
            return null;
        }
        if (!v.isTextual()) {
            doc.at(child(key), "expected text, got " + YamlDoc.describe(v)
                    + (v.isValueNode() ? "; put it in quotes if it is meant as text" : "; " + fix));
            return null;
        }
        if (v.asText().isBlank()) {
            doc.at(child(key), "is empty; " + fix);
            return null;
        }
        return v.asText().strip();
    }

    Double number(String key, boolean required, String fix) {
        JsonNode v = node.get(key);
        if (v == null || v.isNull()) {
            if (required) {
                missing(key, fix);
            }
            return null;
        }
        return number(doc, v, child(key), fix);
    }

    static Double number(YamlDoc doc, JsonNode v, String path, String fix) {
        if (!v.isNumber()) {
            doc.at(path, "expected a number, got " + YamlDoc.describe(v) + "; " + fix
                    + (v.isTextual() ? " (without quotes)" : ""));
            return null;
        }
        double d = v.doubleValue();
        if (!Double.isFinite(d)) {
            doc.at(path, "expected a finite number, got " + v.asText() + "; " + fix);
            return null;
        }
        return d;
    }

    Integer integer(String key, boolean required, String fix) {
        Double d = number(key, required, fix);
        if (d == null) {
            return null;
        }
        if (d != Math.rint(d) || Math.abs(d) > Integer.MAX_VALUE) {
            doc.at(child(key), "expected a whole number, got " + node.get(key).asText() + "; " + fix);
            return null;
        }
        return (int) Math.rint(d);
    }

    /** A list at {@code key} (null with a problem if it is not one); a lone scalar is refused. */
    JsonNode list(String key, boolean required, String fix) {
        JsonNode v = node.get(key);
        if (v == null || v.isNull()) {
            if (required) {
                missing(key, fix);
            }
            return null;
        }
        if (!v.isArray()) {
            doc.at(child(key), "expected a list such as [a, b], got " + YamlDoc.describe(v) + "; " + fix);
            return null;
        }
        return v;
    }
}

package org.echotrellis.sequence;

import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import java.io.IOException;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Set;
import org.echotrellis.InputException;

/**
 * A parsed YAML/JSON value that remembers where it was written, so that every complaint about a
 * protocol file can name file, line and column. Package-private helper of {@link ProtocolReader}.
 */
final class Node {
    private static final int MAX_DEPTH = 32;
    private static final int MAX_ITEMS = 200_000;

    final Object value; // Map<String, Node>, List<Node>, String, Double, Boolean or null
    final String where; // "file:line:col"

    private Node(Object value, String where) {
        this.value = value;
        this.where = where;
    }

    static Node read(JsonParser p, String file) throws IOException {
        int[] count = {0};
        p.nextToken();
        if (p.currentToken() == null) {
            throw new InputException(file + ": file is empty");
        }
        return read(p, file, 0, count);
    }

    private static Node read(JsonParser p, String file, int depth, int[] count) throws IOException {
        JsonLocation loc = p.currentTokenLocation();
        String where = file + ":" + loc.getLineNr() + ":" + loc.getColumnNr();
        if (depth > MAX_DEPTH || ++count[0] > MAX_ITEMS) {
            throw new InputException(where + ": document too deeply nested or too large (limits: depth "
                    + MAX_DEPTH + ", " + MAX_ITEMS + " values)");
        }
        JsonToken t = p.currentToken();
        switch (t) {
            case START_OBJECT -> {
                Map<String, Node> map = new LinkedHashMap<>();
                while (p.nextToken() != JsonToken.END_OBJECT) {
                    String key = p.currentName();
                    JsonLocation kl = p.currentTokenLocation();
                    p.nextToken();
                    Node v = read(p, file, depth + 1, count);
                    if (map.put(key, v) != null) {
                        throw new InputException(file + ":" + kl.getLineNr() + ":" + kl.getColumnNr()
                                + ": key '" + key + "' appears twice");
                    }
                }
                return new Node(Collections.unmodifiableMap(map), where);
            }
            case START_ARRAY -> {
                List<Node> list = new ArrayList<>();
                while (p.nextToken() != JsonToken.END_ARRAY) {
                    list.add(read(p, file, depth + 1, count));
                }
                return new Node(Collections.unmodifiableList(list), where);
            }
            case VALUE_NUMBER_INT, VALUE_NUMBER_FLOAT -> {
                String text = p.getText();
                try {
                    return new Node(p.getDoubleValue(), where);
                } catch (IOException | NumberFormatException e) {
                    // YAML's .inf / .nan: kept as text and interpreted by number()
                    return new Node(text, where);
                }
            }
            case VALUE_TRUE, VALUE_FALSE -> {
                return new Node(t == JsonToken.VALUE_TRUE, where);
            }
            case VALUE_NULL -> {
                return new Node(null, where);
            }
            default -> {
                return new Node(p.getText(), where);
            }
        }
    }

    boolean isMap() {
        return value instanceof Map;
    }

    @SuppressWarnings("unchecked")
    Map<String, Node> map(String what) {
        if (!(value instanceof Map)) {
            throw new InputException(where + ": " + what + " must be a mapping of keys to values, got " + describe());
        }
        return (Map<String, Node>) value;
    }

    @SuppressWarnings("unchecked")
    List<Node> list(String what) {
        if (!(value instanceof List)) {
            throw new InputException(where + ": " + what + " must be a list, got " + describe());
        }
        return (List<Node>) value;
    }

    double number(String key) {
        if (value instanceof Double d) {
            if (d.isNaN()) {
                throw new InputException(where + ": " + key + " must be a number, got NaN");
            }
            return d;
        }
        if (value instanceof String s) {
            String v = s.trim().toLowerCase(java.util.Locale.ROOT);
            if (v.equals("inf") || v.equals(".inf") || v.equals("+.inf") || v.equals("infinity") || v.equals("+inf")) {
                return Double.POSITIVE_INFINITY;
            }
            if (v.equals(".nan") || v.equals("nan")) {
                throw new InputException(where + ": " + key + " must be a number, got NaN");
            }
        }
        throw new InputException(where + ": " + key + " must be a number, got " + describe());
    }

    int integer(String key) {
        double d = number(key);
        if (d != Math.rint(d) || Math.abs(d) > 1e9) {
            throw new InputException(where + ": " + key + " must be a whole number, got " + d);
        }
        return (int) d;
    }

    String text(String key) {
        if (value instanceof String s) {
            return s;
        }
        if (value instanceof Double d) {
            return d == Math.rint(d) ? Long.toString(d.longValue()) : d.toString();
        }
        throw new InputException(where + ": " + key + " must be text, got " + describe());
    }

    String describe() {
        if (value == null) {
            return "nothing (null)";
        }
        if (value instanceof Map) {
            return "a mapping";
        }
        if (value instanceof List) {
            return "a list";
        }
        return "'" + value + "'";
    }

    /** Refuses keys outside the allowed set, naming the key and listing the allowed ones. */
    static void allowOnly(Node mapNode, String what, Set<String> allowed) {
        for (Map.Entry<String, Node> e : mapNode.map(what).entrySet()) {
            if (!allowed.contains(e.getKey())) {
                throw new InputException(e.getValue().where + ": unknown key '" + e.getKey() + "' in " + what
                        + "; allowed: " + String.join(", ", allowed));
            }
        }
    }
}

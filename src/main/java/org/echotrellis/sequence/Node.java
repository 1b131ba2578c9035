package org.echotrellis.sequence;

import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.dataformat.yaml.YAMLParser;
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

    /** Most YAML aliases resolved per document (each counts its whole subtree against MAX_ITEMS). */
    static final int MAX_ALIASES = 10;

    /** Parse state: values read, aliases resolved and anchors seen so far. */
    private static final class Context {
        final String file;
        final Map<String, Node> anchors = new java.util.HashMap<>();
        int count;
        int aliases;

        Context(String file) {
            this.file = file;
        }
    }

    static Node read(JsonParser p, String file) throws IOException {
        p.nextToken();
        if (p.currentToken() == null) {
            throw new InputException(file + ": file is empty");
        }
        return read(p, 0, new Context(file));
    }

    private static Node read(JsonParser p, int depth, Context c) throws IOException {
        JsonLocation loc = p.currentTokenLocation();
        String where = c.file + ":" + loc.getLineNr() + ":" + loc.getColumnNr();
        if (depth > MAX_DEPTH || ++c.count > MAX_ITEMS) {
            throw tooLarge(where);
        }
        JsonToken t = p.currentToken();
        String anchor = p instanceof YAMLParser y && (t == JsonToken.START_OBJECT || t == JsonToken.START_ARRAY)
                ? y.getObjectId() : null;
        switch (t) {
            case START_OBJECT -> {
                Map<String, Node> map = new LinkedHashMap<>();
                while (p.nextToken() != JsonToken.END_OBJECT) {
                    String key = p.currentName();
                    JsonLocation kl = p.currentTokenLocation();
                    p.nextToken();
                    Node v = read(p, depth + 1, c);
                    if (map.put(key, v) != null) {
                        throw new InputException(c.file + ":" + kl.getLineNr() + ":" + kl.getColumnNr()
                                + ": key '" + sanitise(key) + "' appears twice");
                    }
                }
                return anchored(new Node(Collections.unmodifiableMap(map), where), anchor, c);
            }
            case START_ARRAY -> {
                List<Node> list = new ArrayList<>();
                while (p.nextToken() != JsonToken.END_ARRAY) {
                    list.add(read(p, depth + 1, c));
                }
                return anchored(new Node(Collections.unmodifiableList(list), where), anchor, c);
            }
            case VALUE_NUMBER_INT, VALUE_NUMBER_FLOAT -> {
                String text = p.getText();
                if (t == JsonToken.VALUE_NUMBER_INT && !text.matches("[+-]?(0|[1-9][0-9]*)")) {
                    // YAML 1.1 reads 010 as octal 8, 0x10 as 16 and 1_000 as 1000: ambiguous, refused
                    throw new InputException(where + ": write whole numbers in plain decimal without leading zeros, "
                            + "got '" + sanitise(text) + "' (0x, 0o, 0b, leading-zero and _ forms are refused)");
                }
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
                if (p instanceof YAMLParser y && y.isCurrentAlias()) {
                    return alias(p.getText(), where, c);
                }
                return new Node(p.getText(), where);
            }
        }
    }

    private static Node anchored(Node n, String anchor, Context c) {
        if (anchor != null) {
            c.anchors.put(anchor, n);
        }
        return n;
    }

    /** Resolves {@code *name} to the mapping or list anchored as {@code &name} earlier in the document. */
    private static Node alias(String name, String where, Context c) {
        Node target = c.anchors.get(name);
        if (target == null) {
            throw new InputException(where + ": YAML alias *" + sanitise(name) + " does not name an anchored mapping or "
                    + "list (aliases of single values are not supported; write the value out)");
        }
        if (++c.aliases > MAX_ALIASES) {
            throw new InputException(where + ": more than " + MAX_ALIASES + " YAML aliases");
        }
        c.count += size(target);
        if (c.count > MAX_ITEMS) {
            throw tooLarge(where);
        }
        return target;
    }

    private static int size(Node n) {
        int s = 1;
        if (n.value instanceof Map<?, ?> m) {
            for (Object v : m.values()) {
                s += size((Node) v);
            }
        } else if (n.value instanceof List<?> l) {
            for (Object v : l) {
                s += size((Node) v);
            }
        }
        return s;
    }

    private static InputException tooLarge(String where) {
        return new InputException(where + ": document too deeply nested or too large (limits: depth "
                + MAX_DEPTH + ", " + MAX_ITEMS + " values)");
    }

    /**
     * Replaces control and formatting characters (ESC, CR, bidirectional overrides, ...) with '?', so
     * text from a protocol file can be printed to a terminal.
     *
     * @param s text
     * @return printable text
     */
    static String sanitise(String s) {
        StringBuilder b = null;
        for (int i = 0; i < s.length(); i++) {
            char ch = s.charAt(i);
            int type = Character.getType(ch);
            if (type == Character.CONTROL || type == Character.FORMAT) {
                if (b == null) {
                    b = new StringBuilder(s);
                }
                b.setCharAt(i, '?');
            }
        }
        return b == null ? s : b.toString();
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
            return sanitise(s);
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
        return "'" + (value instanceof String s ? sanitise(s) : value) + "'";
    }

    /** Refuses keys outside the allowed set, naming the key and listing the allowed ones. */
    static void allowOnly(Node mapNode, String what, Set<String> allowed) {
        for (Map.Entry<String, Node> e : mapNode.map(what).entrySet()) {
            if (!allowed.contains(e.getKey())) {
                throw new InputException(e.getValue().where + ": unknown key '" + sanitise(e.getKey()) + "' in " + what
                        + "; allowed: " + String.join(", ", allowed));
            }
        }
    }
}

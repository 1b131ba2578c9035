package org.echotrellis.cohort;

import java.util.ArrayList;
import java.util.List;

/**
 * RFC 4180 text for the cohort's small tables: fields holding a comma, quote or line break are
 * quoted with doubled quotes; numbers in Java's shortest round-trip form; NaN as an empty field.
 */
final class CsvText {
    private CsvText() { }

    /**
     * @param values one row (String, Long or Double)
     * @return the CSV line ending in {@code \n}
     */
    static String row(List<?> values) {
        StringBuilder sb = new StringBuilder();
        for (int i = 0; i < values.size(); i++) {
            if (i > 0) {
                sb.append(',');
            }
            Object v = values.get(i);
            if (v instanceof Double d) {
                sb.append(Double.isFinite(d) ? Double.toString(d) : "");
            } else {
                String s = String.valueOf(v);
                if (s.indexOf(',') >= 0 || s.indexOf('"') >= 0 || s.indexOf('\n') >= 0 || s.indexOf('\r') >= 0) {
                    sb.append('"').append(s.replace("\"", "\"\"")).append('"');
                } else {
                    sb.append(s);
                }
            }
        }
        return sb.append('\n').toString();
    }

    /**
     * Splits a table written by {@link #row} into records of fields (quoted fields may span lines).
     *
     * @param text the whole table
     * @return the records, header included
     */
    static List<List<String>> parse(String text) {
        List<List<String>> rows = new ArrayList<>();
        List<String> row = new ArrayList<>();
        StringBuilder f = new StringBuilder();
        boolean quoted = false;
        boolean any = false;
        for (int i = 0; i < text.length(); i++) {
            char c = text.charAt(i);
            any = true;
            if (quoted) {
                if (c == '"' && i + 1 < text.length() && text.charAt(i + 1) == '"') {
                    f.append('"');
                    i++;
                } else if (c == '"') {
                    quoted = false;
                } else {
                    f.append(c);
                }
            } else if (c == '"') {
                quoted = true;
            } else if (c == ',') {
                row.add(f.toString());
                f.setLength(0);
            } else if (c == '\n') {
                row.add(f.toString());
                f.setLength(0);
                rows.add(row);
                row = new ArrayList<>();
                any = false;
            } else if (c != '\r') {
                f.append(c);
            }
        }
        if (any) {
            row.add(f.toString());
            rows.add(row);
        }
        return rows;
    }
}

package org.echotrellis.report;

import java.util.Locale;

/** Escaping and number formatting for report pages. Every text that reaches a page passes {@link #text}. */
public final class Html {
    private Html() { }

    /**
     * Escapes text for element content and quoted attribute values: {@code & < > " '} become
     * entities; control characters other than tab and newline become U+FFFD, so a protocol name
     * or file name cannot change the page's structure.
     *
     * @param s any text, or null (empty)
     * @return the escaped text
     */
    public static String text(String s) {
        if (s == null) {
            return "";
        }
        StringBuilder sb = new StringBuilder(s.length() + 16);
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '&' -> sb.append("&amp;");
                case '<' -> sb.append("&lt;");
                case '>' -> sb.append("&gt;");
                case '"' -> sb.append("&quot;");
                case '\'' -> sb.append("&#39;");
                default -> sb.append(c < 0x20 && c != '\t' && c != '\n' || c == 0x7f ? '\uFFFD' : c);
            }
        }
        return sb.toString();
    }

    /**
     * Formats a number for a table: 4 significant digits, plain notation between 1e-3 and 1e6,
     * "–" for NaN, "∞" for infinities.
     *
     * @param v the value
     * @return the text
     */
    public static String num(double v) {
        if (Double.isNaN(v)) {
            return "–";
        }
        if (Double.isInfinite(v)) {
            return v > 0 ? "∞" : "−∞";
        }
        if (v == Math.rint(v) && Math.abs(v) < 1e9) {
            return String.format(Locale.ROOT, "%d", (long) v);
        }
        double a = Math.abs(v);
        if (a >= 1e-3 && a < 1e6) {
            int decimals = Math.max(0, 3 - (int) Math.floor(Math.log10(a)));
            return String.format(Locale.ROOT, "%." + decimals + "f", v);
        }
        return String.format(Locale.ROOT, "%.3e", v);
    }
}

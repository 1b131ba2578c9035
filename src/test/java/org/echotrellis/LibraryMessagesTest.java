package org.echotrellis;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Pattern;
import java.util.stream.Stream;
import org.junit.jupiter.api.Test;

/**
 * The library names parameters by their keys ({@code t2_min_ms}); only the command line
 * (org.echotrellis.cli) names options ({@code --t2-min-ms}). Every string literal of the main
 * sources outside the cli package is checked, comments aside (source scan, common practice).
 */
class LibraryMessagesTest {
    private static final Path MAIN = Path.of("src/main/java/org/echotrellis");
    private static final Path CLI = MAIN.resolve("cli");
    /** A command-line option: two dashes and a lower-case word. */
    private static final Pattern OPTION = Pattern.compile("(?<![\\w-])--[a-z][a-z0-9-]*");

    @Test
    void noLibraryStringLiteralNamesAnOption() throws IOException {
        List<String> found = new ArrayList<>();
        int files = 0;
        try (Stream<Path> all = Files.walk(MAIN)) {
            for (Path f : all.filter(p -> p.toString().endsWith(".java") && !p.startsWith(CLI)).sorted().toList()) {
                files++;
                String src = Files.readString(f, StandardCharsets.UTF_8);
                for (Literal l : literals(src)) {
                    if (OPTION.matcher(l.text()).find()) {
                        found.add(f + ":" + l.line() + ": \"" + l.text() + "\"");
                    }
                }
            }
        }
        assertTrue(files > 100, "library sources found: " + files);
        assertEquals(List.of(), found, "library string literals naming a command-line option");
    }

    @Test
    void theScannerSeesLiteralsAndSkipsComments() {
        String src = "class A {\n"
                + "  // \"--in-line-comment\"\n"
                + "  /* \"--block-comment\" */\n"
                + "  /** {@code \"--javadoc\"} */\n"
                + "  char q = '\"'; String a = \"t2_min_ms \\\"quoted\\\" --t2-min-ms\";\n"
                + "  String b = \"\"\"\n      block --text\n      \"\"\"; String c = \"a // b\";\n"
                + "}\n";
        List<Literal> ls = literals(src);
        assertEquals(List.of("t2_min_ms \\\"quoted\\\" --t2-min-ms", "      block --text\n      ", "a // b"),
                ls.stream().map(Literal::text).toList());
        assertEquals(5, ls.get(0).line());
        assertEquals(6, ls.get(1).line());
        assertTrue(OPTION.matcher(ls.get(0).text()).find());
        assertTrue(OPTION.matcher(ls.get(1).text()).find());
        assertTrue(!OPTION.matcher("a -- b, x--y, t2_min_ms, -5").find(), "dashes in prose and numbers are not options");
    }

    /** A string literal (escapes kept as written) and the line it starts on. */
    record Literal(String text, int line) { }

    /** The string literals and text blocks of Java source, outside comments and char literals. */
    static List<Literal> literals(String s) {
        List<Literal> out = new ArrayList<>();
        int line = 1;
        int i = 0;
        int n = s.length();
        while (i < n) {
            char c = s.charAt(i);
            if (c == '\n') {
                line++;
                i++;
            } else if (s.startsWith("//", i)) {
                while (i < n && s.charAt(i) != '\n') {
                    i++;
                }
            } else if (s.startsWith("/*", i)) {
                int end = s.indexOf("*/", i + 2);
                end = end < 0 ? n : end + 2;
                line += count(s, i, end);
                i = end;
            } else if (c == '\'') {
                i++;
                while (i < n && s.charAt(i) != '\'') {
                    i += s.charAt(i) == '\\' ? 2 : 1;
                }
                i++;
            } else if (s.startsWith("\"\"\"", i)) {
                int start = s.indexOf('\n', i) + 1;
                int end = s.indexOf("\"\"\"", start);
                out.add(new Literal(s.substring(start, end), line));
                line += count(s, i, end + 3);
                i = end + 3;
            } else if (c == '"') {
                int start = ++i;
                while (i < n && s.charAt(i) != '"') {
                    i += s.charAt(i) == '\\' ? 2 : 1;
                }
                out.add(new Literal(s.substring(start, i), line));
                i++;
            } else {
                i++;
            }
        }
        return out;
    }

    private static int count(String s, int from, int to) {
        int k = 0;
        for (int i = from; i < to; i++) {
            if (s.charAt(i) == '\n') {
                k++;
            }
        }
        return k;
    }
}

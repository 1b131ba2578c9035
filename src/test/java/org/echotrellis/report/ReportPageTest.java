package org.echotrellis.report;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.echotrellis.InputException;
import org.echotrellis.plot.LineChart;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The page as text: escaping, no external references, headings in order, alt text, unique ids. */
class ReportPageTest {
    private static final String HOSTILE = "<script>alert('x')</script>\"&\u0000<img src=http://example.org/a.png>";

    @TempDir
    Path dir;

    @Test
    void textOfAnyOriginIsEscaped() throws Exception {
        Path protocol = dir.resolve("p.yaml");
        Files.writeString(protocol, "name: " + HOSTILE + "\n");
        Map<String, Object> facts = new LinkedHashMap<>();
        facts.put(HOSTILE, HOSTILE);
        Report r = Report.create(HOSTILE).subtitle(HOSTILE)
                .run(RunInfo.of("echotrellis simulate " + HOSTILE, "v").input("--protocol", protocol, true));
        r.section(HOSTILE).paragraph(HOSTILE).caution(HOSTILE).facts(facts)
                .table(HOSTILE, List.of(HOSTILE), List.of(List.of(HOSTILE)))
                .chart(LineChart.create(HOSTILE, "x", "y").add(HOSTILE, new double[] {0, 1}, new double[] {1, 0},
                        LineChart.Look.LINE).build(), 300, 200, HOSTILE);
        String html = r.html();
        // the page's own script is the only script element; no tag from the input survives
        assertEquals(1, count(html, "<script"));
        assertEquals(0, count(html, "<img src=http"));
        assertFalse(html.contains("\u0000"));
        assertTrue(html.contains("&lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt;&quot;&amp;"));
    }

    @Test
    void pageReferencesNothingOutside() {
        Report r = Report.create("t");
        r.section("charts").chart(LineChart.create("a", "x", "y").add("s", new double[] {0, 1}, new double[] {1, 0},
                LineChart.Look.LINE).build(), 300, 200, "first")
                .chart(LineChart.create("b", "x", "y").add("s", new double[] {0, 1}, new double[] {0, 1},
                        LineChart.Look.LINE).build(), 300, 200, "second");
        String html = r.html();
        // src/href only to data: URIs or in-page fragments; the SVG namespace URIs are names, not requests
        Matcher m = Pattern.compile("(?:src|href)=\"([^\"]*)\"").matcher(html);
        while (m.find()) {
            assertTrue(m.group(1).startsWith("data:") || m.group(1).startsWith("#"), m.group(1));
        }
        assertFalse(html.contains("@import") || html.contains("url(http"), "no external style");
        assertTrue(html.contains("Content-Security-Policy"));
        // ids inside the two inline SVGs do not collide
        Matcher ids = Pattern.compile(" id=\"([^\"]+)\"").matcher(html);
        java.util.Set<String> seen = new java.util.HashSet<>();
        while (ids.find()) {
            assertTrue(seen.add(ids.group(1)), "duplicate id " + ids.group(1));
        }
        assertTrue(html.contains("aria-label=\"first\"") && html.contains("aria-label=\"second\""), "alt text");
    }

    @Test
    void headingsAreInOrder() {
        Report r = Report.create("t");
        Section s = r.section("a");
        s.subsection("b").subsection("c").paragraph("x");
        r.section("d").paragraph("y");
        Matcher m = Pattern.compile("<h(\\d)").matcher(r.html());
        int last = 0;
        StringBuilder levels = new StringBuilder();
        while (m.find()) {
            int level = Integer.parseInt(m.group(1));
            assertTrue(level <= last + 1, "heading h" + level + " after h" + last);
            last = level;
            levels.append(level);
        }
        assertEquals("12342", levels.toString());
    }

    @Test
    void reportPathMustBeHtmlAndNotReplacedWithoutForce() throws Exception {
        InputException e = assertThrows(InputException.class, () -> Report.checkTarget(dir.resolve("r.pdf"), false));
        assertTrue(e.getMessage().contains(".html"), e.getMessage());
        Path existing = Files.writeString(dir.resolve("r.html"), "old");
        assertThrows(InputException.class, () -> Report.checkTarget(existing, false));
        Report.checkTarget(existing, true);
        assertThrows(InputException.class, () -> Report.checkTarget(dir, true));
    }

    @Test
    void checksumIsSha256OfTheBytes() throws Exception {
        // FIPS 180-4 example: SHA-256("abc")
        Path f = Files.writeString(dir.resolve("abc.txt"), "abc");
        assertEquals("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad", Checksums.sha256(f));
    }

    private static int count(String s, String needle) {
        int n = 0;
        for (int i = s.indexOf(needle); i >= 0; i = s.indexOf(needle, i + 1)) {
            n++;
        }
        return n;
    }
}

package org.echotrellis.report;

import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.time.Instant;
import java.time.temporal.ChronoUnit;
import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.echotrellis.InputException;
import org.echotrellis.io.AtomicFiles;

/**
 * One self-contained HTML report page: a title, an optional "what was run" block and sections in
 * order. Styles, figures (inline SVG, PNG data URIs) and a small script (slice slider, sortable
 * tables) are inline; the page makes no network requests and reads without the script. Headings
 * are in order (h1 title, h2 sections, h3 sub-sections); every figure has alt text.
 *
 * <pre>{@code
 * Report r = Report.create("fit: series.nii.gz");
 * r.run(runInfo);                                   // command line, version, settings, checksums
 * r.section("Headline numbers").facts(Map.of("median T2 (ms)", 71.2));
 * r.section("Decays").chart(jfreeChart, 720, 420, "decay of voxel (3, 4, 1) with the fitted curve");
 * r.write(Path.of("run.html"), false);
 * }</pre>
 */
public final class Report {
    private final String title;
    private final List<Section> sections = new ArrayList<>();
    private String subtitle;
    private RunInfo run;
    private int ids;

    private Report(String title) {
        this.title = title;
    }

    /**
     * @param title page title and h1 (escaped)
     * @return an empty report
     */
    public static Report create(String title) {
        return new Report(title);
    }

    /**
     * @param text a line under the title (escaped)
     * @return this
     */
    public Report subtitle(String text) {
        this.subtitle = text;
        return this;
    }

    /**
     * Sets the "What was run" section, placed first.
     *
     * @param info command line, version, settings and inputs
     * @return this
     */
    public Report run(RunInfo info) {
        this.run = info;
        return this;
    }

    /**
     * Appends a section (h2).
     *
     * @param heading the heading (escaped)
     * @return the section, to be filled
     */
    public Section section(String heading) {
        Section s = new Section(this, heading, 2);
        sections.add(s);
        return s;
    }

    /** @return a page-unique id prefix for a figure */
    String nextId() {
        return "f" + (++ids);
    }

    /** @return the whole page */
    public String html() {
        StringBuilder sb = new StringBuilder(1 << 16);
        sb.append("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n")
          .append("<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n")
          .append("<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; img-src data:; "
                  + "style-src 'unsafe-inline'; script-src 'unsafe-inline'\">\n")
          .append("<title>").append(Html.text(title)).append("</title>\n<style>\n").append(PageStyle.CSS)
          .append("</style>\n</head>\n<body>\n<main>\n<header>\n<h1>").append(Html.text(title)).append("</h1>\n");
        if (subtitle != null) {
            sb.append("<p class=\"sub\">").append(Html.text(subtitle)).append("</p>\n");
        }
        sb.append("<p class=\"sub\">Report written ")
          .append(Html.text(Instant.now().truncatedTo(ChronoUnit.SECONDS).toString().replace('T', ' ')))
          .append(" UTC. Research and protocol-planning tool, not a medical device.</p>\n</header>\n");
        if (run != null) {
            Section s = new Section(this, "What was run", 2);
            run.render(s);
            s.render(sb);
        }
        for (Section s : sections) {
            s.render(sb);
        }
        sb.append("</main>\n<script>\n").append(PageStyle.SCRIPT).append("</script>\n</body>\n</html>\n");
        return sb.toString();
    }

    /**
     * Writes the page atomically (temporary file, then move).
     *
     * @param out target path (.html or .htm)
     * @param force replace an existing file
     * @return the size of the page in bytes
     */
    public long write(Path out, boolean force) {
        checkPath(out);
        byte[] page = html().getBytes(StandardCharsets.UTF_8);
        AtomicFiles.write(out, force, stream -> stream.write(page));
        return page.length;
    }

    /**
     * Checks a report path before any work: extension .html or .htm, and writable.
     *
     * @param out the path
     * @param force whether an existing file may be replaced
     * @throws InputException otherwise
     */
    public static void checkTarget(Path out, boolean force) {
        checkPath(out);
        AtomicFiles.checkWritable(out, force);
    }

    private static void checkPath(Path out) {
        Path name = out.getFileName();
        String n = name == null ? "" : name.toString().toLowerCase(Locale.ROOT);
        if (!n.endsWith(".html") && !n.endsWith(".htm")) {
            throw new InputException("report " + out + ": the file must end in .html or .htm");
        }
    }
}

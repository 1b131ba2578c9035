package org.echotrellis.report;

import java.util.ArrayList;
import java.util.Base64;
import java.util.List;
import java.util.Map;
import org.echotrellis.plot.ChartFiles;
import org.jfree.chart.JFreeChart;

/**
 * A part of a {@link Report} under one heading. Every method escapes the text it is given; the
 * order of calls is the order on the page.
 */
public final class Section {
    private final Report report;
    private final String heading;
    private final int level;
    private final List<Object> parts = new ArrayList<>();
    private StringBuilder body = new StringBuilder();

    Section(Report report, String heading, int level) {
        this.report = report;
        this.heading = heading;
        this.level = level;
    }

    /**
     * Adds a sub-section (one heading level down, at most h4) after the content added so far.
     *
     * @param title heading (escaped)
     * @return the sub-section
     */
    public Section subsection(String title) {
        Section s = new Section(report, title, Math.min(4, level + 1));
        parts.add(body);
        parts.add(s);
        body = new StringBuilder();
        return s;
    }

    /**
     * @param text a paragraph (escaped)
     * @return this
     */
    public Section paragraph(String text) {
        body.append("<p>").append(Html.text(text)).append("</p>\n");
        return this;
    }

    /**
     * A highlighted caution box, e.g. the RF-exposure caution.
     *
     * @param text the caution (escaped)
     * @return this
     */
    public Section caution(String text) {
        body.append("<p class=\"caution\" role=\"note\"><strong>Caution:</strong> ").append(Html.text(text)).append("</p>\n");
        return this;
    }

    /**
     * Preformatted text (a command line, a protocol file), optionally folded.
     *
     * @param summary a summary line to fold the text under, or null to show it open
     * @param text the text (escaped)
     * @return this
     */
    public Section preformatted(String summary, String text) {
        if (summary != null) {
            body.append("<details><summary>").append(Html.text(summary)).append("</summary>");
        }
        body.append("<pre>").append(Html.text(text)).append("</pre>");
        body.append(summary != null ? "</details>\n" : "\n");
        return this;
    }

    /**
     * Name–value pairs as a two-column table; numbers are formatted with {@link Html#num}, other
     * values with {@code toString()}.
     *
     * @param facts the pairs in order
     * @return this
     */
    public Section facts(Map<String, ?> facts) {
        body.append("<table class=\"facts\"><tbody>\n");
        for (Map.Entry<String, ?> e : facts.entrySet()) {
            body.append("<tr><th scope=\"row\">").append(Html.text(e.getKey())).append("</th><td>")
                .append(cell(e.getValue())).append("</td></tr>\n");
        }
        body.append("</tbody></table>\n");
        return this;
    }

    /**
     * A data table whose columns sort on a click (with the script); numeric cells sort by value.
     *
     * @param caption table caption (escaped)
     * @param headers column headers
     * @param rows rows of cells; numbers are formatted with {@link Html#num}
     * @return this
     */
    public Section table(String caption, List<String> headers, List<? extends List<?>> rows) {
        body.append("<div class=\"scroll\"><table class=\"data sortable\"><caption>").append(Html.text(caption))
            .append("</caption>\n<thead><tr>");
        for (String h : headers) {
            body.append("<th scope=\"col\">").append(Html.text(h)).append("</th>");
        }
        body.append("</tr></thead>\n<tbody>\n");
        for (List<?> row : rows) {
            body.append("<tr>");
            for (Object c : row) {
                if (c instanceof Number n) {
                    body.append("<td class=\"n\" data-v=\"").append(n.doubleValue()).append("\">").append(cell(c));
                } else {
                    body.append("<td>").append(cell(c));
                }
                body.append("</td>");
            }
            body.append("</tr>\n");
        }
        body.append("</tbody></table></div>\n");
        return this;
    }

    /**
     * A data table from records (e.g. the rows a command prints as JSON): the keys of the first
     * record are the columns; lists and maps are shown as text.
     *
     * @param caption table caption (escaped)
     * @param records the rows
     * @return this
     */
    public Section records(String caption, List<? extends Map<String, ?>> records) {
        if (records.isEmpty()) {
            return paragraph(caption + ": none.");
        }
        List<String> headers = new ArrayList<>(records.get(0).keySet());
        List<List<?>> rows = new ArrayList<>();
        for (Map<String, ?> rec : records) {
            List<Object> row = new ArrayList<>();
            for (String h : headers) {
                row.add(rec.get(h));
            }
            rows.add(row);
        }
        return table(caption, headers, rows);
    }

    /**
     * A chart drawn inline as SVG (Batik), scaled to the page width; ids inside the SVG are made
     * unique on the page.
     *
     * @param chart the chart
     * @param widthPx drawing width
     * @param heightPx drawing height
     * @param alt description for screen readers and as caption (escaped)
     * @return this
     */
    public Section chart(JFreeChart chart, int widthPx, int heightPx, String alt) {
        return svgFigure(ChartFiles.svg(chart, widthPx, heightPx), widthPx, heightPx, alt);
    }

    /**
     * Several charts of the same size, drawn in parallel and added in order.
     *
     * @param charts the charts
     * @param alts one description per chart (escaped)
     * @param widthPx drawing width
     * @param heightPx drawing height
     * @return this
     */
    public Section charts(List<JFreeChart> charts, List<String> alts, int widthPx, int heightPx) {
        List<String> svgs = charts.parallelStream().map(c -> ChartFiles.svg(c, widthPx, heightPx)).toList();
        for (int i = 0; i < svgs.size(); i++) {
            svgFigure(svgs.get(i), widthPx, heightPx, alts.get(i));
        }
        return this;
    }

    private Section svgFigure(String svg, int widthPx, int heightPx, String alt) {
        body.append("<figure class=\"chart\">").append(inlineSvg(svg, widthPx, heightPx, alt)).append("<figcaption>")
            .append(Html.text(alt)).append("</figcaption></figure>\n");
        return this;
    }

    /**
     * A PNG image as a data URI.
     *
     * @param png the PNG bytes
     * @param alt alternative text (escaped)
     * @param widthPx display width in CSS pixels
     * @return this
     */
    public Section image(byte[] png, String alt, int widthPx) {
        body.append("<figure class=\"chart\"><img src=\"").append(dataUri(png)).append("\" alt=\"").append(Html.text(alt))
            .append("\" style=\"width:").append(widthPx).append("px\"><figcaption>").append(Html.text(alt))
            .append("</figcaption></figure>\n");
        return this;
    }

    /** Appends trusted markup built by this package. */
    Section raw(String html) {
        body.append(html);
        return this;
    }

    /** @return a new page-unique id */
    String newId() {
        return report.nextId();
    }

    static String dataUri(byte[] png) {
        return "data:image/png;base64," + Base64.getEncoder().encodeToString(png);
    }

    /** Strips the XML prolog, scopes ids to the figure and makes the drawing scale with the page. */
    private String inlineSvg(String svg, int w, int h, String alt) {
        String id = report.nextId() + "-";
        int start = svg.indexOf("<svg");
        // control characters (other than tab and line ends) are not allowed in XML; chart text may hold them
        String s = svg.substring(start).replaceAll("[\\x00-\\x08\\x0B\\x0C\\x0E-\\x1F\\x7F]", "\uFFFD");
        s = s.replace(" id=\"", " id=\"" + id).replace("url(#", "url(#" + id).replace("href=\"#", "href=\"#" + id);
        int close = s.indexOf('>');
        String open = s.substring(0, close).replaceAll(" width=\"[^\"]*\"", "").replaceAll(" height=\"[^\"]*\"", "");
        String attrs = " viewBox=\"0 0 " + w + " " + h + "\" role=\"img\" aria-label=\"" + Html.text(alt)
                + "\" preserveAspectRatio=\"xMidYMid meet\"";
        return open + attrs + s.substring(close);
    }

    private static String cell(Object v) {
        if (v == null) {
            return "–";
        }
        if (v instanceof Double || v instanceof Float) {
            return Html.text(Html.num(((Number) v).doubleValue()));
        }
        return Html.text(v.toString());
    }

    void render(StringBuilder out) {
        out.append("<section>\n<h").append(level).append('>').append(Html.text(heading)).append("</h").append(level).append(">\n");
        for (Object p : parts) {
            if (p instanceof Section s) {
                s.render(out);
            } else {
                out.append((CharSequence) p);
            }
        }
        out.append(body).append("</section>\n");
    }
}

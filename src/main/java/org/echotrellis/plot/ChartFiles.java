package org.echotrellis.plot;

import java.awt.Dimension;
import java.awt.Rectangle;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.Locale;
import javax.xml.parsers.DocumentBuilderFactory;
import javax.xml.parsers.ParserConfigurationException;
import org.apache.batik.svggen.SVGGeneratorContext;
import org.apache.batik.svggen.SVGGraphics2D;
import org.echotrellis.InputException;
import org.echotrellis.io.AtomicFiles;
import org.jfree.chart.ChartUtils;
import org.jfree.chart.JFreeChart;
import org.w3c.dom.Document;

/**
 * Writes charts as PNG or SVG, chosen by the file extension, atomically. The SVG is produced with
 * Apache Batik's {@code SVGGraphics2D} (Apache-2.0) from a fresh DOM each time, so identical charts
 * give byte-identical files.
 */
public final class ChartFiles {
    static {
        System.setProperty("java.awt.headless", "true");
    }

    private ChartFiles() { }

    /**
     * @param path output path
     * @return true for .svg, false for .png
     * @throws InputException for any other extension
     */
    public static boolean isSvg(Path path) {
        Path name = path.getFileName();
        String n = name == null ? "" : name.toString().toLowerCase(Locale.ROOT);
        if (n.endsWith(".svg")) {
            return true;
        }
        if (n.endsWith(".png")) {
            return false;
        }
        throw new InputException("plot file " + path + " must end in .png or .svg");
    }

    /**
     * Writes a chart.
     *
     * @param chart the chart
     * @param out target file (.png or .svg)
     * @param widthPx width in pixels
     * @param heightPx height in pixels
     * @param force whether an existing file may be replaced
     */
    public static void write(JFreeChart chart, Path out, int widthPx, int heightPx, boolean force) {
        boolean svg = isSvg(out);
        AtomicFiles.write(out, force, stream -> writeTo(stream, chart, widthPx, heightPx, svg));
    }

    /**
     * Renders a chart and writes it to a stream. The image is encoded in memory first, so a failing
     * stream (a full disk) surfaces as the stream's own {@link java.io.IOException} with the system's
     * reason, not as an image-encoder error.
     */
    static void writeTo(java.io.OutputStream stream, JFreeChart chart, int widthPx, int heightPx, boolean svg)
            throws java.io.IOException {
        if (svg) {
            Writer w = new OutputStreamWriter(stream, StandardCharsets.UTF_8);
            w.write(svg(chart, widthPx, heightPx));
            w.flush();
        } else {
            java.io.ByteArrayOutputStream png = new java.io.ByteArrayOutputStream(1 << 17);
            ChartUtils.writeChartAsPNG(png, chart, widthPx, heightPx);
            png.writeTo(stream);
            stream.flush();
        }
    }

    /**
     * Renders a chart as SVG text.
     *
     * @param chart the chart
     * @param widthPx width
     * @param heightPx height
     * @return the SVG document
     */
    public static String svg(JFreeChart chart, int widthPx, int heightPx) {
        Document doc;
        try {
            doc = DocumentBuilderFactory.newInstance().newDocumentBuilder().getDOMImplementation()
                    .createDocument("http://www.w3.org/2000/svg", "svg", null);
        } catch (ParserConfigurationException e) {
            throw new IllegalStateException("no XML DOM available", e);
        }
        SVGGeneratorContext ctx = SVGGeneratorContext.createDefault(doc);
        ctx.setComment("echotrellis");
        ctx.setPrecision(4);
        SVGGraphics2D g = new SVGGraphics2D(ctx, false);
        g.setSVGCanvasSize(new Dimension(widthPx, heightPx));
        chart.draw(g, new Rectangle(0, 0, widthPx, heightPx));
        java.io.StringWriter sw = new java.io.StringWriter();
        try {
            g.stream(sw, true);
        } catch (java.io.IOException e) {
            throw new IllegalStateException("SVG serialisation failed", e);
        } finally {
            g.dispose();
        }
        return sw.toString();
    }
}

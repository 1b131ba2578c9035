package org.echotrellis.plot;

import java.awt.Dimension;
import java.awt.Graphics2D;
import java.awt.Rectangle;
import java.awt.geom.Rectangle2D;
import java.awt.image.BufferedImage;
import java.io.OutputStreamWriter;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.Locale;
import javax.imageio.ImageIO;
import javax.xml.parsers.DocumentBuilderFactory;
import javax.xml.parsers.ParserConfigurationException;
import org.apache.batik.svggen.SVGGeneratorContext;
import org.apache.batik.svggen.SVGGraphics2D;
import org.echotrellis.InputException;
import org.echotrellis.io.AtomicFiles;
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
     * Writes a chart as {@code dir/stem.png} and {@code dir/stem.svg}.
     *
     * @param chart the chart
     * @param dir directory
     * @param stem file name without extension
     * @param widthPx width in pixels at scale 1
     * @param heightPx height in pixels at scale 1
     * @param force whether existing files may be replaced
     */
    public static void writePngAndSvg(JFreeChart chart, Path dir, String stem, int widthPx, int heightPx,
            boolean force) {
        write(chart, dir.resolve(stem + ".png"), widthPx, heightPx, force);
        write(chart, dir.resolve(stem + ".svg"), widthPx, heightPx, force);
    }

    /**
     * The file with the other figure extension: {@code a.png} gives {@code a.svg} and back.
     *
     * @param path a .png or .svg path
     * @return its twin
     */
    static Path twin(Path path) {
        String n = path.getFileName().toString();
        String stem = n.substring(0, n.length() - 4);
        return path.resolveSibling(stem + (isSvg(path) ? ".png" : ".svg"));
    }

    /**
     * Writes a chart at the current {@link PlotSettings#scale()}: the layout is made for
     * {@code widthPx × heightPx} and then magnified, so text and lines grow with the figure.
     *
     * @param chart the chart
     * @param out target file (.png or .svg)
     * @param widthPx width in pixels
     * @param heightPx height in pixels
     * @param force whether an existing file may be replaced
     */
    public static void write(JFreeChart chart, Path out, int widthPx, int heightPx, boolean force) {
        boolean svg = isSvg(out);
        double scale = PlotSettings.current().scale();
        AtomicFiles.write(out, force, stream -> writeTo(stream, chart, widthPx, heightPx, svg, scale));
    }

    /**
     * Renders a chart at scale 1 and writes it to a stream (see the scaled variant).
     */
    static void writeTo(java.io.OutputStream stream, JFreeChart chart, int widthPx, int heightPx, boolean svg)
            throws java.io.IOException {
        writeTo(stream, chart, widthPx, heightPx, svg, 1);
    }

    /**
     * Renders a chart and writes it to a stream. The image is encoded in memory first, so a failing
     * stream (a full disk) surfaces as the stream's own {@link java.io.IOException} with the system's
     * reason, not as an image-encoder error.
     */
    static void writeTo(java.io.OutputStream stream, JFreeChart chart, int widthPx, int heightPx, boolean svg,
            double scale) throws java.io.IOException {
        if (svg) {
            Writer w = new OutputStreamWriter(stream, StandardCharsets.UTF_8);
            w.write(svg(chart, widthPx, heightPx, scale));
            w.flush();
        } else {
            java.io.ByteArrayOutputStream png = new java.io.ByteArrayOutputStream(1 << 17);
            ImageIO.write(png(chart, widthPx, heightPx, scale), "png", png);
            png.writeTo(stream);
            stream.flush();
        }
    }

    private static BufferedImage png(JFreeChart chart, int widthPx, int heightPx, double scale) {
        int w = (int) Math.round(widthPx * scale);
        int h = (int) Math.round(heightPx * scale);
        BufferedImage img = new BufferedImage(w, h, BufferedImage.TYPE_INT_RGB);
        Graphics2D g = img.createGraphics();
        try {
            g.scale(scale, scale);
            chart.draw(g, new Rectangle2D.Double(0, 0, widthPx, heightPx));
        } finally {
            g.dispose();
        }
        return img;
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
        return svg(chart, widthPx, heightPx, 1);
    }

    private static String svg(JFreeChart chart, int widthPx, int heightPx, double scale) {
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
        ctx.setImageHandler(new PngImages());
        SVGGraphics2D g = new SVGGraphics2D(ctx, false);
        g.setSVGCanvasSize(new Dimension((int) Math.round(widthPx * scale), (int) Math.round(heightPx * scale)));
        g.scale(scale, scale);
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

    /**
     * Embeds raster images (map previews) in the SVG as base64 PNG data written with the JDK's own
     * PNG encoder, so no extra image codec library is needed.
     */
    private static final class PngImages extends org.apache.batik.svggen.ImageHandlerBase64Encoder {
        @Override
        public void encodeImage(java.awt.image.RenderedImage img, java.io.OutputStream os)
                throws org.apache.batik.svggen.SVGGraphics2DIOException {
            try {
                ImageIO.write(img, "png", os);
            } catch (java.io.IOException e) {
                throw new org.apache.batik.svggen.SVGGraphics2DIOException(e);
            }
        }
    }
}

package org.echotrellis.plot;

import java.awt.image.BufferedImage;
import java.util.ArrayList;
import java.util.List;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.annotations.XYTextAnnotation;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.title.TextTitle;
import org.jfree.chart.ui.Align;
import org.jfree.chart.ui.RectangleInsets;
import org.jfree.chart.ui.TextAnchor;
import org.jfree.data.xy.DefaultXYDataset;

/**
 * Magnitude images side by side on one grey scale (black = 0, white = the upper bound), each with a
 * caption above it: for comparing an ideal and simulated images at the same display window. Row 0
 * is drawn at the bottom. Values above the upper bound are drawn white.
 */
public final class ImagePanels {
    private record Panel(String caption, double[] values) { }

    private final String title;
    private final int rows;
    private final int cols;
    private final List<Panel> panels = new ArrayList<>();
    private String subtitle;

    private ImagePanels(String title, int rows, int cols) {
        this.title = title;
        this.rows = rows;
        this.cols = cols;
    }

    /**
     * @param title chart title
     * @param rows rows of every image
     * @param cols columns of every image
     * @return a new builder
     */
    public static ImagePanels create(String title, int rows, int cols) {
        return new ImagePanels(title, rows, cols);
    }

    /**
     * Adds an image (copied).
     *
     * @param caption text above the image
     * @param values rows·cols values, y·cols + x
     * @return this
     */
    public ImagePanels add(String caption, double[] values) {
        if (values.length != rows * cols) {
            throw new IllegalArgumentException("image " + caption + " needs " + rows * cols + " values, got " + values.length);
        }
        panels.add(new Panel(caption, values.clone()));
        return this;
    }

    /**
     * Sets a subtitle line.
     *
     * @param text the subtitle
     * @return this builder
     */
    public ImagePanels subtitle(String text) {
        this.subtitle = text;
        return this;
    }

    /**
     * @param upper value drawn white (e.g. 1.1 × the largest ideal value)
     * @return the styled chart; the panels are one raster image behind an empty plot (compact in
     *         SVG: an embedded PNG rather than one rectangle per pixel)
     */
    public JFreeChart build(double upper) {
        PngForSvg.register();
        int gap = Math.max(2, cols / 12);
        int n = panels.size();
        int width = n * (cols + gap) - gap;
        int band = Math.max(6, (int) Math.round(rows * 0.09));
        int height = rows + band;
        BufferedImage img = new BufferedImage(width, height, BufferedImage.TYPE_INT_RGB);
        int page = ChartStyle.PAGE.getRGB();
        for (int y = 0; y < height; y++) {
            for (int x = 0; x < width; x++) {
                img.setRGB(x, y, page);
            }
        }
        double top = upper > 0 ? upper : 1;
        for (int p = 0; p < n; p++) {
            double[] v = panels.get(p).values();
            int x0 = p * (cols + gap);
            for (int y = 0; y < rows; y++) {
                for (int x = 0; x < cols; x++) {
                    double f = Math.min(1, Math.max(0, v[y * cols + x] / top));
                    int g = (int) Math.round(255 * (Double.isNaN(f) ? 0 : f));
                    img.setRGB(x0 + x, height - 1 - y, (g << 16) | (g << 8) | g);   // row 0 at the bottom
                }
            }
        }
        NumberAxis xAxis = new NumberAxis();
        NumberAxis yAxis = new NumberAxis();
        xAxis.setRange(0, width);
        yAxis.setRange(0, height);
        xAxis.setVisible(false);
        yAxis.setVisible(false);
        XYPlot plot = new XYPlot(new DefaultXYDataset(), xAxis, yAxis, new XYLineAndShapeRenderer());
        for (int p = 0; p < n; p++) {
            XYTextAnnotation a = new XYTextAnnotation(panels.get(p).caption(), p * (cols + gap) + cols / 2.0,
                    rows + band / 2.0);
            a.setFont(ChartStyle.TICK_FONT);
            a.setPaint(ChartStyle.INK);
            a.setTextAnchor(TextAnchor.CENTER);
            plot.addAnnotation(a);
        }
        JFreeChart chart = new JFreeChart(title, ChartStyle.TITLE_FONT, plot, false);
        if (subtitle != null) {
            chart.addSubtitle(new TextTitle(subtitle));
        }
        ChartStyle.apply(chart);
        plot.setBackgroundPaint(ChartStyle.PAGE);
        plot.setBackgroundImage(img);
        plot.setBackgroundImageAlignment(Align.FIT);
        plot.setBackgroundImageAlpha(1f);
        plot.setOutlineVisible(false);
        plot.setDomainGridlinesVisible(false);
        plot.setRangeGridlinesVisible(false);
        plot.setAxisOffset(RectangleInsets.ZERO_INSETS);
        return chart;
    }

    /** @return a width and height in pixels that keep the pixels about square, {width, height} */
    public int[] size() {
        int n = Math.max(1, panels.size());
        int w = Math.max(600, Math.min(1800, n * 340));
        double aspect = (rows * 1.12) / (n * (cols + Math.max(2, cols / 12)));
        int h = (int) Math.round(Math.max(260, Math.min(1200, (w - 40) * aspect + 110)));
        return new int[] {w, h};
    }
}

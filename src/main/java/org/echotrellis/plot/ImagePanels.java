package org.echotrellis.plot;

import java.awt.Color;
import java.util.ArrayList;
import java.util.List;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.annotations.XYTextAnnotation;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.GrayPaintScale;
import org.jfree.chart.renderer.xy.XYBlockRenderer;
import org.jfree.chart.title.TextTitle;
import org.jfree.chart.ui.TextAnchor;
import org.jfree.data.xy.DefaultXYZDataset;

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

    /** Sets a subtitle line. */
    public ImagePanels subtitle(String text) {
        this.subtitle = text;
        return this;
    }

    /**
     * @param upper value drawn white (e.g. 1.1 × the largest ideal value)
     * @return the styled chart
     */
    public JFreeChart build(double upper) {
        int gap = Math.max(2, cols / 12);
        int n = panels.size();
        double[][] xyz = new double[3][n * rows * cols];
        int k = 0;
        for (int p = 0; p < n; p++) {
            double[] v = panels.get(p).values();
            int x0 = p * (cols + gap);
            for (int y = 0; y < rows; y++) {
                for (int x = 0; x < cols; x++) {
                    xyz[0][k] = x0 + x;
                    xyz[1][k] = y;
                    xyz[2][k] = Math.min(upper, Math.max(0, v[y * cols + x]));
                    k++;
                }
            }
        }
        DefaultXYZDataset data = new DefaultXYZDataset();
        data.addSeries("images", xyz);
        XYBlockRenderer renderer = new XYBlockRenderer();
        renderer.setPaintScale(new GrayPaintScale(0, upper > 0 ? upper : 1));
        NumberAxis xAxis = new NumberAxis();
        NumberAxis yAxis = new NumberAxis();
        double width = n * (cols + gap) - gap;
        xAxis.setRange(-0.5, width - 0.5);
        double top = rows + Math.max(6, rows * 0.09);
        yAxis.setRange(-0.5, top);
        xAxis.setVisible(false);
        yAxis.setVisible(false);
        XYPlot plot = new XYPlot(data, xAxis, yAxis, renderer);
        for (int p = 0; p < n; p++) {
            XYTextAnnotation a = new XYTextAnnotation(panels.get(p).caption(), p * (cols + gap) + cols / 2.0,
                    rows + (top - rows) / 2);
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
        plot.setOutlineVisible(false);
        plot.setDomainGridlinesVisible(false);
        plot.setRangeGridlinesVisible(false);
        plot.getRenderer().setDefaultOutlinePaint(Color.BLACK);
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

package org.echotrellis.plot;

import java.awt.Color;
import java.awt.Font;
import java.awt.geom.Rectangle2D;
import java.awt.image.BufferedImage;
import java.nio.file.Path;
import java.util.Arrays;
import java.util.List;

import org.jfree.chart.JFreeChart;
import org.jfree.chart.LegendItem;
import org.jfree.chart.LegendItemCollection;
import org.jfree.chart.annotations.XYDataImageAnnotation;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.axis.NumberTickUnit;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.title.LegendTitle;
import org.jfree.chart.title.PaintScaleLegend;
import org.jfree.chart.ui.RectangleEdge;
import org.jfree.chart.ui.RectangleInsets;
import org.jfree.data.xy.DefaultXYDataset;

/**
 * A preview image of one slice of a parameter map, written as PNG or SVG: a continuous map with a
 * colour bar ({@link MapPalette}), or a map of categories (voxel status codes) with a legend that
 * names each category. Rows are drawn with y upwards (voxel j = 0 at the bottom), as in the NIfTI
 * voxel grid. The slice is drawn as one image (in SVG an embedded PNG), not as one rectangle per
 * voxel, so SVG files stay small; voxels without a value are black, like the background.
 */
public final class MapPreview {
    /** One named category of a category map. */
    public record Category(int code, String name, Color color) { }

    private MapPreview() { }

    /**
     * Writes the central slice (z = nz/2) of a 3-D map.
     *
     * @param out target (.png or .svg)
     * @param map the map, x fastest (not modified)
     * @param nx x size
     * @param ny y size
     * @param nz z size
     * @param title chart title
     * @param unitLabel colour-bar label with unit, e.g. "T2 (ms)"
     * @param lower value of the first colour, or NaN for the 2nd percentile of the slice
     * @param upper value of the last colour, or NaN for the 98th percentile of the slice
     * @param force overwrite an existing file
     */
    public static void writeCentralSlice(Path out, float[] map, int nx, int ny, int nz, String title, String unitLabel,
            double lower, double upper, boolean force) {
        int z = nz / 2;
        float[] slice = Arrays.copyOfRange(map, z * nx * ny, (z + 1) * nx * ny);
        JFreeChart chart = chart(slice, nx, ny, title + " (slice " + z + ")", unitLabel, lower, upper);
        ChartFiles.write(chart, out, 640, height(nx, ny), force);
    }

    /**
     * Writes the central slice of a category map (e.g. status codes) with a legend naming the
     * categories.
     *
     * @param out target (.png or .svg)
     * @param codes category codes, x fastest (not modified)
     * @param nx x size
     * @param ny y size
     * @param nz z size
     * @param title chart title
     * @param categories the categories; a code not listed is drawn black
     * @param force overwrite an existing file
     */
    public static void writeCentralCategories(Path out, byte[] codes, int nx, int ny, int nz, String title,
            List<Category> categories, boolean force) {
        int z = nz / 2;
        byte[] slice = Arrays.copyOfRange(codes, z * nx * ny, (z + 1) * nx * ny);
        ChartFiles.write(categoryChart(slice, nx, ny, title + " (slice " + z + ")", categories), out, 640,
                height(nx, ny) + 40, force);
    }

    private static int height(int nx, int ny) {
        return (int) Math.round(Math.max(240, Math.min(900, 520.0 * ny / nx + 120)));
    }

    /**
     * Builds the chart of one slice.
     *
     * @param slice values, x fastest, nx·ny (not modified)
     * @param nx x size
     * @param ny y size
     * @param title chart title
     * @param unitLabel colour-bar label
     * @param lower first colour value or NaN (2nd percentile)
     * @param upper last colour value or NaN (98th percentile)
     * @return the chart
     */
    public static JFreeChart chart(float[] slice, int nx, int ny, String title, String unitLabel, double lower,
            double upper) {
        double[] range = percentileRange(slice, lower, upper);
        MapPalette palette = new MapPalette(range[0], range[1]);
        BufferedImage img = new BufferedImage(nx, ny, BufferedImage.TYPE_INT_ARGB);
        for (int j = 0; j < ny; j++) {
            for (int i = 0; i < nx; i++) {
                float v = slice[i + nx * j];
                int argb = Float.isFinite(v) ? ((Color) palette.getPaint(v)).getRGB() : 0xFF000000;
                img.setRGB(i, ny - 1 - j, argb);
            }
        }
        JFreeChart chart = imageChart(img, nx, ny, title, false);
        NumberAxis barAxis = new NumberAxis(ChartStyle.sentenceCase(unitLabel));
        barAxis.setRange(palette.getLowerBound(), palette.getUpperBound());
        barAxis.setTickUnit(new NumberTickUnit(niceStep((palette.getUpperBound() - palette.getLowerBound()) / 5)));
        barAxis.setLabelFont(ChartStyle.LABEL_FONT);
        barAxis.setTickLabelFont(ChartStyle.TICK_FONT);
        barAxis.setLabelPaint(ChartStyle.INK);
        barAxis.setTickLabelPaint(ChartStyle.INK);
        PaintScaleLegend bar = new PaintScaleLegend(palette, barAxis);
        bar.setPosition(RectangleEdge.RIGHT);
        bar.setStripWidth(14);
        bar.setAxisOffset(4);
        bar.setMargin(new RectangleInsets(8, 8, 8, 8));
        bar.setSubdivisionCount(256);
        bar.setBackgroundPaint(ChartStyle.PAGE);
        chart.addSubtitle(bar);
        return chart;
    }

    /**
     * Builds the chart of a category slice with a legend.
     *
     * @param slice codes, x fastest (not modified)
     * @param nx x size
     * @param ny y size
     * @param title chart title
     * @param categories named categories and their colours
     * @return the chart
     */
    public static JFreeChart categoryChart(byte[] slice, int nx, int ny, String title, List<Category> categories) {
        int[] colour = new int[256];
        Arrays.fill(colour, 0xFF000000);
        LegendItemCollection items = new LegendItemCollection();
        for (Category c : categories) {
            colour[c.code() & 0xFF] = c.color().getRGB() | 0xFF000000;
            LegendItem li = new LegendItem(c.code() + " " + c.name(), null, null, null,
                    new Rectangle2D.Double(-6, -6, 12, 12), c.color(), ChartStyle.line(0.8f), ChartStyle.INK);
            items.add(li);
        }
        BufferedImage img = new BufferedImage(nx, ny, BufferedImage.TYPE_INT_ARGB);
        for (int j = 0; j < ny; j++) {
            for (int i = 0; i < nx; i++) {
                img.setRGB(i, ny - 1 - j, colour[slice[i + nx * j] & 0xFF]);
            }
        }
        JFreeChart chart = imageChart(img, nx, ny, title, true);
        chart.getXYPlot().setFixedLegendItems(items);
        for (int i = 0; i < chart.getSubtitleCount(); i++) {
            if (chart.getSubtitle(i) instanceof LegendTitle legend) {
                legend.setPosition(RectangleEdge.RIGHT);
            }
        }
        ChartStyle.apply(chart);
        return chart;
    }

    private static JFreeChart imageChart(BufferedImage img, int nx, int ny, String title, boolean legend) {
        // magnified with whole pixels so that viewers which smooth embedded images still show voxels
        int k = Math.max(1, (int) Math.ceil(600.0 / Math.max(nx, ny)));
        BufferedImage big = new BufferedImage(nx * k, ny * k, BufferedImage.TYPE_INT_ARGB);
        java.awt.Graphics2D g = big.createGraphics();
        g.drawImage(img, 0, 0, nx * k, ny * k, null);
        g.dispose();
        NumberAxis xAxis = new NumberAxis("x (voxel)");
        NumberAxis yAxis = new NumberAxis("y (voxel)");
        xAxis.setRange(-0.5, nx - 0.5);
        yAxis.setRange(-0.5, ny - 0.5);
        XYPlot plot = new XYPlot(new DefaultXYDataset(), xAxis, yAxis, new XYLineAndShapeRenderer(false, false));
        plot.addAnnotation(new XYDataImageAnnotation(big, -0.5, -0.5, nx, ny, true));
        JFreeChart chart = new JFreeChart(title, new Font(Font.SANS_SERIF, Font.BOLD, 14), plot, legend);
        ChartStyle.apply(chart);
        plot.setBackgroundPaint(Color.BLACK);
        plot.setDomainGridlinesVisible(false);
        plot.setRangeGridlinesVisible(false);
        return chart;
    }

    /**
     * The colour range of a slice: the given ends, or the 2nd / 98th percentile of its finite values.
     *
     * @param values the values (not modified)
     * @param lower fixed lower end or NaN
     * @param upper fixed upper end or NaN
     * @return {lower, upper}
     */
    public static double[] percentileRange(float[] values, double lower, double upper) {
        double[] finite = new double[values.length];
        int n = 0;
        for (float v : values) {
            if (Float.isFinite(v)) {
                finite[n++] = v;
            }
        }
        double[] sorted = Arrays.copyOf(finite, n);
        Arrays.sort(sorted);
        double lo = Double.isNaN(lower) ? rank(sorted, 0.02, 0) : lower;
        double hi = Double.isNaN(upper) ? rank(sorted, 0.98, 1) : upper;
        return new double[] {lo, hi};
    }

    /** @return 1, 2, 2.5 or 5 times a power of ten, at least {@code raw} */
    static double niceStep(double raw) {
        if (!(raw > 0) || !Double.isFinite(raw)) {
            return 1;
        }
        double p = Math.pow(10, Math.floor(Math.log10(raw)));
        for (double m : new double[] {1, 2, 2.5, 5, 10}) {
            if (m * p >= raw * (1 - 1e-9)) {
                return m * p;
            }
        }
        return 10 * p;
    }

    private static double rank(double[] sorted, double q, double fallback) {
        if (sorted.length == 0) {
            return fallback;
        }
        return sorted[(int) Math.round(q * (sorted.length - 1))];
    }
}

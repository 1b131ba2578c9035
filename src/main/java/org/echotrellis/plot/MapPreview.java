package org.echotrellis.plot;

import java.awt.Color;
import java.awt.Font;
import java.nio.file.Path;
import java.util.Arrays;

import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYBlockRenderer;
import org.jfree.chart.title.PaintScaleLegend;
import org.jfree.chart.ui.RectangleEdge;
import org.jfree.chart.ui.RectangleInsets;
import org.jfree.data.xy.DefaultXYZDataset;

/**
 * A preview image of one slice of a parameter map with a colour bar, written as PNG or SVG.
 * Rows are drawn with y upwards (voxel j = 0 at the bottom), as in the NIfTI voxel grid.
 */
public final class MapPreview {
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
        int w = 640;
        int h = (int) Math.round(Math.max(240, Math.min(900, 520.0 * ny / nx + 120)));
        ChartFiles.write(chart, out, w, h, force);
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
        double[] finite = new double[slice.length];
        int n = 0;
        for (float v : slice) {
            if (Float.isFinite(v)) {
                finite[n++] = v;
            }
        }
        double[] sorted = Arrays.copyOf(finite, n);
        Arrays.sort(sorted);
        double lo = Double.isNaN(lower) ? rank(sorted, 0.02, 0) : lower;
        double hi = Double.isNaN(upper) ? rank(sorted, 0.98, 1) : upper;
        double[][] xyz = new double[3][nx * ny];
        for (int j = 0; j < ny; j++) {
            for (int i = 0; i < nx; i++) {
                int k = i + nx * j;
                xyz[0][k] = i;
                xyz[1][k] = j;
                xyz[2][k] = slice[k];
            }
        }
        DefaultXYZDataset data = new DefaultXYZDataset();
        data.addSeries("map", xyz);
        MapPalette palette = new MapPalette(lo, hi);
        XYBlockRenderer renderer = new XYBlockRenderer();
        renderer.setPaintScale(palette);
        NumberAxis xAxis = new NumberAxis("x (voxel)");
        NumberAxis yAxis = new NumberAxis("y (voxel)");
        xAxis.setRange(-0.5, nx - 0.5);
        yAxis.setRange(-0.5, ny - 0.5);
        XYPlot plot = new XYPlot(data, xAxis, yAxis, renderer);
        plot.setBackgroundPaint(Color.BLACK);
        plot.setDomainGridlinesVisible(false);
        plot.setRangeGridlinesVisible(false);
        JFreeChart chart = new JFreeChart(title, new Font(Font.SANS_SERIF, Font.BOLD, 14), plot, false);
        ChartStyle.apply(chart);
        plot.setBackgroundPaint(Color.BLACK);
        plot.setDomainGridlinesVisible(false);
        plot.setRangeGridlinesVisible(false);
        NumberAxis barAxis = new NumberAxis(unitLabel);
        barAxis.setRange(palette.getLowerBound(), palette.getUpperBound());
        PaintScaleLegend bar = new PaintScaleLegend(palette, barAxis);
        bar.setPosition(RectangleEdge.RIGHT);
        bar.setStripWidth(14);
        bar.setAxisOffset(4);
        bar.setMargin(new RectangleInsets(8, 8, 8, 8));
        bar.setSubdivisionCount(128);
        chart.addSubtitle(bar);
        return chart;
    }

    private static double rank(double[] sorted, double q, double fallback) {
        if (sorted.length == 0) {
            return fallback;
        }
        return sorted[(int) Math.round(q * (sorted.length - 1))];
    }
}

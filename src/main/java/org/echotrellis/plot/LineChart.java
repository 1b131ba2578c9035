package org.echotrellis.plot;

import java.awt.Shape;
import java.awt.geom.Ellipse2D;
import java.util.ArrayList;
import java.util.List;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.LogAxis;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.PlotOrientation;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.title.TextTitle;
import org.jfree.data.xy.DefaultXYDataset;

/**
 * Builds XY line charts in the project style: each series a line, markers, or both; solid or
 * dashed. Used for echo trains, decays and fits, schedules and spectra.
 */
public final class LineChart {
    /** How a series is drawn. */
    public enum Look {
        /** Solid line. */
        LINE,
        /** Dashed line. */
        DASHED,
        /** Markers only. */
        MARKERS,
        /** Solid line with markers. */
        LINE_MARKERS
    }

    private record Series(String name, double[] x, double[] y, Look look, int color) { }

    private final String title;
    private final String xLabel;
    private final String yLabel;
    private final List<Series> series = new ArrayList<>();
    private String subtitle;
    private boolean logX;
    private Double yMin;
    private Double yMax;
    private Double xMin;
    private Double xMax;

    private LineChart(String title, String xLabel, String yLabel) {
        this.title = title;
        this.xLabel = xLabel;
        this.yLabel = yLabel;
    }

    /**
     * @param title chart title
     * @param xLabel x-axis label with unit
     * @param yLabel y-axis label with unit
     * @return a new builder
     */
    public static LineChart create(String title, String xLabel, String yLabel) {
        return new LineChart(title, xLabel, yLabel);
    }

    /** Adds a series with the next palette colour; arrays are copied. */
    public LineChart add(String name, double[] x, double[] y, Look look) {
        return add(name, x, y, look, series.size());
    }

    /** Adds a series with palette colour {@code color}; arrays are copied. */
    public LineChart add(String name, double[] x, double[] y, Look look, int color) {
        if (x.length != y.length) {
            throw new IllegalArgumentException("series " + name + ": x and y lengths differ");
        }
        series.add(new Series(name, plottable(x), plottable(y), look, color));
        return this;
    }

    /** Values beyond ±1e100 cannot be drawn (axis arithmetic overflows): they become gaps (NaN). */
    private static double[] plottable(double[] v) {
        double[] c = v.clone();
        for (int i = 0; i < c.length; i++) {
            if (!(Math.abs(c[i]) <= 1e100)) {
                c[i] = Double.NaN;
            }
        }
        return c;
    }

    /** Sets a subtitle line under the title. */
    public LineChart subtitle(String text) {
        this.subtitle = text;
        return this;
    }

    /** Uses a logarithmic x axis. */
    public LineChart logX() {
        this.logX = true;
        return this;
    }

    /** Fixes the y range. */
    public LineChart yRange(double min, double max) {
        this.yMin = min;
        this.yMax = max;
        return this;
    }

    /** Fixes the x range (linear x axis only). */
    public LineChart xRange(double min, double max) {
        this.xMin = min;
        this.xMax = max;
        return this;
    }

    /** @return the styled chart */
    public JFreeChart build() {
        DefaultXYDataset data = new DefaultXYDataset();
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer();
        Shape dot = new Ellipse2D.Double(-3, -3, 6, 6);
        java.util.Set<String> keys = new java.util.HashSet<>();
        for (int i = 0; i < series.size(); i++) {
            Series s = series.get(i);
            // the dataset replaces a series whose key repeats, so a repeated name gets a number
            String key = s.name();
            for (int copy = 2; !keys.add(key); copy++) {
                key = s.name() + " (" + copy + ")";
            }
            data.addSeries(key, new double[][] {s.x(), s.y()});
            r.setSeriesPaint(i, ChartStyle.color(s.color()));
            boolean line = s.look() != Look.MARKERS;
            boolean marks = s.look() == Look.MARKERS || s.look() == Look.LINE_MARKERS;
            r.setSeriesLinesVisible(i, line);
            r.setSeriesShapesVisible(i, marks);
            r.setSeriesShape(i, dot);
            r.setSeriesStroke(i, s.look() == Look.DASHED ? ChartStyle.dashed(1.6f) : ChartStyle.line(2.0f));
        }
        NumberAxis y = new NumberAxis(yLabel);
        y.setAutoRangeIncludesZero(false);
        if (yMin != null) {
            y.setRange(yMin, yMax);
        }
        XYPlot plot;
        if (logX) {
            LogAxis x = new LogAxis(xLabel);
            x.setSmallestValue(1e-3);
            x.setNumberFormatOverride(new java.text.DecimalFormat("0.###"));
            plot = new XYPlot(data, x, y, r);
        } else {
            NumberAxis x = new NumberAxis(xLabel);
            x.setAutoRangeIncludesZero(true);
            if (xMin != null) {
                x.setRange(xMin, xMax);
            }
            plot = new XYPlot(data, x, y, r);
        }
        plot.setOrientation(PlotOrientation.VERTICAL);
        JFreeChart chart = new JFreeChart(title, ChartStyle.TITLE_FONT, plot, true);
        if (subtitle != null) {
            chart.addSubtitle(new TextTitle(subtitle));
        }
        return ChartStyle.apply(chart);
    }
}

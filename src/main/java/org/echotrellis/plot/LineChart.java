package org.echotrellis.plot;

import java.util.ArrayList;
import java.util.List;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.LogAxis;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.axis.NumberTickUnit;
import org.jfree.chart.plot.PlotOrientation;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.title.TextTitle;
import org.jfree.data.xy.DefaultXYDataset;

/**
 * Builds XY line charts in the project style: each series a line, markers, or both; solid or
 * dashed. Used for echo trains, decays and fits, schedules and spectra.
 *
 * <p>Colour is never the only cue: a series with palette colour {@code c} also gets marker
 * {@link ChartStyle#marker(int) marker(c)}, and a plain line dash pattern
 * {@link ChartStyle#dashPattern(int) dashPattern(c)}. Every line is drawn as one path, so dash
 * patterns run on along the curve instead of restarting at each sample. Axes span the data (the
 * x axis starts at zero only when asked), and a logarithmic axis shows one labelled tick per decade
 * with unlabelled minor ticks between.
 */
public final class LineChart {
    /** How a series is drawn. */
    public enum Look {
        /** Solid line. */
        LINE,
        /** Dashed reference line (e.g. an ideal curve); drawn in ink when its colour is {@link #INK}. */
        DASHED,
        /** Markers only. */
        MARKERS,
        /** Solid line with markers. */
        LINE_MARKERS
    }

    /** Colour index that draws a series in the ink colour instead of a palette colour. */
    public static final int INK = -1;

    private record Series(String name, double[] x, double[] y, Look look, int color) { }

    private final String title;
    private final String xLabel;
    private final String yLabel;
    private final List<Series> series = new ArrayList<>();
    private String subtitle;
    private boolean logX;
    private boolean xFromZero;
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

    /**
     * Adds a series with the next palette colour; arrays are copied.
     *
     * @param name legend entry; a repeated name gets a number
     * @param x x values in the unit of the x-axis label; values beyond ±1e100 become gaps
     * @param y y values, as many as {@code x}
     * @param look how the series is drawn
     * @return this builder
     * @throws IllegalArgumentException if {@code x} and {@code y} differ in length
     */
    public LineChart add(String name, double[] x, double[] y, Look look) {
        return add(name, x, y, look, series.size());
    }

    /**
     * Adds a series with palette colour {@code color}; arrays are copied.
     *
     * @param name legend entry; a repeated name gets a number
     * @param x x values in the unit of the x-axis label; values beyond ±1e100 become gaps
     * @param y y values, as many as {@code x}
     * @param look how the series is drawn
     * @param color palette colour index (markers and dashes follow it), or {@link #INK}
     * @return this builder
     * @throws IllegalArgumentException if {@code x} and {@code y} differ in length
     */
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

    /**
     * Sets a subtitle line under the title.
     *
     * @param text the subtitle, e.g. the settings behind the curves
     * @return this builder
     */
    public LineChart subtitle(String text) {
        this.subtitle = text;
        return this;
    }

    /**
     * Uses a logarithmic x axis.
     *
     * @return this builder
     */
    public LineChart logX() {
        this.logX = true;
        return this;
    }

    /**
     * Starts the (linear) x axis at zero, e.g. for times counted from the excitation.
     *
     * @return this builder
     */
    public LineChart xFromZero() {
        this.xFromZero = true;
        return this;
    }

    /**
     * Fixes the y range.
     *
     * @param min lower end of the y axis, in the unit of the y-axis label
     * @param max upper end of the y axis
     * @return this builder
     */
    public LineChart yRange(double min, double max) {
        this.yMin = min;
        this.yMax = max;
        return this;
    }

    /**
     * Fixes the x range (linear x axis only).
     *
     * @param min lower end of the x axis, in the unit of the x-axis label
     * @param max upper end of the x axis
     * @return this builder
     */
    public LineChart xRange(double min, double max) {
        this.xMin = min;
        this.xMax = max;
        return this;
    }

    /** @return the styled chart */
    public JFreeChart build() {
        DefaultXYDataset data = new DefaultXYDataset();
        XYLineAndShapeRenderer r = new XYLineAndShapeRenderer();
        r.setDrawSeriesLineAsPath(true);
        java.util.Set<String> keys = new java.util.HashSet<>();
        for (int i = 0; i < series.size(); i++) {
            Series s = series.get(i);
            // the dataset replaces a series whose key repeats, so a repeated name gets a number
            String key = s.name();
            for (int copy = 2; !keys.add(key); copy++) {
                key = s.name() + " (" + copy + ")";
            }
            data.addSeries(key, new double[][] {s.x(), s.y()});
            r.setSeriesPaint(i, s.color() == INK ? ChartStyle.INK : ChartStyle.color(s.color()));
            boolean line = s.look() != Look.MARKERS;
            boolean marks = s.look() == Look.MARKERS || s.look() == Look.LINE_MARKERS;
            r.setSeriesLinesVisible(i, line);
            r.setSeriesShapesVisible(i, marks);
            r.setSeriesShape(i, ChartStyle.marker(Math.max(0, s.color())));
            r.setSeriesStroke(i, switch (s.look()) {
                case DASHED -> ChartStyle.dashed(1.6f);
                case LINE -> ChartStyle.patterned(2.0f, Math.max(0, s.color()));
                default -> ChartStyle.line(2.0f);
            });
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
            decades(x, series);
            plot = new XYPlot(data, x, y, r);
        } else {
            NumberAxis x = new NumberAxis(xLabel);
            x.setAutoRangeIncludesZero(xFromZero);
            if (xMin != null) {
                x.setRange(xMin, xMax);
            }
            plot = new XYPlot(data, x, y, r);
        }
        plot.setOrientation(PlotOrientation.VERTICAL);
        if (logX) {
            // faint lines at 2, 3, ... 9 times each decade make the logarithmic scale readable
            plot.setDomainMinorGridlinesVisible(true);
            plot.setDomainMinorGridlinePaint(new java.awt.Color(0xEEECE6));
            plot.setDomainMinorGridlineStroke(new java.awt.BasicStroke(0.5f));
        }
        JFreeChart chart = new JFreeChart(title, ChartStyle.TITLE_FONT, plot, true);
        if (subtitle != null) {
            chart.addSubtitle(new TextTitle(subtitle));
        }
        return ChartStyle.apply(chart);
    }

    /**
     * One labelled tick per decade with nine minor ticks between when the data span more than a
     * decade; the axis's own choice otherwise (still with minor ticks).
     */
    private static void decades(LogAxis x, List<Series> series) {
        double lo = Double.POSITIVE_INFINITY;
        double hi = Double.NEGATIVE_INFINITY;
        for (Series s : series) {
            for (double v : s.x()) {
                if (v > 0 && Double.isFinite(v)) {
                    lo = Math.min(lo, v);
                    hi = Math.max(hi, v);
                }
            }
        }
        x.setMinorTickMarksVisible(true);
        x.setMinorTickMarkOutsideLength(3);
        x.setMinorTickCount(9);
        if (hi / lo >= 10) {
            x.setAutoTickUnitSelection(false);
            x.setTickUnit(new NumberTickUnit(1.0));
            x.setRange(lo / 1.15, hi * 1.15);
        }
    }
}

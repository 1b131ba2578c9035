package org.echotrellis.plot;

import java.awt.BasicStroke;
import java.util.ArrayList;
import java.util.List;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.labels.StandardCategoryItemLabelGenerator;
import org.jfree.chart.plot.CategoryPlot;
import org.jfree.chart.plot.PlotOrientation;
import org.jfree.chart.plot.ValueMarker;
import org.jfree.chart.renderer.category.BarRenderer;
import org.jfree.chart.renderer.category.StandardBarPainter;
import org.jfree.chart.title.TextTitle;
import org.jfree.chart.ui.RectangleAnchor;
import org.jfree.chart.ui.TextAnchor;
import org.jfree.data.category.DefaultCategoryDataset;

/**
 * Builds a horizontal bar chart in the project style, one bar per labelled value, with optional
 * dashed reference lines (e.g. a budget). Used for RF exposure comparisons.
 */
public final class BarChart {
    private record Bar(String label, double value, int color) { }

    private record Line(String label, double value) { }

    private final String title;
    private final String valueLabel;
    private final List<Bar> bars = new ArrayList<>();
    private final List<Line> lines = new ArrayList<>();
    private String subtitle;
    private String format = "0.000";

    private BarChart(String title, String valueLabel) {
        this.title = title;
        this.valueLabel = valueLabel;
    }

    /**
     * @param title chart title
     * @param valueLabel value-axis label with unit
     * @return a new builder
     */
    public static BarChart create(String title, String valueLabel) {
        return new BarChart(title, valueLabel);
    }

    /**
     * Adds a bar with palette colour {@code color}.
     *
     * @param label category label shown beside the bar
     * @param value bar length in the unit of the value-axis label
     * @param color palette colour index ({@link ChartStyle#color(int)})
     * @return this builder
     */
    public BarChart bar(String label, double value, int color) {
        bars.add(new Bar(label, value, color));
        return this;
    }

    /**
     * Adds a dashed reference line across the bars at {@code value}.
     *
     * @param label text drawn at the line, e.g. the budget's name
     * @param value position on the value axis
     * @return this builder
     */
    public BarChart referenceLine(String label, double value) {
        lines.add(new Line(label, value));
        return this;
    }

    /**
     * Sets a subtitle line under the title.
     *
     * @param text the subtitle
     * @return this builder
     */
    public BarChart subtitle(String text) {
        subtitle = text;
        return this;
    }

    /**
     * Sets the decimal pattern of the value labels (default 0.000).
     *
     * @param pattern a {@link java.text.DecimalFormat} pattern such as {@code 0.00}
     * @return this builder
     */
    public BarChart valueFormat(String pattern) {
        format = pattern;
        return this;
    }

    /** @return the styled chart */
    public JFreeChart build() {
        DefaultCategoryDataset data = new DefaultCategoryDataset();
        for (Bar b : bars) {
            data.addValue(b.value(), "value", b.label());
        }
        BarRenderer r = new BarRenderer() {
            private static final long serialVersionUID = 1L;

            @Override
            public java.awt.Paint getItemPaint(int row, int column) {
                return ChartStyle.color(bars.get(column).color());
            }
        };
        r.setBarPainter(new StandardBarPainter());
        r.setShadowVisible(false);
        r.setMaximumBarWidth(0.18);
        r.setDefaultItemLabelGenerator(new StandardCategoryItemLabelGenerator("{2}", new java.text.DecimalFormat(format)));
        r.setDefaultItemLabelsVisible(true);
        r.setDefaultItemLabelFont(ChartStyle.TICK_FONT);
        r.setDefaultItemLabelPaint(ChartStyle.INK);
        r.setDefaultPositiveItemLabelPosition(new org.jfree.chart.labels.ItemLabelPosition(
                org.jfree.chart.labels.ItemLabelAnchor.OUTSIDE3, TextAnchor.CENTER_LEFT));
        r.setItemLabelAnchorOffset(6);
        NumberAxis value = new NumberAxis(valueLabel);
        value.setAutoRangeIncludesZero(true);
        value.setUpperMargin(0.15);
        CategoryPlot plot = new CategoryPlot(data, new org.jfree.chart.axis.CategoryAxis(null), value, r);
        plot.setOrientation(PlotOrientation.HORIZONTAL);
        plot.setRangeAxisLocation(org.jfree.chart.axis.AxisLocation.BOTTOM_OR_RIGHT);
        for (Line l : lines) {
            ValueMarker m = new ValueMarker(l.value(), ChartStyle.INK, ChartStyle.dashed(1.4f));
            m.setLabel(l.label());
            m.setLabelFont(ChartStyle.TICK_FONT);
            m.setLabelPaint(ChartStyle.INK);
            m.setLabelAnchor(RectangleAnchor.BOTTOM_RIGHT);
            m.setLabelTextAnchor(TextAnchor.BOTTOM_LEFT);
            plot.addRangeMarker(m);
        }
        plot.setRangeGridlineStroke(new BasicStroke(0.6f));
        JFreeChart chart = new JFreeChart(title, ChartStyle.TITLE_FONT, plot, false);
        if (subtitle != null) {
            chart.addSubtitle(new TextTitle(subtitle));
        }
        return ChartStyle.apply(chart);
    }
}

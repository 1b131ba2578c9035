package org.echotrellis.plot;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.Paint;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.ValueAxis;
import org.jfree.chart.block.BlockBorder;
import org.jfree.chart.plot.CategoryPlot;
import org.jfree.chart.plot.Plot;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.title.LegendTitle;
import org.jfree.chart.title.TextTitle;
import org.jfree.chart.ui.RectangleInsets;

/**
 * The project's chart style, applied in one place: warm off-white page, white plot area with a thin
 * frame and dotted grid, a muted palette of our own, serif-free fonts and round line joins.
 */
public final class ChartStyle {
    /** Series colours in order: ink blue, copper, moss, plum, ochre, slate, brick, teal. */
    public static final Color[] SERIES_COLORS = {
        new Color(0x1F4E79), new Color(0xC0612B), new Color(0x5A7D2A), new Color(0x7A3E7D),
        new Color(0xC99A1E), new Color(0x55636F), new Color(0x9E2B25), new Color(0x2A8C82),
    };
    /** Page background. */
    public static final Color PAGE = new Color(0xFBFAF6);
    /** Text colour. */
    public static final Color INK = new Color(0x222222);
    /** Grid colour. */
    public static final Color GRID = new Color(0xD9D6CC);
    /** Title font. */
    public static final Font TITLE_FONT = new Font(Font.SANS_SERIF, Font.BOLD, 17);
    /** Subtitle font. */
    public static final Font SUBTITLE_FONT = new Font(Font.SANS_SERIF, Font.PLAIN, 12);
    /** Axis label font. */
    public static final Font LABEL_FONT = new Font(Font.SANS_SERIF, Font.PLAIN, 13);
    /** Tick label font. */
    public static final Font TICK_FONT = new Font(Font.SANS_SERIF, Font.PLAIN, 11);

    static {
        System.setProperty("java.awt.headless", "true");
    }

    private ChartStyle() { }

    /** @return the colour of series i (cycling) */
    public static Color color(int i) {
        return SERIES_COLORS[Math.floorMod(i, SERIES_COLORS.length)];
    }

    /** @return a solid line stroke of the given width */
    public static BasicStroke line(float width) {
        return new BasicStroke(width, BasicStroke.CAP_ROUND, BasicStroke.JOIN_ROUND);
    }

    /** @return a dashed line stroke of the given width */
    public static BasicStroke dashed(float width) {
        return new BasicStroke(width, BasicStroke.CAP_BUTT, BasicStroke.JOIN_ROUND, 10f, new float[] {6f, 4f}, 0f);
    }

    /**
     * Applies the style to a chart (title, legend, plot background, axes, grid).
     *
     * @param chart modified in place
     * @return the same chart
     */
    public static JFreeChart apply(JFreeChart chart) {
        chart.setBackgroundPaint(PAGE);
        chart.setAntiAlias(true);
        chart.setTextAntiAlias(true);
        chart.setPadding(new RectangleInsets(8, 8, 8, 14));
        TextTitle title = chart.getTitle();
        if (title != null) {
            title.setFont(TITLE_FONT);
            title.setPaint(INK);
        }
        for (int i = 0; i < chart.getSubtitleCount(); i++) {
            if (chart.getSubtitle(i) instanceof LegendTitle legend) {
                legend.setBackgroundPaint(PAGE);
                legend.setFrame(BlockBorder.NONE);
                legend.setItemFont(TICK_FONT);
                legend.setItemPaint(INK);
            } else if (chart.getSubtitle(i) instanceof TextTitle t) {
                t.setFont(SUBTITLE_FONT);
                t.setPaint(INK);
            }
        }
        Plot plot = chart.getPlot();
        plot.setBackgroundPaint(Color.WHITE);
        plot.setOutlinePaint(new Color(0x9A968C));
        plot.setOutlineStroke(new BasicStroke(0.8f));
        if (plot instanceof XYPlot xy) {
            xy.setDomainGridlinePaint(GRID);
            xy.setRangeGridlinePaint(GRID);
            xy.setDomainGridlineStroke(gridStroke());
            xy.setRangeGridlineStroke(gridStroke());
            xy.setAxisOffset(new RectangleInsets(4, 4, 4, 4));
            for (int i = 0; i < xy.getDomainAxisCount(); i++) {
                axis(xy.getDomainAxis(i));
            }
            for (int i = 0; i < xy.getRangeAxisCount(); i++) {
                axis(xy.getRangeAxis(i));
            }
        } else if (plot instanceof CategoryPlot cp) {
            cp.setRangeGridlinePaint(GRID);
            cp.setRangeGridlineStroke(gridStroke());
            cp.getDomainAxis().setLabelFont(LABEL_FONT);
            cp.getDomainAxis().setTickLabelFont(TICK_FONT);
            cp.getDomainAxis().setLabelPaint(INK);
            cp.getDomainAxis().setTickLabelPaint(INK);
            for (int i = 0; i < cp.getRangeAxisCount(); i++) {
                axis(cp.getRangeAxis(i));
            }
        }
        return chart;
    }

    private static BasicStroke gridStroke() {
        return new BasicStroke(0.6f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 1f, new float[] {1.5f, 2.5f}, 0f);
    }

    private static void axis(ValueAxis a) {
        if (a == null) {
            return;
        }
        Paint ink = INK;
        a.setLabelFont(LABEL_FONT);
        a.setTickLabelFont(TICK_FONT);
        a.setLabelPaint(ink);
        a.setTickLabelPaint(ink);
        a.setAxisLinePaint(new Color(0x9A968C));
        a.setTickMarkPaint(new Color(0x9A968C));
    }
}

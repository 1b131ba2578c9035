package org.echotrellis.plot;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.Paint;
import java.awt.Shape;
import java.awt.geom.AffineTransform;
import java.awt.geom.Area;
import java.awt.geom.Ellipse2D;
import java.awt.geom.Path2D;
import java.awt.geom.Rectangle2D;
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
 * frame and dotted grid, a categorical palette of our own, serif-free fonts and round line joins.
 *
 * <p>The categorical palette alternates dark and light colours and cold and warm hues so that
 * neighbouring series stay apart for readers with protanopia or deuteranopia: under the
 * Machado, Oliveira &amp; Fernandes (2009) simulation every pair of neighbours (the cycle wrapping
 * round) differs by at least 20 CIEDE2000 units ({@code PaletteTest} measures it). Colour is never
 * the only cue: series {@code i} also gets marker {@link #marker(int)} and, for plain lines, dash
 * pattern {@link #dashPattern(int)}.
 */
public final class ChartStyle {
    /** Series colours in order: indigo, amber, spruce, orchid, umber, sky, olive, lilac. */
    private static final Color[] SERIES_COLORS = {
        new Color(0x2B3A8C), new Color(0xE8A33D), new Color(0x17594A), new Color(0xE08CB0),
        new Color(0x6B2E1E), new Color(0x86C3E8), new Color(0x8F8A2A), new Color(0xA070C8),
    };
    /** Number of categorical colours before the cycle repeats. */
    public static final int SERIES_COLOR_COUNT = SERIES_COLORS.length;
    /** Dash patterns (on, off lengths in px at scale 1) for plain lines, series 0 solid. */
    private static final float[][] DASHES = {
        null, {9f, 4f}, {2f, 3f}, {9f, 3f, 2f, 3f}, {5f, 5f}, {14f, 4f, 3f, 4f, 3f, 4f},
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

    /**
     * @param i series index; indices past the palette cycle
     * @return the colour of series i (cycling)
     */
    public static Color color(int i) {
        return SERIES_COLORS[Math.floorMod(i, SERIES_COLORS.length)];
    }

    /** @return a copy of the categorical palette, in order */
    public static Color[] seriesColors() {
        return SERIES_COLORS.clone();
    }

    /**
     * @param i series index (cycling)
     * @return the marker of series i: circle, square, triangle, diamond, inverted triangle, cross,
     *     plus, hexagon
     */
    public static Shape marker(int i) {
        double r = 3.6;
        return switch (Math.floorMod(i, 8)) {
            case 0 -> new Ellipse2D.Double(-r, -r, 2 * r, 2 * r);
            case 1 -> new Rectangle2D.Double(-r * 0.9, -r * 0.9, 1.8 * r, 1.8 * r);
            case 2 -> polygon(r * 1.2, 3, -Math.PI / 2);
            case 3 -> polygon(r * 1.25, 4, -Math.PI / 2);
            case 4 -> polygon(r * 1.2, 3, Math.PI / 2);
            case 5 -> cross(r, Math.PI / 4);
            case 6 -> cross(r, 0);
            default -> polygon(r * 1.1, 6, 0);
        };
    }

    /**
     * @param i index among a chart's plain-line series (cycling)
     * @return the dash pattern of that line, or null for solid
     */
    public static float[] dashPattern(int i) {
        float[] d = DASHES[Math.floorMod(i, DASHES.length)];
        return d == null ? null : d.clone();
    }

    /**
     * @param width line width in px at plot scale 1
     * @param i index among the chart's plain-line series
     * @return a line stroke of the given width with dash pattern {@link #dashPattern(int)}
     */
    public static BasicStroke patterned(float width, int i) {
        float[] d = dashPattern(i);
        return d == null ? line(width)
                : new BasicStroke(width, BasicStroke.CAP_BUTT, BasicStroke.JOIN_ROUND, 10f, d, 0f);
    }

    private static Shape polygon(double r, int corners, double start) {
        Path2D.Double p = new Path2D.Double();
        for (int k = 0; k < corners; k++) {
            double a = start + 2 * Math.PI * k / corners;
            if (k == 0) {
                p.moveTo(r * Math.cos(a), r * Math.sin(a));
            } else {
                p.lineTo(r * Math.cos(a), r * Math.sin(a));
            }
        }
        p.closePath();
        return p;
    }

    /** A filled cross of two bars (rotated by {@code angle}), so that it reads as a marker, not a line. */
    private static Shape cross(double r, double angle) {
        double w = r * 0.42;
        Area a = new Area(new Rectangle2D.Double(-r, -w / 2, 2 * r, w));
        a.add(new Area(new Rectangle2D.Double(-w / 2, -r, w, 2 * r)));
        return AffineTransform.getRotateInstance(angle).createTransformedShape(a);
    }

    /**
     * @param width line width in px at plot scale 1
     * @return a solid line stroke of the given width
     */
    public static BasicStroke line(float width) {
        return new BasicStroke(width, BasicStroke.CAP_ROUND, BasicStroke.JOIN_ROUND);
    }

    /**
     * @param width line width in px at plot scale 1
     * @return a dashed line stroke of the given width
     */
    public static BasicStroke dashed(float width) {
        return new BasicStroke(width, BasicStroke.CAP_BUTT, BasicStroke.JOIN_ROUND, 10f, new float[] {6f, 4f}, 0f);
    }

    /**
     * Applies the style to a chart (title, legend, plot background, axes, grid).
     *
     * @param chart modified in place
     * @return the same chart
     */
    static JFreeChart apply(JFreeChart chart) {
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
            cp.getDomainAxis().setLabel(sentenceCase(cp.getDomainAxis().getLabel()));
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

    /**
     * Axis labels in sentence case: a label that starts with a lower-case word gets a capital
     * ("echo time (ms)" → "Echo time (ms)"); one that starts with a symbol ("x (voxel)", "μ") is
     * left alone.
     *
     * @param label a label, or null
     * @return the label in sentence case
     */
    public static String sentenceCase(String label) {
        if (label == null || label.length() < 2) {
            return label;
        }
        char c0 = label.charAt(0);
        char c1 = label.charAt(1);
        if (c0 >= 'a' && c0 <= 'z' && c1 >= 'a' && c1 <= 'z') {
            return Character.toUpperCase(c0) + label.substring(1);
        }
        return label;
    }

    private static BasicStroke gridStroke() {
        return new BasicStroke(0.6f, BasicStroke.CAP_BUTT, BasicStroke.JOIN_MITER, 1f, new float[] {1.5f, 2.5f}, 0f);
    }

    private static void axis(ValueAxis a) {
        if (a == null) {
            return;
        }
        Paint ink = INK;
        a.setLabel(sentenceCase(a.getLabel()));
        a.setLabelFont(LABEL_FONT);
        a.setTickLabelFont(TICK_FONT);
        a.setLabelPaint(ink);
        a.setTickLabelPaint(ink);
        a.setAxisLinePaint(new Color(0x9A968C));
        a.setTickMarkPaint(new Color(0x9A968C));
    }
}

package org.echotrellis.plot;

import java.awt.Color;
import java.util.List;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.plot.IntervalMarker;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.ui.Layer;
import org.jfree.chart.ui.RectangleAnchor;
import org.jfree.chart.ui.RectangleInsets;
import org.jfree.chart.ui.TextAnchor;

/**
 * T2 spectrum plot: amplitude per bin against T2 on a logarithmic axis, one series per decay, with
 * the fraction windows shaded.
 */
public final class SpectrumPlot {
    private static final Color WINDOW_FILL = new Color(0x8FB8A8);

    private SpectrumPlot() { }

    /**
     * @param title      chart title
     * @param subtitle   subtitle (settings), or null
     * @param t2Ms       bin T2 values in ms (not modified)
     * @param names      series names
     * @param amplitudes one amplitude array per series, same length as {@code t2Ms} (not modified)
     * @param windowsMs  shaded windows as {lo, hi} pairs in ms
     * @return the styled chart
     */
    public static JFreeChart chart(String title, String subtitle, double[] t2Ms, List<String> names,
                                   List<double[]> amplitudes, List<double[]> windowsMs) {
        LineChart c = LineChart.create(title, "T2 (ms)", "Amplitude (signal units)").logX();
        if (subtitle != null) {
            c.subtitle(subtitle);
        }
        for (int i = 0; i < names.size(); i++) {
            c.add(names.get(i), t2Ms, amplitudes.get(i), LineChart.Look.LINE_MARKERS);
        }
        JFreeChart chart = c.build();
        XYPlot plot = chart.getXYPlot();
        int row = 0;
        for (double[] w : windowsMs) {
            IntervalMarker m = new IntervalMarker(w[0], w[1]);
            m.setPaint(WINDOW_FILL);
            m.setAlpha(0.25f);
            m.setLabel("window " + fmt(w[0]) + "–" + fmt(w[1]) + " ms");
            m.setLabelFont(ChartStyle.TICK_FONT);
            m.setLabelPaint(ChartStyle.INK);
            m.setLabelAnchor(RectangleAnchor.TOP);
            m.setLabelTextAnchor(TextAnchor.TOP_CENTER);
            // one text row per window, so labels of overlapping windows never print over each other
            m.setLabelOffset(new RectangleInsets(6 + 15 * row++, 0, 0, 0));
            plot.addDomainMarker(m, Layer.BACKGROUND);
        }
        return chart;
    }

    private static String fmt(double v) {
        return v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
    }
}

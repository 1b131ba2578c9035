package org.echotrellis.plot;

import java.awt.Font;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.StandardXYBarPainter;
import org.jfree.chart.renderer.xy.XYBarRenderer;
import org.jfree.chart.title.TextTitle;
import org.jfree.data.xy.DefaultIntervalXYDataset;

/**
 * A histogram of the values of one map in the project style: equal-width bins over a given range,
 * values outside the range counted in the first or last bin, non-finite values left out.
 */
public final class HistogramChart {
    private HistogramChart() { }

    /**
     * Counts values into equal-width bins.
     *
     * @param values the values (not modified); NaN and infinities are skipped
     * @param lower lower edge of the first bin
     * @param upper upper edge of the last bin (&gt; lower; otherwise widened by 1)
     * @param bins number of bins (≥ 1)
     * @return counts per bin; values below {@code lower} or above {@code upper} go to the end bins
     */
    public static long[] counts(float[] values, double lower, double upper, int bins) {
        double hi = upper > lower ? upper : lower + 1;
        long[] c = new long[bins];
        double scale = bins / (hi - lower);
        for (float v : values) {
            if (Float.isFinite(v)) {
                int b = (int) Math.floor((v - lower) * scale);
                c[Math.max(0, Math.min(bins - 1, b))]++;
            }
        }
        return c;
    }

    /**
     * Builds the chart.
     *
     * @param title chart title
     * @param subtitle subtitle (e.g. the count and the range), or null
     * @param valueLabel x-axis label with unit
     * @param lower lower edge of the first bin
     * @param upper upper edge of the last bin
     * @param counts counts per bin (not modified)
     * @return the styled chart
     */
    public static JFreeChart chart(String title, String subtitle, String valueLabel, double lower, double upper,
            long[] counts) {
        int n = counts.length;
        double hi = upper > lower ? upper : lower + 1;
        double w = (hi - lower) / n;
        double[][] data = new double[6][n];
        for (int i = 0; i < n; i++) {
            double x0 = lower + i * w;
            data[0][i] = x0 + w / 2;
            data[1][i] = x0;
            data[2][i] = x0 + w;
            data[3][i] = counts[i];
            data[4][i] = counts[i];
            data[5][i] = counts[i];
        }
        DefaultIntervalXYDataset ds = new DefaultIntervalXYDataset();
        ds.addSeries("voxels", data);
        XYBarRenderer r = new XYBarRenderer(0.0);
        r.setBarPainter(new StandardXYBarPainter());
        r.setShadowVisible(false);
        r.setDrawBarOutline(false);
        r.setSeriesPaint(0, ChartStyle.color(0));
        NumberAxis x = new NumberAxis(valueLabel);
        x.setRange(lower, hi);
        NumberAxis y = new NumberAxis("voxels");
        y.setAutoRangeIncludesZero(true);
        XYPlot plot = new XYPlot(ds, x, y, r);
        JFreeChart chart = new JFreeChart(title, new Font(Font.SANS_SERIF, Font.BOLD, 14), plot, false);
        if (subtitle != null) {
            chart.addSubtitle(new TextTitle(subtitle));
        }
        return ChartStyle.apply(chart);
    }
}

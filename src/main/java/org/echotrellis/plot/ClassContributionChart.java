package org.echotrellis.plot;

import java.awt.Color;
import java.awt.geom.Ellipse2D;
import org.echotrellis.pathway.ClassDecomposition;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.DatasetRenderingOrder;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.StackedXYBarRenderer;
import org.jfree.chart.renderer.xy.StandardXYBarPainter;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.title.TextTitle;
import org.jfree.data.xy.CategoryTableXYDataset;
import org.jfree.data.xy.DefaultXYDataset;

/**
 * Stacked bars of the class contributions of every echo (m = 0 spin-echo pathways, m = 1, m = 2,
 * m &ge; 3 stimulated pathways), each projected on the echo's own phase so that the bars add up to
 * the echo magnitude, with the echo magnitude drawn over them as a line. A class that interferes
 * destructively shows as a bar below zero.
 */
public final class ClassContributionChart {
    private static final String[] NAMES = {"m = 0 (spin echo)", "m = 1", "m = 2", "m ≥ 3"};
    private static final Color[] COLORS = {ChartStyle.color(0), ChartStyle.color(1), ChartStyle.color(4),
        ChartStyle.color(3)};

    private ClassContributionChart() { }

    /**
     * @param title chart title
     * @param subtitle subtitle (may be null)
     * @param d the class decomposition
     * @return the styled chart
     */
    public static JFreeChart create(String title, String subtitle, ClassDecomposition d) {
        CategoryTableXYDataset bars = new CategoryTableXYDataset();
        int n = d.echoCount();
        double[] x = new double[n];
        double[] total = new double[n];
        for (int e = 0; e < n; e++) {
            x[e] = e + 1;
            total[e] = d.magnitude(e);
            for (int g = 0; g < NAMES.length; g++) {
                int to = g == NAMES.length - 1 ? Integer.MAX_VALUE : g;
                bars.add(x[e], d.projected(e, g, to), NAMES[g], false);
            }
        }
        bars.setIntervalWidth(0.72);
        StackedXYBarRenderer br = new StackedXYBarRenderer(0.0);
        br.setBarPainter(new StandardXYBarPainter());
        br.setShadowVisible(false);
        br.setDrawBarOutline(false);
        for (int g = 0; g < NAMES.length; g++) {
            br.setSeriesPaint(g, COLORS[g]);
        }
        NumberAxis xa = new NumberAxis("Echo number");
        xa.setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        xa.setRange(0.4, n + 0.6);
        NumberAxis ya = new NumberAxis("Contribution to the echo (fraction of M0)");
        XYPlot plot = new XYPlot(bars, xa, ya, br);
        DefaultXYDataset line = new DefaultXYDataset();
        line.addSeries("echo magnitude |A|", new double[][] {x, total});
        XYLineAndShapeRenderer lr = new XYLineAndShapeRenderer(true, true);
        lr.setSeriesPaint(0, ChartStyle.INK);
        lr.setSeriesStroke(0, ChartStyle.line(1.8f));
        lr.setSeriesShape(0, new Ellipse2D.Double(-3, -3, 6, 6));
        plot.setRenderer(1, lr);
        plot.setDataset(1, line);
        plot.setDatasetRenderingOrder(DatasetRenderingOrder.FORWARD);
        JFreeChart chart = new JFreeChart(title, ChartStyle.TITLE_FONT, plot, true);
        if (subtitle != null) {
            chart.addSubtitle(new TextTitle(subtitle));
        }
        return ChartStyle.apply(chart);
    }
}

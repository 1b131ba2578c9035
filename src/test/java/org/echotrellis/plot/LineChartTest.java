package org.echotrellis.plot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;

import java.awt.BasicStroke;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.data.xy.XYDataset;
import org.junit.jupiter.api.Test;

class LineChartTest {

    /** Two series with the same name are both drawn, each with its own look (none silently replaced). */
    @Test
    void seriesWithTheSameNameAreKeptApart() {
        double[] x = {0, 1, 2};
        JFreeChart c = LineChart.create("t", "x (ms)", "y")
                .add("EPG, B1 = 1.00", x, new double[] {1, 0.9, 0.8}, LineChart.Look.LINE_MARKERS, 0)
                .add("EPG, B1 = 1.00", x, new double[] {1, 0.8, 0.6}, LineChart.Look.LINE_MARKERS, 1)
                .add("ideal", x, new double[] {1, 0.7, 0.5}, LineChart.Look.DASHED, 5)
                .build();
        XYPlot plot = c.getXYPlot();
        XYDataset d = plot.getDataset();
        assertEquals(3, d.getSeriesCount());
        assertNotEquals(d.getSeriesKey(0), d.getSeriesKey(1));
        assertEquals(0.6, d.getYValue(1, 2), 0);
        assertEquals(0.5, d.getYValue(2, 2), 0);
        XYLineAndShapeRenderer r = (XYLineAndShapeRenderer) plot.getRenderer();
        assertFalse(r.getSeriesShapesVisible(2), "the dashed series has no markers");
        assertEquals(ChartStyle.color(5), r.getSeriesPaint(2));
        assertFalse(((BasicStroke) r.getSeriesStroke(2)).getDashArray() == null, "series 2 is dashed");
    }
}

package org.echotrellis.plot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNotEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

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

    /**
     * A dashed curve of many samples is one SVG path with one dash pattern (a path per segment would
     * restart the pattern at every sample and draw the curve solid).
     */
    @Test
    void aDashedCurveIsOnePath() {
        int n = 400;
        double[] x = new double[n];
        double[] y = new double[n];
        for (int i = 0; i < n; i++) {
            x[i] = i;
            y[i] = Math.exp(-i / 100.0);
        }
        String svg = ChartFiles.svg(LineChart.create("t", "time (ms)", "y")
                .add("ideal", x, y, LineChart.Look.DASHED, LineChart.INK).build(), 600, 400);
        int elements = svg.split("<path", -1).length + svg.split("<line", -1).length - 2;
        // grid lines, ticks and frame take a few dozen elements; one per segment would be ≥ 399
        assertTrue(elements < 120, "drawn elements: " + elements);
        assertTrue(svg.contains("stroke-dasharray:6,4"), "the curve is dashed");
        assertTrue(svg.contains("Time (ms)"), "axis label in sentence case");
    }

    /** Plain lines of different colours also differ in dash pattern, and markers differ by series. */
    @Test
    void seriesDifferByMoreThanColour() {
        double[] x = {1, 2, 3};
        JFreeChart c = LineChart.create("t", "x", "y")
                .add("a", x, x, LineChart.Look.LINE).add("b", x, x, LineChart.Look.LINE)
                .add("c", x, x, LineChart.Look.LINE_MARKERS).add("d", x, x, LineChart.Look.LINE_MARKERS).build();
        XYLineAndShapeRenderer r = (XYLineAndShapeRenderer) c.getXYPlot().getRenderer();
        assertNotEquals(java.util.Arrays.toString(((BasicStroke) r.getSeriesStroke(0)).getDashArray()),
                java.util.Arrays.toString(((BasicStroke) r.getSeriesStroke(1)).getDashArray()));
        assertNotEquals(r.getSeriesShape(2).getBounds2D().toString() + r.getSeriesShape(2).getClass(),
                r.getSeriesShape(3).getBounds2D().toString() + r.getSeriesShape(3).getClass());
        assertTrue(r.getDrawSeriesLineAsPath());
    }
}

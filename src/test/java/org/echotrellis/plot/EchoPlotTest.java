package org.echotrellis.plot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotEquals;

import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYItemRenderer;
import org.junit.jupiter.api.Test;

class EchoPlotTest {

    /** However many trains are drawn, none takes the colour of the ideal curve. */
    @Test
    void trainsNeverShareTheIdealCurveColour() {
        EchoPlot p = EchoPlot.create("t");
        int trains = 9;
        for (int i = 0; i < trains; i++) {
            p.series("train " + i, new double[] {10, 20}, new double[] {0.9 - 0.01 * i, 0.8});
        }
        XYPlot plot = p.ideal(40, 1, 20).build().getXYPlot();
        XYItemRenderer r = plot.getRenderer();
        assertEquals(trains + 1, plot.getDataset().getSeriesCount());
        for (int i = 0; i < trains; i++) {
            assertNotEquals(r.getSeriesPaint(trains), r.getSeriesPaint(i), "train " + i);
        }
    }
}

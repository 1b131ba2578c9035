package org.echotrellis.plot;

import java.awt.BasicStroke;
import java.awt.Color;
import java.awt.Font;
import java.awt.geom.Ellipse2D;
import java.awt.geom.Line2D;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.HashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.echotrellis.pathway.PhaseGraph;
import org.jfree.chart.JFreeChart;
import org.jfree.chart.LegendItem;
import org.jfree.chart.LegendItemCollection;
import org.jfree.chart.annotations.XYLineAnnotation;
import org.jfree.chart.annotations.XYTextAnnotation;
import org.jfree.chart.axis.NumberAxis;
import org.jfree.chart.plot.ValueMarker;
import org.jfree.chart.plot.XYPlot;
import org.jfree.chart.renderer.xy.XYLineAndShapeRenderer;
import org.jfree.chart.title.TextTitle;
import org.jfree.chart.ui.Layer;
import org.jfree.chart.ui.TextAnchor;
import org.jfree.data.xy.DefaultXYDataset;

/**
 * The phase-graph diagram: dephasing order against time. Transverse states are solid lines rising
 * (or falling) by their dephasing step over each interval, longitudinal states dashed horizontal
 * lines; line width and opacity are proportional to the state's magnitude relative to the largest
 * state of the same interval (so relaxation does not wash out the later echoes and weak pathways
 * fade out), or, on the logarithmic scale, grow from the tracing threshold to M0. RF pulses are thin vertical rules
 * (labelled with their flip when there are few), echoes are dots on the k = 0 axis.
 */
public final class PhaseGraphDiagram {
    private static final Color TRANSVERSE = ChartStyle.color(0);
    private static final Color LONGITUDINAL = ChartStyle.color(1);
    private static final Color ECHO = ChartStyle.color(6);
    private static final Color PULSE = new Color(0xB5B1A6);
    /** Most pulses that still get a flip label. */
    private static final int MAX_LABELLED_PULSES = 20;

    private PhaseGraphDiagram() { }

    /** How line strength follows the state magnitude. */
    public enum Scale {
        /** Width and opacity proportional to |state| over the largest |state| of the same interval. */
        LINEAR,
        /** Width and opacity logarithmic from the tracing threshold (faint) to M0 (full). */
        LOG
    }

    /**
     * @param title chart title
     * @param subtitle subtitle line (may be null)
     * @param g the traced states
     * @return the styled chart, line strength proportional to magnitude
     */
    public static JFreeChart create(String title, String subtitle, PhaseGraph g) {
        return create(title, subtitle, g, Scale.LINEAR);
    }

    /**
     * @param title chart title
     * @param subtitle subtitle line (may be null)
     * @param g the traced states
     * @param scale how line strength follows magnitude
     * @return the styled chart
     */
    public static JFreeChart create(String title, String subtitle, PhaseGraph g, Scale scale) {
        NumberAxis x = new NumberAxis("Time (ms)");
        NumberAxis y = new NumberAxis("Dephasing order k");
        y.setStandardTickUnits(NumberAxis.createIntegerTickUnits());
        double tEnd = 1;
        int kMax = 1;
        for (PhaseGraph.Segment s : g.segments()) {
            tEnd = Math.max(tEnd, s.endMs());
            kMax = Math.max(kMax, Math.max(Math.abs(s.startOrder()), Math.abs(s.endOrder())));
        }
        for (PhaseGraph.EchoMark e : g.echoes()) {
            tEnd = Math.max(tEnd, e.timeMs());
        }
        x.setRange(0, tEnd * 1.02);
        boolean label = g.pulses().size() <= MAX_LABELLED_PULSES;
        y.setRange(-kMax - 0.8, kMax + (label ? 1.6 : 0.8));
        // the echoes are the only dataset (dots on k = 0); the states are drawn as annotations
        DefaultXYDataset echoes = new DefaultXYDataset();
        double[][] at = new double[2][g.echoes().size()];
        for (int i = 0; i < at[0].length; i++) {
            at[0][i] = g.echoes().get(i).timeMs();
        }
        echoes.addSeries("echo", at);
        XYLineAndShapeRenderer dots = new XYLineAndShapeRenderer(false, true);
        dots.setSeriesPaint(0, ECHO);
        double r = g.echoes().size() > 20 ? 3 : 4;
        dots.setSeriesShape(0, new Ellipse2D.Double(-r, -r, 2 * r, 2 * r));
        XYPlot plot = new XYPlot(echoes, x, y, dots);
        double floor = g.threshold() > 0 ? g.threshold() : 1e-4;
        Map<Double, Double> largest = new HashMap<>();
        for (PhaseGraph.Segment s : g.segments()) {
            largest.merge(s.startMs(), s.magnitude(), Math::max);
        }
        List<PhaseGraph.Segment> order = new ArrayList<>(g.segments());
        order.sort(Comparator.comparingDouble(PhaseGraph.Segment::magnitude));
        for (PhaseGraph.Segment s : order) {
            double w = scale == Scale.LOG ? strength(s.magnitude(), floor) : s.magnitude() / largest.get(s.startMs());
            Color base = s.longitudinal() ? LONGITUDINAL : TRANSVERSE;
            Color c = new Color(base.getRed(), base.getGreen(), base.getBlue(), (int) Math.round(25 + 230 * w));
            float width = (float) (0.4 + 3.2 * w);
            BasicStroke stroke = s.longitudinal() ? ChartStyle.dashed(width) : ChartStyle.line(width);
            dots.addAnnotation(new XYLineAnnotation(s.startMs(), s.startOrder(), s.endMs(), s.endOrder(), stroke, c),
                    Layer.BACKGROUND);
        }
        for (PhaseGraph.Pulse p : g.pulses()) {
            ValueMarker m = new ValueMarker(p.timeMs(), PULSE, new BasicStroke(0.7f));
            plot.addDomainMarker(m);
            if (label) {
                XYTextAnnotation t = new XYTextAnnotation(String.format(Locale.ROOT, " %.0f°", p.flipDeg()), p.timeMs(),
                        kMax + 0.5);
                t.setFont(new Font(Font.SANS_SERIF, Font.PLAIN, 10));
                t.setPaint(ChartStyle.INK);
                t.setTextAnchor(TextAnchor.BOTTOM_LEFT);
                plot.addAnnotation(t, false);
            }
        }
        plot.setFixedLegendItems(legend());
        JFreeChart chart = new JFreeChart(title, ChartStyle.TITLE_FONT, plot, true);
        if (subtitle != null) {
            chart.addSubtitle(new TextTitle(subtitle));
        }
        return ChartStyle.apply(chart);
    }

    /** 0 at the threshold, 1 at M0, logarithmic in between. */
    static double strength(double magnitude, double floor) {
        double v = Math.log10(magnitude / floor) / Math.log10(1 / floor);
        return Math.max(0, Math.min(1, v));
    }

    private static LegendItemCollection legend() {
        LegendItemCollection items = new LegendItemCollection();
        Line2D line = new Line2D.Double(-8, 0, 8, 0);
        LegendItem f = new LegendItem("transverse F(k)", null, null, null, line, ChartStyle.line(2f), TRANSVERSE);
        LegendItem z = new LegendItem("longitudinal Z(k)", null, null, null, line, ChartStyle.dashed(2f), LONGITUDINAL);
        LegendItem e = new LegendItem("echo", null, null, null, new Ellipse2D.Double(-4, -4, 8, 8), ECHO);
        LegendItem p = new LegendItem("RF pulse", null, null, null, new Line2D.Double(0, -7, 0, 7), new BasicStroke(1f), PULSE);
        items.add(f);
        items.add(z);
        items.add(e);
        items.add(p);
        return items;
    }
}

package org.echotrellis.plot;

import org.echotrellis.sequence.EchoTrain;
import org.jfree.chart.JFreeChart;

/**
 * Echo amplitude against echo time: one or more EPG-predicted trains (markers joined by lines) and,
 * optionally, the ideal exp(&minus;TE/T2) curve a perfect 180&deg; train would give (dashed).
 */
public final class EchoPlot {
    private final LineChart chart;
    private int count;

    private EchoPlot(String title) {
        chart = LineChart.create(title, "Echo time (ms)", "Echo amplitude (fraction of M0)").xFromZero();
    }

    /**
     * @param title chart title
     * @return a new echo plot with the given title
     */
    public static EchoPlot create(String title) {
        return new EchoPlot(title);
    }

    /**
     * Adds a predicted train (magnitudes).
     *
     * @param name legend entry
     * @param train the predicted train; its echo times in ms and magnitudes are drawn
     * @return this plot
     */
    public EchoPlot train(String name, EchoTrain train) {
        chart.add(name, train.timesMs(), train.magnitudes(), LineChart.Look.LINE_MARKERS, nextColor());
        return this;
    }

    /**
     * Adds a series of magnitudes at given times.
     *
     * @param name legend entry
     * @param timesMs echo times in ms
     * @param values magnitudes as fractions of M0, one per time
     * @return this plot
     */
    public EchoPlot series(String name, double[] timesMs, double[] values) {
        chart.add(name, timesMs, values, LineChart.Look.LINE_MARKERS, nextColor());
        return this;
    }

    /**
     * Adds the ideal curve scale&middot;exp(&minus;t/T2) sampled finely from 0 to the last time.
     *
     * @param t2Ms T2 in ms
     * @param scale amplitude at t = 0 (sin of the excitation flip)
     * @param lastMs end of the curve in ms
     * @return this
     */
    public EchoPlot ideal(double t2Ms, double scale, double lastMs) {
        int m = 200;
        double[] t = new double[m + 1];
        double[] y = new double[m + 1];
        for (int i = 0; i <= m; i++) {
            t[i] = lastMs * i / m;
            y[i] = scale * Math.exp(-t[i] / t2Ms);
        }
        chart.add("ideal exp(-TE/T2), T2 = " + fmt(t2Ms) + " ms", t, y, LineChart.Look.DASHED, LineChart.INK);
        return this;
    }

    /**
     * Adds a subtitle.
     *
     * @param s the subtitle, e.g. the protocol and tissue
     * @return this plot
     */
    public EchoPlot subtitle(String s) {
        chart.subtitle(s);
        return this;
    }

    /** @return the styled chart */
    public JFreeChart build() {
        return chart.build();
    }

    /** The next palette colour (and marker) for a train; the ideal curve is drawn in ink. */
    private int nextColor() {
        return count++;
    }

    private static String fmt(double v) {
        return Double.isInfinite(v) ? "inf" : (v == Math.rint(v) ? Long.toString((long) v) : String.format(java.util.Locale.ROOT, "%.1f", v));
    }
}

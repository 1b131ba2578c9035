package org.echotrellis.plot;

import java.awt.Color;
import java.awt.Paint;

import org.jfree.chart.renderer.PaintScale;

/**
 * A continuous colour scale of our own for parameter maps: near-black indigo through teal and
 * green to a pale yellow, monotone in lightness so that a grey-scale print keeps the order.
 * Values below the range take the first colour, above it the last; NaN is transparent.
 */
public final class MapPalette implements PaintScale {
    private static final float[][] STOPS = {
        {0.00f, 0.07f, 0.04f, 0.16f},
        {0.25f, 0.20f, 0.18f, 0.50f},
        {0.50f, 0.10f, 0.50f, 0.55f},
        {0.75f, 0.45f, 0.75f, 0.35f},
        {1.00f, 0.98f, 0.95f, 0.55f},
    };

    private final double lower;
    private final double upper;

    /**
     * @param lower value mapped to the first colour
     * @param upper value mapped to the last colour (&gt; lower; otherwise the range is widened)
     */
    public MapPalette(double lower, double upper) {
        this.lower = lower;
        // an empty range is widened by 1, or relatively where adding 1 would not change the value
        this.upper = upper > lower ? upper : lower + Math.max(1, Math.abs(lower) * 1e-6);
    }

    @Override
    public double getLowerBound() {
        return lower;
    }

    @Override
    public double getUpperBound() {
        return upper;
    }

    @Override
    public Paint getPaint(double value) {
        if (Double.isNaN(value)) {
            return new Color(0, 0, 0, 0);
        }
        double t = Math.max(0, Math.min(1, (value - lower) / (upper - lower)));
        for (int i = 1; i < STOPS.length; i++) {
            if (t <= STOPS[i][0]) {
                float[] a = STOPS[i - 1];
                float[] b = STOPS[i];
                float f = (float) ((t - a[0]) / (b[0] - a[0]));
                return new Color(a[1] + f * (b[1] - a[1]), a[2] + f * (b[2] - a[2]), a[3] + f * (b[3] - a[3]));
            }
        }
        float[] e = STOPS[STOPS.length - 1];
        return new Color(e[1], e[2], e[3]);
    }
}

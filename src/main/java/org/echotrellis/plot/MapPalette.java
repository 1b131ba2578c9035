package org.echotrellis.plot;

import java.awt.Color;
import java.awt.Paint;

import org.jfree.chart.renderer.PaintScale;

/**
 * The project's sequential colour scale for parameter maps: deep blue-teal through steel blue,
 * mauve and shell pink to a warm white. It is laid out in CIELAB (CIE 15:2004): lightness L* rises
 * linearly from 25 to 95, so the order survives grey-scale printing and every form of colour-vision
 * deficiency (which mostly removes hue contrast, not lightness contrast), and chroma stays moderate
 * (≤ 34) so no band looks like an edge. The darkest colour (L* 25, blue-teal) stays well apart from
 * the black of the plot background and of voxels outside the mask, which are drawn black.
 *
 * <p>Control points (L*, C*, hue°): (25, 17, 228), (43, 30, 258), (62, 34, 318), (80, 24, 15),
 * (95, 8, 70); the colour between them is interpolated linearly in L*a*b* and converted to sRGB
 * (IEC 61966-2-1) with the D65 white point. {@code PaletteTest} checks the lightness order with its
 * own colour conversion. Values below the range take the first colour, above it the last; NaN is
 * transparent.
 */
final class MapPalette implements PaintScale {
    private static final double[][] LCH = {{25, 17, 228}, {43, 30, 258}, {62, 34, 318}, {80, 24, 15}, {95, 8, 70}};
    private static final int LEVELS = 512;
    private static final Color[] TABLE = table();

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
        return colorAt((value - lower) / (upper - lower));
    }

    /**
     * @param t position along the scale, clamped to [0, 1]
     * @return the colour there
     */
    public static Color colorAt(double t) {
        double c = Math.max(0, Math.min(1, t));
        return TABLE[(int) Math.round(c * (LEVELS - 1))];
    }

    private static Color[] table() {
        Color[] t = new Color[LEVELS];
        int segments = LCH.length - 1;
        for (int i = 0; i < LEVELS; i++) {
            double u = (double) i / (LEVELS - 1) * segments;
            int k = Math.min((int) u, segments - 1);
            double f = u - k;
            double[] a = lab(LCH[k]);
            double[] b = lab(LCH[k + 1]);
            t[i] = srgb(a[0] + f * (b[0] - a[0]), a[1] + f * (b[1] - a[1]), a[2] + f * (b[2] - a[2]));
        }
        return t;
    }

    private static double[] lab(double[] lch) {
        double h = Math.toRadians(lch[2]);
        return new double[] {lch[0], lch[1] * Math.cos(h), lch[1] * Math.sin(h)};
    }

    /** CIELAB (D65) → sRGB, clamped to the gamut (the control points are chosen inside it). */
    private static Color srgb(double l, double a, double b) {
        double fy = (l + 16) / 116;
        double x = 0.95047 * finv(fy + a / 500);
        double y = finv(fy);
        double z = 1.08883 * finv(fy - b / 200);
        double r = 3.2404542 * x - 1.5371385 * y - 0.4985314 * z;
        double g = -0.9692660 * x + 1.8760108 * y + 0.0415560 * z;
        double bl = 0.0556434 * x - 0.2040259 * y + 1.0572252 * z;
        return new Color(gamma(r), gamma(g), gamma(bl));
    }

    private static double finv(double f) {
        double d = 6.0 / 29;
        return f > d ? f * f * f : 3 * d * d * (f - 4.0 / 29);
    }

    private static int gamma(double c) {
        double v = Math.max(0, Math.min(1, c));
        double s = v <= 0.0031308 ? 12.92 * v : 1.055 * Math.pow(v, 1 / 2.4) - 0.055;
        return (int) Math.round(255 * s);
    }
}

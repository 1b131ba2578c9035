package org.echotrellis.plot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.Color;
import org.junit.jupiter.api.Test;

/**
 * Colour checks of the plot style, with a colour pipeline written here independently of the
 * palette code: sRGB → linear RGB (IEC 61966-2-1), → XYZ (D65) → CIELAB (CIE 15:2004), colour
 * differences by CIEDE2000 (CIE 142-2001; formula and test data as given by G. Sharma, W. Wu and
 * E. N. Dalal, "The CIEDE2000 color-difference formula: implementation notes, supplementary test
 * data, and mathematical observations", Color Res Appl 30:21, 2005), and colour-vision deficiency
 * simulated with the severity-1.0 matrices of G. M. Machado, M. M. Oliveira and L. A. F. Fernandes,
 * "A physiologically-based model for simulation of color vision deficiency", IEEE TVCG 15:1291
 * (2009), applied to linear RGB (matrix values from memory of the paper's table).
 */
class PaletteTest {
    private static final double[][] PROTANOPIA = {
        {0.152286, 1.052583, -0.204868}, {0.114503, 0.786281, 0.099216}, {-0.003882, -0.048116, 1.051998}};
    private static final double[][] DEUTERANOPIA = {
        {0.367322, 0.860646, -0.227968}, {0.280085, 0.672501, 0.047413}, {-0.011820, 0.042940, 0.968881}};
    private static final double[][] TRITANOPIA = {
        {1.255528, -0.076749, -0.178779}, {-0.078411, 0.930809, 0.147602}, {0.004733, 0.691367, 0.303900}};

    @Test
    void ciede2000ReproducesSharmasTestPairs() {
        // Sharma, Wu & Dalal (2005), Table 1, pairs 1-3 and 7 (from memory)
        assertEquals(2.0425, de2000(new double[] {50, 2.6772, -79.7751}, new double[] {50, 0, -82.7485}), 1e-4);
        assertEquals(2.8615, de2000(new double[] {50, 3.1571, -77.2803}, new double[] {50, 0, -82.7485}), 1e-4);
        assertEquals(3.4412, de2000(new double[] {50, 2.8361, -74.0200}, new double[] {50, 0, -82.7485}), 1e-4);
        assertEquals(0.0, de2000(new double[] {50, 0, 0}, new double[] {50, 0, 0}), 1e-12);
    }

    @Test
    void neighbouringSeriesColoursStayApartUnderColourVisionDeficiency() {
        Color[] c = ChartStyle.seriesColors();
        double[][][] sims = {null, PROTANOPIA, DEUTERANOPIA, TRITANOPIA};
        String[] names = {"normal vision", "protanopia", "deuteranopia", "tritanopia"};
        // 20 CIEDE2000 units: clearly different at a glance (common practice treats ~2 as just noticeable);
        // tritanopia is rare and also covered by the marker shapes, so it gets a lower floor
        double[] floor = {20, 20, 20, 12};
        for (int s = 0; s < sims.length; s++) {
            for (int i = 0; i < c.length; i++) {
                Color a = c[i];
                Color b = c[(i + 1) % c.length];
                double d = de2000(lab(a, sims[s]), lab(b, sims[s]));
                assertTrue(d >= floor[s], names[s] + ": colours " + i + " and " + (i + 1) % c.length
                        + " differ by only " + d);
            }
        }
    }

    @Test
    void markersDifferForEveryPaletteColour() {
        for (int i = 0; i < ChartStyle.SERIES_COLOR_COUNT; i++) {
            for (int j = i + 1; j < ChartStyle.SERIES_COLOR_COUNT; j++) {
                assertTrue(!ChartStyle.marker(i).getBounds2D().equals(ChartStyle.marker(j).getBounds2D())
                        || !java.util.Arrays.equals(outline(ChartStyle.marker(i)), outline(ChartStyle.marker(j))),
                        "markers " + i + " and " + j);
            }
        }
    }

    @Test
    void sequentialMapRisesInLightnessAndItsLowEndStandsOffBlack() {
        double prev = Double.NEGATIVE_INFINITY;
        for (int i = 0; i <= 200; i++) {
            Color col = MapPalette.colorAt(i / 200.0);
            for (double[][] sim : new double[][][] {null, PROTANOPIA, DEUTERANOPIA}) {
                double l = lab(col, sim)[0];
                if (sim == null) {
                    assertTrue(l > prev, "L* must rise at step " + i + ": " + l + " after " + prev);
                    prev = l;
                }
            }
        }
        double[] black = {0, 0, 0};
        for (double[][] sim : new double[][][] {null, PROTANOPIA, DEUTERANOPIA}) {
            // the darkest map colour against the black background and outside-mask voxels
            assertTrue(de2000(lab(MapPalette.colorAt(0), sim), black) > 15);
        }
        // lightness spans most of the scale, so a grey-scale print keeps the order readable
        assertTrue(lab(MapPalette.colorAt(1), null)[0] - lab(MapPalette.colorAt(0), null)[0] > 60);
    }

    @Test
    void sequentialMapKeepsItsOrderUnderColourVisionDeficiency() {
        for (double[][] sim : new double[][][] {PROTANOPIA, DEUTERANOPIA}) {
            double prev = Double.NEGATIVE_INFINITY;
            for (int i = 0; i <= 20; i++) {
                double l = lab(MapPalette.colorAt(i / 20.0), sim)[0];
                assertTrue(l > prev, "simulated L* must rise at " + i);
                prev = l;
            }
        }
    }

    private static double[] outline(java.awt.Shape s) {
        java.awt.geom.PathIterator it = s.getPathIterator(null);
        java.util.List<Double> v = new java.util.ArrayList<>();
        double[] p = new double[6];
        while (!it.isDone()) {
            int type = it.currentSegment(p);
            v.add((double) type);
            v.add(Math.rint(p[0] * 100));
            v.add(Math.rint(p[1] * 100));
            it.next();
        }
        return v.stream().mapToDouble(Double::doubleValue).toArray();
    }

    /** sRGB colour (optionally passed through a CVD matrix in linear RGB) → CIELAB, D65. */
    static double[] lab(Color c, double[][] sim) {
        double[] rgb = {lin(c.getRed()), lin(c.getGreen()), lin(c.getBlue())};
        if (sim != null) {
            double[] o = new double[3];
            for (int i = 0; i < 3; i++) {
                o[i] = Math.max(0, Math.min(1, sim[i][0] * rgb[0] + sim[i][1] * rgb[1] + sim[i][2] * rgb[2]));
            }
            rgb = o;
        }
        // IEC 61966-2-1 sRGB → XYZ matrix, D65 white (0.95047, 1, 1.08883)
        double x = (0.4124564 * rgb[0] + 0.3575761 * rgb[1] + 0.1804375 * rgb[2]) / 0.95047;
        double y = 0.2126729 * rgb[0] + 0.7151522 * rgb[1] + 0.0721750 * rgb[2];
        double z = (0.0193339 * rgb[0] + 0.1191920 * rgb[1] + 0.9503041 * rgb[2]) / 1.08883;
        return new double[] {116 * f(y) - 16, 500 * (f(x) - f(y)), 200 * (f(y) - f(z))};
    }

    private static double lin(int v) {
        double c = v / 255.0;
        return c <= 0.04045 ? c / 12.92 : Math.pow((c + 0.055) / 1.055, 2.4);
    }

    private static double f(double t) {
        double d = 6.0 / 29;
        return t > d * d * d ? Math.cbrt(t) : t / (3 * d * d) + 4.0 / 29;
    }

    /** CIEDE2000 colour difference (kL = kC = kH = 1). */
    static double de2000(double[] p, double[] q) {
        double c1 = Math.hypot(p[1], p[2]);
        double c2 = Math.hypot(q[1], q[2]);
        double cb = (c1 + c2) / 2;
        double g = 0.5 * (1 - Math.sqrt(Math.pow(cb, 7) / (Math.pow(cb, 7) + Math.pow(25, 7))));
        double a1 = (1 + g) * p[1];
        double a2 = (1 + g) * q[1];
        double c1p = Math.hypot(a1, p[2]);
        double c2p = Math.hypot(a2, q[2]);
        double h1 = hue(p[2], a1);
        double h2 = hue(q[2], a2);
        double dl = q[0] - p[0];
        double dc = c2p - c1p;
        double dh = 0;
        if (c1p * c2p != 0) {
            dh = h2 - h1;
            if (dh > 180) {
                dh -= 360;
            } else if (dh < -180) {
                dh += 360;
            }
        }
        double dhh = 2 * Math.sqrt(c1p * c2p) * Math.sin(Math.toRadians(dh / 2));
        double lb = (p[0] + q[0]) / 2;
        double cbp = (c1p + c2p) / 2;
        double hb;
        if (c1p * c2p == 0) {
            hb = h1 + h2;
        } else if (Math.abs(h1 - h2) <= 180) {
            hb = (h1 + h2) / 2;
        } else {
            hb = h1 + h2 < 360 ? (h1 + h2 + 360) / 2 : (h1 + h2 - 360) / 2;
        }
        double t = 1 - 0.17 * cos(hb - 30) + 0.24 * cos(2 * hb) + 0.32 * cos(3 * hb + 6) - 0.20 * cos(4 * hb - 63);
        double dTheta = 30 * Math.exp(-Math.pow((hb - 275) / 25, 2));
        double rc = 2 * Math.sqrt(Math.pow(cbp, 7) / (Math.pow(cbp, 7) + Math.pow(25, 7)));
        double sl = 1 + 0.015 * (lb - 50) * (lb - 50) / Math.sqrt(20 + (lb - 50) * (lb - 50));
        double sc = 1 + 0.045 * cbp;
        double sh = 1 + 0.015 * cbp * t;
        double rt = -Math.sin(Math.toRadians(2 * dTheta)) * rc;
        return Math.sqrt(Math.pow(dl / sl, 2) + Math.pow(dc / sc, 2) + Math.pow(dhh / sh, 2)
                + rt * (dc / sc) * (dhh / sh));
    }

    private static double hue(double b, double a) {
        double h = Math.toDegrees(Math.atan2(b, a));
        return h < 0 ? h + 360 : h;
    }

    private static double cos(double deg) {
        return Math.cos(Math.toRadians(deg));
    }
}

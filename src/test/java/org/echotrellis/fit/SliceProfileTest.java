package org.echotrellis.fit;

import org.echotrellis.sequence.PulseShape;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.junit.jupiter.api.Test;

class SliceProfileTest {

    @Test
    void rectangularPulseMatchesTheRotatingFrameSolution() {
        // Hard pulse of duration 1 with on-resonance flip a and offset f: rotation by
        // phi = sqrt(a^2 + (2 pi f)^2) about a tilted axis, so |b| = (a/phi) sin(phi/2)
        // (Bloch equations in the rotating frame; common practice).
        double[] rect = new double[64];
        java.util.Arrays.fill(rect, 1);
        PulseShape shape = new PulseShape("rect", rect);
        for (double deg : new double[] {30, 90, 180}) {
            double a = Math.toRadians(deg);
            for (double f : new double[] {0, 0.3, 1.1, 2.5}) {
                double phi = Math.hypot(a, 2 * Math.PI * f);
                double want = 2 * Math.asin(Math.abs(a / phi * Math.sin(phi / 2)));
                assertEquals(want, BlochProfile.effectiveFlip(shape, a, f), 1e-9, deg + "° at " + f);
            }
        }
    }

    @Test
    void smallTipProfileIsTheFourierTransformOfTheEnvelope() {
        // Small-tip approximation (Pauly, Nishimura & Macovski, J Magn Reson 81:43, 1989):
        // flip(f) ≈ a |FT b(f)| / FT b(0); for a windowed sinc of TBW 4 the FWHM is ≈ TBW cycles.
        PulseShape s = PulseShape.sinc(4);
        double[] b = s.samples();
        double a = Math.toRadians(5);
        for (double f : new double[] {0, 0.8, 1.6, 2.4, 3.5}) {
            double re = 0;
            double im = 0;
            double dc = 0;
            for (int i = 0; i < b.length; i++) {
                double t = (i + 0.5) / b.length;
                re += b[i] * Math.cos(2 * Math.PI * f * t);
                im += b[i] * Math.sin(2 * Math.PI * f * t);
                dc += b[i];
            }
            // the small-tip error grows as a^2; at 5° it stays below 0.1 % of a
            assertEquals(a * Math.hypot(re, im) / dc, BlochProfile.effectiveFlip(s, a, f), 1e-3 * a, "f = " + f);
        }
        double fwhm = BlochProfile.excitationFwhm(s, Math.toRadians(90));
        assertTrue(fwhm > 3.2 && fwhm < 4.8, "FWHM " + fwhm);
    }

    @Test
    void gaussianShapeHasItsTimeBandwidthProduct() {
        // Fourier pair of a Gaussian (common practice): exp(-t^2/2s^2) has spectral FWHM
        // sqrt(2 ln 2)/(pi s); at a small tip the excitation FWHM is the spectral FWHM.
        for (double tbw : new double[] {2, 4}) {
            double fwhm = BlochProfile.excitationFwhm(PulseShape.gauss(tbw), Math.toRadians(5));
            assertEquals(tbw, fwhm, 0.03 * tbw, "gauss:" + tbw);
        }
    }

    @Test
    void pulseFileIsReadAndCheckedLineByLine(@org.junit.jupiter.api.io.TempDir java.nio.file.Path dir)
            throws java.io.IOException {
        java.nio.file.Path f = dir.resolve("rect.txt");
        java.nio.file.Files.writeString(f, "# a hard pulse\n" + "2\n".repeat(40));
        PulseShape shape = PulseShape.fromFile(f, "--slice-profile");
        assertEquals(40, shape.samples().length);
        assertEquals(1.0, shape.samples()[7], 0.0);  // normalised to peak 1
        double a = Math.PI;
        double phi = Math.hypot(a, 2 * Math.PI * 0.4);
        assertEquals(2 * Math.asin(a / phi * Math.sin(phi / 2)), BlochProfile.effectiveFlip(shape, a, 0.4), 1e-9);
        SliceProfile p = SliceProfiles.parse(f.toString(), CpmgTrain.constant(8, 10, 180), 8, 2.0);
        assertEquals(8, p.positions());
        java.nio.file.Path bad = dir.resolve("bad.txt");
        java.nio.file.Files.writeString(bad, "1\n1\nabc\n");
        org.echotrellis.InputException e = org.junit.jupiter.api.Assertions.assertThrows(
                org.echotrellis.InputException.class, () -> PulseShape.fromFile(bad, "--slice-profile"));
        assertTrue(e.getMessage().contains("line 3"), e.getMessage());
        org.junit.jupiter.api.Assertions.assertThrows(org.echotrellis.InputException.class,
                () -> SliceProfiles.parse(dir.resolve("none.txt").toString(), CpmgTrain.constant(8, 10, 180), 8, 1));
    }

    @Test
    void profileFitRecoversT2WhereTheIdealModelIsBiased() {
        CpmgTrain train = CpmgTrain.constant(32, 10, 180);
        SliceProfile p = SliceProfiles.parse("sinc:4", train, 16, 1.0);
        assertEquals(16, p.positions());
        assertTrue(p.refocusingFactors()[0] > 0.9);                  // near the centre: close to nominal
        assertTrue(p.refocusingFactors()[15] < 0.2);                 // 1.45 slice widths out: almost no flip
        // Data: weighted sum over positions from the lane engine without derivatives (CpmgEngine),
        // true T2 70 ms, B1 0.9.
        double[] fe = p.excitationFactors();
        double[] fr = p.refocusingFactors();
        double[] w = p.weights();
        double[] y = new double[32];
        CpmgEngine eng = new CpmgEngine(1);
        for (int z = 0; z < 16; z++) {
            double[] flips = new double[32];
            java.util.Arrays.fill(flips, 180 * fr[z] * 0.9);
            CpmgTrain local = CpmgTrain.of(32, 10, 90 * fe[z] * 0.9, flips);
            double[] e = eng.echoes(local, 1000, 70, 1.0);
            for (int n = 0; n < 32; n++) {
                y[n] += w[z] * e[n];
            }
        }
        for (int n = 0; n < 32; n++) {
            y[n] = Math.abs(y[n]);
        }
        FitSettings s = FitSettings.defaults(train);
        T2Estimate withProfile = new T2Fit.Factory(s.withProfile(p), FitModel.EPG, false).newKernel().estimate(y, Double.NaN);
        T2Estimate ideal = new T2Fit.Factory(s, FitModel.EPG, false).newKernel().estimate(y, Double.NaN);
        assertEquals(70, withProfile.t2Ms(), 70 * 1e-4);
        assertEquals(0.9, withProfile.b1Scale(), 1e-4);
        assertTrue(Math.abs(ideal.t2Ms() / 70 - 1) > 0.03, "ideal model T2 " + ideal.t2Ms());
    }
}

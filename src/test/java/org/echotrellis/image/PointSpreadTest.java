package org.echotrellis.image;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Random;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Simulator;
import org.echotrellis.sequence.Tissue;
import org.junit.jupiter.api.Test;

/** PSF and its figures against closed forms and an independent plain DFT. */
class PointSpreadTest {

    private static Protocol train(int echoes, double espMs, double[] flips) {
        return Protocol.ofTrain("t", "", new Tissue("x", 1000, 100), 1.0, CpmgTrain.of(echoes, espMs, 90, flips), "test");
    }

    private static double[] constant(int n, double v) {
        double[] a = new double[n];
        java.util.Arrays.fill(a, v);
        return a;
    }

    @Test
    void ideal180WithoutRelaxationGivesTheDiscreteDelta() {
        // ideal 180° CPMG with T1 = T2 = ∞: every echo is 1 (Carr & Purcell 1954; Meiboom & Gill 1958),
        // so all weights are equal and the PSF is the discrete delta: peak 1, no side lobes, and the FWHM
        // of a single sample with zero neighbours by linear interpolation is 0.5 + 0.5 = 1 pixel
        Protocol p = train(16, 5, constant(16, 180));
        Tissue free = new Tissue("free", Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY);
        for (KSpaceOrdering o : List.of(KSpaceOrdering.linear(128, 16), KSpaceOrdering.centric(128, 16),
                KSpaceOrdering.linear(96, 16, 3))) {
            TissueImage t = FseImaging.analyse(p, o, List.of(free), Double.NaN).tissues().get(0);
            double[] psf = t.psf();
            assertEquals(1, psf[o.centreLine()], 1e-12);
            for (int i = 0; i < psf.length; i++) {
                if (i != o.centreLine()) {
                    assertEquals(0, psf[i], 1e-12);
                }
            }
            assertEquals(1, t.figures().fwhmPx(), 1e-9, o.describe());
            assertEquals(1, t.figures().peak(), 1e-12);
            assertEquals(0, t.figures().sidelobe(), 1e-12);
        }
    }

    /** The closed form and its derivation are in the Javadoc of {@link PointSpread}. */
    @Test
    void singleShotLinearExponentialMatchesTheGeometricSum() {
        // single shot (S = 1), linear: line j is echo j + 1, weight r^(j+1), r = exp(−ESP/T2), centre weight
        // r^(c+1). Closed form (geometric sum, METHODS §13; common practice), with θ = 2πx/L and
        // exp(iθL) = 1 for integer x:
        //   Σⱼ r^(j+1) e^{iθ(j−c)} = r·e^{−iθc}·(1 − r^L)/(1 − r e^{iθ})
        //   PSF(x) = (1 − r^L) / (L · r^c · sqrt(1 − 2r·cos θ + r²))
        for (double t2 : new double[] {40, 80, 300}) {
            int n = 64;
            double esp = 5;
            Protocol p = train(n, esp, constant(n, 180));
            TissueImage t = FseImaging.analyse(p, KSpaceOrdering.linear(n, n), List.of(new Tissue("x", 1e9, t2)),
                    Double.NaN).tissues().get(0);
            double r = Math.exp(-esp / t2);
            int c = n / 2;
            double[] psf = t.psf();
            double[] closed = new double[n];
            for (int i = 0; i < n; i++) {
                double theta = 2 * Math.PI * (i - c) / n;
                closed[i] = (1 - Math.pow(r, n)) / (n * Math.pow(r, c) * Math.sqrt(1 - 2 * r * Math.cos(theta) + r * r));
                assertEquals(closed[i], psf[i], 1e-9 * closed[i] + 1e-12, "T2 " + t2 + " pixel " + (i - c));
            }
            assertEquals(closed[c], t.figures().peak(), 1e-9);
            // the closed form is symmetric and falls monotonically from x = 0: FWHM from the first sample below half
            double half = closed[c] / 2;
            int k = 1;
            while (closed[c + k] >= half) {
                k++;
            }
            double flank = (k - 1) + (closed[c + k - 1] - half) / (closed[c + k - 1] - closed[c + k]);
            assertEquals(2 * flank, t.figures().fwhmPx(), 1e-9);
            assertEquals(0, t.figures().sidelobe(), 1e-12, "monotone flanks have no side lobes");
            assertEquals(Math.exp(-(c + 1) * esp / t2), t.centerSignal(), 1e-12);
        }
    }

    @Test
    void randomSchedulesAgreeWithAPlainDft() {
        Random rnd = new Random(20261202L);
        for (int trial = 0; trial < 12; trial++) {
            int echoes = 4 + rnd.nextInt(28);
            int lines = echoes * (1 + rnd.nextInt(8));
            double[] flips = new double[echoes];
            for (int i = 0; i < echoes; i++) {
                flips[i] = 40 + 140 * rnd.nextDouble();
            }
            Protocol p = train(echoes, 3 + 7 * rnd.nextDouble(), flips);
            KSpaceOrdering o = switch (trial % 3) {
                case 0 -> KSpaceOrdering.linear(lines, echoes);
                case 1 -> KSpaceOrdering.centric(lines, echoes);
                default -> KSpaceOrdering.linear(lines, echoes, 1 + rnd.nextInt(echoes));
            };
            Tissue tissue = new Tissue("x", 500 + 2000 * rnd.nextDouble(), 20 + 200 * rnd.nextDouble());
            TissueImage t = FseImaging.analyse(p, o, List.of(tissue), Double.NaN).tissues().get(0);
            double[] reference = PlainDft.psf(t.weights());
            double[] echoAmp = Simulator.simulate(p, tissue.t1Ms(), tissue.t2Ms(), 1.0).magnitudes();
            double[] fromKernel = new PsfKernel(o).psf(echoAmp, new double[lines]);
            for (int i = 0; i < lines; i++) {
                assertEquals(reference[i], t.psf()[i], 1e-10 * (1 + reference[i]), "trial " + trial + " pixel " + i);
                assertEquals(reference[i], fromKernel[i], 1e-10 * (1 + reference[i]), "kernel, trial " + trial);
            }
            assertEquals(PointSpread.figures(reference).fwhmPx(), new PsfKernel(o).figures(echoAmp).fwhmPx(), 1e-8);
        }
    }

    @Test
    void fftOfAnyLengthAgreesWithAPlainDft() {
        Random rnd = new Random(7);
        for (int n : new int[] {1, 2, 3, 8, 12, 30, 97, 128, 210, 243}) {
            double[] re = new double[n];
            double[] im = new double[n];
            for (int i = 0; i < n; i++) {
                re[i] = rnd.nextGaussian();
                im[i] = rnd.nextGaussian();
            }
            for (boolean inverse : new boolean[] {false, true}) {
                double[][] ref = PlainDft.dft(re, im, inverse);
                double[] r = re.clone();
                double[] m = im.clone();
                Dft.transform(r, m, inverse);
                for (int k = 0; k < n; k++) {
                    assertEquals(ref[0][k], r[k], 1e-9 * n, "n " + n);
                    assertEquals(ref[1][k], m[k], 1e-9 * n, "n " + n);
                }
            }
        }
    }

    @Test
    void figuresOfHandWorkedSamples() {
        // hand-worked: peak 1 at the centre (index 4); right flank 0.6 then 0.1 → 1 + 0.1/0.5 = 1.2;
        // left flank 0.2 → 0.5/0.8 = 0.625; FWHM 1.825; flanks fall to zero everywhere: no side lobe
        PsfFigures f = PointSpread.figures(new double[] {0, 0, 0, 0.2, 1, 0.6, 0.1, 0});
        assertEquals(1.825, f.fwhmPx(), 1e-12);
        assertEquals(1, f.peak(), 0);
        assertEquals(0, f.sidelobe(), 0);
        // main lobe ends at the minima 0.1 (index 2) and 0 (index 0); the sample 0.3 at index 1 is a side lobe
        PsfFigures g = PointSpread.figures(new double[] {0, 0.3, 0.1, 0.2, 1, 0.2, 0.1, 0.05});
        assertEquals(0.3, g.sidelobe(), 1e-12);
        assertEquals(2 * (0.5 / 0.8), g.fwhmPx(), 1e-12);
        assertTrue(Double.isNaN(PointSpread.figures(new double[] {0, 0, 0}).fwhmPx()));
    }
}

package org.echotrellis.image;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import java.util.Random;
import org.echotrellis.sequence.Tissue;
import org.junit.jupiter.api.Test;

/** Phantom image formation against a direct circular convolution with the complex PSF and noise statistics. */
class PhantomImagerTest {

    private static TissueImage tissue(String name, double[] w) {
        double[] psf = PointSpread.psf(w);
        return new TissueImage(new Tissue(name, 1000, 100), 0, w[w.length / 2], w, psf, PointSpread.figures(psf));
    }

    @Test
    void flatWeightsReproduceTheIdealImage() {
        // flat weights: the PSF is the discrete delta, so the image is the ideal image (common practice)
        int n = 48;
        double[] a = new double[n];
        double[] b = new double[n];
        java.util.Arrays.fill(a, 0.7);
        java.util.Arrays.fill(b, 0.3);
        Phantom ph = Phantom.builtin(n, 2);
        PhantomImages img = PhantomImager.image(ph, List.of(tissue("a", a), tissue("b", b)), 0, 1);
        for (int i = 0; i < n * n; i++) {
            assertEquals(img.ideal()[i], img.simulated()[i], 1e-12);
        }
        assertEquals(0.7, img.ideal()[0], 0);
    }

    @Test
    void randomWeightsMatchADirectConvolution() {
        // reference: for each column, |Σ_t Σ_y' I_t(y') h_t(y − y')| with h_t(d) = (1/L) Σ_j w_j e^{+i2π(j−c)d/L},
        // computed in double precision straight from the definition (no transform code shared)
        Random rnd = new Random(99);
        for (int trial = 0; trial < 3; trial++) {
            int rows = 12 + 6 * trial;
            int cols = 5;
            int[] region = new int[rows * cols];
            for (int i = 0; i < region.length; i++) {
                region[i] = rnd.nextInt(3) - 1;
            }
            Phantom ph = new Phantom(rows, cols, region, "random");
            double[][] w = new double[2][rows];
            for (int t = 0; t < 2; t++) {
                for (int j = 0; j < rows; j++) {
                    w[t][j] = 0.1 + rnd.nextDouble();
                }
            }
            PhantomImages img = PhantomImager.image(ph, List.of(tissue("a", w[0]), tissue("b", w[1])), 0, 1);
            int c = rows / 2;
            for (int x = 0; x < cols; x++) {
                for (int y = 0; y < rows; y++) {
                    double re = 0;
                    double im = 0;
                    for (int yy = 0; yy < rows; yy++) {
                        int t = region[yy * cols + x];
                        if (t < 0) {
                            continue;
                        }
                        int d = y - yy;
                        for (int j = 0; j < rows; j++) {
                            double ang = 2 * Math.PI * (j - c) * (double) d / rows;
                            re += w[t][j] * Math.cos(ang) / rows;
                            im += w[t][j] * Math.sin(ang) / rows;
                        }
                    }
                    assertEquals(Math.hypot(re, im), img.simulated()[y * cols + x], 1e-10, "trial " + trial);
                }
            }
        }
    }

    @Test
    void noiseHasTheRequestedSpreadForSeveralSeeds() {
        // far from zero signal the magnitude noise is close to Gaussian with sd σ (Gudbjartsson & Patz, MRM 34:910, 1995)
        int n = 64;
        double[] w = new double[n];
        java.util.Arrays.fill(w, 1);
        int[] region = new int[n * n];
        Phantom ph = new Phantom(n, n, region, "uniform");
        for (long seed : new long[] {1, 7, 20261202}) {
            PhantomImages img = PhantomImager.image(ph, List.of(tissue("a", w)), 0.05, seed);
            double sum = 0;
            double sq = 0;
            for (double v : img.simulated()) {
                sum += v;
                sq += v * v;
            }
            double mean = sum / (n * n);
            double sd = Math.sqrt(sq / (n * n) - mean * mean);
            assertEquals(1, mean, 0.005, "seed " + seed);
            assertTrue(Math.abs(sd - 0.05) < 0.05 * 0.06, "seed " + seed + ": sd " + sd);   // ~4 standard errors
        }
    }

    @Test
    void resamplingKeepsLabelsAndScalesColumns() {
        Phantom p = new Phantom(2, 4, new int[] {0, 0, 1, 1, 0, 0, 1, 1}, "t").withRows(4);
        assertEquals(8, p.cols());
        assertEquals(1, p.region()[7]);
        assertEquals(0, p.region()[0]);
    }
}

package org.echotrellis.image;

import java.util.List;
import java.util.Random;
import org.echotrellis.Checks;
import org.echotrellis.InputException;

/**
 * Forms the image of a {@link Phantom} as a segmented fast spin echo sees it: every tissue's
 * indicator image is transformed along the phase-encoding direction (columns, {@link Dft}), its
 * k-space line j multiplied by that tissue's weight wⱼ (line j is k-index j − ⌊L/2⌋), the tissues
 * summed, transformed back, complex Gaussian noise of standard deviation σ added to the real and
 * the imaginary part of every pixel (java.util.Random with a fixed seed), and the magnitude taken.
 * The read-out direction is not weighted (no T2* or off-resonance during the read-out). The ideal
 * image puts every tissue at its centre weight. Cost: (T + 1) transforms of length L per column.
 */
public final class PhantomImager {
    private PhantomImager() { }

    /**
     * @param phantom the phantom; its rows must equal the number of lines (see {@link Phantom#withRows})
     * @param tissues per-tissue weights, indexed like the phantom's regions
     * @param noiseSd σ per pixel and channel (0 for none)
     * @param seed noise seed
     * @return the ideal and simulated images
     */
    public static PhantomImages image(Phantom phantom, List<TissueImage> tissues, double noiseSd, long seed) {
        Checks.require(noiseSd >= 0 && Double.isFinite(noiseSd), "noise_sd must be >= 0, got " + noiseSd);
        int rows = phantom.rows();
        int cols = phantom.cols();
        int[] region = phantom.region();
        for (TissueImage t : tissues) {
            if (t.weights().length != rows) {
                throw new InputException("the phantom has " + rows + " rows but the k-space weighting has "
                        + t.weights().length + " lines");
            }
        }
        int nt = tissues.size();
        double[][] w = new double[nt][];
        double[] centre = new double[nt];
        for (int t = 0; t < nt; t++) {
            w[t] = tissues.get(t).weights();
            centre[t] = tissues.get(t).centerSignal();
        }
        int c = rows / 2;
        double[] ideal = new double[rows * cols];
        double[] sim = new double[rows * cols];
        double[] accRe = new double[rows];
        double[] accIm = new double[rows];
        double[] re = new double[rows];
        double[] im = new double[rows];
        Random rng = new Random(seed);
        for (int x = 0; x < cols; x++) {
            java.util.Arrays.fill(accRe, 0);
            java.util.Arrays.fill(accIm, 0);
            for (int t = 0; t < nt; t++) {
                boolean any = false;
                for (int y = 0; y < rows; y++) {
                    boolean in = region[y * cols + x] == t;
                    re[y] = in ? 1 : 0;
                    im[y] = 0;
                    any |= in;
                }
                if (!any) {
                    continue;
                }
                Dft.transform(re, im, false);
                for (int j = 0; j < rows; j++) {
                    int k = Math.floorMod(j - c, rows);
                    accRe[k] += w[t][j] * re[k];
                    accIm[k] += w[t][j] * im[k];
                }
            }
            Dft.transform(accRe, accIm, true);
            for (int y = 0; y < rows; y++) {
                int r = region[y * cols + x];
                ideal[y * cols + x] = r < 0 ? 0 : centre[r];
                double nr = noiseSd == 0 ? 0 : noiseSd * rng.nextGaussian();
                double ni = noiseSd == 0 ? 0 : noiseSd * rng.nextGaussian();
                sim[y * cols + x] = Math.hypot(accRe[y] / rows + nr, accIm[y] / rows + ni);
            }
        }
        return new PhantomImages(rows, cols, ideal, sim, noiseSd, seed);
    }
}

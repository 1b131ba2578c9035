package org.echotrellis.io;

import org.echotrellis.InputException;

/**
 * Estimates the noise level σ of the underlying Gaussian channels from magnitude voxels that hold
 * no signal (the complement of the mask). For pure noise the magnitude is Rayleigh-distributed
 * with E[M²] = 2σ², so σ = √(mean(M²)/2) (Gudbjartsson &amp; Patz, "The Rician distribution of
 * noisy MRI data", Magn Reson Med 34:910, 1995). All echoes of every background voxel are used,
 * except voxels whose echoes are all exactly 0 (zero-filled outside the field of view or by a
 * masking tool: they hold no noise sample, and counting them would lower σ).
 */
public final class BackgroundNoise {
    private BackgroundNoise() { }

    /**
     * @param job the volume job; its mask defines the background
     * @return σ in signal units
     * @throws InputException without a mask, or with fewer than 32 finite background values
     */
    public static double sigma(VolumeJob job) {
        if (job.mask().isEmpty()) {
            throw new InputException("noise_sigma auto needs a mask (the noise is estimated outside it)");
        }
        NiftiHeader h = job.data().header();
        int slice = h.size(1) * h.size(2);
        int echoes = job.echoes();
        double[] slab = new double[slice * echoes];
        double sum = 0;
        long n = 0;
        for (int z = 0; z < h.size(3); z++) {
            job.data().readSlab(z, 1, slab);
            for (int v = 0; v < slice; v++) {
                if (job.inside(z * slice + v) || allZero(slab, v * echoes, echoes)) {
                    continue;
                }
                for (int e = 0; e < echoes; e++) {
                    double m = slab[v * echoes + e];
                    if (Double.isFinite(m)) {
                        sum += m * m;
                        n++;
                    }
                }
            }
        }
        if (n < 32) {
            throw new InputException("noise_sigma auto: only " + n + " finite values outside the mask; give noise_sigma as a number");
        }
        return Math.sqrt(sum / n / 2.0);
    }

    /** True if every echo of the voxel is exactly 0 (zero-filled, not a noise sample). */
    private static boolean allZero(double[] slab, int off, int echoes) {
        for (int e = 0; e < echoes; e++) {
            if (slab[off + e] != 0) {
                return false;
            }
        }
        return true;
    }
}

package org.echotrellis.io;

import java.nio.file.Path;
import java.util.Optional;
import java.util.Random;

/** Test volumes for the background-noise estimate: signal in the mask, Rayleigh noise outside. */
final class NoiseVolumes {
    private NoiseVolumes() { }

    /**
     * Writes an nx×nx×1×ne float series (mask: x &lt; 10 with amplitude {@code signal}; Rician
     * magnitudes of σ everywhere except columns x ≥ zeroFrom, which are zero-filled) and returns
     * {@link BackgroundNoise#sigma} of it.
     */
    static double estimate(Path file, long seed, int nx, int ne, double sigma, double signal, int zeroFrom) {
        Random r = new Random(seed);
        int nv = nx * nx;
        double[] data = new double[nv * ne];
        double[] mask = new double[nv];
        for (int v = 0; v < nv; v++) {
            int x = v % nx;
            mask[v] = x < 10 ? 1 : 0;
            for (int e = 0; e < ne; e++) {
                double a = mask[v] == 1 ? signal : 0;
                data[e * nv + v] = x >= zeroFrom ? 0 : Math.hypot(a + sigma * r.nextGaussian(), sigma * r.nextGaussian());
            }
        }
        Nifti.write(file, NiftiHeader.create(NiftiDatatype.FLOAT32, nx, nx, 1, ne), data, false);
        try (NiftiInput in = Nifti.open(file)) {
            NiftiImage m = NiftiImage.of(NiftiHeader.create(NiftiDatatype.UINT8, nx, nx, 1), mask, "mask");
            return BackgroundNoise.sigma(VolumeJob.of(in, Optional.of(m), Optional.empty()));
        }
    }
}

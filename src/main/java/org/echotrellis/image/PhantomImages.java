package org.echotrellis.image;

/**
 * The ideal and the simulated magnitude image of a phantom (rows along phase encoding, y·cols + x).
 * Arrays are copied on the way in and out.
 *
 * @param rows rows
 * @param cols columns
 * @param ideal every tissue at its centre weight, no blurring and no noise
 * @param simulated the image after k-space weighting, noise and magnitude
 * @param noiseSd noise standard deviation per pixel and channel (0 for none)
 * @param seed seed of the noise
 */
public record PhantomImages(int rows, int cols, double[] ideal, double[] simulated, double noiseSd, long seed) {
    /**
     * Copies.
     *
     * @param rows rows
     * @param cols columns
     * @param ideal every tissue at its centre weight, no blurring and no noise
     * @param simulated the image after k-space weighting, noise and magnitude
     * @param noiseSd noise standard deviation per pixel and channel (0 for none)
     * @param seed seed of the noise
     */
    public PhantomImages {
        ideal = ideal.clone();
        simulated = simulated.clone();
    }

    /** @return every tissue at its centre weight, no blurring and no noise (a copy) */
    @Override
    public double[] ideal() {
        return ideal.clone();
    }

    /** @return the image after k-space weighting, noise and magnitude (a copy) */
    @Override
    public double[] simulated() {
        return simulated.clone();
    }
}

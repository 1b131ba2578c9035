package org.echotrellis.image;

import org.echotrellis.sequence.Tissue;

/**
 * Image-level figures of one tissue for one protocol and ordering. Arrays are copied on the way in
 * and out.
 *
 * @param tissue the tissue
 * @param effectiveTeMs echo time of the echo that acquires k = 0, in ms
 * @param centerSignal the weight at k = 0 (echo magnitude, M0 = 1): the value of a large region
 * @param weights weight of every phase-encoding line j = 0 … L−1
 * @param psf centred PSF magnitude, element i is pixel i − ⌊L/2⌋ (see {@link PointSpread})
 * @param figures FWHM, peak and side lobe of the PSF
 */
public record TissueImage(Tissue tissue, double effectiveTeMs, double centerSignal, double[] weights, double[] psf,
                          PsfFigures figures) {
    /**
     * Copies.
     *
     * @param tissue the tissue
     * @param effectiveTeMs echo time of the echo that acquires k = 0, in ms
     * @param centerSignal the weight at k = 0 (echo magnitude, M0 = 1): the value of a large region
     * @param weights weight of every phase-encoding line j = 0 … L−1
     * @param psf centred PSF magnitude, element i is pixel i − ⌊L/2⌋ (see {@link PointSpread})
     * @param figures FWHM, peak and side lobe of the PSF
     */
    public TissueImage {
        weights = weights.clone();
        psf = psf.clone();
    }

    /** @return weight of every phase-encoding line j = 0 … L−1 (a copy) */
    @Override
    public double[] weights() {
        return weights.clone();
    }

    /** @return centred PSF magnitude, element i is pixel i − ⌊L/2⌋ (see {@link PointSpread}; a copy) */
    @Override
    public double[] psf() {
        return psf.clone();
    }

    /** @return the tissue name */
    public String name() {
        return tissue.name();
    }
}

package org.echotrellis.image;

/**
 * Figures of a centred point-spread-function magnitude.
 *
 * @param fwhmPx full width at half maximum in pixels, by linear interpolation between the samples
 *               on each flank of the main lobe (capped at L when the PSF never falls to half its
 *               peak; NaN for a zero PSF)
 * @param peak the largest sample (1 for the discrete delta of a flat weighting)
 * @param sidelobe the largest sample outside the main lobe, relative to the peak (0 when the main
 *                 lobe covers every sample)
 */
public record PsfFigures(double fwhmPx, double peak, double sidelobe) {
    /** Figures of a PSF that is zero everywhere (no signal at k = 0). */
    public static final PsfFigures UNDEFINED = new PsfFigures(Double.NaN, Double.NaN, Double.NaN);
}

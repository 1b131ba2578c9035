package org.echotrellis.fit.spectrum;

import java.util.List;

/**
 * The T2 spectrum of one decay and its derived numbers, as fitted by {@link SpectrumFitter}
 * (regularised NNLS, Whittall &amp; MacKay 1989, on EPG bases with the refocusing angle estimated as
 * in Prasloski et al. 2012). Arrays are copied in and out.
 *
 * @param name               label of the decay (table row or voxel)
 * @param t2Ms               T2 grid in ms
 * @param amplitude          spectrum amplitude per bin (signal units; Σ ≈ extrapolated signal at t = 0)
 * @param refocusDeg         refocusing angle used (fitted or fixed), degrees
 * @param chi2               residual sum of squares of the final spectrum
 * @param chi2Unregularised  residual sum of squares of the unregularised spectrum at the same angle
 * @param mu                 Tikhonov weight (0 = none)
 * @param snr                SNR estimate: max fitted echo / residual noise estimate
 * @param gmT2Ms             geometric-mean T2 of the whole spectrum in ms
 * @param windows            fraction and geometric-mean T2 per requested window
 * @param status             a {@link SpectrumStatus} code
 */
public record SpectrumFit(String name, double[] t2Ms, double[] amplitude, double refocusDeg, double chi2,
                          double chi2Unregularised, double mu, double snr, double gmT2Ms, List<Window> windows,
                          int status) {

    /**
     * One window's numbers.
     *
     * @param window   the T2 window
     * @param fraction Σ_window s / Σ s (NaN for an empty spectrum)
     * @param gmT2Ms   geometric-mean T2 within the window in ms (NaN if the window is empty)
     */
    public record Window(FractionWindow window, double fraction, double gmT2Ms) { }

    /**
     * Copies arrays and the list.
     *
     * @param name               label of the decay (table row or voxel)
     * @param t2Ms               T2 grid in ms
     * @param amplitude          spectrum amplitude per bin (signal units; Σ ≈ extrapolated signal at t = 0)
     * @param refocusDeg         refocusing angle used (fitted or fixed), degrees
     * @param chi2               residual sum of squares of the final spectrum
     * @param chi2Unregularised  residual sum of squares of the unregularised spectrum at the same angle
     * @param mu                 Tikhonov weight (0 = none)
     * @param snr                SNR estimate: max fitted echo / residual noise estimate

     * @param gmT2Ms             geometric-mean T2 of the whole spectrum in ms
     * @param windows            fraction and geometric-mean T2 per requested window
     * @param status             a {@link SpectrumStatus} code
     */
    public SpectrumFit {
        t2Ms = t2Ms.clone();
        amplitude = amplitude.clone();
        windows = List.copyOf(windows);
    }

    /** @return a copy of the T2 grid in ms */
    @Override
    public double[] t2Ms() {
        return t2Ms.clone();
    }

    /** @return a copy of the spectrum amplitudes */
    @Override
    public double[] amplitude() {
        return amplitude.clone();
    }

    /** @return index of the largest amplitude */
    public int peakBin() {
        int best = 0;
        for (int j = 1; j < amplitude.length; j++) {
            if (amplitude[j] > amplitude[best]) {
                best = j;
            }
        }
        return best;
    }
}

package org.echotrellis.fit.spectrum;

import java.util.Locale;
import org.echotrellis.InputException;

/** How the Tikhonov weight μ of the spectrum fit is chosen. */
public enum Regularisation {
    /** μ = 0: plain NNLS (sparse spectra). */
    NONE,
    /**
     * μ such that the misfit rises by a given factor over the unregularised misfit
     * (Whittall &amp; MacKay, J Magn Reson 84:134, 1989; factor 1.02 as in Whittall et al., MRM 37:34, 1997).
     */
    CHI2,
    /** μ minimising generalised cross-validation (Golub, Heath &amp; Wahba, Technometrics 21:215, 1979). */
    GCV;

    /** @return the option spelling ({@code none}, {@code chi2}, {@code gcv}) */
    public String label() {
        return name().toLowerCase(Locale.ROOT);
    }

    /**
     * @param text option value
     * @return the method
     * @throws InputException naming {@code --regularisation} if unknown
     */
    public static Regularisation parse(String text) {
        for (Regularisation r : values()) {
            if (r.label().equals(text.trim().toLowerCase(Locale.ROOT))) {
                return r;
            }
        }
        throw new InputException("--regularisation must be one of none, chi2, gcv; got '" + text + "'");
    }
}

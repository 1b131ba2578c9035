package org.echotrellis.fit.spectrum;

import org.echotrellis.InputException;

/** How the Tikhonov weight μ of the spectrum fit is chosen. Option values are descriptive words. */
public enum Regularisation {
    /** μ = 0: plain NNLS (sparse spectra). */
    NONE("none"),
    /**
     * μ such that the misfit rises by a given factor over the unregularised misfit (the misfit
     * criterion of Whittall &amp; MacKay, J Magn Reson 84:134, 1989).
     */
    MISFIT("misfit"),
    /** μ minimising generalised cross-validation (Golub, Heath &amp; Wahba, Technometrics 21:215, 1979). */
    CROSS_VALIDATION("cross-validation");

    private final String label;

    Regularisation(String label) {
        this.label = label;
    }

    /** @return the option spelling ({@code none}, {@code misfit}, {@code cross-validation}) */
    public String label() {
        return label;
    }

    /**
     * @param text option value
     * @return the method
     * @throws InputException naming {@code --regularisation} if unknown
     */
    public static Regularisation parse(String text) {
        for (Regularisation r : values()) {
            if (r.label.equals(text.trim())) {
                return r;
            }
        }
        throw new InputException("regularisation must be one of misfit, cross-validation, none; got '" + text + "'");
    }
}

package org.echotrellis.fit.spectrum;

/** Per-decay status codes of a spectrum fit (the status map of image output). */
public final class SpectrumStatus {
    private SpectrumStatus() { }

    /** Fitted. */
    public static final int OK = 0;
    /** Outside the mask: not fitted. */
    public static final int MASKED = 1;
    /** A value is NaN or infinite: not fitted. */
    public static final int INVALID = 2;
    /** No positive echo: not fitted. */
    public static final int NO_SIGNAL = 3;
    /** NNLS stopped at its iteration limit; the result is the last iterate. */
    public static final int NOT_CONVERGED = 4;
    /** The regularisation target could not be bracketed; the result uses the nearest weight tried. */
    public static final int TARGET_NOT_REACHED = 5;
    /**
     * Fitted, but the largest fitted echo is below {@link #LOW_SIGNAL_SNR} times the residual noise
     * estimate: the spectrum is mostly noise. The bar is higher than the mono-component fit's 3×
     * because 40 free amplitudes also fit noise spikes: pure Rayleigh noise gives SNR estimates of
     * about 2–5 (common practice: spectra need SNR in the hundreds to be trusted).
     */
    public static final int LOW_SIGNAL = 6;
    /** The B1 map value puts the refocusing angle outside the tabulated range: not fitted. */
    public static final int B1_OUT_OF_RANGE = 7;
    /** SNR estimate below which a fit is {@link #LOW_SIGNAL}. */
    public static final double LOW_SIGNAL_SNR = 10;

    /**
     * @param status a code
     * @return true if the decay was fitted (the numbers are defined), whatever the caveat
     */
    public static boolean fitted(int status) {
        return status != MASKED && status != INVALID && status != NO_SIGNAL && status != B1_OUT_OF_RANGE;
    }

    /**
     * @param status a code
     * @return short description
     */
    public static String describe(int status) {
        switch (status) {
            case OK: return "ok";
            case MASKED: return "outside mask";
            case INVALID: return "non-finite echo value";
            case NO_SIGNAL: return "no positive echo";
            case NOT_CONVERGED: return "NNLS iteration limit";
            case TARGET_NOT_REACHED: return "regularisation target not reached";
            case LOW_SIGNAL: return "low signal";
            case B1_OUT_OF_RANGE: return "B1 map value outside the refocusing range";
            default: return "unknown";
        }
    }
}

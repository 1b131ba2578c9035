package org.echotrellis.fit;

/** The decay models of the {@code fit} command. */
public enum FitModel {
    /** Stimulated-echo-corrected EPG model: amplitude, T2 and B1 ({@link EpgFitter}). */
    EPG,
    /** Mono-exponential: amplitude and T2, optional offset ({@link MonoFitter}). */
    MONO
}

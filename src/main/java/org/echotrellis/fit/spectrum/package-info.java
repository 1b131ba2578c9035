/**
 * Multi-component T2 spectra: the distribution of T2 within one decay, fitted as a non-negative
 * combination of EPG echo trains on a log-spaced T2 grid.
 *
 * <p>Owns the Lawson–Hanson NNLS solver ({@link org.echotrellis.fit.spectrum.Nnls}), the per-angle
 * basis cache ({@link org.echotrellis.fit.spectrum.BasisCache}), Tikhonov regularisation chosen by
 * the χ²-factor criterion or generalised cross-validation, refocusing-angle refinement and the
 * derived numbers (window fractions, geometric-mean T2, SNR).
 *
 * <p>A sub-package of {@code fit} so that the spectrum job sits beside the mono-component fit
 * without sharing its files. Depends on {@code org.echotrellis.epg} (echo trains), and on the
 * project root ({@code Checks}, {@code InputException}). Must not import {@code io}, {@code plot}
 * or {@code cli}.
 */
package org.echotrellis.fit.spectrum;

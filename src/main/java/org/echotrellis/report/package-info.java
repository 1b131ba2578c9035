/**
 * Shareable run reports: one self-contained HTML page per run (styles and figures inline, no
 * network requests, a small optional script for the slice slider and sortable tables) built from
 * sections — what was run ({@link org.echotrellis.report.RunInfo}, with SHA-256 checksums of the
 * inputs), headline numbers, map montages of every slice with colour bars
 * ({@link org.echotrellis.report.VolumeSections}), histograms, sample decays with their fitted
 * curves ({@link org.echotrellis.report.FitSamples}) and spectra
 * ({@link org.echotrellis.report.SpectrumSamples}). Entry point: {@link org.echotrellis.report.Report}.
 *
 * <p>May depend on {@code epg}, {@code sequence}, the jobs ({@code fit}, {@code pathway},
 * {@code design}), {@code io} and {@code plot}; must not import {@code cli}.
 */
package org.echotrellis.report;

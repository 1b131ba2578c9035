/**
 * Volume analyses as a library: {@link org.echotrellis.fit.volume.VolumeAnalysis} runs the
 * single-component T2 fit or the multi-component T2 spectrum over an opened NIfTI series (from a
 * path, a stream or a seekable channel) with an optional mask and B1 map, and returns
 * {@link org.echotrellis.fit.volume.VolumeMaps}, which can write themselves as NIfTI maps.
 * {@link org.echotrellis.fit.volume.VolumeRequest} holds the protocol text and the settings
 * ({@link org.echotrellis.fit.volume.FitOptions}, {@link org.echotrellis.fit.spectrum.SpectrumOptions})
 * as serialisable values for distributed jobs.
 *
 * <p>Depends on {@code fit}, {@code fit.spectrum}, {@code io} and {@code sequence}; must not import
 * {@code plot}, {@code cli}, {@code design} or {@code pathway}.
 */
package org.echotrellis.fit.volume;

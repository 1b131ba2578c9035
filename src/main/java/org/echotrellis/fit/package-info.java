/**
 * Single-component T2 fitting of multi-echo spin-echo decays: the stimulated-echo-corrected EPG
 * model with amplitude, T2 and B1 ({@link org.echotrellis.fit.T2Fit}; Lebel &amp; Wilman, Magn
 * Reson Med 64:1005, 2010) of the protocol's whole acquisition (slice profile, repetition time,
 * diffusion: tabulated once per run in {@link org.echotrellis.fit.TrainSurface}), the
 * mono-exponential reference, the Rician mean model
 * ({@link org.echotrellis.fit.Rician}) and Cramér–Rao standard errors. Multi-component spectra
 * live in the sub-package {@code spectrum}.
 *
 * <p>Depends on {@code org.echotrellis.sequence} (the acquisition model), {@code org.echotrellis.epg}
 * (the derivative-carrying CPMG kernel), on {@code io}
 * only for the {@link org.echotrellis.io.VoxelKernel} plug-in and {@link org.echotrellis.io.VoxelStatus},
 * and on Commons Math (mono-exponential fit). Must not import {@code plot}, {@code cli},
 * {@code design} or {@code pathway}.
 */
package org.echotrellis.fit;

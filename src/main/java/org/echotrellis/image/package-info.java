/**
 * From echo train to image for segmented fast spin echo: k-space ordering of the echoes
 * ({@link org.echotrellis.image.KSpaceOrdering}), per-tissue k-space weights, effective echo time,
 * the point-spread function and its figures ({@link org.echotrellis.image.PointSpread},
 * {@link org.echotrellis.image.PsfKernel}), tissue contrast and CNR
 * ({@link org.echotrellis.image.FseImaging}), and the image of a labelled phantom
 * ({@link org.echotrellis.image.PhantomImager}). One phase-encoding direction; no motion, T2* or
 * off-resonance during the read-out (Busse et al., MRM 55:1030, 2006; Mugler, JMRI 39:745, 2014).
 *
 * <p>Records in, records out, flat arrays in the loops. This package may use
 * {@code org.echotrellis.epg} and {@code org.echotrellis.sequence}; it must not import {@code io},
 * {@code plot}, {@code cli}, {@code fit}, {@code pathway} or {@code design} (design reads it).
 */
package org.echotrellis.image;

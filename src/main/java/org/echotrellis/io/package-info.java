/**
 * File input and output shared by the commands: atomic writes that never overwrite without
 * permission, output sets written as one unit ({@link org.echotrellis.io.OutputSet}), checked
 * writers that turn any failed write into a {@link org.echotrellis.io.WriteFailure}, JSON, NIfTI-1 volumes ({@link org.echotrellis.io.Nifti}, bounded gzip), CSV decay
 * tables ({@link org.echotrellis.io.DecayTableReader}), the volume pipeline that streams a 4-D
 * series slab by slab through per-thread {@link org.echotrellis.io.VoxelKernel}s with a mask, an
 * optional B1 map and a per-voxel {@link org.echotrellis.io.VoxelStatus}, and run summaries
 * ({@code summary.json}, {@link org.echotrellis.io.RunSummary}).
 *
 * <p>May depend on {@code epg} and {@code sequence}; must not import {@code fit}, {@code pathway},
 * {@code design}, {@code plot} or {@code cli}. Jobs plug in through
 * {@link org.echotrellis.io.VoxelKernel}.
 */
package org.echotrellis.io;

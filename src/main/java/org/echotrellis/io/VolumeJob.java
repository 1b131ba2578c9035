package org.echotrellis.io;

import java.util.Optional;

import org.echotrellis.Checks;
import org.echotrellis.InputException;

/**
 * What a volume job reads: the 4-D echo series (x, y, z, echo), an optional 3-D mask (voxels with
 * value 0 or NaN are skipped) and an optional 3-D B1 map (flip-angle scale per voxel). Shapes and
 * voxel-to-world affines are checked on construction (within a thousandth of a voxel).
 *
 * @param data the open echo series
 * @param mask optional mask on the same grid
 * @param b1Map optional B1 map on the same grid
 * @param threads worker threads (≥ 1)
 * @param slabValues upper bound on doubles per slab buffer (≥ 1; at least one slice is read; the
 *        pipeline holds two buffers)
 */
public record VolumeJob(NiftiInput data, Optional<NiftiImage> mask, Optional<NiftiImage> b1Map, int threads,
                        long slabValues) {

    /** Default slab budget: 4 M doubles (32 MB; two slabs are held). */
    public static final long DEFAULT_SLAB_VALUES = 4L << 20;

    /**
     * Validates shapes.
     *
     * @param data the open echo series
     * @param mask optional mask on the same grid
     * @param b1Map optional B1 map on the same grid
     * @param threads worker threads (≥ 1)
     * @param slabValues upper bound on doubles per slab buffer (≥ 1; at least one slice is read; the
     *        pipeline holds two buffers)
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public VolumeJob {
        Checks.inRange("threads", threads, 1, 1024, null);
        if (slabValues < 1) {
            throw new IllegalArgumentException("slabValues must be >= 1");
        }
        NiftiHeader h = data.header();
        boolean fiveD = h.rank() == 5 && h.size(4) == 1;  // (x, y, z, 1, echo): echoes along dim 5
        if (h.rank() > 4 && !fiveD) {
            throw new InputException(data.source() + ": expected a 4-D series (x, y, z, echo) or a 5-D one (x, y, z, 1, echo), got "
                    + h.rank() + " dimensions with dim[4] = " + h.size(4));
        }
        mask.ifPresent(m -> sameGrid(h, m.header(), "mask", m.source()));
        b1Map.ifPresent(b -> sameGrid(h, b.header(), "B1 map", b.source()));
    }

    /**
     * A job with default threads (all cores) and slab budget.
     *
     * @param data the echo series
     * @param mask optional mask
     * @param b1Map optional B1 map
     * @return the job
     */
    public static VolumeJob of(NiftiInput data, Optional<NiftiImage> mask, Optional<NiftiImage> b1Map) {
        return new VolumeJob(data, mask, b1Map, Runtime.getRuntime().availableProcessors(), DEFAULT_SLAB_VALUES);
    }

    /** @return number of echoes (volumes of the series) */
    public int echoes() {
        return data.header().volumes();
    }

    /** @return voxels per 3-D volume */
    public int voxels() {
        return (int) data.header().voxelsPerVolume();
    }

    /**
     * @param v linear voxel index
     * @return true if the voxel is inside the mask (or there is no mask)
     */
    public boolean inside(int v) {
        if (mask.isEmpty()) {
            return true;
        }
        double m = mask.get().get(v);
        return m != 0 && !Double.isNaN(m);
    }

    /**
     * Refuses an image that is not a 3-D volume on the series grid (shape and geometry), naming
     * both shapes.
     *
     * @param h header of the series
     * @param m header of the image
     * @param role what the image is, e.g. "mask" or "--b1-map"
     * @param source file name of the image
     */
    static void sameGrid(NiftiHeader h, NiftiHeader m, String role, String source) {
        boolean ok = m.volumes() == 1 && m.size(1) == h.size(1) && m.size(2) == h.size(2) && m.size(3) == h.size(3);
        if (!ok) {
            throw new InputException(role + " " + source + ": shape " + shape(m) + " does not match the data grid "
                    + h.size(1) + "x" + h.size(2) + "x" + h.size(3) + " (a 3-D image on the same grid is required)");
        }
        String diff = NiftiAffine.difference(h, m);
        if (diff != null) {
            throw new InputException(role + " " + source + ": same shape as the data, but another geometry: " + diff
                    + " (a 3-D image on the same grid is required)");
        }
    }

    /**
     * Refuses a series that is not 4-D with one volume per echo.
     *
     * @param h header of the series
     * @param source its file name
     * @param echoes echoes of the protocol
     */
    public static void checkSeries(NiftiHeader h, String source, int echoes) {
        if (h.rank() < 4 || h.volumes() == 1 && echoes > 1) {
            throw new InputException(source + ": a " + h.rank() + "-D image of shape " + shape(h) + "; DATA must be a "
                    + "4-D series (x, y, z, echo) with one volume per echo (" + echoes + " in the protocol)");
        }
        if (h.volumes() != echoes) {
            throw new InputException(source + ": " + h.volumes() + " echoes (dim 4 of shape " + shape(h)
                    + "), but the protocol has " + echoes);
        }
    }

    private static String shape(NiftiHeader m) {
        StringBuilder sb = new StringBuilder();
        for (int a = 1; a <= m.rank(); a++) {
            sb.append(a > 1 ? "x" : "").append(m.size(a));
        }
        return sb.toString();
    }
}

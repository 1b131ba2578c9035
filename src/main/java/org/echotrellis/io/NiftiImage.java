package org.echotrellis.io;

/**
 * A whole NIfTI-1 image held in memory as scaled double values (x fastest, then y, z, volume),
 * immutable. Used for the 3-D mask and B1 map and for small volumes; large 4-D data are read
 * slab by slab through {@link NiftiInput}.
 */
public final class NiftiImage {
    private final NiftiHeader header;
    private final double[] values;
    private final String source;

    NiftiImage(NiftiHeader header, double[] values, String source, boolean copy) {
        if (values.length != header.totalVoxels()) {
            throw new IllegalArgumentException("image needs " + header.totalVoxels() + " values, got " + values.length);
        }
        this.header = header;
        this.values = copy ? values.clone() : values;
        this.source = source;
    }

    /**
     * @param header header giving the shape
     * @param values values in file order (copied)
     * @param source name used in messages
     * @return the image
     */
    public static NiftiImage of(NiftiHeader header, double[] values, String source) {
        return new NiftiImage(header, values, source, true);
    }

    /** @return the header */
    public NiftiHeader header() {
        return header;
    }

    /** @return the file name (or other label) used in messages */
    public String source() {
        return source;
    }

    /** @return number of values */
    public int size() {
        return values.length;
    }

    /**
     * @param i linear index (x fastest)
     * @return the scaled value
     */
    public double get(int i) {
        return values[i];
    }

    /** @return a copy of all values */
    public double[] values() {
        return values.clone();
    }

    /**
     * A copy with every value multiplied by a factor, for example 0.01 to turn a B1 map in percent
     * (100 = nominal, as BIDS recommends for TB1map) into a flip-angle scale.
     *
     * @param factor the factor
     * @return the scaled image
     */
    public NiftiImage times(double factor) {
        double[] v = values.clone();
        for (int i = 0; i < v.length; i++) {
            v[i] *= factor;
        }
        return new NiftiImage(header, v, source, false);
    }

    /** @return the values as floats, e.g. a map for {@link RegionStatistics} */
    public float[] floats() {
        float[] f = new float[values.length];
        for (int i = 0; i < f.length; i++) {
            f[i] = (float) values[i];
        }
        return f;
    }

    /** @return the values as bytes, e.g. the codes of a status map ({@link VoxelStatus}) */
    public byte[] bytes() {
        byte[] b = new byte[values.length];
        for (int i = 0; i < b.length; i++) {
            b[i] = (byte) values[i];
        }
        return b;
    }
}

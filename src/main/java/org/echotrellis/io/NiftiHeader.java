package org.echotrellis.io;

import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.util.Arrays;

import org.echotrellis.InputException;

/**
 * The fields of a NIfTI-1 single-file header ({@code .nii}, magic {@code "n+1\0"}) that this
 * project uses, immutable. Layout and rules from {@code nifti1.h} (R. W. Cox, NIH Data Format
 * Working Group, 2003/2007): 348-byte header, datatype at byte 70, pixdim at 76, vox_offset at
 * 108, scl_slope/scl_inter at 112/116, qform/sform codes at 252/254, magic at 344, then the
 * 4-byte extender. Geometry (pixdim, qform, sform, units) is carried unchanged from an input
 * to the maps written from it.
 */
public final class NiftiHeader {
    /** sizeof_hdr of a NIfTI-1 header */
    public static final int HEADER_SIZE = 348;
    /** smallest data offset in a single file: header plus extender */
    public static final int MIN_VOX_OFFSET = 352;

    private final int[] dim;          // dim[0] = rank, dim[1..7]
    private final float[] pixdim;     // pixdim[0] = qfac
    private final NiftiDatatype datatype;
    private final long voxOffset;
    private final double sclSlope;
    private final double sclInter;
    private final int xyztUnits;
    private final int qformCode;
    private final int sformCode;
    private final float[] quatern;    // b, c, d, qoffset x, y, z
    private final float[] srow;       // srow_x, srow_y, srow_z (4 each)
    private final String description;
    private final ByteOrder order;

    private NiftiHeader(int[] dim, float[] pixdim, NiftiDatatype datatype, long voxOffset, double sclSlope,
            double sclInter, int xyztUnits, int qformCode, int sformCode, float[] quatern, float[] srow,
            String description, ByteOrder order) {
        this.dim = dim.clone();
        this.pixdim = pixdim.clone();
        this.datatype = datatype;
        this.voxOffset = voxOffset;
        this.sclSlope = sclSlope;
        this.sclInter = sclInter;
        this.xyztUnits = xyztUnits;
        this.qformCode = qformCode;
        this.sformCode = sformCode;
        this.quatern = quatern.clone();
        this.srow = srow.clone();
        this.description = description;
        this.order = order;
    }

    /**
     * A new header with unit voxel size, no orientation codes, no scaling, little-endian.
     *
     * @param datatype voxel type
     * @param sizes 1 to 7 dimension sizes, each ≥ 1 (x fastest)
     * @return the header
     */
    public static NiftiHeader create(NiftiDatatype datatype, int... sizes) {
        if (sizes.length < 1 || sizes.length > 7) {
            throw new IllegalArgumentException("NIfTI rank must be 1..7, got " + sizes.length);
        }
        int[] d = new int[8];
        Arrays.fill(d, 1);
        d[0] = sizes.length;
        for (int i = 0; i < sizes.length; i++) {
            if (sizes[i] < 1 || sizes[i] > Short.MAX_VALUE) {
                throw new IllegalArgumentException("NIfTI dimension " + (i + 1) + " must be 1..32767, got " + sizes[i]);
            }
            d[i + 1] = sizes[i];
        }
        float[] p = new float[8];
        Arrays.fill(p, 1f);
        float[] s = {1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0};
        return new NiftiHeader(d, p, datatype, MIN_VOX_OFFSET, 1.0, 0.0, 2 | 16, 0, 0, new float[6], s,
                "echotrellis", ByteOrder.LITTLE_ENDIAN);
    }

    /** @return the rank dim[0] */
    public int rank() {
        return dim[0];
    }

    /**
     * @param axis 1..7
     * @return dim[axis] (1 beyond the rank)
     */
    public int size(int axis) {
        return axis <= dim[0] ? dim[axis] : 1;
    }

    /** @return nx·ny·nz, the voxels of one 3-D volume */
    public long voxelsPerVolume() {
        return (long) size(1) * size(2) * size(3);
    }

    /** @return the number of 3-D volumes (product of dims 4..7), e.g. echoes */
    public int volumes() {
        long v = 1;
        for (int a = 4; a <= 7; a++) {
            v *= size(a);
        }
        return (int) v;
    }

    /** @return total stored values */
    public long totalVoxels() {
        return voxelsPerVolume() * volumes();
    }

    /** @return bytes of voxel data */
    public long dataBytes() {
        return totalVoxels() * datatype.bytes();
    }

    /** @return the voxel datatype */
    public NiftiDatatype datatype() {
        return datatype;
    }

    /** @return byte offset of the voxel data in the file */
    public long voxOffset() {
        return voxOffset;
    }

    /** @return scl_slope as stored (0 means unscaled) */
    public double sclSlope() {
        return sclSlope;
    }

    /** @return scl_inter as stored */
    public double sclInter() {
        return sclInter;
    }

    /** @return true if scl_slope is non-zero, so values are slope·stored + inter */
    public boolean isScaled() {
        return sclSlope != 0.0;
    }

    /** @return the byte order of the file */
    public ByteOrder order() {
        return order;
    }

    /**
     * @param i 0..7
     * @return pixdim[i] (pixdim[0] is qfac)
     */
    public float pixdim(int i) {
        return pixdim[i];
    }

    /** @return qform_code */
    public int qformCode() {
        return qformCode;
    }

    /** @return sform_code */
    public int sformCode() {
        return sformCode;
    }

    /** @return xyzt_units */
    public int xyztUnits() {
        return xyztUnits;
    }

    /** @return srow_x, srow_y, srow_z concatenated (copy) */
    public float[] srow() {
        return srow.clone();
    }

    /** @return quatern_b, c, d, qoffset_x, y, z (copy) */
    public float[] quatern() {
        return quatern.clone();
    }

    /** @return the descrip text */
    public String description() {
        return description;
    }

    /**
     * A 3-D header on the same grid and geometry (for a map computed from this volume).
     *
     * @param type datatype of the map
     * @return the header, unscaled, little-endian
     */
    public NiftiHeader asMap(NiftiDatatype type) {
        int[] d = dim.clone();
        d[0] = Math.min(3, d[0]);
        for (int a = 4; a <= 7; a++) {
            d[a] = 1;
        }
        float[] p = pixdim.clone();
        for (int a = 4; a <= 7; a++) {
            p[a] = a <= d[0] ? p[a] : 1f;
        }
        return new NiftiHeader(d, p, type, MIN_VOX_OFFSET, 1.0, 0.0, xyztUnits, qformCode, sformCode, quatern, srow,
                "echotrellis", ByteOrder.LITTLE_ENDIAN);
    }

    /**
     * @param type new datatype
     * @return a copy with another datatype (scaling kept)
     */
    public NiftiHeader withDatatype(NiftiDatatype type) {
        return new NiftiHeader(dim, pixdim, type, voxOffset, sclSlope, sclInter, xyztUnits, qformCode, sformCode,
                quatern, srow, description, order);
    }

    /**
     * @param slope scl_slope (0 = unscaled)
     * @param inter scl_inter
     * @return a copy with other scaling
     */
    public NiftiHeader withScaling(double slope, double inter) {
        return new NiftiHeader(dim, pixdim, datatype, voxOffset, slope, inter, xyztUnits, qformCode, sformCode,
                quatern, srow, description, order);
    }

    /**
     * @param byteOrder byte order for writing
     * @return a copy with another byte order
     */
    public NiftiHeader withOrder(ByteOrder byteOrder) {
        return new NiftiHeader(dim, pixdim, datatype, voxOffset, sclSlope, sclInter, xyztUnits, qformCode, sformCode,
                quatern, srow, description, byteOrder);
    }

    /**
     * A 4-D header on the same spatial grid and geometry with {@code n} volumes along dim 4, for
     * example one volume per T2 bin of a spectrum. pixdim[4] is set to 1 and the time unit dropped
     * (dim 4 is not time).
     *
     * @param n volumes along dim 4 (1..32767)
     * @return the header
     */
    public NiftiHeader withVolumes(int n) {
        if (n < 1 || n > Short.MAX_VALUE) {
            throw new IllegalArgumentException("NIfTI dimension 4 must be 1..32767, got " + n);
        }
        int[] d = new int[8];
        float[] p = pixdim.clone();
        d[0] = 4;
        for (int a = 1; a <= 3; a++) {
            d[a] = size(a);
        }
        d[4] = n;
        for (int a = 5; a <= 7; a++) {
            d[a] = 1;
            p[a] = 1f;
        }
        p[4] = 1f;
        return new NiftiHeader(d, p, datatype, voxOffset, sclSlope, sclInter, xyztUnits & 0x07, qformCode, sformCode,
                quatern, srow, description, order);
    }

    /**
     * @param sizes voxel sizes for axes 1..n
     * @return a copy with pixdim[1..n] set
     */
    public NiftiHeader withVoxelSize(float... sizes) {
        float[] p = pixdim.clone();
        System.arraycopy(sizes, 0, p, 1, Math.min(7, sizes.length));
        return new NiftiHeader(dim, p, datatype, voxOffset, sclSlope, sclInter, xyztUnits, qformCode, sformCode,
                quatern, srow, description, order);
    }

    /**
     * Encodes the header, the extender (no extensions) and padding up to {@link #MIN_VOX_OFFSET}.
     *
     * @return 352 bytes; the data follow at offset 352
     */
    byte[] encode() {
        ByteBuffer b = ByteBuffer.allocate(MIN_VOX_OFFSET).order(order);
        b.putInt(0, HEADER_SIZE);
        for (int i = 0; i < 8; i++) {
            b.putShort(40 + 2 * i, (short) dim[i]);
        }
        b.putShort(70, (short) datatype.code());
        b.putShort(72, (short) datatype.bitpix());
        for (int i = 0; i < 8; i++) {
            b.putFloat(76 + 4 * i, pixdim[i]);
        }
        b.putFloat(108, MIN_VOX_OFFSET);
        b.putFloat(112, (float) sclSlope);
        b.putFloat(116, (float) sclInter);
        b.put(123, (byte) xyztUnits);
        byte[] text = description.getBytes(StandardCharsets.US_ASCII);
        b.position(148);
        b.put(text, 0, Math.min(79, text.length));
        b.putShort(252, (short) qformCode);
        b.putShort(254, (short) sformCode);
        for (int i = 0; i < 6; i++) {
            b.putFloat(256 + 4 * i, quatern[i]);
        }
        for (int i = 0; i < 12; i++) {
            b.putFloat(280 + 4 * i, srow[i]);
        }
        b.position(344);
        b.put(new byte[] {'n', '+', '1', 0});
        return b.array();  // bytes 348..351 (extender) stay 0: no extensions
    }

    /**
     * Decodes and checks a header: sizeof_hdr 348 in either byte order, magic "n+1\0", rank 1..7,
     * positive sizes whose product fits (at most 2^31−1 volumes beyond dim 3), a supported datatype
     * with matching bitpix, vox_offset ≥ 352. Non-finite scl_slope/scl_inter read as 0 (slope 0:
     * unscaled).
     *
     * @param raw at least 348 bytes from the start of the file
     * @param where file name for messages
     * @return the header
     * @throws InputException naming the file, the field and the bad value
     */
    static NiftiHeader decode(byte[] raw, String where) {
        if (raw.length < HEADER_SIZE) {
            throw new InputException(where + ": not a NIfTI-1 file (only " + raw.length + " bytes, a header needs 348)");
        }
        ByteBuffer b = ByteBuffer.wrap(raw).order(ByteOrder.LITTLE_ENDIAN);
        if (b.getInt(0) != HEADER_SIZE) {
            b.order(ByteOrder.BIG_ENDIAN);
            if (b.getInt(0) != HEADER_SIZE) {
                throw new InputException(where + ": not a NIfTI-1 file (sizeof_hdr is neither 348 little- nor big-endian)");
            }
        }
        String magic = new String(raw, 344, 4, StandardCharsets.US_ASCII);
        if (magic.equals("ni1\0")) {
            throw new InputException(where + ": header/image pair (.hdr/.img) is not supported; use a single .nii or .nii.gz file");
        }
        if (!magic.equals("n+1\0")) {
            throw new InputException(where + ": bad NIfTI-1 magic at byte 344 (expected \"n+1\\0\")");
        }
        int[] d = new int[8];
        for (int i = 0; i < 8; i++) {
            d[i] = b.getShort(40 + 2 * i);
        }
        if (d[0] < 1 || d[0] > 7) {
            throw new InputException(where + ": dim[0] must be 1..7, got " + d[0]);
        }
        for (int i = 1; i <= 7; i++) {
            if (i <= d[0] && d[i] < 1) {
                throw new InputException(where + ": dim[" + i + "] must be >= 1, got " + d[i]);
            }
            if (i > d[0]) {
                d[i] = 1;
            }
        }
        NiftiDatatype type = NiftiDatatype.ofCode(b.getShort(70), where);
        int bitpix = b.getShort(72);
        if (bitpix != type.bitpix()) {
            throw new InputException(where + ": bitpix " + bitpix + " does not match datatype " + type + " (" + type.bitpix() + ")");
        }
        long volumes = 1;
        for (int i = 4; i <= 7; i++) {
            volumes *= d[i];  // at most 32767^4, no long overflow
        }
        boolean fits = volumes <= Integer.MAX_VALUE;
        try {
            Math.multiplyExact(Math.multiplyExact((long) d[1] * d[2] * d[3], volumes), type.bytes());
        } catch (ArithmeticException e) {
            fits = false;
        }
        if (!fits) {
            throw new InputException(where + ": dims " + d[1] + "x" + d[2] + "x" + d[3] + "x" + d[4] + "x" + d[5] + "x" + d[6]
                    + "x" + d[7] + " declare more values than can be read (at most 2^31-1 volumes beyond dim 3)");
        }
        float[] p = new float[8];
        for (int i = 0; i < 8; i++) {
            p[i] = b.getFloat(76 + 4 * i);
        }
        double off = b.getFloat(108);
        if (!(off >= MIN_VOX_OFFSET) || off > 1e12 || off != Math.rint(off)) {
            // a single-file NIfTI-1 keeps its data after the 352-byte header (nifti1.h): any smaller
            // offset, negative or positive, would read the header as voxel data
            throw new InputException(where + ": vox_offset must be a whole number >= 352 (data after the header), got "
                    + (off == Math.rint(off) && Math.abs(off) < 1e12 ? String.valueOf((long) off) : String.valueOf(off)));
        }
        long voxOffset = (long) off;
        // non-finite scaling fields (NaN is what writers leave when they do not scale) read as 0,
        // and scl_slope = 0 means unscaled (nifti1.h)
        double slope = finiteOrZero(b.getFloat(112));
        double inter = finiteOrZero(b.getFloat(116));
        int units = raw[123] & 0xff;
        int end = 148;
        while (end < 228 && raw[end] != 0) {
            end++;
        }
        String text = new String(raw, 148, end - 148, StandardCharsets.US_ASCII);
        float[] q = new float[6];
        for (int i = 0; i < 6; i++) {
            q[i] = b.getFloat(256 + 4 * i);
        }
        float[] s = new float[12];
        for (int i = 0; i < 12; i++) {
            s[i] = b.getFloat(280 + 4 * i);
        }
        return new NiftiHeader(d, p, type, voxOffset, slope, inter, units, b.getShort(252), b.getShort(254), q, s,
                text, b.order());
    }

    private static double finiteOrZero(float v) {
        return Float.isFinite(v) ? v : 0.0;
    }

    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder("NIfTI-1 ").append(datatype).append(' ');
        for (int i = 1; i <= dim[0]; i++) {
            sb.append(i > 1 ? "x" : "").append(dim[i]);
        }
        return sb.toString();
    }
}

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
    private int intentCode;           // set only through withIntent (copies keep it)
    private String intentName = "";

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
        return (new NiftiHeader(d, p, datatype, MIN_VOX_OFFSET, 1.0, 0.0, 2 | 16, 0, 0, new float[6], s,
                "echotrellis", ByteOrder.LITTLE_ENDIAN));
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
            p[a] = 0f;  // a 3-D map has no time step: pixdim[4..7] unused, time unit cleared
        }
        return (new NiftiHeader(d, p, type, MIN_VOX_OFFSET, 1.0, 0.0, xyztUnits & 0x07, qformCode, sformCode, quatern, srow,
                "echotrellis", ByteOrder.LITTLE_ENDIAN));
    }

    /**
     * @param type new datatype
     * @return a copy with another datatype (scaling kept)
     */
    public NiftiHeader withDatatype(NiftiDatatype type) {
        return keepIntent(new NiftiHeader(dim, pixdim, type, voxOffset, sclSlope, sclInter, xyztUnits, qformCode, sformCode,
                quatern, srow, description, order));
    }

    /**
     * @param slope scl_slope (0 = unscaled)
     * @param inter scl_inter
     * @return a copy with other scaling
     */
    public NiftiHeader withScaling(double slope, double inter) {
        return keepIntent(new NiftiHeader(dim, pixdim, datatype, voxOffset, slope, inter, xyztUnits, qformCode, sformCode,
                quatern, srow, description, order));
    }

    /**
     * @param byteOrder byte order for writing
     * @return a copy with another byte order
     */
    public NiftiHeader withOrder(ByteOrder byteOrder) {
        return keepIntent(new NiftiHeader(dim, pixdim, datatype, voxOffset, sclSlope, sclInter, xyztUnits, qformCode, sformCode,
                quatern, srow, description, byteOrder));
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
        return keepIntent(new NiftiHeader(d, p, datatype, voxOffset, sclSlope, sclInter, xyztUnits & 0x07, qformCode, sformCode,
                quatern, srow, description, order));
    }

    /**
     * @param sizes voxel sizes for axes 1..n
     * @return a copy with pixdim[1..n] set
     */
    public NiftiHeader withVoxelSize(float... sizes) {
        float[] p = pixdim.clone();
        System.arraycopy(sizes, 0, p, 1, Math.min(7, sizes.length));
        return keepIntent(new NiftiHeader(dim, p, datatype, voxOffset, sclSlope, sclInter, xyztUnits, qformCode, sformCode,
                quatern, srow, description, order));
    }

    /** NIFTI_INTENT_ESTIMATE: the values are parameter estimates (nifti1.h). */
    public static final int INTENT_ESTIMATE = 1001;
    /** NIFTI_INTENT_LABEL: the values are labels (nifti1.h). */
    public static final int INTENT_LABEL = 1002;

    private NiftiHeader keepIntent(NiftiHeader h) {
        h.intentCode = intentCode;
        h.intentName = intentName;
        return h;
    }

    /** @return intent_code (0 none; {@link #INTENT_ESTIMATE}, {@link #INTENT_LABEL}) */
    public int intentCode() {
        return intentCode;
    }

    /** @return intent_name (at most 15 characters) */
    public String intentName() {
        return intentName;
    }

    /**
     * @param code intent_code, e.g. {@link #INTENT_ESTIMATE}
     * @param name intent_name (ASCII, cut to 15 characters)
     * @return a copy with this intent
     */
    public NiftiHeader withIntent(int code, String name) {
        NiftiHeader h = keepIntent(new NiftiHeader(dim, pixdim, datatype, voxOffset, sclSlope, sclInter, xyztUnits,
                qformCode, sformCode, quatern, srow, description, order));
        h.intentCode = code;
        h.intentName = name == null ? "" : name;
        return h;
    }

    /**
     * @param text descrip (ASCII, cut to 79 characters)
     * @return a copy with this description
     */
    public NiftiHeader withDescription(String text) {
        return keepIntent(new NiftiHeader(dim, pixdim, datatype, voxOffset, sclSlope, sclInter, xyztUnits, qformCode,
                sformCode, quatern, srow, text == null ? "" : text, order));
    }

    /**
     * A copy with an affine as both qform and sform (codes as given): the sform rows are the
     * affine, the qform is its rotation as a quaternion with voxel sizes and qfac, following the
     * nifti1.h conversion. The affine's 3×3 part must be a rotation times positive voxel sizes (an
     * orthogonal grid); a shear keeps only the sform.
     *
     * @param affine 12 values, rows x, y, z of the voxel-to-world (mm) matrix
     * @param code transform code for both (1 scanner, 2 aligned)
     * @return the header
     */
    public NiftiHeader withAffine(double[] affine, int code) {
        float[] s = new float[12];
        for (int i = 0; i < 12; i++) {
            s[i] = (float) affine[i];
        }
        NiftiAffine.Quatern q = NiftiAffine.toQuatern(affine);
        float[] p = pixdim.clone();
        float[] quat = quatern.clone();
        int qc = 0;
        if (q != null) {
            p[0] = (float) q.qfac();
            p[1] = (float) q.dx();
            p[2] = (float) q.dy();
            p[3] = (float) q.dz();
            quat = new float[] {(float) q.b(), (float) q.c(), (float) q.d(), s[3], s[7], s[11]};
            qc = code;
        }
        return keepIntent(new NiftiHeader(dim, p, datatype, voxOffset, sclSlope, sclInter, xyztUnits, qc, code,
                quat, s, description, order));
    }

    /**
     * The voxel-to-world affine (mm): the sform if its code is set, else the qform if its code is
     * set, else the voxel sizes on the diagonal (nifti1.h method 1).
     *
     * @return 12 values, rows x, y, z
     */
    public double[] affine() {
        return NiftiAffine.of(this);
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
        b.putShort(68, (short) intentCode);
        byte[] iname = intentName.getBytes(StandardCharsets.US_ASCII);
        b.position(328);
        b.put(iname, 0, Math.min(15, iname.length));
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

    /** sizeof_hdr of a NIfTI-2 header */
    public static final int NIFTI2_HEADER_SIZE = 540;

    /** The on-disk forms a header can come from. */
    enum Format {
        /** NIfTI-1 single file, magic "n+1". */
        NIFTI1("NIfTI-1"),
        /** NIfTI-1 header of a .hdr/.img pair, magic "ni1". */
        NIFTI1_PAIR("NIfTI-1 pair"),
        /** ANALYZE 7.5 header of a .hdr/.img pair: no NIfTI magic, no orientation. */
        ANALYZE("ANALYZE 7.5"),
        /** NIfTI-2 single file, magic "n+2". */
        NIFTI2("NIfTI-2"),
        /** NIfTI-2 header of a pair, magic "ni2". */
        NIFTI2_PAIR("NIfTI-2 pair");

        private final String label;

        Format(String label) {
            this.label = label;
        }

        /** @return true if the voxel data sit in a separate .img file */
        boolean paired() {
            return this == NIFTI1_PAIR || this == ANALYZE || this == NIFTI2_PAIR;
        }

        @Override
        public String toString() {
            return label;
        }
    }

    private Format format = Format.NIFTI1;

    /** @return the form the header was read from (NIfTI-1 for headers made in memory) */
    Format format() {
        return format;
    }

    /**
     * The header size a file declares in its first four bytes: 348 (NIfTI-1, ANALYZE 7.5) or 540
     * (NIfTI-2), in either byte order.
     *
     * @param first4 the first four bytes
     * @param where file name for messages
     * @return 348 or 540
     * @throws InputException for anything else
     */
    static int headerSize(byte[] first4, String where) {
        if (first4.length < 4) {
            throw new InputException(where + ": not a NIfTI file (fewer than 4 bytes)");
        }
        for (ByteOrder o : new ByteOrder[] {ByteOrder.LITTLE_ENDIAN, ByteOrder.BIG_ENDIAN}) {
            int n = ByteBuffer.wrap(first4).order(o).getInt(0);
            if (n == HEADER_SIZE || n == NIFTI2_HEADER_SIZE) {
                return n;
            }
        }
        throw new InputException(where + ": not a NIfTI file (sizeof_hdr is neither 348 nor 540, little- or big-endian)");
    }

    /**
     * Decodes and checks a header of any supported form, told apart by sizeof_hdr and magic, never
     * by the file name: NIfTI-1 ("n+1" single file, "ni1" pair), ANALYZE 7.5 (348 bytes without a
     * NIfTI magic: a pair, no orientation), NIfTI-2 (540 bytes, "n+2"/"ni2"; layout of
     * {@code nifti2.h}, NIH DFWG 2011, from memory: int64 dims at 16, float64 pixdim at 104, int64
     * vox_offset at 168, descrip at 240, int32 qform/sform codes at 344/348, float64 quaternion at
     * 352 and srows at 400, int32 xyzt_units/intent_code at 500/504). Checks: rank 1..7, positive
     * sizes whose product fits (at most 2^31−1 values per volume set), a supported datatype with
     * matching bitpix, vox_offset ≥ the header and extender for single files. Non-finite
     * scl_slope/scl_inter read as 0 (slope 0: unscaled).
     *
     * @param raw the header bytes from the start of the file (348 or 540 of them at least)
     * @param where file name for messages
     * @return the header
     * @throws InputException naming the file, the field and the bad value
     */
    static NiftiHeader decode(byte[] raw, String where) {
        int size = headerSize(raw, where);
        if (raw.length < size) {
            throw new InputException(where + ": not a NIfTI file (only " + raw.length + " bytes, a header needs " + size + ")");
        }
        ByteBuffer b = ByteBuffer.wrap(raw).order(ByteOrder.LITTLE_ENDIAN);
        if (b.getInt(0) != size) {
            b.order(ByteOrder.BIG_ENDIAN);
        }
        return size == HEADER_SIZE ? decode1(raw, b, where) : decode2(raw, b, where);
    }

    private static NiftiHeader decode1(byte[] raw, ByteBuffer b, String where) {
        String magic = new String(raw, 344, 4, StandardCharsets.US_ASCII);
        Format f;
        if (magic.equals("n+1\0")) {
            f = Format.NIFTI1;
        } else if (magic.equals("ni1\0")) {
            f = Format.NIFTI1_PAIR;
        } else if (raw[344] != 'n') {
            f = Format.ANALYZE;  // ANALYZE 7.5 keeps smin (int32) here, never a NIfTI magic
        } else {
            throw new InputException(where + ": bad NIfTI-1 magic at byte 344 (expected \"n+1\\0\", \"ni1\\0\" or an ANALYZE 7.5 header)");
        }
        long[] d = new long[8];
        for (int i = 0; i < 8; i++) {
            d[i] = b.getShort(40 + 2 * i);
        }
        double[] p = new double[8];
        for (int i = 0; i < 8; i++) {
            p[i] = b.getFloat(76 + 4 * i);
        }
        boolean analyze = f == Format.ANALYZE;
        double[] q = new double[6];
        double[] s = new double[12];
        for (int i = 0; !analyze && i < 6; i++) {
            q[i] = b.getFloat(256 + 4 * i);
        }
        for (int i = 0; !analyze && i < 12; i++) {
            s[i] = b.getFloat(280 + 4 * i);
        }
        return build(f, where, b.order(), d, p, b.getShort(70), b.getShort(72), b.getFloat(108), b.getFloat(112),
                b.getFloat(116), raw[123] & 0xff, text(raw, 148, 80), analyze ? 0 : b.getShort(252),
                analyze ? 0 : b.getShort(254), q, s, analyze ? 0 : b.getShort(68), analyze ? "" : text(raw, 328, 16));
    }

    private static NiftiHeader decode2(byte[] raw, ByteBuffer b, String where) {
        String magic = new String(raw, 4, 4, StandardCharsets.US_ASCII);
        Format f;
        if (magic.equals("n+2\0")) {
            f = Format.NIFTI2;
        } else if (magic.equals("ni2\0")) {
            f = Format.NIFTI2_PAIR;
        } else {
            throw new InputException(where + ": bad NIfTI-2 magic at byte 4 (expected \"n+2\\0\" or \"ni2\\0\")");
        }
        long[] d = new long[8];
        for (int i = 0; i < 8; i++) {
            d[i] = b.getLong(16 + 8 * i);
        }
        double[] p = new double[8];
        for (int i = 0; i < 8; i++) {
            p[i] = b.getDouble(104 + 8 * i);
        }
        double[] q = new double[6];
        for (int i = 0; i < 6; i++) {
            q[i] = b.getDouble(352 + 8 * i);
        }
        double[] s = new double[12];
        for (int i = 0; i < 12; i++) {
            s[i] = b.getDouble(400 + 8 * i);
        }
        return build(f, where, b.order(), d, p, b.getShort(12), b.getShort(14), (double) b.getLong(168),
                b.getDouble(176), b.getDouble(184), b.getInt(500), text(raw, 240, 80), b.getInt(344), b.getInt(348),
                q, s, b.getInt(504), text(raw, 508, 16));
    }

    private static String text(byte[] raw, int from, int max) {
        int end = from;
        while (end < from + max && raw[end] != 0) {
            end++;
        }
        return new String(raw, from, end - from, StandardCharsets.US_ASCII);
    }

    private static NiftiHeader build(Format f, String where, ByteOrder order, long[] dl, double[] pd, int typeCode,
            int bitpix, double off, double slopeRaw, double interRaw, int units, String descrip, int qcode, int scode,
            double[] qd, double[] sd, int intent, String intentName) {
        if (dl[0] < 1 || dl[0] > 7) {
            throw new InputException(where + ": dim[0] must be 1..7, got " + dl[0]);
        }
        int[] d = new int[8];
        d[0] = (int) dl[0];
        for (int i = 1; i <= 7; i++) {
            if (i <= d[0] && (dl[i] < 1 || dl[i] > Integer.MAX_VALUE)) {
                throw new InputException(where + ": dim[" + i + "] must be within [1, 2^31-1], got " + dl[i]);
            }
            d[i] = i > d[0] ? 1 : (int) dl[i];
        }
        NiftiDatatype type = NiftiDatatype.ofCode((short) typeCode, where);
        if (bitpix != type.bitpix()) {
            throw new InputException(where + ": bitpix " + bitpix + " does not match datatype " + type + " (" + type.bitpix() + ")");
        }
        boolean fits = true;
        try {
            long volumes = 1;
            for (int i = 4; i <= 7; i++) {
                volumes = Math.multiplyExact(volumes, d[i]);
            }
            fits = volumes <= Integer.MAX_VALUE;
            Math.multiplyExact(Math.multiplyExact(Math.multiplyExact(Math.multiplyExact((long) d[1], d[2]), d[3]), volumes),
                    type.bytes());
        } catch (ArithmeticException e) {
            fits = false;
        }
        if (!fits) {
            throw new InputException(where + ": dims " + d[1] + "x" + d[2] + "x" + d[3] + "x" + d[4] + "x" + d[5] + "x" + d[6]
                    + "x" + d[7] + " declare more values than can be read (at most 2^31-1 volumes beyond dim 3)");
        }
        int minOffset = f == Format.NIFTI2 ? NIFTI2_HEADER_SIZE + 4 : f.paired() ? 0 : MIN_VOX_OFFSET;
        if (!(off >= minOffset) || off > 1e12 || off != Math.rint(off)) {
            // the data follow the header (nifti1.h, nifti2.h): any smaller offset, negative or
            // positive, would read the header as voxel data, so both are refused alike
            throw new InputException(where + ": vox_offset must be a whole number >= " + minOffset
                    + " (data after the header), got "
                    + (off == Math.rint(off) && Math.abs(off) < 1e12 ? String.valueOf((long) off) : String.valueOf(off)));
        }
        long voxOffset = (long) off;
        float[] p = new float[8];
        for (int i = 0; i < 8; i++) {
            p[i] = (float) pd[i];
        }
        float[] q = new float[6];
        for (int i = 0; i < 6; i++) {
            q[i] = (float) qd[i];
        }
        float[] s = new float[12];
        for (int i = 0; i < 12; i++) {
            s[i] = (float) sd[i];
        }
        // non-finite scaling fields (NaN is what writers leave when they do not scale) read as 0,
        // and scl_slope = 0 means unscaled (nifti1.h)
        NiftiHeader h = new NiftiHeader(d, p, type, voxOffset, finiteOrZero(slopeRaw), finiteOrZero(interRaw), units,
                qcode, scode, q, s, descrip, order);
        h.intentCode = intent;
        h.intentName = intentName;
        h.format = f;
        return h;
    }

    private static double finiteOrZero(double v) {
        return Double.isFinite(v) ? v : 0.0;
    }

    @Override
    public String toString() {
        StringBuilder sb = new StringBuilder(format.toString()).append(' ').append(datatype).append(' ');
        for (int i = 1; i <= dim[0]; i++) {
            sb.append(i > 1 ? "x" : "").append(dim[i]);
        }
        return sb.toString();
    }
}

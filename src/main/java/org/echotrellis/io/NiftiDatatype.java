package org.echotrellis.io;

import java.nio.ByteBuffer;

import org.echotrellis.InputException;

/**
 * The NIfTI-1 voxel datatypes this project reads and writes, with their codes and sizes from
 * {@code nifti1.h} (R. W. Cox, NIH Data Format Working Group, 2003/2007).
 */
public enum NiftiDatatype {
    /** unsigned 8-bit integer, code 2 */
    UINT8(2, 1),
    /** signed 16-bit integer, code 4 */
    INT16(4, 2),
    /** signed 32-bit integer, code 8 */
    INT32(8, 4),
    /** IEEE 32-bit float, code 16 */
    FLOAT32(16, 4),
    /** IEEE 64-bit float, code 64 */
    FLOAT64(64, 8),
    /** unsigned 16-bit integer, code 512 */
    UINT16(512, 2);

    private final int code;
    private final int bytes;

    NiftiDatatype(int code, int bytes) {
        this.code = code;
        this.bytes = bytes;
    }

    /** @return the NIfTI-1 datatype code */
    public int code() {
        return code;
    }

    /** @return bytes per voxel */
    public int bytes() {
        return bytes;
    }

    /** @return bits per voxel (the header's bitpix) */
    public int bitpix() {
        return 8 * bytes;
    }

    /** @return true for the integer types (values are rounded and clamped on writing) */
    public boolean isInteger() {
        return this != FLOAT32 && this != FLOAT64;
    }

    /**
     * Looks a code up.
     *
     * @param code datatype code from a header
     * @param where file name for the message
     * @return the datatype
     * @throws InputException if the code is not one of the supported types
     */
    public static NiftiDatatype ofCode(int code, String where) {
        for (NiftiDatatype t : values()) {
            if (t.code == code) {
                return t;
            }
        }
        throw new InputException(where + ": NIfTI datatype code " + code
                + " is not supported; allowed: 2 (uint8), 4 (int16), 8 (int32), 16 (float32), 64 (float64), 512 (uint16)");
    }

    /**
     * Reads one stored value at the buffer's position (advancing it), without scaling.
     *
     * @param buf buffer in the file's byte order
     * @return the stored value
     */
    double get(ByteBuffer buf) {
        switch (this) {
            case UINT8: return buf.get() & 0xff;
            case INT16: return buf.getShort();
            case UINT16: return buf.getShort() & 0xffff;
            case INT32: return buf.getInt();
            case FLOAT32: return buf.getFloat();
            default: return buf.getDouble();
        }
    }

    /**
     * Writes one value at the buffer's position (advancing it). Integer types round to nearest (ties upward)
     * and clamp to their range; NaN is stored as 0 for integer types.
     *
     * @param buf buffer in the output byte order
     * @param v value to store
     */
    void put(ByteBuffer buf, double v) {
        switch (this) {
            case UINT8: buf.put((byte) clampRound(v, 0, 255)); break;
            case INT16: buf.putShort((short) clampRound(v, Short.MIN_VALUE, Short.MAX_VALUE)); break;
            case UINT16: buf.putShort((short) clampRound(v, 0, 65535)); break;
            case INT32: buf.putInt((int) clampRound(v, Integer.MIN_VALUE, Integer.MAX_VALUE)); break;
            case FLOAT32: buf.putFloat((float) v); break;
            default: buf.putDouble(v); break;
        }
    }

    private static long clampRound(double v, long lo, long hi) {
        if (Double.isNaN(v)) {
            return 0;
        }
        long r = Math.round(v);
        return Math.max(lo, Math.min(hi, r));
    }
}

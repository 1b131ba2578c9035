package org.echotrellis.io;

import java.io.BufferedInputStream;
import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.zip.GZIPInputStream;
import java.util.zip.GZIPOutputStream;
import java.util.zip.ZipException;

import org.echotrellis.InputException;
import org.echotrellis.InputFiles;

/**
 * Reading and writing NIfTI-1 single files ({@code .nii}, and {@code .nii.gz}: the whole file
 * gzip-compressed, RFC 1952), following {@code nifti1.h} (R. W. Cox, NIH DFWG 2003/2007).
 * Compression is detected from the leading bytes 0x1f 0x8b on reading and from the
 * {@code .gz} extension on writing. Inflation is bounded: a stream that would inflate beyond
 * vox_offset plus the data size declared by its header is refused, never inflated unbounded, and a
 * declared size larger than the free space of the temporary directory is refused up front.
 */
public final class Nifti {
    private static final int CHUNK = 1 << 16;

    private Nifti() { }

    /**
     * Opens a file for slab-by-slab reading.
     *
     * @param file .nii or .nii.gz
     * @return the open input (close it)
     * @throws InputException for a missing, truncated, oversized or non-NIfTI file
     */
    public static NiftiInput open(Path file) {
        String where = file.toString();
        InputFiles.requireRegular(file, where);
        try {
            byte[] head = new byte[2];
            try (InputStream in = Files.newInputStream(file)) {
                if (in.readNBytes(head, 0, 2) < 2) {
                    throw new InputException(where + ": not a NIfTI-1 file (fewer than 2 bytes)");
                }
            }
            if ((head[0] & 0xff) == 0x1f && (head[1] & 0xff) == 0x8b) {
                return openCompressed(file, where);
            }
            FileChannel ch = FileChannel.open(file, StandardOpenOption.READ);
            try {
                ByteBuffer hb = ByteBuffer.allocate(NiftiHeader.HEADER_SIZE);
                while (hb.hasRemaining() && ch.read(hb) >= 0) {
                    // read the header
                }
                NiftiHeader h = NiftiHeader.decode(java.util.Arrays.copyOf(hb.array(), hb.position()), where);
                long need = h.voxOffset() + h.dataBytes();
                if (ch.size() < need) {
                    throw new InputException(where + ": file is truncated: " + ch.size() + " bytes, header declares " + need);
                }
                return new NiftiInput(h, ch, null, where);
            } catch (RuntimeException e) {
                ch.close();
                throw e;
            }
        } catch (NoSuchFileException e) {
            throw new InputException(where + ": file not found");
        } catch (IOException e) {
            throw InputFiles.readFailure(where, e);
        }
    }

    /** Free space kept after inflating: a tenth of what is free, at least 64 MB (common practice). */
    static long freeSpaceMargin(long free) {
        return Math.max(free / 10, 64L << 20);
    }

    /**
     * Reads only the header (inflating the first 348 bytes of a {@code .nii.gz}), so shapes can be
     * checked before any voxel data are inflated or allocated.
     *
     * @param file .nii or .nii.gz
     * @return the header
     * @throws InputException for a missing, unreadable or non-NIfTI file
     */
    public static NiftiHeader readHeader(Path file) {
        String where = file.toString();
        InputFiles.requireRegular(file, where);
        try (InputStream raw = new BufferedInputStream(Files.newInputStream(file))) {
            raw.mark(2);
            int b0 = raw.read();
            int b1 = raw.read();
            raw.reset();
            InputStream in = b0 == 0x1f && b1 == 0x8b ? new GZIPInputStream(raw, CHUNK) : raw;
            return NiftiHeader.decode(in.readNBytes(NiftiHeader.HEADER_SIZE), where);
        } catch (ZipException | java.io.EOFException e) {
            throw new InputException(where + ": corrupt or truncated gzip stream (" + e.getMessage() + ")", e);
        } catch (IOException e) {
            throw InputFiles.readFailure(where, e);
        }
    }

    /**
     * Reads a 3-D image that must lie on the grid of a series, checking its header first so a
     * mismatched or oversized file is refused before its data are inflated or allocated.
     *
     * @param file the image (.nii or .nii.gz)
     * @param grid header of the series
     * @param option the option naming the file in messages, e.g. {@code --mask}
     * @return the image
     * @throws InputException naming both shapes when they differ
     */
    public static NiftiImage readOnGrid(Path file, NiftiHeader grid, String option) {
        checkOnGrid(file, grid, option);
        return read(file);
    }

    /**
     * Checks from its header alone that a 3-D image lies on the grid of a series.
     *
     * @param file the image (.nii or .nii.gz); null is accepted and ignored
     * @param grid header of the series
     * @param option the option naming the file in messages
     * @throws InputException naming both shapes when they differ
     */
    public static void checkOnGrid(Path file, NiftiHeader grid, String option) {
        if (file != null) {
            VolumeJob.sameGrid(grid, readHeader(file), option, file.toString());
        }
    }

    private static final String TEMP_PREFIX = "echotrellis-inflated-";

    /** Removes inflated copies left by processes that no longer run (killed with SIGKILL). */
    private static void cleanStaleTemporaries(Path tmpDir) {
        try (java.nio.file.DirectoryStream<Path> ds = Files.newDirectoryStream(tmpDir, TEMP_PREFIX + "*.nii")) {
            for (Path p : ds) {
                String rest = p.getFileName().toString().substring(TEMP_PREFIX.length());
                try {
                    long pid = Long.parseLong(rest.substring(0, rest.indexOf('-')));
                    if (ProcessHandle.of(pid).isEmpty()) {
                        Files.deleteIfExists(p);
                    }
                } catch (RuntimeException | IOException ignored) {
                    // not one of ours, or already gone
                }
            }
        } catch (IOException | RuntimeException ignored) {
            // best effort
        }
    }

    private static NiftiInput openCompressed(Path file, String where) throws IOException {
        Path tmpDir = Path.of(System.getProperty("java.io.tmpdir"));
        cleanStaleTemporaries(tmpDir);
        Path tmp = Files.createTempFile(tmpDir, TEMP_PREFIX + ProcessHandle.current().pid() + "-", ".nii");
        tmp.toFile().deleteOnExit();
        try (InputStream in = new GZIPInputStream(new BufferedInputStream(Files.newInputStream(file)), CHUNK);
                OutputStream out = new BufferedOutputStream(Files.newOutputStream(tmp), CHUNK)) {
            byte[] hb = in.readNBytes(NiftiHeader.HEADER_SIZE);
            NiftiHeader h = NiftiHeader.decode(hb, where);
            long need = h.voxOffset() + h.dataBytes();
            long free = Files.getFileStore(tmp).getUsableSpace();
            if (need > free - freeSpaceMargin(free)) {
                throw new InputException(where + ": header declares " + need + " bytes; its inflated temporary copy in "
                        + tmpDir + " would leave less than " + (freeSpaceMargin(free) >> 20) + " MB of the " + (free >> 20)
                        + " MB free; refused (set java.io.tmpdir to a larger disk, or decompress the file)");
            }
            out.write(hb);
            long have = hb.length;
            byte[] buf = new byte[CHUNK];
            while (have < need) {
                int n = in.read(buf, 0, (int) Math.min(buf.length, need - have));
                if (n < 0) {
                    throw new InputException(where + ": file is truncated: inflates to " + have + " bytes, header declares " + need);
                }
                out.write(buf, 0, n);
                have += n;
            }
            if (in.read() >= 0) {
                throw new InputException(where + ": gzip stream inflates beyond the " + need
                        + " bytes declared by its header; refused");
            }
        } catch (ZipException | java.io.EOFException e) {
            Files.deleteIfExists(tmp);
            throw new InputException(where + ": corrupt or truncated gzip stream (" + e.getMessage() + ")", e);
        } catch (RuntimeException | IOException e) {
            Files.deleteIfExists(tmp);
            throw e;
        }
        FileChannel ch = FileChannel.open(tmp, StandardOpenOption.READ);
        byte[] hb = new byte[NiftiHeader.HEADER_SIZE];
        ch.read(ByteBuffer.wrap(hb), 0);
        return new NiftiInput(NiftiHeader.decode(hb, where), ch, tmp, where);
    }

    /**
     * Reads a whole file into memory.
     *
     * @param file .nii or .nii.gz
     * @return the image (scaled values)
     */
    public static NiftiImage read(Path file) {
        try (NiftiInput in = open(file)) {
            return in.readAll();
        }
    }

    /**
     * Writes an image atomically. Values are stored in the header's datatype and byte order;
     * if the header is scaled the stored value is (value − inter)/slope. Gzip when the name ends
     * in {@code .gz}.
     *
     * @param file target
     * @param header shape, datatype, scaling, byte order and geometry
     * @param values values in file order (not modified), length = header.totalVoxels()
     * @param force overwrite an existing file
     */
    public static void write(Path file, NiftiHeader header, double[] values, boolean force) {
        write(file, header, values.length, i -> values[i], force);
    }

    /**
     * Writes a float map atomically (see {@link #write(Path, NiftiHeader, double[], boolean)}).
     *
     * @param file target
     * @param header shape, datatype and geometry
     * @param values values in file order (not modified)
     * @param force overwrite an existing file
     */
    public static void write(Path file, NiftiHeader header, float[] values, boolean force) {
        write(file, header, values.length, i -> values[i], force);
    }

    private interface Values {
        double at(int i);
    }

    private static void write(Path file, NiftiHeader header, int count, Values values, boolean force) {
        if (count != header.totalVoxels()) {
            throw new IllegalArgumentException("header needs " + header.totalVoxels() + " values, got " + count);
        }
        boolean gz = file.getFileName().toString().endsWith(".gz");
        NiftiHeader h = header;
        double slope = h.isScaled() ? h.sclSlope() : 1.0;
        double inter = h.isScaled() ? h.sclInter() : 0.0;
        NiftiDatatype type = h.datatype();
        AtomicFiles.write(file, force, raw -> {
            OutputStream out = gz ? new GZIPOutputStream(raw, CHUNK) : raw;
            out.write(h.encode());
            ByteBuffer buf = ByteBuffer.allocate(CHUNK).order(h.order());
            for (int i = 0; i < count; i++) {
                if (buf.remaining() < type.bytes()) {
                    out.write(buf.array(), 0, buf.position());
                    buf.clear();
                }
                type.put(buf, (values.at(i) - inter) / slope);
            }
            out.write(buf.array(), 0, buf.position());
            if (out instanceof GZIPOutputStream) {
                ((GZIPOutputStream) out).finish();
            }
            out.flush();
        });
    }

}

package org.echotrellis.io;

import java.io.BufferedInputStream;
import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.channels.SeekableByteChannel;
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
            Path headerFile = pairHeader(file);
            NiftiHeader h = NiftiHeader.decode(readHead(headerFile, where), where);
            if (h.format().paired()) {
                return openPair(headerFile, file, h, where);
            }
            if (gzipped(file)) {
                try (InputStream in = new GZIPInputStream(new BufferedInputStream(Files.newInputStream(file)), CHUNK)) {
                    return spool(in, where);
                } catch (ZipException | java.io.EOFException e) {
                    throw new InputException(where + ": corrupt or truncated gzip stream (" + e.getMessage() + ")", e);
                }
            }
            return inPlace(FileChannel.open(file, StandardOpenOption.READ), where);
        } catch (NoSuchFileException e) {
            throw new InputException(where + ": file not found");
        } catch (ZipException | java.io.EOFException e) {
            throw new InputException(where + ": corrupt or truncated gzip stream (" + e.getMessage() + ")", e);
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
        try {
            return NiftiHeader.decode(readHead(pairHeader(file), where), where);
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

    /**
     * A new temporary file for an inflated copy, named with this process id so that a later run can
     * remove it if this process is killed; deleted on exit. Stale copies are removed first.
     */
    private static Path inflatedTemporary(String suffix) throws IOException {
        Path tmpDir = Path.of(System.getProperty("java.io.tmpdir"));
        cleanStaleTemporaries(tmpDir);
        Path tmp = Files.createTempFile(tmpDir, TEMP_PREFIX + ProcessHandle.current().pid() + "-", suffix);
        tmp.toFile().deleteOnExit();
        return tmp;
    }

    /** Removes inflated copies left by processes that no longer run (killed with SIGKILL). */
    private static void cleanStaleTemporaries(Path tmpDir) {
        try (java.nio.file.DirectoryStream<Path> ds = Files.newDirectoryStream(tmpDir, TEMP_PREFIX + "*")) {
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

    private static boolean gzipped(Path file) throws IOException {
        try (InputStream in = Files.newInputStream(file)) {
            byte[] head = in.readNBytes(2);
            return head.length == 2 && (head[0] & 0xff) == 0x1f && (head[1] & 0xff) == 0x8b;
        }
    }

    /** The header bytes of a file (inflated if gzip): 348 or 540 of them. */
    private static byte[] readHead(Path file, String where) throws IOException {
        boolean gz = gzipped(file);
        try (InputStream raw = Files.newInputStream(file);
                InputStream in = gz ? new GZIPInputStream(new BufferedInputStream(raw), CHUNK) : raw) {
            byte[] first = in.readNBytes(4);
            int size = NiftiHeader.headerSize(first, where);
            byte[] all = java.util.Arrays.copyOf(first, size);
            int n = in.readNBytes(all, 4, size - 4);
            return java.util.Arrays.copyOf(all, 4 + n);
        }
    }

    /**
     * The header file of a path: an image file named {@code X.img[.gz]} whose sibling
     * {@code X.hdr[.gz]} exists has its header there; any other path holds its own header.
     */
    private static Path pairHeader(Path file) {
        String name = file.getFileName().toString();
        String lower = name.toLowerCase(java.util.Locale.ROOT);
        int cut = lower.endsWith(".img") ? 4 : lower.endsWith(".img.gz") ? 7 : -1;
        if (cut < 0) {
            return file;
        }
        String stem = name.substring(0, name.length() - cut);
        for (String ext : new String[] {".hdr", ".hdr.gz", ".HDR"}) {
            Path h = file.resolveSibling(stem + ext);
            if (Files.isRegularFile(h)) {
                return h;
            }
        }
        return file;
    }

    /** The image file of a pair header: the given path if it is not the header, else X.img[.gz]. */
    private static Path pairImage(Path headerFile, Path given, String where) {
        if (!given.equals(headerFile)) {
            return given;
        }
        String name = headerFile.getFileName().toString();
        String lower = name.toLowerCase(java.util.Locale.ROOT);
        int cut = lower.endsWith(".hdr.gz") ? 7 : lower.lastIndexOf('.') >= 0 ? name.length() - lower.lastIndexOf('.') : 0;
        String stem = name.substring(0, name.length() - cut);
        for (String ext : new String[] {".img", ".img.gz", ".IMG"}) {
            Path i = headerFile.resolveSibling(stem + ext);
            if (Files.isRegularFile(i)) {
                return i;
            }
        }
        throw new InputException(where + ": a .hdr/.img pair header (no single-file NIfTI magic \"n+1\" at byte 344), "
                + "but its image file " + stem + ".img is missing");
    }

    private static NiftiInput openPair(Path headerFile, Path given, NiftiHeader h, String where) throws IOException {
        Path image = pairImage(headerFile, given, where);
        String what = where + " (image " + image.getFileName() + ")";
        long need = h.voxOffset() + h.dataBytes();
        if (!gzipped(image)) {
            FileChannel ch = FileChannel.open(image, StandardOpenOption.READ);
            if (ch.size() < need) {
                ch.close();
                throw new InputException(what + ": file is truncated: " + ch.size() + " bytes, header declares " + need);
            }
            return new NiftiInput(h, ch, null, where);
        }
        Path tmp = inflatedTemporary(".img");
        try (InputStream in = new GZIPInputStream(new BufferedInputStream(Files.newInputStream(image)), CHUNK);
                OutputStream out = new BufferedOutputStream(Files.newOutputStream(tmp), CHUNK)) {
            copyBounded(in, out, 0, need, what);
        } catch (RuntimeException | IOException e) {
            Files.deleteIfExists(tmp);
            throw e;
        }
        return new NiftiInput(h, FileChannel.open(tmp, StandardOpenOption.READ), tmp, where);
    }

    /** Copies until {@code need} bytes are written in all; refuses a stream that ends early or (gzip) runs on. */
    private static void copyBounded(InputStream in, OutputStream out, long have, long need, String where) throws IOException {
        long done = have;
        byte[] buf = new byte[CHUNK];
        while (done < need) {
            int n = in.read(buf, 0, (int) Math.min(buf.length, need - done));
            if (n < 0) {
                throw new InputException(where + ": file is truncated: inflates to " + done + " bytes, header declares " + need);
            }
            out.write(buf, 0, n);
            done += n;
        }
        if (in instanceof GZIPInputStream && in.read() >= 0) {
            throw new InputException(where + ": gzip stream inflates beyond the " + need
                    + " bytes declared by its header; refused");
        }
    }

    /**
     * Opens a series from a stream (for example a file of a distributed file system). The stream is
     * copied (inflated if it starts with the gzip bytes 0x1f 0x8b) into a temporary file, bounded by
     * the size its header declares; {@link NiftiInput#close()} deletes the copy. The stream is read
     * to its end but not closed.
     *
     * @param in the file's bytes from the start
     * @param name the file name used in messages
     * @return the open input (close it)
     * @throws InputException for a truncated, oversized or non-NIfTI stream
     */
    public static NiftiInput open(InputStream in, String name) {
        try {
            BufferedInputStream b = new BufferedInputStream(in, CHUNK);
            b.mark(2);
            int b0 = b.read();
            int b1 = b.read();
            b.reset();
            InputStream src = b0 == 0x1f && b1 == 0x8b ? new GZIPInputStream(b, CHUNK) : b;
            return spool(src, name);
        } catch (ZipException | java.io.EOFException e) {
            throw new InputException(name + ": corrupt or truncated gzip stream (" + e.getMessage() + ")", e);
        } catch (IOException e) {
            throw new InputException(name + ": cannot read (" + e.getMessage() + ")", e);
        }
    }

    /**
     * Opens a series from a seekable channel positioned anywhere (the file starts at position 0).
     * An uncompressed file is read in place (the channel is closed with the input); a gzip file is
     * inflated into a temporary file as for {@link #open(InputStream, String)} and the channel closed.
     *
     * @param channel the file's bytes
     * @param name the file name used in messages
     * @return the open input (close it)
     * @throws InputException for a truncated, oversized or non-NIfTI file
     */
    public static NiftiInput open(SeekableByteChannel channel, String name) {
        try {
            ByteBuffer head = ByteBuffer.allocate(2);
            channel.position(0);
            while (head.hasRemaining() && channel.read(head) >= 0) {
                // first two bytes
            }
            if (head.position() < 2) {
                channel.close();
                throw new InputException(name + ": not a NIfTI file (fewer than 2 bytes)");
            }
            channel.position(0);
            if ((head.get(0) & 0xff) == 0x1f && (head.get(1) & 0xff) == 0x8b) {
                try (SeekableByteChannel c = channel) {
                    return open(java.nio.channels.Channels.newInputStream(c), name);
                }
            }
            return inPlace(channel, name);
        } catch (IOException e) {
            throw new InputException(name + ": cannot read (" + e.getMessage() + ")", e);
        }
    }

    private static NiftiInput inPlace(SeekableByteChannel ch, String where) throws IOException {
        try {
            ByteBuffer hb = ByteBuffer.allocate(NiftiHeader.NIFTI2_HEADER_SIZE);
            ch.position(0);
            while (hb.hasRemaining() && ch.read(hb) >= 0) {
                // read the header
            }
            NiftiHeader h = NiftiHeader.decode(java.util.Arrays.copyOf(hb.array(), hb.position()), where);
            if (h.format().paired()) {
                throw new InputException(where + ": a .hdr/.img pair header; open the pair by its file path");
            }
            long need = h.voxOffset() + h.dataBytes();
            if (ch.size() < need) {
                throw new InputException(where + ": file is truncated: " + ch.size() + " bytes, header declares " + need);
            }
            return new NiftiInput(h, ch, null, where);
        } catch (RuntimeException | IOException e) {
            ch.close();
            throw e;
        }
    }

    /** Copies a decompressed stream into a temporary file, bounded by its header's declared size. */
    private static NiftiInput spool(InputStream in, String where) throws IOException {
        Path tmp = inflatedTemporary(".nii");
        Path tmpDir = tmp.getParent();
        try (OutputStream out = new BufferedOutputStream(Files.newOutputStream(tmp), CHUNK)) {
            byte[] first = in.readNBytes(4);
            byte[] hb = java.util.Arrays.copyOf(first, NiftiHeader.headerSize(first, where));
            int got = in.readNBytes(hb, 4, hb.length - 4);
            NiftiHeader h = NiftiHeader.decode(java.util.Arrays.copyOf(hb, 4 + got), where);
            if (h.format().paired()) {
                throw new InputException(where + ": a .hdr/.img pair header; open the pair by its file path");
            }
            long need = h.voxOffset() + h.dataBytes();
            long free = Files.getFileStore(tmp).getUsableSpace();
            if (need > free - freeSpaceMargin(free)) {
                throw new InputException(where + ": header declares " + need + " bytes; its inflated temporary copy in "
                        + tmpDir + " would leave less than " + (freeSpaceMargin(free) >> 20) + " MB of the " + (free >> 20)
                        + " MB free; refused (set java.io.tmpdir to a larger disk, or decompress the file)");
            }
            out.write(hb);
            copyBounded(in, out, hb.length, need, where);
        } catch (ZipException | java.io.EOFException e) {
            Files.deleteIfExists(tmp);
            throw new InputException(where + ": corrupt or truncated gzip stream (" + e.getMessage() + ")", e);
        } catch (RuntimeException | IOException e) {
            Files.deleteIfExists(tmp);
            throw e;
        }
        FileChannel ch = FileChannel.open(tmp, StandardOpenOption.READ);
        byte[] hb = new byte[NiftiHeader.NIFTI2_HEADER_SIZE];
        int n = ch.read(ByteBuffer.wrap(hb), 0);
        return new NiftiInput(NiftiHeader.decode(java.util.Arrays.copyOf(hb, Math.max(0, n)), where), ch, tmp, where);
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
        AtomicFiles.write(file, force, raw -> encode(raw, header, count, values, gz));
    }

    /**
     * Writes an image to a stream (for example a file of a distributed file system) in the same
     * form as {@link #write(Path, NiftiHeader, float[], boolean)}; the stream is flushed, not closed.
     *
     * @param out the target stream
     * @param header shape, datatype and geometry
     * @param values values in file order (not modified), length = header.totalVoxels()
     * @param gzip compress (for a {@code .nii.gz} name)
     * @throws IOException if the stream fails
     */
    public static void write(OutputStream out, NiftiHeader header, float[] values, boolean gzip) throws IOException {
        if (values.length != header.totalVoxels()) {
            throw new IllegalArgumentException("header needs " + header.totalVoxels() + " values, got " + values.length);
        }
        encode(out, header, values.length, i -> values[i], gzip);
    }

    private static void encode(OutputStream raw, NiftiHeader h, int count, Values values, boolean gz) throws IOException {
        double slope = h.isScaled() ? h.sclSlope() : 1.0;
        double inter = h.isScaled() ? h.sclInter() : 0.0;
        NiftiDatatype type = h.datatype();
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
    }
}

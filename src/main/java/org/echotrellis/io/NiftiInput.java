package org.echotrellis.io;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.channels.SeekableByteChannel;
import java.nio.file.Files;
import java.nio.file.Path;

import org.echotrellis.InputException;

/**
 * An open NIfTI file read slab by slab (a range of z slices across all volumes), so a large
 * 4-D series never has to sit in memory whole. A {@code .nii.gz} input is inflated once, bounded
 * by the header's declared size, into a temporary file that {@link #close()} deletes. Not
 * thread-safe; the buffer grows to the largest slab requested and is then reused.
 */
public final class NiftiInput implements AutoCloseable {
    private final NiftiHeader header;
    private final SeekableByteChannel channel;
    private final Path temporary;
    private final String source;
    private ByteBuffer buffer = ByteBuffer.allocate(0);

    NiftiInput(NiftiHeader header, SeekableByteChannel channel, Path temporary, String source) {
        this.header = header;
        this.channel = channel;
        this.temporary = temporary;
        this.source = source;
    }

    /** @return the header */
    public NiftiHeader header() {
        return header;
    }

    /** @return the file name used in messages */
    public String source() {
        return source;
    }

    /**
     * Reads slices z0 .. z0+nz−1 of every volume, scaled.
     *
     * @param z0 first slice
     * @param nz number of slices
     * @param out written: out[v·volumes + t] for voxel v of the slab (x fastest) and volume t;
     *        length ≥ nx·ny·nz·volumes
     */
    public void readSlab(int z0, int nz, double[] out) {
        int nx = header.size(1);
        int ny = header.size(2);
        int vols = header.volumes();
        if (z0 < 0 || nz < 1 || z0 + nz > header.size(3)) {
            throw new IllegalArgumentException("slab " + z0 + "+" + nz + " outside 0.." + header.size(3));
        }
        int slabVoxels = nx * ny * nz;
        NiftiDatatype type = header.datatype();
        int bytes = slabVoxels * type.bytes();
        if (buffer.capacity() < bytes) {
            buffer = ByteBuffer.allocate(bytes);
        }
        buffer.order(header.order());
        boolean scaled = header.isScaled();
        double slope = header.sclSlope();
        double inter = header.sclInter();
        long perVolume = header.voxelsPerVolume();
        for (int t = 0; t < vols; t++) {
            long pos = header.voxOffset() + ((long) t * perVolume + (long) z0 * nx * ny) * type.bytes();
            buffer.clear().limit(bytes);
            readFully(pos);
            buffer.flip();
            for (int v = 0; v < slabVoxels; v++) {
                double x = type.get(buffer);
                out[v * vols + t] = scaled ? slope * x + inter : x;
            }
        }
    }

    /**
     * Reads the whole file into memory.
     *
     * @return the image
     * @throws InputException if it has more than 2^31−16 values
     */
    public NiftiImage readAll() {
        long total = header.totalVoxels();
        if (total > Integer.MAX_VALUE - 16) {
            throw new InputException(source + ": " + total + " values are too many to hold in memory");
        }
        int nz = header.size(3);
        int vols = header.volumes();
        int slice = header.size(1) * header.size(2);
        double[] slab = new double[slice * vols];
        double[] all = new double[(int) total];
        for (int z = 0; z < nz; z++) {
            readSlab(z, 1, slab);
            for (int v = 0; v < slice; v++) {
                for (int t = 0; t < vols; t++) {
                    all[(int) (t * header.voxelsPerVolume()) + z * slice + v] = slab[v * vols + t];
                }
            }
        }
        return new NiftiImage(header, all, source, false);
    }

    private void readFully(long pos) {
        try {
            long p = pos;
            while (buffer.hasRemaining()) {
                channel.position(p);
                int n = channel.read(buffer);
                if (n < 0) {
                    throw new InputException(source + ": file is truncated (voxel data end before byte " + (pos + buffer.limit()) + ")");
                }
                p += n;
            }
        } catch (IOException e) {
            throw new UncheckedIOException(source + ": " + e.getMessage(), e);
        }
    }

    /** Closes the file and deletes the temporary inflated copy, if any. */
    @Override
    public void close() {
        try {
            channel.close();
            if (temporary != null) {
                Files.deleteIfExists(temporary);
            }
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }
}

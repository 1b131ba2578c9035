package org.echotrellis.io;

import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.util.List;

import org.echotrellis.InputException;

/**
 * Joins one 3-D file per echo (as BIDS stores multi-echo series) into one 4-D float32 series in a
 * temporary file, slice by slice (at most one slice of one echo in memory), and opens it.
 * Every echo must have the first one's grid and affine.
 */
public final class EchoStack {
    private EchoStack() { }

    /**
     * @param echoes the per-echo files, in echo order
     * @param name name of the joined series in messages
     * @return the open 4-D series; {@link NiftiInput#close()} deletes the temporary file
     * @throws InputException if an echo is not 3-D or lies on another grid
     */
    public static NiftiInput open(List<Path> echoes, String name) {
        if (echoes.isEmpty()) {
            throw new IllegalArgumentException("no echo files");
        }
        Path tmp = null;
        try (NiftiInput first = Nifti.open(echoes.get(0))) {
            NiftiHeader h0 = first.header();
            NiftiHeader out = h0.asMap(NiftiDatatype.FLOAT32).withVolumes(echoes.size());
            tmp = Files.createTempFile("echotrellis-", ".nii");
            tmp.toFile().deleteOnExit();
            int slice = h0.size(1) * h0.size(2);
            int nz = h0.size(3);
            long perEcho = (long) slice * nz;
            try (FileChannel ch = FileChannel.open(tmp, StandardOpenOption.WRITE)) {
                ch.write(ByteBuffer.wrap(out.encode()), 0);
                double[] values = new double[slice];
                ByteBuffer buf = ByteBuffer.allocate(slice * 4).order(out.order());
                for (int e = 0; e < echoes.size(); e++) {
                    try (NiftiInput in = e == 0 ? null : Nifti.open(echoes.get(e))) {
                        NiftiInput src = e == 0 ? first : in;
                        check(h0, src, echoes.get(0));
                        for (int z = 0; z < nz; z++) {
                            src.readSlab(z, 1, values);
                            buf.clear();
                            for (double v : values) {
                                buf.putFloat((float) v);
                            }
                            buf.flip();
                            long pos = NiftiHeader.MIN_VOX_OFFSET + 4L * (e * perEcho + (long) z * slice);
                            while (buf.hasRemaining()) {
                                pos += ch.write(buf, pos);
                            }
                        }
                    }
                }
            }
            FileChannel read = FileChannel.open(tmp, StandardOpenOption.READ);
            return new NiftiInput(out, read, tmp, name);
        } catch (IOException e) {
            deleteQuietly(tmp);
            throw new InputException(name + ": cannot join the echo files (" + e.getMessage() + ")", e);
        } catch (RuntimeException e) {
            deleteQuietly(tmp);
            throw e;
        }
    }

    private static void check(NiftiHeader h0, NiftiInput src, Path firstFile) {
        NiftiHeader h = src.header();
        if (h.volumes() != 1 || h.size(1) != h0.size(1) || h.size(2) != h0.size(2) || h.size(3) != h0.size(3)) {
            throw new InputException(src.source() + ": echo file has shape " + h + ", the first echo " + firstFile
                    + " has " + h0 + " (every echo must be one 3-D volume on the same grid)");
        }
        String diff = NiftiAffine.difference(h0, h);
        if (diff != null) {
            throw new InputException(src.source() + ": echo file lies on another grid than " + firstFile + ": " + diff);
        }
    }

    private static void deleteQuietly(Path p) {
        try {
            if (p != null) {
                Files.deleteIfExists(p);
            }
        } catch (IOException e) {
            // best effort: the file is also marked delete-on-exit
        }
    }
}

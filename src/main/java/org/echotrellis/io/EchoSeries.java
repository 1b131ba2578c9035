package org.echotrellis.io;

import java.io.BufferedOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.io.UncheckedIOException;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import org.echotrellis.InputException;

/**
 * Joins one 3-D file per echo (as BIDS stores multi-echo series: {@code _echo-<n>}) into one 4-D
 * float32 {@code .nii} (x, y, z, echo) that {@link Nifti#open(Path)} streams slab by slab. One echo
 * volume is held at a time, so memory stays at one 3-D volume whatever the echo count. Every echo must
 * have the first one's matrix and affine.
 */
public final class EchoSeries {
    private EchoSeries() { }

    /**
     * @param echoFiles the 3-D echo files in echo order (.nii or .nii.gz)
     * @param out the 4-D file to write (uncompressed; replaced if present)
     * @return the 4-D header written
     * @throws InputException naming the file if an echo is not 3-D, or its grid differs from the first
     */
    public static NiftiHeader join(List<Path> echoFiles, Path out) {
        if (echoFiles.isEmpty()) {
            throw new IllegalArgumentException("no echo files");
        }
        NiftiHeader first = null;
        NiftiHeader h4 = null;
        try (OutputStream o = new BufferedOutputStream(Files.newOutputStream(out), 1 << 16)) {
            ByteBuffer buf = null;
            for (Path f : echoFiles) {
                NiftiImage img = Nifti.read(f);
                NiftiHeader h = img.header();
                if (h.volumes() != 1) {
                    throw new InputException(f + ": " + h.volumes() + " volumes; one 3-D image per echo file expected");
                }
                if (first == null) {
                    first = h;
                    h4 = h.asMap(NiftiDatatype.FLOAT32).withVolumes(echoFiles.size())
                            .withOrder(ByteOrder.LITTLE_ENDIAN);
                    o.write(h4.encode());
                    buf = ByteBuffer.allocate((int) h.voxelsPerVolume() * 4).order(ByteOrder.LITTLE_ENDIAN);
                } else {
                    String diff = h.size(1) != first.size(1) || h.size(2) != first.size(2) || h.size(3) != first.size(3)
                            ? "matrix " + h.size(1) + "x" + h.size(2) + "x" + h.size(3) + " vs " + first.size(1) + "x"
                                    + first.size(2) + "x" + first.size(3)
                            : NiftiAffine.difference(first, h);
                    if (diff != null) {
                        throw new InputException(f + ": not on the grid of " + echoFiles.get(0) + " (" + diff + ")");
                    }
                }
                buf.clear();
                for (int i = 0; i < img.size(); i++) {
                    buf.putFloat((float) img.get(i));
                }
                o.write(buf.array(), 0, buf.position());
            }
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + out + ": " + e.getMessage(), e);
        }
        return h4;
    }
}

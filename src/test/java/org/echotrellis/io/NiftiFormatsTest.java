package org.echotrellis.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.zip.GZIPOutputStream;

import org.echotrellis.InputException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * NIfTI-2 single files, .hdr/.img pairs (NIfTI-1 and ANALYZE 7.5), the qform and 5-D series. The
 * files are built byte by byte here from the published layouts (nifti1.h, Cox 2003/2007; nifti2.h,
 * NIH DFWG 2011, offsets from memory), independently of the project's writer.
 */
class NiftiFormatsTest {
    @TempDir
    Path dir;

    private static final float[] VALUES = {1.5f, -2f, 3.25f, 4f, 5f, 6f, 7f, 8f, 9f, 10f, 11f, 12f};  // 3x2x2

    /** nifti2.h: 540-byte header; magic at 4, int64 dim at 16, float64 pixdim at 104, vox_offset at 168. */
    private static byte[] nifti2(ByteOrder order, boolean pair) {
        ByteBuffer b = ByteBuffer.allocate(544 + 4 * VALUES.length).order(order);
        b.putInt(0, 540);
        b.position(4);
        b.put((pair ? "ni2\0" : "n+2\0").getBytes(StandardCharsets.US_ASCII)).put(new byte[] {'\r', '\n', 032, '\n'});
        b.putShort(12, (short) 16);  // float32
        b.putShort(14, (short) 32);
        long[] dim = {3, 3, 2, 2, 1, 1, 1, 1};
        for (int i = 0; i < 8; i++) {
            b.putLong(16 + 8 * i, dim[i]);
        }
        double[] pix = {1, 2, 2.5, 3, 0, 0, 0, 0};
        for (int i = 0; i < 8; i++) {
            b.putDouble(104 + 8 * i, pix[i]);
        }
        b.putLong(168, pair ? 0 : 544);
        b.putDouble(176, 2.0);   // scl_slope
        b.putDouble(184, 1.0);   // scl_inter
        b.putInt(348, 1);        // sform_code scanner
        double[] srow = {2, 0, 0, -10, 0, 2.5, 0, 20, 0, 0, 3, 5};
        for (int i = 0; i < 12; i++) {
            b.putDouble(400 + 8 * i, srow[i]);
        }
        b.putInt(500, 2 | 8);    // mm, s
        b.position(544);
        for (float v : VALUES) {
            b.putFloat(v);
        }
        return b.array();
    }

    @Test
    void niftiTwoSingleFileReadsInBothByteOrdersAndGzipped() throws IOException {
        for (ByteOrder order : new ByteOrder[] {ByteOrder.LITTLE_ENDIAN, ByteOrder.BIG_ENDIAN}) {
            Path f = dir.resolve("two-" + order + ".nii");
            Files.write(f, nifti2(order, false));
            Path g = dir.resolve("two-" + order + ".nii.gz");
            try (OutputStream out = new GZIPOutputStream(Files.newOutputStream(g))) {
                out.write(nifti2(order, false));
            }
            for (Path p : new Path[] {f, g}) {
                NiftiImage img = Nifti.read(p);
                assertEquals(12, img.size());
                for (int i = 0; i < 12; i++) {
                    assertEquals(2.0 * VALUES[i] + 1.0, img.get(i), 0.0, p + " value " + i);  // slope 2, intercept 1
                }
                assertEquals(3, img.header().rank());
                assertArrayEquals(new double[] {2, 0, 0, -10, 0, 2.5, 0, 20, 0, 0, 3, 5}, img.header().affine(), 0.0);
            }
        }
    }

    @Test
    void niftiOnePairAndAnalyzePairReadByMagic() throws IOException {
        byte[] single = encodeSingle();
        for (String kind : new String[] {"ni1", "analyze"}) {
            byte[] hdr = java.util.Arrays.copyOf(single, 348);
            ByteBuffer b = ByteBuffer.wrap(hdr).order(ByteOrder.LITTLE_ENDIAN);
            b.putFloat(108, 0f);  // data at the start of the .img
            if (kind.equals("ni1")) {
                hdr[344] = 'n';
                hdr[345] = 'i';
                hdr[346] = '1';
                hdr[347] = 0;
            } else {
                java.util.Arrays.fill(hdr, 252, 348, (byte) 0);  // ANALYZE 7.5 history fields, smin = 0
            }
            byte[] img = java.util.Arrays.copyOfRange(single, 352, single.length);
            Path h = dir.resolve(kind + ".hdr");
            Files.write(h, hdr);
            Files.write(dir.resolve(kind + ".img"), img);
            NiftiImage byHeader = Nifti.read(h);
            NiftiImage byImage = Nifti.read(dir.resolve(kind + ".img"));
            for (int i = 0; i < 12; i++) {
                assertEquals(VALUES[i], byHeader.get(i), 0.0, kind + " " + i);
                assertEquals(VALUES[i], byImage.get(i), 0.0, kind + " " + i);
            }
            Files.delete(dir.resolve(kind + ".img"));
            Path gz = dir.resolve(kind + ".img.gz");
            try (OutputStream out = new GZIPOutputStream(Files.newOutputStream(gz))) {
                out.write(img);
            }
            assertEquals(VALUES[5], Nifti.read(h).get(5), 0.0);
            Files.delete(gz);
            InputException e = assertThrows(InputException.class, () -> Nifti.read(h));
            assertTrue(e.getMessage().contains(kind + ".img"), e.getMessage());
        }
    }

    /** The project's own single-file encoding of VALUES (348-byte header, extender, data at 352). */
    private byte[] encodeSingle() throws IOException {
        Path f = dir.resolve("single.nii");
        double[] v = new double[VALUES.length];
        for (int i = 0; i < v.length; i++) {
            v[i] = VALUES[i];
        }
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.FLOAT32, 3, 2, 2), v, true);
        return Files.readAllBytes(f);
    }

    @Test
    void qformGivesTheRotatedScaledAffine() throws IOException {
        // quaternion (a, b, c, d) = (cos 45°, 0, 0, sin 45°) is a 90° rotation about z:
        // R = [[0, -1, 0], [1, 0, 0], [0, 0, 1]] (nifti1.h formula); qfac = -1 flips the third axis
        byte[] raw = encodeSingle();
        ByteBuffer b = ByteBuffer.wrap(raw).order(ByteOrder.LITTLE_ENDIAN);
        b.putFloat(76, -1f);
        b.putFloat(80, 2f);
        b.putFloat(84, 3f);
        b.putFloat(88, 4f);
        b.putShort(252, (short) 1);
        b.putShort(254, (short) 0);
        float s = (float) Math.sqrt(0.5);
        float[] q = {0, 0, s, 7, 8, 9};
        for (int i = 0; i < 6; i++) {
            b.putFloat(256 + 4 * i, q[i]);
        }
        Path f = dir.resolve("q.nii");
        Files.write(f, raw);
        double[] expected = {0, -3, 0, 7, 2, 0, 0, 8, 0, 0, -4, 9};
        NiftiHeader h = Nifti.read(f).header();
        assertArrayEquals(expected, h.affine(), 1e-6);
        // and back: the quaternion form of that affine gives the same matrix
        NiftiHeader again = NiftiHeader.create(NiftiDatatype.FLOAT32, 3, 2, 2).withAffine(expected, 1);
        assertEquals(-1f, again.pixdim(0));
        assertArrayEquals(new float[] {0, 0, s, 7, 8, 9}, again.quatern(), 1e-6f);
    }

    @Test
    void fiveDimensionalSeriesWithSingletonTimeIsAVolumeSeries() {
        Path f = dir.resolve("five.nii");
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.FLOAT32, 2, 2, 1, 1, 3), new double[12], false);
        try (NiftiInput in = Nifti.open(f)) {
            assertEquals(3, VolumeJob.of(in, java.util.Optional.empty(), java.util.Optional.empty()).echoes());
        }
        Path g = dir.resolve("six.nii");
        Nifti.write(g, NiftiHeader.create(NiftiDatatype.FLOAT32, 2, 2, 1, 2, 3), new double[24], false);
        try (NiftiInput in = Nifti.open(g)) {
            assertThrows(InputException.class, () -> VolumeJob.of(in, java.util.Optional.empty(), java.util.Optional.empty()));
        }
    }
}

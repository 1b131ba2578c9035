package org.echotrellis.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.InputStream;
import java.io.OutputStream;
import java.nio.ByteBuffer;
import java.nio.ByteOrder;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Random;
import java.util.zip.GZIPOutputStream;

import org.echotrellis.InputException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.EnumSource;

class NiftiTest {
    @TempDir
    Path dir;

    private static double[] valuesFor(NiftiDatatype type, int n, long seed) {
        Random r = new Random(seed);
        double[] v = new double[n];
        for (int i = 0; i < n; i++) {
            switch (type) {
                case UINT8: v[i] = r.nextInt(256); break;
                case INT16: v[i] = r.nextInt(65536) - 32768; break;
                case UINT16: v[i] = r.nextInt(65536); break;
                case INT32: v[i] = r.nextInt(); break;
                case FLOAT32: v[i] = (float) (r.nextGaussian() * 1e3); break;
                default: v[i] = r.nextGaussian() * 1e6; break;
            }
        }
        return v;
    }

    @ParameterizedTest
    @EnumSource(NiftiDatatype.class)
    void roundTripEveryDatatypeBothOrdersPlainAndGzip(NiftiDatatype type) {
        for (long seed : new long[] {1, 2, 3}) {
            for (ByteOrder order : new ByteOrder[] {ByteOrder.LITTLE_ENDIAN, ByteOrder.BIG_ENDIAN}) {
                for (String ext : new String[] {".nii", ".nii.gz"}) {
                    NiftiHeader h = NiftiHeader.create(type, 4, 3, 2, 5).withOrder(order).withVoxelSize(1.25f, 2f, 3f);
                    double[] v = valuesFor(type, 4 * 3 * 2 * 5, seed);
                    Path f = dir.resolve(type + "-" + order + "-" + seed + ext);
                    Nifti.write(f, h, v, false);
                    NiftiImage back = Nifti.read(f);
                    assertArrayEquals(v, back.values(), 0.0, type + " " + order + " " + ext);  // exact: lossless storage
                    assertEquals(order, back.header().order());
                    assertEquals(type, back.header().datatype());
                    assertEquals(1.25f, back.header().pixdim(1));
                    assertEquals(5, back.header().volumes());
                }
            }
        }
    }

    @Test
    void scalingIsAppliedOnReadAndInvertedOnWrite() {
        NiftiHeader h = NiftiHeader.create(NiftiDatatype.INT16, 5, 1, 1).withScaling(0.25, -3);
        double[] v = {-3, -2.75, 0, 10.5, 100};
        Path f = dir.resolve("scaled.nii");
        Nifti.write(f, h, v, false);
        assertArrayEquals(v, Nifti.read(f).values(), 0.0);
    }

    @Test
    void headerBytesFollowTheStandard() throws IOException {
        Path f = dir.resolve("h.nii");
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.FLOAT32, 2, 2, 2), new double[8], false);
        byte[] raw = Files.readAllBytes(f);
        ByteBuffer b = ByteBuffer.wrap(raw).order(ByteOrder.LITTLE_ENDIAN);
        // nifti1.h (Cox, NIH DFWG 2003): sizeof_hdr = 348 at byte 0, datatype at 70, bitpix at 72,
        // vox_offset (float) at 108 and >= 352, magic "n+1\0" at 344, extender at 348..351.
        assertEquals(348, b.getInt(0));
        assertEquals(16, b.getShort(70));
        assertEquals(32, b.getShort(72));
        assertTrue(b.getFloat(108) >= 352f);
        assertEquals(0f, b.getFloat(108) % 16f);  // nifti1.h: vox_offset should be a multiple of 16
        assertEquals("n+1\0", new String(raw, 344, 4, StandardCharsets.US_ASCII));
        assertArrayEquals(new byte[4], java.util.Arrays.copyOfRange(raw, 348, 352));
        assertEquals(352 + 8 * 4, raw.length);
    }

    @Test
    void readsAFileBuiltByteByByteFromTheStandardLayout() throws IOException {
        // Fixture written with Python's struct module from the nifti1.h field layout, no NIfTI
        // library; see src/test/resources/nifti/make_handmade.py (Python 3.11) for how it was made.
        Path f = dir.resolve("handmade.nii.gz");
        try (InputStream in = NiftiTest.class.getResourceAsStream("/nifti/handmade_be_int16.nii.gz")) {
            Files.copy(in, f);
        }
        NiftiImage img = Nifti.read(f);
        NiftiHeader h = img.header();
        assertEquals(ByteOrder.BIG_ENDIAN, h.order());
        assertEquals(NiftiDatatype.INT16, h.datatype());
        assertEquals(4, h.rank());
        assertEquals(3, h.size(1));
        assertEquals(2, h.size(4));
        assertEquals(1.5f, h.pixdim(1));
        assertEquals(1, h.qformCode());
        assertEquals("handmade", h.description());
        for (int i = 0; i < 24; i++) {
            assertEquals(0.5 * (7 * i - 40) + 10, img.get(i), 0.0, "voxel " + i);  // stored 7i-40, slope 0.5, inter 10
        }
        try (NiftiInput in = Nifti.open(f)) {
            double[] slab = new double[3 * 2 * 2];
            in.readSlab(1, 1, slab);
            // voxel (x=2, y=1, z=1) has linear index 11 in volume 0 and 23 in volume 1; in the slab
            // it is voxel 5, values interleaved per echo
            assertEquals(0.5 * (7 * 11 - 40) + 10, slab[5 * 2], 0.0);
            assertEquals(0.5 * (7 * 23 - 40) + 10, slab[5 * 2 + 1], 0.0);
        }
    }

    @Test
    void refusesExistingOutputWithoutForce() {
        Path f = dir.resolve("x.nii");
        NiftiHeader h = NiftiHeader.create(NiftiDatatype.UINT8, 2);
        Nifti.write(f, h, new double[] {1, 2}, false);
        InputException e = assertThrows(InputException.class, () -> Nifti.write(f, h, new double[] {3, 4}, false));
        assertTrue(e.getMessage().contains("exists; overwriting needs force"), e.getMessage());
        Nifti.write(f, h, new double[] {3, 4}, true);
        assertArrayEquals(new double[] {3, 4}, Nifti.read(f).values(), 0.0);
    }

    @Test
    void refusesTruncatedAndForeignFiles() throws IOException {
        Path f = dir.resolve("t.nii");
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.FLOAT32, 10, 10), new double[100], false);
        byte[] raw = Files.readAllBytes(f);
        Path cut = dir.resolve("cut.nii");
        Files.write(cut, java.util.Arrays.copyOf(raw, raw.length - 10));
        assertTrue(assertThrows(InputException.class, () -> Nifti.read(cut)).getMessage().contains("truncated"));
        Path cutHeader = dir.resolve("cuthdr.nii");
        Files.write(cutHeader, java.util.Arrays.copyOf(raw, 100));
        assertThrows(InputException.class, () -> Nifti.read(cutHeader));
        Path text = dir.resolve("text.nii");
        Files.writeString(text, "echo_time_ms,a\n10,1\n".repeat(40));
        assertTrue(assertThrows(InputException.class, () -> Nifti.read(text)).getMessage().contains("not a NIfTI"));
        Path gzCut = dir.resolve("cut.nii.gz");
        Files.write(gzCut, java.util.Arrays.copyOf(gzip(raw), 60));
        assertThrows(InputException.class, () -> Nifti.read(gzCut));
        assertThrows(InputException.class, () -> Nifti.read(dir.resolve("missing.nii")));
    }

    @Test
    void refusesGzipThatInflatesBeyondTheDeclaredSize() throws IOException {
        Path f = dir.resolve("small.nii");
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.UINT8, 4), new double[] {1, 2, 3, 4}, false);
        byte[] raw = Files.readAllBytes(f);
        byte[] bomb = new byte[raw.length + (1 << 20)];  // 1 MiB of zeros past the 4 declared bytes
        System.arraycopy(raw, 0, bomb, 0, raw.length);
        Path g = dir.resolve("bomb.nii.gz");
        Files.write(g, gzip(bomb));
        InputException e = assertThrows(InputException.class, () -> Nifti.read(g));
        assertTrue(e.getMessage().contains("beyond"), e.getMessage());
    }

    @Test
    void rejectsBadHeaderFields() throws IOException {
        Path f = dir.resolve("b.nii");
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.FLOAT32, 2, 2), new double[4], false);
        byte[] raw = Files.readAllBytes(f);
        assertBad(raw, 70, (short) 32, "datatype code 32");   // complex64 unsupported
        assertBad(raw, 72, (short) 8, "bitpix");
        assertBad(raw, 40, (short) 9, "dim[0]");
        byte[] magic = raw.clone();
        magic[345] = 'x';
        Path m = dir.resolve("magic.nii");
        Files.write(m, magic);
        assertTrue(assertThrows(InputException.class, () -> Nifti.read(m)).getMessage().contains("magic"));
    }

    @Test
    void refusesAHeaderWhoseValueCountOverflows() throws IOException {
        // nifti1.h: the data hold dim[1]·…·dim[dim[0]] values. Dims 4..6 of 2048·2048·1024 declare
        // 2^32 volumes of float32; a file that carries none of them must not read as an empty image.
        Path f = dir.resolve("o.nii");
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.FLOAT32, 1), new double[1], false);
        byte[] raw = withDims(Files.readAllBytes(f), 6, 1, 1, 1, 2048, 2048, 1024);
        Path p = dir.resolve("overflow.nii");
        Files.write(p, raw);
        InputException e = assertThrows(InputException.class, () -> Nifti.open(p).close());
        assertTrue(e.getMessage().contains("overflow.nii"), e.getMessage());
        Path g = dir.resolve("overflow.nii.gz");
        Files.write(g, gzip(raw));
        assertThrows(InputException.class, () -> Nifti.open(g).close());
    }

    @Test
    void nonFiniteScalingReadsAsUnscaled() throws IOException {
        // nifti1.h: scl_slope = 0 means the stored values are used as they are. Writers leave NaN
        // in both fields when they store float data without scaling (nibabel's default header,
        // from memory), and the NIfTI reference library maps non-finite scl_slope/scl_inter to 0
        // (nifti1_io.c, from memory): such a file must read, unscaled, not be refused.
        Path f = dir.resolve("s.nii");
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.FLOAT32, 3), new double[] {1.5, -2, 7}, false);
        byte[] raw = Files.readAllBytes(f);
        ByteBuffer b = ByteBuffer.wrap(raw).order(ByteOrder.LITTLE_ENDIAN);
        b.putFloat(112, Float.NaN);
        b.putFloat(116, Float.NaN);
        Path p = dir.resolve("nan-scaling.nii");
        Files.write(p, raw);
        NiftiImage img = Nifti.read(p);
        assertEquals(false, img.header().isScaled());
        assertArrayEquals(new double[] {1.5, -2, 7}, img.values(), 0.0);
        b.putFloat(112, 2f);   // a real slope with a NaN intercept: intercept 0
        Files.write(p, raw);
        assertArrayEquals(new double[] {3, -4, 14}, Nifti.read(p).values(), 0.0);
    }

    @Test
    void refusesGzipWhoseDeclaredSizeExceedsTheSpaceForItsInflatedCopy() throws IOException {
        // The inflation bound is the header's declared size; a header that declares 32767^3
        // float64 voxels (about 2.8e14 bytes, more than this disk) must be refused before
        // inflating, or a stream of zeros behind it fills the disk up to that bound.
        Path f = dir.resolve("big.nii");
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.FLOAT64, 1), new double[1], false);
        byte[] raw = withDims(Files.readAllBytes(f), 3, 32767, 32767, 32767);
        byte[] padded = java.util.Arrays.copyOf(raw, raw.length + (1 << 16));
        Path g = dir.resolve("big.nii.gz");
        Files.write(g, gzip(padded));
        InputException e = assertThrows(InputException.class, () -> Nifti.open(g).close());
        assertTrue(e.getMessage().contains("free"), e.getMessage());
    }

    /** Overwrites dim[0..] of a little-endian header (in place) and returns it. */
    private static byte[] withDims(byte[] raw, int... dims) {
        ByteBuffer b = ByteBuffer.wrap(raw).order(ByteOrder.LITTLE_ENDIAN);
        for (int i = 0; i < dims.length; i++) {
            b.putShort(40 + 2 * i, (short) dims[i]);
        }
        return raw;
    }

    private void assertBad(byte[] raw, int offset, short value, String expect) throws IOException {
        byte[] c = raw.clone();
        ByteBuffer.wrap(c).order(ByteOrder.LITTLE_ENDIAN).putShort(offset, value);
        Path p = dir.resolve("bad" + offset + ".nii");
        Files.write(p, c);
        InputException e = assertThrows(InputException.class, () -> Nifti.read(p));
        assertTrue(e.getMessage().contains(expect), e.getMessage());
    }

    private static byte[] gzip(byte[] raw) throws IOException {
        ByteArrayOutputStream bos = new ByteArrayOutputStream();
        try (OutputStream o = new GZIPOutputStream(bos)) {
            o.write(raw);
        }
        return bos.toByteArray();
    }
}

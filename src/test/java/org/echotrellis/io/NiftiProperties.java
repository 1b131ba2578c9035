package org.echotrellis.io;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.io.IOException;
import java.nio.ByteOrder;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Random;

import net.jqwik.api.ForAll;
import net.jqwik.api.Property;
import net.jqwik.api.constraints.IntRange;

class NiftiProperties {

    /** Any shape, datatype, byte order and compression reads back what was written, slab by slab too. */
    @Property(tries = 60, seed = "20261201")
    void slabsReadBackWhatWasWritten(@ForAll @IntRange(min = 1, max = 7) int nx, @ForAll @IntRange(min = 1, max = 6) int ny,
            @ForAll @IntRange(min = 1, max = 5) int nz, @ForAll @IntRange(min = 1, max = 4) int nt,
            @ForAll NiftiDatatype type, @ForAll boolean big, @ForAll boolean gz, @ForAll long seed) throws IOException {
        Path dir = Files.createTempDirectory("nifti-prop");
        try {
            Random r = new Random(seed);
            int n = nx * ny * nz * nt;
            double[] v = new double[n];
            for (int i = 0; i < n; i++) {
                v[i] = type.isInteger() ? r.nextInt(200) : r.nextGaussian();
            }
            NiftiHeader h = NiftiHeader.create(type, nx, ny, nz, nt).withOrder(big ? ByteOrder.BIG_ENDIAN : ByteOrder.LITTLE_ENDIAN);
            Path f = dir.resolve(gz ? "p.nii.gz" : "p.nii");
            Nifti.write(f, h, v, false);
            double[] expect = v.clone();
            if (type == NiftiDatatype.FLOAT32) {
                for (int i = 0; i < n; i++) {
                    expect[i] = (float) v[i];
                }
            }
            try (NiftiInput in = Nifti.open(f)) {
                assertEquals(nt, in.header().volumes());
                double[] slab = new double[nx * ny * nt];
                for (int z = 0; z < nz; z++) {
                    in.readSlab(z, 1, slab);
                    for (int xy = 0; xy < nx * ny; xy++) {
                        for (int t = 0; t < nt; t++) {
                            assertEquals(expect[t * nx * ny * nz + z * nx * ny + xy], slab[xy * nt + t], 0.0);
                        }
                    }
                }
                assertArrayEquals(expect, in.readAll().values(), 0.0);
            }
        } finally {
            try (var s = Files.walk(dir)) {
                s.sorted(java.util.Comparator.reverseOrder()).forEach(p -> p.toFile().delete());
            }
        }
    }
}

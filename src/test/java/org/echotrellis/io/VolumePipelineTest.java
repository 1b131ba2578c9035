package org.echotrellis.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Path;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import java.util.Random;

import com.fasterxml.jackson.databind.JsonNode;
import org.echotrellis.InputException;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class VolumePipelineTest {
    @TempDir
    Path dir;

    /** A kernel that returns the echo mean and B1, and LOW_SIGNAL for a mean below 1. */
    private static final VoxelKernel.Factory MEAN = new VoxelKernel.Factory() {
        @Override
        public List<String> outputs() {
            return List.of("mean", "b1");
        }

        @Override
        public VoxelKernel newKernel() {
            return (echoes, offset, count, b1, out) -> {
                double s = 0;
                for (int e = 0; e < count; e++) {
                    s += echoes[offset + e];
                }
                out[0] = s / count;
                out[1] = b1;
                return out[0] < 1 ? VoxelStatus.LOW_SIGNAL : VoxelStatus.OK;
            };
        }
    };

    @Test
    void streamsSlabsOverThreadsWithMaskB1AndBadVoxels() {
        for (long seed : new long[] {11, 12, 13}) {
            int nx = 7;
            int ny = 5;
            int nz = 6;
            int ne = 4;
            int nv = nx * ny * nz;
            Random r = new Random(seed);
            double[] data = new double[nv * ne];
            double[] mask = new double[nv];
            double[] b1 = new double[nv];
            for (int v = 0; v < nv; v++) {
                mask[v] = r.nextDouble() < 0.8 ? 1 : 0;
                b1[v] = 0.5 + r.nextDouble();
                for (int e = 0; e < ne; e++) {
                    data[e * nv + v] = 10 * r.nextDouble();
                }
            }
            int nanVoxel = 17;
            mask[nanVoxel] = 1;
            data[2 * nv + nanVoxel] = Double.NaN;
            int badB1 = 23;
            mask[badB1] = 1;
            b1[badB1] = 0;
            Path f = dir.resolve("d" + seed + ".nii.gz");
            Nifti.write(f, NiftiHeader.create(NiftiDatatype.FLOAT64, nx, ny, nz, ne), data, false);
            NiftiImage m = NiftiImage.of(NiftiHeader.create(NiftiDatatype.UINT8, nx, ny, nz), mask, "mask");
            NiftiImage b = NiftiImage.of(NiftiHeader.create(NiftiDatatype.FLOAT32, nx, ny, nz), b1, "b1");
            try (NiftiInput in = Nifti.open(f)) {
                // slab budget of 2 slices forces three slabs; 3 threads share each slab
                VolumeJob job = new VolumeJob(in, Optional.of(m), Optional.of(b), 3, 2L * nx * ny * ne);
                long[] last = new long[1];
                VolumeResult res = VolumePipeline.run(job, MEAN, new ProgressReporter() {
                    @Override
                    public void start(String task, long total) { }

                    @Override
                    public synchronized void advance(long done) {
                        last[0] = Math.max(last[0], done);
                    }

                    @Override
                    public void finish() { }
                });
                float[] mean = res.map("mean");
                float[] b1Out = res.map("b1");
                byte[] st = res.status();
                long inside = 0;
                for (int v = 0; v < nv; v++) {
                    if (mask[v] == 0) {
                        assertEquals(VoxelStatus.OUTSIDE_MASK.code(), st[v]);
                        assertTrue(Float.isNaN(mean[v]));
                        continue;
                    }
                    inside++;
                    if (v == nanVoxel || v == badB1) {
                        assertEquals(VoxelStatus.INVALID_INPUT.code(), st[v]);
                        continue;
                    }
                    double s = 0;
                    for (int e = 0; e < ne; e++) {
                        s += data[e * nv + v];
                    }
                    assertEquals(s / ne, mean[v], 1e-5);  // float map of a double mean
                    assertEquals((float) b1[v], b1Out[v], 0f);
                    assertEquals((s / ne < 1 ? VoxelStatus.LOW_SIGNAL : VoxelStatus.OK).code(), st[v]);
                }
                assertEquals(inside, res.processed());
                assertEquals(inside, last[0]);
                Map<VoxelStatus, Long> counts = res.statusCounts();
                assertEquals(2L, counts.get(VoxelStatus.INVALID_INPUT));
                assertEquals(nv - inside, counts.get(VoxelStatus.OUTSIDE_MASK));

                List<Path> files = res.writeMaps(dir.resolve("out" + seed), false);
                assertEquals(3, files.size());
                NiftiImage statusBack = Nifti.read(dir.resolve("out" + seed).resolve("status.nii.gz"));
                assertEquals(NiftiDatatype.UINT8, statusBack.header().datatype());
                assertEquals(st[badB1], (byte) statusBack.get(badB1));
                assertEquals(3, statusBack.header().rank());

                JsonNode js = RunSummary.build(res, Map.of("model", "mean"));
                assertEquals("mean", js.get("settings").get("model").asText());
                assertEquals(2, js.get("status_counts").get("invalid_input").asInt());
                double[] fitted = res.fittedValues("mean");
                assertEquals(RunSummary.percentile(fitted, 50), js.get("maps").get("mean").get("p50").asDouble(), 0.0);
                assertTrue(js.get("voxels_per_second").asDouble() > 0);
            }
        }
    }

    @Test
    void aFailingVoxelIsRecordedAndTheVolumeGoesOn() {
        Path f = dir.resolve("fail.nii");
        double[] data = new double[3 * 2 * 1 * 2];
        for (int i = 0; i < data.length; i++) {
            data[i] = i;
        }
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.FLOAT32, 3, 2, 1, 2), data, false);
        VoxelKernel.Factory failOnFour = new VoxelKernel.Factory() {
            @Override
            public List<String> outputs() {
                return List.of("first");
            }

            @Override
            public VoxelKernel newKernel() {
                return (echoes, offset, count, b1, out) -> {
                    if (echoes[offset] == 4) {
                        throw new ArithmeticException("solver failure");
                    }
                    out[0] = echoes[offset];
                    return VoxelStatus.OK;
                };
            }
        };
        try (NiftiInput in = Nifti.open(f)) {
            VolumeResult r = VolumePipeline.run(VolumeJob.of(in, Optional.empty(), Optional.empty()), failOnFour,
                    ProgressReporter.NONE);
            assertEquals(VoxelStatus.NOT_CONVERGED.code(), r.status()[4]);
            assertTrue(Float.isNaN(r.map("first")[4]));
            assertEquals(5f, r.map("first")[5], 0f);
            assertEquals(5L, r.statusCounts().get(VoxelStatus.OK));
        }
    }

    @Test
    void percentileInterpolatesBetweenRanks() {
        double[] v = {1, 2, 3, 4, 5};
        assertEquals(3, RunSummary.percentile(v, 50), 0.0);
        assertEquals(1.2, RunSummary.percentile(v, 5), 1e-12);  // position 0.05*4 = 0.2 (linear, common practice)
        assertEquals(5, RunSummary.percentile(v, 100), 0.0);
        assertTrue(Double.isNaN(RunSummary.percentile(new double[0], 50)));
    }

    @Test
    void rejectsMaskOrB1OnAnotherGrid() {
        Path f = dir.resolve("g.nii");
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.FLOAT32, 4, 4, 2, 3), new double[96], false);
        NiftiImage wrong = NiftiImage.of(NiftiHeader.create(NiftiDatatype.UINT8, 4, 4, 3), new double[48], "m.nii");
        try (NiftiInput in = Nifti.open(f)) {
            InputException e = assertThrows(InputException.class,
                    () -> VolumeJob.of(in, Optional.of(wrong), Optional.empty()));
            assertTrue(e.getMessage().contains("mask m.nii"), e.getMessage());
            assertThrows(InputException.class, () -> VolumeJob.of(in, Optional.empty(), Optional.of(wrong)));
        }
    }

    @Test
    void rejectsMaskOfTheSameShapeWithAnotherAffine() {
        double[] affine = {2, 0, 0, -30, 0, 2, 0, -40, 0, 0, 3, 10};
        double[] shifted = affine.clone();
        shifted[3] += 2;  // one voxel to the right
        Path f = dir.resolve("a.nii");
        Nifti.write(f, NiftiHeader.create(NiftiDatatype.FLOAT32, 4, 4, 2, 3).withAffine(affine, 1), new double[96], false);
        NiftiImage same = NiftiImage.of(NiftiHeader.create(NiftiDatatype.UINT8, 4, 4, 2).withAffine(affine, 2),
                new double[32], "same.nii");
        NiftiImage other = NiftiImage.of(NiftiHeader.create(NiftiDatatype.UINT8, 4, 4, 2).withAffine(shifted, 1),
                new double[32], "other.nii");
        try (NiftiInput in = Nifti.open(f)) {
            VolumeJob.of(in, Optional.of(same), Optional.of(same));
            InputException e = assertThrows(InputException.class, () -> VolumeJob.of(in, Optional.of(other), Optional.empty()));
            assertTrue(e.getMessage().contains("other.nii") && e.getMessage().contains("geometry"), e.getMessage());
            assertThrows(InputException.class, () -> VolumeJob.of(in, Optional.empty(), Optional.of(other)));
        }
    }

    @Test
    void backgroundSigmaMatchesTheRayleighSecondMoment() {
        // Pure-noise magnitude is Rayleigh with E[M^2] = 2 sigma^2 (Gudbjartsson & Patz 1995)
        for (long seed : new long[] {5, 6, 7}) {
            double sigma = 3.0;
            double est = NoiseVolumes.estimate(dir.resolve("n" + seed + ".nii"), seed, 40, 8, sigma, 1000, 40);
            assertEquals(sigma, est, 0.03 * sigma);  // 9600 values: relative SD of the estimate ~0.5%
        }
    }
}

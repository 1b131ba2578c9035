package org.echotrellis.io;

import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.ExecutorService;
import java.util.concurrent.Executors;
import java.util.concurrent.Future;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicLong;

/**
 * Runs a {@link VoxelKernel} over every voxel of a volume: reads the series slab by slab (whole z
 * slices, bounded by {@link VolumeJob#slabValues()}; the next slab is read while the current one is
 * processed, so two slabs are held), skips voxels outside the mask, marks voxels
 * with non-finite echoes or an invalid B1 value {@link VoxelStatus#INVALID_INPUT} and voxels whose
 * kernel throws {@link VoxelStatus#NOT_CONVERGED} with NaN outputs (the volume goes on), and spreads the rest over worker threads in chunks, one kernel (workspace) per thread.
 * Output maps are float arrays of one 3-D volume each.
 */
public final class VolumePipeline {
    private static final int CHUNK = 128;

    private VolumePipeline() { }

    /**
     * @param job inputs and threads
     * @param factory the kernels and output names
     * @param progress receives voxels done (inside the mask)
     * @return maps, status and timing
     */
    public static VolumeResult run(VolumeJob job, VoxelKernel.Factory factory, ProgressReporter progress) {
        long t0 = System.nanoTime();
        NiftiHeader h = job.data().header();
        int nx = h.size(1);
        int ny = h.size(2);
        int nz = h.size(3);
        int echoes = job.echoes();
        int slice = nx * ny;
        int nvox = job.voxels();
        List<String> names = List.copyOf(factory.outputs());
        float[][] maps = new float[names.size()][nvox];
        byte[] status = new byte[nvox];
        long total = 0;
        for (int v = 0; v < nvox; v++) {
            if (job.inside(v)) {
                total++;
            }
        }
        int slabSlices = (int) Math.max(1, Math.min(nz, job.slabValues() / ((long) slice * echoes)));
        // two slab buffers: the next slab is read while the workers fit the current one
        double[] slab = new double[slabSlices * slice * echoes];
        double[] next = new double[slab.length];
        int threads = job.threads();
        VoxelKernel[] kernels = new VoxelKernel[threads];
        double[][] outs = new double[threads][names.size()];
        for (int t = 0; t < threads; t++) {
            kernels[t] = factory.newKernel();
        }
        AtomicLong done = new AtomicLong();
        progress.start("voxels", total);
        ExecutorService pool = Executors.newFixedThreadPool(threads, r -> {
            Thread th = new Thread(r, "echotrellis-voxel");
            th.setDaemon(true);
            return th;
        });
        try {
            job.data().readSlab(0, Math.min(slabSlices, nz), slab);
            for (int z0 = 0; z0 < nz; z0 += slabSlices) {
                int nzs = Math.min(slabSlices, nz - z0);
                int base = z0 * slice;
                int count = nzs * slice;
                AtomicInteger cursor = new AtomicInteger();
                List<Future<?>> futures = new ArrayList<>();
                final double[] current = slab;
                for (int t = 0; t < threads; t++) {
                    final int ti = t;
                    futures.add(pool.submit(() -> {
                        int start;
                        while ((start = cursor.getAndAdd(CHUNK)) < count) {
                            int end = Math.min(count, start + CHUNK);
                            int n = work(job, kernels[ti], outs[ti], current, base, start, end, echoes, maps, status);
                            progress.advance(done.addAndGet(n));
                        }
                    }));
                }
                int z1 = z0 + slabSlices;
                if (z1 < nz) {
                    job.data().readSlab(z1, Math.min(slabSlices, nz - z1), next);
                }
                for (Future<?> f : futures) {
                    f.get();
                }
                slab = next;
                next = current;
            }
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            throw new IllegalStateException("volume job interrupted", e);
        } catch (ExecutionException e) {
            Throwable c = e.getCause();
            if (c instanceof RuntimeException re) {
                throw re;
            }
            throw new IllegalStateException(c);
        } finally {
            pool.shutdownNow();
            progress.finish();
        }
        double seconds = (System.nanoTime() - t0) * 1e-9;
        return new VolumeResult(h.asMap(NiftiDatatype.FLOAT32), names, maps, status, seconds, total);
    }

    /** Processes slab voxels [start, end); returns how many were inside the mask. */
    private static int work(VolumeJob job, VoxelKernel kernel, double[] out, double[] slab, int base, int start,
            int end, int echoes, float[][] maps, byte[] status) {
        int inside = 0;
        for (int v = start; v < end; v++) {
            int gi = base + v;
            if (!job.inside(gi)) {
                status[gi] = (byte) VoxelStatus.OUTSIDE_MASK.code();
                fillNaN(maps, gi);
                continue;
            }
            inside++;
            double b1 = job.b1Map().isPresent() ? job.b1Map().get().get(gi) : Double.NaN;
            boolean valid = job.b1Map().isEmpty() || (b1 > 0 && Double.isFinite(b1));
            int off = v * echoes;
            for (int e = 0; e < echoes && valid; e++) {
                valid = VoxelStatus.usable(slab[off + e]);
            }
            VoxelStatus s;
            if (valid) {
                try {
                    s = kernel.process(slab, off, echoes, b1, out);
                    for (int k = 0; k < maps.length; k++) {
                        maps[k][gi] = (float) out[k];
                    }
                } catch (RuntimeException e) {
                    // one voxel never stops the volume: its solver failed, record it and go on
                    s = VoxelStatus.NOT_CONVERGED;
                    fillNaN(maps, gi);
                }
            } else {
                s = VoxelStatus.INVALID_INPUT;
                fillNaN(maps, gi);
            }
            status[gi] = (byte) s.code();
        }
        return inside;
    }

    private static void fillNaN(float[][] maps, int gi) {
        for (float[] m : maps) {
            m[gi] = Float.NaN;
        }
    }
}

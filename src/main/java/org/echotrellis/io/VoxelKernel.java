package org.echotrellis.io;

/**
 * The per-voxel work of a volume job, for example one T2 fit. An instance owns its workspace and
 * is used by one thread only; {@link Factory#newKernel()} is called once per worker thread.
 */
public interface VoxelKernel {

    /**
     * Processes one voxel. Called only for voxels inside the mask whose echoes are all finite and
     * whose B1 value (if a map is given) is finite and &gt; 0.
     *
     * @param echoes the voxel's echo values at {@code echoes[offset .. offset + count)}; not modified
     * @param offset start of the voxel's values
     * @param count number of echoes
     * @param b1Scale the B1 map value, or NaN without a map
     * @param out receives one value per output of the factory (NaN for none); modified
     * @return the voxel's status
     */
    VoxelStatus process(double[] echoes, int offset, int count, double b1Scale, double[] out);

    /** Creates kernels and names their outputs. Implementations are thread-safe. */
    interface Factory {
        /** @return output names in order, e.g. {@code t2_ms}; each becomes one map */
        java.util.List<String> outputs();

        /** @return a new kernel with its own workspace */
        VoxelKernel newKernel();
    }
}

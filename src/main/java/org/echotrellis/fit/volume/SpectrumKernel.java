package org.echotrellis.fit.volume;

import java.util.ArrayList;
import java.util.List;
import org.echotrellis.fit.spectrum.BasisCache;
import org.echotrellis.fit.spectrum.SpectrumFitter;
import org.echotrellis.fit.spectrum.SpectrumOptions;
import org.echotrellis.fit.spectrum.SpectrumStatus;
import org.echotrellis.io.VoxelKernel;
import org.echotrellis.io.VoxelStatus;

/**
 * The spectrum fit as a voxel kernel of the volume pipeline: outputs are the scalar maps (slot order
 * of {@link SpectrumFitter}) followed by one amplitude per T2 bin. One fitter (workspace) per thread,
 * the basis cache shared.
 */
final class SpectrumKernel implements VoxelKernel {
    private final SpectrumFitter fitter;
    private final double[] amplitudes;
    private final double[] scalars;

    private SpectrumKernel(BasisCache cache, SpectrumOptions options) {
        fitter = new SpectrumFitter(cache, options);
        amplitudes = new double[options.grid().bins()];
        scalars = new double[fitter.scalarCount()];
    }

    @Override
    public VoxelStatus process(double[] echoes, int offset, int count, double b1Scale, double[] out) {
        int status = fitter.fit(echoes, offset, amplitudes, scalars);
        int k = scalars.length;
        System.arraycopy(scalars, 0, out, 0, k);
        System.arraycopy(amplitudes, 0, out, k, amplitudes.length);
        return status(status);
    }

    /** Maps a spectrum status onto the shared status map codes. */
    static VoxelStatus status(int spectrumStatus) {
        switch (spectrumStatus) {
            case SpectrumStatus.OK: return VoxelStatus.OK;
            case SpectrumStatus.NOT_CONVERGED: return VoxelStatus.NOT_CONVERGED;
            case SpectrumStatus.TARGET_NOT_REACHED: return VoxelStatus.HIT_BOUND;
            case SpectrumStatus.LOW_SIGNAL: return VoxelStatus.LOW_SIGNAL;
            case SpectrumStatus.MASKED: return VoxelStatus.OUTSIDE_MASK;
            default: return VoxelStatus.INVALID_INPUT;
        }
    }

    /** Factory: shares the cache, names the outputs. */
    static final class Factory implements VoxelKernel.Factory {
        private final BasisCache cache;
        private final SpectrumOptions options;
        private final List<String> outputs;

        Factory(BasisCache cache, SpectrumOptions options) {
            this.cache = cache;
            this.options = options;
            List<String> names = new ArrayList<>(SpectrumNames.scalars(options));
            double[] t2 = options.grid().t2Ms();
            for (int j = 0; j < t2.length; j++) {
                names.add(SpectrumNames.binOutput(j, t2[j]));
            }
            this.outputs = List.copyOf(names);
        }

        @Override
        public List<String> outputs() {
            return outputs;
        }

        @Override
        public VoxelKernel newKernel() {
            return new SpectrumKernel(cache, options);
        }
    }
}

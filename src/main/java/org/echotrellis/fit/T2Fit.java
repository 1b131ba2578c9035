package org.echotrellis.fit;

import java.util.ArrayList;
import java.util.List;

import org.echotrellis.io.VoxelKernel;
import org.echotrellis.io.VoxelStatus;

/**
 * A T2 fit of one model for one thread: {@link #estimate} for single decays, and the
 * {@link VoxelKernel} of the volume pipeline. Create instances with {@link Factory}, which builds
 * the shared start dictionary once.
 */
public final class T2Fit implements VoxelKernel {
    private final Factory factory;
    private final EpgFitter epg;
    private final MonoFitter mono;
    private final double[] epgOut = new double[EpgFitter.OUTPUTS];
    private final double[] monoOut = new double[MonoFitter.OUTPUTS];

    private T2Fit(Factory f) {
        this.factory = f;
        this.epg = f.model == FitModel.EPG ? new EpgFitter(f.settings, f.dictionary) : null;
        this.mono = f.model == FitModel.MONO || f.compareMono ? new MonoFitter(f.settings) : null;
    }

    /**
     * Fits one decay (magnitudes, one per echo of the protocol).
     *
     * @param decay the echoes (copied)
     * @param b1Fixed B1 from a map, or NaN to fit it
     * @return the estimate
     */
    public T2Estimate estimate(double[] decay, double b1Fixed) {
        double[] y = decay.clone();
        int n = factory.settings.train().echoes();
        if (y.length != n) {
            throw new IllegalArgumentException("decay has " + y.length + " echoes, the protocol " + n);
        }
        double[] out = new double[factory.outputs.size()];
        java.util.Arrays.fill(monoOut, Double.NaN);
        VoxelStatus s = VoxelStatus.INVALID_INPUT;
        boolean finite = true;
        for (double v : y) {
            finite &= VoxelStatus.usable(v);
        }
        if (finite) {
            s = process(y, 0, n, b1Fixed, out);
        } else {
            java.util.Arrays.fill(out, Double.NaN);
        }
        List<String> names = factory.outputs;
        return new T2Estimate(get(out, names, "t2_ms"), get(out, names, "t2_se_ms"), get(out, names, "b1_scale"),
                get(out, names, "b1_se"), get(out, names, "amplitude"), get(out, names, "residual_rms"), s,
                factory.model == FitModel.MONO ? get(out, names, "t2_ms") : get(out, names, "mono_t2_ms"));
    }

    /**
     * The fitted model curves of the last {@link #estimate}: the EPG curve (NaN for the mono
     * model) and the mono-exponential curve (NaN without it), one value per echo.
     *
     * @param e the estimate returned by the last call
     * @return {epg, mono}
     */
    public double[][] curves(T2Estimate e) {
        FitSettings s = factory.settings;
        int n = s.train().echoes();
        double[] epgCurve = new double[n];
        double[] monoCurve = new double[n];
        java.util.Arrays.fill(epgCurve, Double.NaN);
        java.util.Arrays.fill(monoCurve, Double.NaN);
        if (epg != null && e.status().fitted()) {
            EpgSignal sig = new EpgSignal(s);
            sig.evaluate(e.t2Ms(), e.b1Scale(), epgCurve, new double[n], new double[n]);
            for (int i = 0; i < n; i++) {
                epgCurve[i] *= e.amplitude();
            }
        }
        if (mono != null && Double.isFinite(monoOut[MonoFitter.T2])) {
            for (int i = 0; i < n; i++) {
                monoCurve[i] = monoOut[MonoFitter.AMPLITUDE] * Math.exp(-s.train().echoTimeMs(i + 1) / monoOut[MonoFitter.T2])
                        + monoOut[MonoFitter.OFFSET];
            }
        }
        return new double[][] {epgCurve, monoCurve};
    }

    private static double get(double[] out, List<String> names, String key) {
        int i = names.indexOf(key);
        return i < 0 ? Double.NaN : out[i];
    }

    @Override
    public VoxelStatus process(double[] echoes, int offset, int count, double b1Scale, double[] out) {
        if (factory.model == FitModel.EPG) {
            VoxelStatus s = epg.fit(echoes, offset, b1Scale, epgOut);
            System.arraycopy(epgOut, 0, out, 0, EpgFitter.OUTPUTS);
            if (factory.compareMono) {
                mono.fit(echoes, offset, monoOut);
                out[EpgFitter.OUTPUTS] = monoOut[MonoFitter.T2];
            }
            return s;
        }
        VoxelStatus s = mono.fit(echoes, offset, monoOut);
        out[0] = monoOut[MonoFitter.T2];
        out[1] = monoOut[MonoFitter.T2_SE];
        out[2] = monoOut[MonoFitter.AMPLITUDE];
        out[3] = monoOut[MonoFitter.RESIDUAL_RMS];
        if (factory.settings.monoOffset()) {
            out[4] = monoOut[MonoFitter.OFFSET];
        }
        return s;
    }

    /** Shared, thread-safe: settings, model and the precomputed start dictionary. */
    public static final class Factory implements VoxelKernel.Factory {
        private final FitSettings settings;
        private final FitModel model;
        private final boolean compareMono;
        private final StartDictionary dictionary;
        private final List<String> outputs;

        /**
         * @param settings fit settings
         * @param model the model
         * @param compareMono also fit the mono-exponential model (EPG model only)
         */
        public Factory(FitSettings settings, FitModel model, boolean compareMono) {
            this.settings = settings;
            this.model = model;
            this.compareMono = compareMono && model == FitModel.EPG;
            this.dictionary = model == FitModel.EPG ? new StartDictionary(settings) : null;
            List<String> o = new ArrayList<>();
            if (model == FitModel.EPG) {
                o.addAll(List.of("t2_ms", "t2_se_ms", "b1_scale", "b1_se", "amplitude", "residual_rms"));
                if (this.compareMono) {
                    o.add("mono_t2_ms");
                }
            } else {
                o.addAll(List.of("t2_ms", "t2_se_ms", "amplitude", "residual_rms"));
                if (settings.monoOffset()) {
                    o.add("offset");
                }
            }
            this.outputs = List.copyOf(o);
        }

        /** @return the settings */
        public FitSettings settings() {
            return settings;
        }

        /** @return the model */
        public FitModel model() {
            return model;
        }

        @Override
        public List<String> outputs() {
            return outputs;
        }

        @Override
        public T2Fit newKernel() {
            return new T2Fit(this);
        }
    }
}

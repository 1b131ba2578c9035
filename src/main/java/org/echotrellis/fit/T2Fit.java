package org.echotrellis.fit;

import java.util.ArrayList;
import java.util.List;

import org.echotrellis.io.VoxelKernel;
import org.echotrellis.io.VoxelStatus;

/**
 * A T2 fit of one model for one thread: {@link #estimate} for single decays, and the
 * {@link VoxelKernel} of the volume pipeline. The EPG model fits T2, B1 and amplitude to the
 * magnitude echo train, so that refocusing errors do not bias T2 (Lebel &amp; Wilman 2010). Create instances with {@link Factory}, which builds
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
        this.epg = f.model == FitModel.EPG ? new EpgFitter(f.settings, f.dictionary, f.surface) : null;
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
            EpgSignal sig = new EpgSignal(s, factory.surface);
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

    /**
     * Shared, thread-safe: settings, model, the model table of the acquisition (built once, for any
     * acquisition other than the plain ideal-pulse CPMG train) and the precomputed start dictionary.
     */
    public static final class Factory implements VoxelKernel.Factory {
        private final FitSettings settings;
        private final FitModel model;
        private final boolean compareMono;
        private final TrainSurface surface;
        private final StartDictionary dictionary;
        private final List<String> outputs;

        /**
         * @param settings fit settings
         * @param model the model
         * @param compareMono also fit the mono-exponential model (EPG model only)
         */
        public Factory(FitSettings settings, FitModel model, boolean compareMono) {
            this(settings, model, compareMono, !Acquisitions.plainCpmg(settings.protocol()));
        }

        /**
         * @param settings fit settings
         * @param model the model
         * @param compareMono also fit the mono-exponential model (EPG model only)
         * @param tabulate use the tabulated model even for a plain CPMG train
         */
        Factory(FitSettings settings, FitModel model, boolean compareMono, boolean tabulate) {
            this.settings = settings;
            this.model = model;
            this.compareMono = compareMono && model == FitModel.EPG;
            this.surface = model == FitModel.EPG && tabulate ? surface(settings) : null;
            this.dictionary = model == FitModel.EPG ? new StartDictionary(settings, surface) : null;
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

        /**
         * The same run with another noise σ, sharing the model table and the start dictionary (both
         * independent of σ).
         *
         * @param base the factory to share with
         * @param noiseSigma channel noise σ, or NaN
         */
        public Factory(Factory base, double noiseSigma) {
            this.settings = base.settings.withNoiseSigma(noiseSigma);
            this.model = base.model;
            this.compareMono = base.compareMono;
            this.surface = base.surface;
            this.dictionary = base.dictionary;
            this.outputs = base.outputs;
        }

        private static TrainSurface surface(FitSettings s) {
            return TrainSurface.build(new TrainSource(s.protocol(), s.t1Ms(), s.b1Max() + 0.1), s.t2MinMs(), s.t2MaxMs(), s.b1Min(),
                    s.b1Max());
        }

        /** @return true if the model is the tabulated acquisition (not the exact per-evaluation engine) */
        public boolean tabulated() {
            return surface != null;
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

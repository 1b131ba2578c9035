package org.echotrellis.fit;

import java.util.Random;
import java.util.concurrent.TimeUnit;

import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.openjdk.jmh.infra.Blackhole;

/**
 * Voxels per second of the 32-echo T2 fits (one voxel per operation; run with {@code -t 2} for
 * both cores): the EPG T2 + B1 fit without and with a 16-position slice profile, and the
 * mono-exponential Levenberg–Marquardt fit (Commons Math). Decays: T2 20–200 ms, B1 0.55–0.95,
 * Gaussian noise at SNR 200 on the first echo, {@value #BANK} different decays cycled (for the
 * slice-profile fit the decays are made with the same profile model, as from a 2-D acquisition).
 */
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class FitBenchmark {
    static final int ECHOES = 32;
    static final int BANK = 256;
    static final CpmgTrain TRAIN = CpmgTrain.constant(ECHOES, 10, 180);
    static final FitSettings SETTINGS = FitSettings.defaults(TRAIN);
    static final T2Fit.Factory EPG = new T2Fit.Factory(SETTINGS, FitModel.EPG, false);
    static final T2Fit.Factory MONO = new T2Fit.Factory(SETTINGS, FitModel.MONO, false);
    static final T2Fit.Factory PROFILE = new T2Fit.Factory(
            SETTINGS.withProfile(SliceProfiles.parse("sinc:4", TRAIN, 16, 1.0)), FitModel.EPG, false);

    /** Per-thread kernels and a bank of decays. */
    @State(Scope.Thread)
    public static class Work {
        T2Fit epg = EPG.newKernel();
        T2Fit mono = MONO.newKernel();
        T2Fit profile = PROFILE.newKernel();
        double[] bank = new double[BANK * ECHOES];
        double[] profileBank = new double[BANK * ECHOES];
        double[] out = new double[8];
        int next;

        @Setup
        public void setup() {
            Random r = new Random(77);
            CpmgEngine eng = new CpmgEngine(1);
            for (int i = 0; i < BANK; i++) {
                double[] e = eng.echoes(TRAIN, 1000, 20 * Math.pow(10, r.nextDouble()), 0.55 + 0.4 * r.nextDouble());
                double sigma = Math.abs(e[0]) / 200;
                for (int k = 0; k < ECHOES; k++) {
                    bank[i * ECHOES + k] = Math.abs(e[k]) + sigma * r.nextGaussian();
                }
            }
            // decays of a 2-D acquisition for the slice-profile fit: the profile model itself
            EpgSignal sig = new EpgSignal(PROFILE.settings());
            double[] g = new double[ECHOES];
            double[] d1 = new double[ECHOES];
            double[] d2 = new double[ECHOES];
            for (int i = 0; i < BANK; i++) {
                sig.evaluate(20 * Math.pow(10, r.nextDouble()), 0.55 + 0.4 * r.nextDouble(), g, d1, d2);
                double sigma = g[0] / 200;
                for (int k = 0; k < ECHOES; k++) {
                    profileBank[i * ECHOES + k] = g[k] + sigma * r.nextGaussian();
                }
            }
        }

        int offset() {
            next = (next + 1) & (BANK - 1);
            return next * ECHOES;
        }
    }

    /** EPG fit of T2, B1 and amplitude, no slice profile. */
    @Benchmark
    public void epgFit(Work w, Blackhole bh) {
        bh.consume(w.epg.process(w.bank, w.offset(), ECHOES, Double.NaN, w.out));
        bh.consume(w.out[0]);
    }

    /** Mono-exponential fit (Commons Math Levenberg–Marquardt, analytic Jacobian). */
    @Benchmark
    public void monoFit(Work w, Blackhole bh) {
        bh.consume(w.mono.process(w.bank, w.offset(), ECHOES, Double.NaN, w.out));
        bh.consume(w.out[0]);
    }

    /** EPG fit with a 16-position Bloch-simulated sinc:4 slice profile. */
    @Benchmark
    public void epgFitSliceProfile(Work w, Blackhole bh) {
        bh.consume(w.profile.process(w.profileBank, w.offset(), ECHOES, Double.NaN, w.out));
        bh.consume(w.out[0]);
    }
}

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
 * Gaussian noise at SNR 200 on the first echo, {@value #BANK} different decays cycled. The
 * slice-selective fit uses a protocol with sinc TBW 4 pulses (2 ms) on excitation and refocusing,
 * equal widths, its decays made by the acquisition model at B1 0.7–1.15 (a 2-D acquisition); the
 * model table is built once in the set-up, as in a run.
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
    static final org.echotrellis.sequence.Protocol SLICE = org.echotrellis.sequence.Protocol.ofTrain("slice", "",
            new org.echotrellis.sequence.Tissue("x", 1000, 80), 1, TRAIN, "bench",
            new org.echotrellis.sequence.Acquisition(java.util.Optional.of(org.echotrellis.sequence.RfPulse.of("sinc", 4, 2)),
                    java.util.Optional.of(org.echotrellis.sequence.RfPulse.of("sinc", 4, 2)), true, 1,
                    Double.POSITIVE_INFINITY, java.util.Optional.empty()));
    static final T2Fit.Factory PROFILE = new T2Fit.Factory(FitSettings.defaults(SLICE), FitModel.EPG, false);

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
            // decays of a 2-D acquisition: the slice-selective acquisition model
            for (int i = 0; i < BANK; i++) {
                double[] g = org.echotrellis.sequence.Simulator.simulate(SLICE, 1000, 20 * Math.pow(10, r.nextDouble()),
                        0.7 + 0.45 * r.nextDouble()).magnitudes();
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

    /** EPG fit of a slice-selective acquisition (sinc TBW 4), tabulated model. */
    @Benchmark
    public void epgFitSliceProfile(Work w, Blackhole bh) {
        bh.consume(w.profile.process(w.profileBank, w.offset(), ECHOES, Double.NaN, w.out));
        bh.consume(w.out[0]);
    }
}

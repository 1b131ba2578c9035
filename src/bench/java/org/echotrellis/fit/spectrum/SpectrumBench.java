package org.echotrellis.fit.spectrum;

import java.util.SplittableRandom;
import java.util.concurrent.TimeUnit;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OperationsPerInvocation;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Threads;
import org.openjdk.jmh.annotations.Warmup;
import org.openjdk.jmh.infra.Blackhole;

/**
 * Spectrum fit throughput: 32 echoes (ESP 10 ms), the default settings of the protocol (33 bins
 * 10–1280 ms, coarse angles then a continuous search, misfit regularisation 1 + 1/128). One operation
 * = one voxel; decays are brain-like mixtures with refocusing 130–180° (B1 0.72–1.0) and SNR 100–400
 * (our own values), generated once. {@code acquisition=ideal}: hard pulses; {@code slice}: sinc TBW 4
 * slice-selective pulses on both, equal widths, decays from the slice model itself.
 *
 * <pre>
 * mvn -B -q -Pbench package -DskipTests
 * java -jar target/benchmarks.jar SpectrumBench -f 1 -wi 3 -i 5
 * </pre>
 */
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class SpectrumBench {

    static final int VOXELS = 512;

    /** Shared: basis cache and decays. */
    @State(Scope.Benchmark)
    public static class Shared {
        @Param({"misfit", "none", "cross-validation"})
        public String regularisation;

        @Param({"ideal", "slice"})
        public String acquisition;

        BasisCache cache;
        SpectrumOptions options;
        double[] decays;

        @Setup
        public void setup() {
            org.echotrellis.sequence.Protocol p = protocol(acquisition.equals("slice"));
            options = SpectrumOptions.defaults(p).withT1Ms(1000).withRegularisation(Regularisation.parse(regularisation));
            cache = BasisCache.build(p, 1000, options.grid(), options.search());
            decays = new double[VOXELS * 32];
            SplittableRandom rnd = new SplittableRandom(42);
            CpmgEngine engine = new CpmgEngine(1);
            for (int v = 0; v < VOXELS; v++) {
                double b1 = (130 + 50 * rnd.nextDouble()) / 180;
                double mwf = 0.2 * rnd.nextDouble();
                double[] a = org.echotrellis.sequence.Simulator.simulate(p, 1000, 15 + 10 * rnd.nextDouble(), b1).magnitudes();
                double[] b = org.echotrellis.sequence.Simulator.simulate(p, 1000, 60 + 40 * rnd.nextDouble(), b1).magnitudes();
                double sigma = 1 / (100 + 300 * rnd.nextDouble());
                for (int i = 0; i < 32; i++) {
                    double s = mwf * Math.abs(a[i]) + (1 - mwf) * Math.abs(b[i]);
                    double re = s + sigma * gauss(rnd);
                    double im = sigma * gauss(rnd);
                    decays[v * 32 + i] = Math.hypot(re, im);
                }
            }
        }

        static org.echotrellis.sequence.Protocol protocol(boolean slice) {
            java.util.Optional<org.echotrellis.sequence.RfPulse> e = java.util.Optional.of(
                    org.echotrellis.sequence.RfPulse.of("sinc", 4, 2));
            org.echotrellis.sequence.Acquisition a = slice
                    ? new org.echotrellis.sequence.Acquisition(e, e, true, 1, Double.POSITIVE_INFINITY, java.util.Optional.empty())
                    : org.echotrellis.sequence.Acquisition.none();
            return org.echotrellis.sequence.Protocol.ofTrain("bench", "", new org.echotrellis.sequence.Tissue("x", 1000, 80),
                    1, CpmgTrain.constant(32, 10, 180), "bench", a);
        }

        static double gauss(SplittableRandom r) {
            return Math.sqrt(-2 * Math.log(1 - r.nextDouble())) * Math.cos(2 * Math.PI * r.nextDouble());
        }
    }

    /** Per thread: the fitter workspace. */
    @State(Scope.Thread)
    public static class Worker {
        SpectrumFitter fitter;
        double[] amplitudes;
        double[] scalars;

        @Setup
        public void setup(Shared s) {
            fitter = new SpectrumFitter(s.cache, s.options);
            amplitudes = new double[s.options.grid().bins()];
            scalars = new double[fitter.scalarCount()];
        }
    }

    /** One thread. */
    @Benchmark
    @OperationsPerInvocation(VOXELS)
    public void oneThread(Shared s, Worker w, Blackhole bh) {
        run(s, w, bh);
    }

    /** Two threads (the machine's cores); JMH reports the summed throughput. */
    @Benchmark
    @Threads(2)
    @OperationsPerInvocation(VOXELS)
    public void twoThreads(Shared s, Worker w, Blackhole bh) {
        run(s, w, bh);
    }

    private static void run(Shared s, Worker w, Blackhole bh) {
        for (int v = 0; v < VOXELS; v++) {
            bh.consume(w.fitter.fit(s.decays, v * 32, w.amplitudes, w.scalars));
        }
        bh.consume(w.amplitudes);
    }
}

package org.echotrellis.sequence;

import java.util.Optional;
import java.util.concurrent.TimeUnit;
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
 * Throughput of the whole-acquisition model ({@link AcquisitionModel}) on 32-echo trains, ESP 10 ms, in
 * trains per second: a non-selective CPMG train with diffusion (2 cycles/mm crushers of 1 ms, 2 ms
 * refocusing pulses, D = 0.003 mm²/s) and TR 3000 ms; and a slice-selective train (Hann sinc TBW 4,
 * equal widths). T2 and B1 change with every call. Run with {@code -t 2} for both cores.
 */
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class AcquisitionBenchmark {
    static final int ECHOES = 32;

    /** The models, built once and shared by the benchmark threads (they are thread-safe). */
    @State(Scope.Benchmark)
    public static class Models {
        AcquisitionModel diffusionTr;
        AcquisitionModel slice;
        AcquisitionModel sliceTr;

        @Setup
        public void setup() {
            CpmgTrain t = CpmgTrain.constant(ECHOES, 10, 160);
            Tissue fluid = new Tissue("fluid", 4000, 1500, 0.003);
            RfPulse sinc = RfPulse.of("sinc", 4, 2);
            Acquisition a = new Acquisition(Optional.empty(), Optional.of(sinc), false, 1, 3000,
                    Optional.of(new Crusher(2, 1)));
            diffusionTr = AcquisitionModel.of(Protocol.ofTrain("d", "", fluid, 1, t, "bench", a), 1.5);
            CpmgTrain t180 = CpmgTrain.constant(ECHOES, 10, 180);
            Acquisition s = new Acquisition(Optional.of(sinc), Optional.of(sinc), true, 1, Double.POSITIVE_INFINITY,
                    Optional.empty());
            slice = AcquisitionModel.of(Protocol.ofTrain("s", "", new Tissue("t", 1000, 80), 1, t180, "bench", s), 1.5);
            Acquisition st = new Acquisition(Optional.of(sinc), Optional.of(sinc), true, 1, 3000, Optional.of(new Crusher(2, 1)));
            sliceTr = AcquisitionModel.of(Protocol.ofTrain("s", "", fluid, 1, t180, "bench", st), 1.5);
        }
    }

    /** Per-thread output and a counter that varies T2 and B1. */
    @State(Scope.Thread)
    public static class Out {
        double[] re = new double[ECHOES];
        double[] im = new double[ECHOES];
        double[] t1s = new double[AcquisitionModel.LANES];
        double[] t2s = new double[AcquisitionModel.LANES];
        double[] b1s = new double[AcquisitionModel.LANES];
        double[] reL = new double[AcquisitionModel.LANES * ECHOES];
        double[] imL = new double[AcquisitionModel.LANES * ECHOES];
        int i;

        double t2() {
            i++;
            return 20 + (i % 97);
        }

        double b1() {
            return 0.7 + 0.005 * (i % 101);
        }
    }

    /** Non-selective CPMG train with diffusion and TR. */
    @Benchmark
    public void cpmgDiffusionRepetition(Models m, Out o, Blackhole bh) {
        double t2 = o.t2();
        m.diffusionTr.echoes(4000, t2, o.b1(), o.re, o.im);
        bh.consume(o.re[ECHOES - 1]);
    }

    /** The same, {@value AcquisitionModel#LANES} trains per call in lock-step lanes. */
    @Benchmark
    @org.openjdk.jmh.annotations.OperationsPerInvocation(AcquisitionModel.LANES)
    public void cpmgDiffusionRepetitionLanes(Models m, Out o, Blackhole bh) {
        for (int l = 0; l < AcquisitionModel.LANES; l++) {
            o.t1s[l] = 4000;
            o.t2s[l] = o.t2();
            o.b1s[l] = o.b1();
        }
        m.diffusionTr.echoes(o.t1s, o.t2s, o.b1s, AcquisitionModel.LANES, o.reL, o.imL);
        bh.consume(o.reL[ECHOES - 1]);
    }

    /** Slice-selective train, no TR. */
    @Benchmark
    public void sliceSelective(Models m, Out o, Blackhole bh) {
        double t2 = o.t2();
        m.slice.echoes(1000, t2, o.b1(), o.re, o.im);
        bh.consume(o.re[ECHOES - 1]);
    }

    /** Slice-selective train with diffusion and TR. */
    @Benchmark
    public void sliceSelectiveDiffusionRepetition(Models m, Out o, Blackhole bh) {
        double t2 = o.t2();
        m.sliceTr.echoes(4000, t2, o.b1(), o.re, o.im);
        bh.consume(o.re[ECHOES - 1]);
    }

    /** Building the model of a slice-selective protocol (tables over B1 up to 1.5). */
    @Benchmark
    @BenchmarkMode(Mode.AverageTime)
    @OutputTimeUnit(TimeUnit.MILLISECONDS)
    public AcquisitionModel buildSliceModel() {
        CpmgTrain t180 = CpmgTrain.constant(ECHOES, 10, 180);
        RfPulse sinc = RfPulse.of("sinc", 4, 2);
        Acquisition s = new Acquisition(Optional.of(sinc), Optional.of(sinc), true, 1, Double.POSITIVE_INFINITY,
                Optional.empty());
        return AcquisitionModel.of(Protocol.ofTrain("s", "", new Tissue("t", 1000, 80), 1, t180, "bench", s), 1.5);
    }
}

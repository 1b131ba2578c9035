package org.echotrellis.epg;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OperationsPerInvocation;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.openjdk.jmh.infra.Blackhole;

/**
 * Throughput of the EPG engines on 32-echo trains, in trains per second (each invocation runs
 * {@value #LANES} trains in lock-step lanes). Run with {@code -t 2} for both cores.
 */
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class EngineBenchmark {
    static final int LANES = 8;
    static final int ECHOES = 32;

    /** One engine and workspace per benchmark thread. */
    @State(Scope.Thread)
    public static class Work {
        CpmgEngine cpmg = new CpmgEngine(LANES);
        GeneralEngine general = new GeneralEngine(LANES);
        CpmgTrain constant = CpmgTrain.constant(ECHOES, 10, 150);
        CpmgTrain variable;
        EpgProgram anyPhase;
        double[] t1 = new double[LANES];
        double[] t2 = new double[LANES];
        double[] b1 = new double[LANES];
        double[] out = new double[LANES * ECHOES];
        double[] outIm = new double[LANES * ECHOES];

        @Setup
        public void setup() {
            double[] flips = new double[ECHOES];
            for (int i = 0; i < ECHOES; i++) {
                flips[i] = 180 - 100 * Math.sin(Math.PI * i / (ECHOES - 1));
                t1[i % LANES] = 1000;
            }
            variable = CpmgTrain.of(ECHOES, 10, 90, flips);
            EpgProgram.Builder b = EpgProgram.builder().rf(90, 0);
            for (int i = 0; i < ECHOES; i++) {
                // quadratic phase cycling: no CPMG relation, fully complex states
                b.interval(5, 1).rf(150, 0.5 * 17 * i * i).interval(5, 1).echo();
            }
            anyPhase = b.build();
            for (int l = 0; l < LANES; l++) {
                t2[l] = 20 + 25 * l;
                b1[l] = 0.7 + 0.05 * l;
            }
        }
    }

    /** CPMG fast path, constant 150 degree refocusing. */
    @Benchmark
    @OperationsPerInvocation(LANES)
    public void cpmgConstantFlip(Work w, Blackhole bh) {
        w.cpmg.run(w.constant, w.t1, w.t2, w.b1, LANES, w.out);
        bh.consume(w.out[ECHOES - 1]);
    }

    /** CPMG fast path, a different flip at every pulse. */
    @Benchmark
    @OperationsPerInvocation(LANES)
    public void cpmgVariableFlips(Work w, Blackhole bh) {
        w.cpmg.run(w.variable, w.t1, w.t2, w.b1, LANES, w.out);
        bh.consume(w.out[ECHOES - 1]);
    }

    /** General complex engine, arbitrary RF phases. */
    @Benchmark
    @OperationsPerInvocation(LANES)
    public void generalAnyPhase(Work w, Blackhole bh) {
        w.general.run(w.anyPhase, w.t1, w.t2, w.b1, LANES, w.out, w.outIm);
        bh.consume(w.out[ECHOES - 1]);
    }
}

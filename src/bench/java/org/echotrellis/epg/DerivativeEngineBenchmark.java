package org.echotrellis.epg;

import java.util.Arrays;
import java.util.concurrent.TimeUnit;

import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.openjdk.jmh.infra.Blackhole;

/**
 * Throughput of the derivative-carrying CPMG kernel on 32-echo trains (echoes plus ∂/∂T2 and
 * ∂/∂B1), one lane (no slice profile) and 16 lanes (a 16-position slice profile), in evaluations
 * per second.
 */
@BenchmarkMode(Mode.Throughput)
@OutputTimeUnit(TimeUnit.SECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class DerivativeEngineBenchmark {
    /** One engine per benchmark thread. */
    @State(Scope.Thread)
    public static class Work {
        CpmgTrain train = CpmgTrain.constant(32, 10, 180);
        CpmgDerivativeEngine one = new CpmgDerivativeEngine(1);
        CpmgDerivativeEngine sixteen = new CpmgDerivativeEngine(16);
        double[] ones = {1};
        double[] f16 = new double[16];
        double[] w16 = new double[16];
        double[] echo = new double[32];
        double[] dT2 = new double[32];
        double[] dB1 = new double[32];
        int i;

        {
            for (int l = 0; l < 16; l++) {
                f16[l] = 1 - l / 16.0;
            }
            Arrays.fill(w16, 1 / 16.0);
        }
    }

    /** One lane. */
    @Benchmark
    public void oneLane(Work w, Blackhole bh) {
        w.one.run(w.train, 1000, 40 + (w.i++ & 63), 0.8, w.ones, w.ones, w.ones, 1, w.echo, w.dT2, w.dB1);
        bh.consume(w.dB1[31]);
    }

    /** Sixteen lanes summed (slice profile). */
    @Benchmark
    public void sixteenLanes(Work w, Blackhole bh) {
        w.sixteen.run(w.train, 1000, 40 + (w.i++ & 63), 0.8, w.f16, w.f16, w.w16, 16, w.echo, w.dT2, w.dB1);
        bh.consume(w.dB1[31]);
    }
}

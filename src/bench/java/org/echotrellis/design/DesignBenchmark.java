package org.echotrellis.design;

import org.echotrellis.sequence.PulseShape;

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

/**
 * Cost of the design jobs on an 80-echo train (white matter at 3 T, ESP 4 ms): one echo-by-echo
 * inversion of a prescription, one forward simulation with the design stepper, and one whole
 * budgeted optimisation (3 BOBYQA starts, 6 knots). Single-threaded jobs: run with {@code -t 1}.
 */
@BenchmarkMode(Mode.AverageTime)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class DesignBenchmark {
    /** One workspace per benchmark thread. */
    @State(Scope.Thread)
    public static class Work {
        final DesignProblem problem = new DesignProblem("white_matter_3t", 80, 4, 90, 1084, 69, 1, 10, 180);
        final double[] target = new EchoTarget.Decay(250, 0.5).amplitudes(problem);
        final double[] flips = new double[80];
        final double[] out = new double[80];
        final FlipInverter inverter = new FlipInverter();
        final CpmgStepper stepper = new CpmgStepper();
        final RfExposure rf = new RfExposure(PulseShape.sinc(4), 2, PulseShape.sinc(4), 2, 4000, 12);
        final ExposureLimits limits = new ExposureLimits(0.5, Double.POSITIVE_INFINITY);
        final Objective flat = new Objective.MinOver(20, 80);

        {
            java.util.Arrays.fill(flips, 120);
        }
    }

    /** Echo-by-echo inversion of an 80-echo prescription (Brent root per echo). */
    @Benchmark
    @OutputTimeUnit(TimeUnit.MICROSECONDS)
    public Inversion inversion80(Work w) {
        return w.inverter.invert(w.problem, w.target, new Startup.Ramp(3));
    }

    /** Forward simulation of the same train with the design stepper (reference cost per evaluation). */
    @Benchmark
    @OutputTimeUnit(TimeUnit.MICROSECONDS)
    public double[] forward80(Work w) {
        w.stepper.run(80, 4, 1084, 69, 1, 90, w.flips, w.out);
        return w.out;
    }

    /** One whole budgeted optimisation (min echo over 20–80 within half the all-180° RF energy). */
    @Benchmark
    @OutputTimeUnit(TimeUnit.MILLISECONDS)
    public OptimizedSchedule optimisation80(Work w) {
        return new ScheduleOptimizer().optimize(w.problem, w.flat, w.limits, w.rf, 6, 3000);
    }
}

package org.echotrellis.pathway;

import java.util.concurrent.TimeUnit;
import org.openjdk.jmh.annotations.Benchmark;
import org.openjdk.jmh.annotations.BenchmarkMode;
import org.openjdk.jmh.annotations.Fork;
import org.openjdk.jmh.annotations.Measurement;
import org.openjdk.jmh.annotations.Mode;
import org.openjdk.jmh.annotations.OutputTimeUnit;
import org.openjdk.jmh.annotations.Param;
import org.openjdk.jmh.annotations.Scope;
import org.openjdk.jmh.annotations.Setup;
import org.openjdk.jmh.annotations.State;
import org.openjdk.jmh.annotations.Warmup;
import org.openjdk.jmh.infra.Blackhole;

/**
 * Time for the exact class decomposition of one CPMG train (issue floor: 128 echoes well under a
 * second), and for the pathway search of its last echo. Average time per train in milliseconds.
 */
@BenchmarkMode(Mode.AverageTime)
@OutputTimeUnit(TimeUnit.MILLISECONDS)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class ClassDecompositionBenchmark {
    /** One tracker and output buffer per benchmark thread. */
    @State(Scope.Thread)
    public static class Work {
        @Param({"32", "128"})
        int echoes;

        ClassTracker tracker = new ClassTracker();
        PathwaySearch search = new PathwaySearch();
        Schedule schedule;
        double[] re;
        double[] im;

        @Setup
        public void setup() {
            Schedule.Builder b = Schedule.builder().rf(90, 90);
            for (int n = 0; n < echoes; n++) {
                b.interval(5, 1).rf(130, 0).interval(5, 1).echo();
            }
            schedule = b.build();
            re = new double[schedule.classOffset[schedule.echoCount()]];
            im = new double[re.length];
        }
    }

    /** All classes of every echo of the train (T1 1000 ms, T2 60 ms, B1 0.9). */
    @Benchmark
    public void decompose(Work w, Blackhole bh) {
        w.tracker.run(w.schedule, 1000, 60, 0.9, w.re, w.im);
        bh.consume(w.re);
        bh.consume(w.im);
    }

    /** The 10 largest pathways of the last echo, no amplitude threshold. */
    @Benchmark
    public TopPathways topTenOfLastEcho(Work w) {
        return w.search.find(w.schedule, w.schedule.echoCount() - 1, 1000, 60, 0.9, PathwaySearch.Limits.of(10));
    }
}

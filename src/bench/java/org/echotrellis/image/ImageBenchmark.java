package org.echotrellis.image;

import java.util.List;
import java.util.concurrent.TimeUnit;
import org.echotrellis.design.DesignProblem;
import org.echotrellis.design.Objective;
import org.echotrellis.design.ObjectiveEvaluator;
import org.echotrellis.sequence.Tissue;
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
 * Cost of the image figures on a 32-echo train laid over 256 lines (linear, echo 16 at k = 0): PSF
 * figures from the tabulated kernel (what a design objective evaluation adds to the simulation),
 * the same from the weights through the FFT (what {@code image} does per tissue), one whole design
 * objective evaluation (CPMG stepper + kernel), and a 256 × 256 phantom image of two tissues.
 * Single-threaded: run with {@code -t 1}.
 */
@BenchmarkMode(Mode.AverageTime)
@Warmup(iterations = 3, time = 2)
@Measurement(iterations = 5, time = 2)
@Fork(1)
public class ImageBenchmark {
    /** One workspace per benchmark thread. */
    @State(Scope.Thread)
    public static class Work {
        final KSpaceOrdering ordering = KSpaceOrdering.linear(256, 32, 16);
        final PsfKernel kernel = new PsfKernel(ordering);
        final double[] echoes = new double[32];
        final double[] weights;
        final double[] flips = new double[32];
        final DesignProblem problem = new DesignProblem("white_matter_3t", 32, 6, 90, 1084, 69, 1, 10, 180);
        final Objective psf = new Objective.PsfWidth(16, 256, 32, "white_matter_3t", 1084, 69, 0.2, 0.05);
        final ObjectiveEvaluator evaluator = new ObjectiveEvaluator();
        final Phantom phantom = Phantom.builtin(256, 2);
        final List<TissueImage> tissues;

        {
            for (int e = 0; e < 32; e++) {
                echoes[e] = Math.exp(-6.0 * (e + 1) / 69);
                flips[e] = 60 + 3 * e;
            }
            weights = FseImagingWeights.of(echoes, ordering);
            double[] flat = new double[256];
            java.util.Arrays.fill(flat, 0.9);
            tissues = List.of(image("wm", weights), image("csf", flat));
        }

        private static TissueImage image(String name, double[] w) {
            double[] p = PointSpread.psf(w);
            return new TissueImage(new Tissue(name, 1000, 100), 0, w[w.length / 2], w, p, PointSpread.figures(p));
        }
    }

    /** Weights of a train (a helper so that the state can build them). */
    static final class FseImagingWeights {
        static double[] of(double[] echoes, KSpaceOrdering o) {
            return FseImaging.weights(echoes, o.echoOfLine());
        }
    }

    /** PSF figures from the tabulated kernel: 32 echoes × 256 pixels. */
    @Benchmark
    @OutputTimeUnit(TimeUnit.MICROSECONDS)
    public PsfFigures kernelFigures(Work w) {
        return w.kernel.figures(w.echoes);
    }

    /** PSF and figures from 256 weights through the mixed-radix FFT. */
    @Benchmark
    @OutputTimeUnit(TimeUnit.MICROSECONDS)
    public PsfFigures transformFigures(Work w) {
        return PointSpread.figures(PointSpread.psf(w.weights));
    }

    /** One evaluation of the design objective psf:16:256:white_matter_3t:0.2:0.05. */
    @Benchmark
    @OutputTimeUnit(TimeUnit.MICROSECONDS)
    public double objectiveEvaluation(Work w) {
        return w.evaluator.value(w.psf, w.problem, w.flips);
    }

    /** A 256 × 256 phantom image of two tissues with noise. */
    @Benchmark
    @OutputTimeUnit(TimeUnit.MILLISECONDS)
    public PhantomImages phantom256(Work w) {
        return PhantomImager.image(w.phantom, w.tissues, 0.01, 1);
    }
}

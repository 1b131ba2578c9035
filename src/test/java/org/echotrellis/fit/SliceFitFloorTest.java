package org.echotrellis.fit;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Arrays;
import java.util.Random;

import org.echotrellis.sequence.EchoTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Simulator;
import org.echotrellis.sequence.SliceBlochReference;
import org.junit.jupiter.api.Test;

/**
 * Accuracy floors of {@code fit} on 2-D data (issue floors): decays from the independent isochromat
 * Bloch simulation in test sources ({@link SliceBlochReference}: sinc TBW 4 on both pulses, equal
 * slice widths, 32 echoes, ESP 10 ms, T1 1000 ms), fitted with the protocol's slice-selective model;
 * and noise-free trains of our own model (no local minima). Reference trains are computed once per class.
 */
class SliceFitFloorTest {
    static final double[] T2 = {20, 45, 150};
    static final double[] B1 = {0.7, 0.85, 1.0, 1.15};
    static final int DRAWS = 15;
    static final Protocol SLICE = TrainSurfaceTest.slice(1, Double.POSITIVE_INFINITY);
    static final double[][][] REFERENCE = new double[T2.length][B1.length][];
    static final T2Fit.Factory FACTORY = new T2Fit.Factory(FitSettings.defaults(SLICE).withT1Ms(1000), FitModel.EPG, false);

    static {
        for (int i = 0; i < T2.length; i++) {
            for (int j = 0; j < B1.length; j++) {
                REFERENCE[i][j] = SliceBlochReference.magnitudes(
                        SliceBlochReference.Settings.of("sinc", 4, 1, 90, 180, 32, 10, 1000, T2[i], B1[j]));
            }
        }
    }

    @Test
    void blochReferenceAtSnr200MedianT2Within2PercentInEveryCellAndB1Within005WhereIdentifiable() {
        // Rician magnitude noise (Gudbjartsson & Patz 1995), SNR 200 on echo 1, known sigma given to
        // the fit's Rician mean model (--noise-sigma); fixed seed per cell.
        T2Fit fit = FACTORY.newKernel();
        StringBuilder fails = new StringBuilder();
        StringBuilder table = new StringBuilder();
        for (int i = 0; i < T2.length; i++) {
            for (int j = 0; j < B1.length; j++) {
                double[] clean = REFERENCE[i][j];
                double sigma = clean[0] / 200;
                T2Fit noisy = new T2Fit.Factory(FACTORY, sigma).newKernel();
                Random r = new Random(1000 * i + j);
                double[] t2 = new double[DRAWS];
                double[] b1 = new double[DRAWS];
                int identifiable = 0;
                for (int d = 0; d < DRAWS; d++) {
                    T2Estimate e = noisy.estimate(FitData.rician(clean, sigma, r), Double.NaN);
                    t2[d] = e.t2Ms() / T2[i] - 1;
                    b1[d] = e.b1Scale() - B1[j];
                    identifiable += Double.isFinite(e.b1Se()) && e.b1Se() < 0.025 ? 1 : 0;
                }
                double mt2 = median(t2);
                double mb1 = median(b1);
                table.append(String.format(java.util.Locale.ROOT, "T2 %.0f B1 %.2f: T2 %+.4f B1 %+.4f id %d%n",
                        T2[i], B1[j], mt2, mb1, identifiable));
                if (!(Math.abs(mt2) <= 0.02)) {
                    fails.append("T2 ").append(T2[i]).append(" B1 ").append(B1[j]).append(": median T2 error ").append(mt2).append('\n');
                }
                if (identifiable > DRAWS / 2 && !(Math.abs(mb1) <= 0.05)) {
                    fails.append("T2 ").append(T2[i]).append(" B1 ").append(B1[j]).append(": median B1 error ").append(mb1).append('\n');
                }
            }
        }
        record("slice-fit-bloch.txt", table.toString());
        assertTrue(fails.length() == 0, fails + "\n" + table);
    }

    /** Keeps the measured figures in target/floors (for BENCHMARKS.md), never on the console. */
    static void record(String name, String text) {
        try {
            java.nio.file.Path d = java.nio.file.Path.of("target", "floors");
            java.nio.file.Files.createDirectories(d);
            java.nio.file.Files.writeString(d.resolve(name), text);
        } catch (java.io.IOException e) {
            throw new java.io.UncheckedIOException(e);
        }
    }

    @Test
    void noiseFreeTrainsOfTheModelAreRecoveredWithoutLocalMinima() {
        // Our own model's trains (the acquisition model evaluated directly, not the fit's table):
        // T2 12-180 ms x B1 0.65-1.2, T2 within 0.5 %, B1 within 0.01 away from B1 = 1.
        T2Fit fit = FACTORY.newKernel();
        StringBuilder fails = new StringBuilder();
        double worstT2 = 0;
        double worstB1 = 0;
        for (double t2 : new double[] {12, 20, 40, 80, 180}) {
            for (double b1 : new double[] {0.65, 0.8, 0.9, 1.0, 1.1, 1.2}) {
                EchoTrain train = Simulator.simulate(SLICE, 1000, t2, b1);
                T2Estimate e = fit.estimate(train.magnitudes(), Double.NaN);
                boolean t2Ok = Math.abs(e.t2Ms() / t2 - 1) <= 0.005;
                boolean b1Ok = Math.abs(b1 - 1) < 0.05 || Math.abs(e.b1Scale() - b1) <= 0.01;
                worstT2 = Math.max(worstT2, Math.abs(e.t2Ms() / t2 - 1));
                worstB1 = Math.abs(b1 - 1) < 0.05 ? worstB1 : Math.max(worstB1, Math.abs(e.b1Scale() - b1));
                if (!t2Ok || !b1Ok) {
                    fails.append(String.format(java.util.Locale.ROOT, "T2 %.0f B1 %.2f -> T2 %.3f B1 %.4f%n", t2, b1,
                            e.t2Ms(), e.b1Scale()));
                }
            }
        }
        record("slice-fit-model.txt", "worst T2 error " + worstT2 + ", worst B1 error (|B1 - 1| >= 0.05) " + worstB1 + "\n");
        assertTrue(fails.length() == 0, fails.toString());
    }

    static double median(double[] v) {
        double[] s = v.clone();
        Arrays.sort(s);
        int n = s.length;
        return n % 2 == 1 ? s[n / 2] : 0.5 * (s[n / 2 - 1] + s[n / 2]);
    }
}

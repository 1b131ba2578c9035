package org.echotrellis.fit;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Random;

import org.apache.commons.math3.fitting.leastsquares.LeastSquaresBuilder;
import org.apache.commons.math3.fitting.leastsquares.LeastSquaresOptimizer;
import org.apache.commons.math3.fitting.leastsquares.LevenbergMarquardtOptimizer;
import org.apache.commons.math3.fitting.leastsquares.MultivariateJacobianFunction;
import org.apache.commons.math3.linear.Array2DRowRealMatrix;
import org.apache.commons.math3.linear.ArrayRealVector;
import org.apache.commons.math3.linear.RealMatrix;
import org.apache.commons.math3.linear.RealVector;
import org.apache.commons.math3.util.Pair;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.epg.EpgProgram;
import org.echotrellis.epg.GeneralEngine;
import org.junit.jupiter.api.Test;

/**
 * The fast fit (specialised LM, variable projection, analytic derivative states on the CPMG lane
 * kernel) against a slow, independent reference: Commons Math 3.6.1 Levenberg–Marquardt over
 * (A, T2, B1) with central-difference derivatives of the complex general engine.
 */
class ReferenceFitTest {

    private static EpgProgram program(CpmgTrain t) {
        EpgProgram.Builder b = EpgProgram.builder().rf(t.excitationFlipDeg(), t.excitationPhaseDeg());
        for (int i = 0; i < t.echoes(); i++) {
            b.interval(t.echoSpacingMs() / 2, 1).rf(t.refocusFlipDeg(i), t.refocusPhaseDeg(i))
                    .interval(t.echoSpacingMs() / 2, 1).echo();
        }
        return b.build();
    }

    /** |echoes| of the general engine. */
    private static double[] general(EpgProgram p, double t2, double b1) {
        GeneralEngine g = new GeneralEngine(1);
        double[] re = new double[p.echoCount()];
        double[] im = new double[p.echoCount()];
        g.run(p, new double[] {1000}, new double[] {t2}, new double[] {b1}, 1, re, im);
        for (int i = 0; i < re.length; i++) {
            re[i] = Math.hypot(re[i], im[i]);
        }
        return re;
    }

    private static double[] referenceFit(EpgProgram p, double[] y, double[] start) {
        int n = y.length;
        MultivariateJacobianFunction f = point -> {
            double a = point.getEntry(0);
            double t2 = point.getEntry(1);
            double b1 = point.getEntry(2);
            double[] s = general(p, t2, b1);
            RealVector v = new ArrayRealVector(n);
            RealMatrix j = new Array2DRowRealMatrix(n, 3);
            double ht = 1e-5 * t2;
            double hb = 1e-6;
            double[] tp = general(p, t2 + ht, b1);
            double[] tm = general(p, t2 - ht, b1);
            double[] bp = general(p, t2, b1 + hb);
            double[] bm = general(p, t2, b1 - hb);
            for (int i = 0; i < n; i++) {
                v.setEntry(i, a * s[i]);
                j.setEntry(i, 0, s[i]);
                j.setEntry(i, 1, a * (tp[i] - tm[i]) / (2 * ht));
                j.setEntry(i, 2, a * (bp[i] - bm[i]) / (2 * hb));
            }
            return new Pair<>(v, j);
        };
        LeastSquaresOptimizer.Optimum o = new LevenbergMarquardtOptimizer()
                .withCostRelativeTolerance(1e-14).withParameterRelativeTolerance(1e-12)
                .optimize(new LeastSquaresBuilder().start(start).model(f).target(y)
                        .maxEvaluations(2000).maxIterations(500).build());
        return o.getPoint().toArray();
    }

    @Test
    void fastFitAgreesWithTheSlowReferenceOnNoiseFreeData() {
        for (long seed : new long[] {7, 8, 9}) {
            Random r = new Random(seed);
            for (int k = 0; k < 3; k++) {
                int n = 16 + r.nextInt(17);
                double[] flips = new double[n];
                double alpha = 120 + 60 * r.nextDouble();
                java.util.Arrays.fill(flips, alpha);
                CpmgTrain train = CpmgTrain.of(n, 6 + 6 * r.nextDouble(), 90, flips);
                double t2 = 20 + 200 * r.nextDouble();
                double b1 = 0.55 + 0.35 * r.nextDouble() * 180 / alpha;
                b1 = Math.min(b1, 0.97 * 180 / alpha);
                EpgProgram p = program(train);
                double[] y = general(p, t2, b1);
                for (int i = 0; i < n; i++) {
                    y[i] *= 3.0;
                }
                double[] ref = referenceFit(p, y, new double[] {3.3, t2 * 1.1, b1 * 0.95});
                T2Estimate fast = new T2Fit.Factory(FitSettings.defaults(train), FitModel.EPG, false).newKernel()
                        .estimate(y, Double.NaN);
                String at = "seed " + seed + " T2 " + t2 + " B1 " + b1 + " alpha " + alpha;
                assertEquals(ref[1], fast.t2Ms(), 1e-4 * ref[1], at);          // issue: 1e-4 relative
                assertEquals(ref[2], fast.b1Scale(), 1e-4 * ref[2], at);
                assertEquals(ref[0], fast.amplitude(), 1e-4 * ref[0], at);
                assertEquals(t2, ref[1], 1e-5 * t2, at);                       // the reference finds the truth
            }
        }
    }
}

package org.echotrellis.fit;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Random;

import org.echotrellis.epg.CpmgTrain;
import org.junit.jupiter.api.Test;

class AmplitudeProjectionTest {
    private static final CpmgTrain TRAIN = CpmgTrain.constant(32, 10, 180);

    @Test
    void reportedAmplitudeIsTheLinearLeastSquaresAmplitudeAtTheReportedT2AndB1() {
        // Variable projection (Golub & Pereyra, SIAM J Numer Anal 10:413, 1973): at the fitted
        // nonlinear parameters the amplitude is the linear least-squares solution A = g·y / g·g,
        // g the unit-amplitude model train. Checked to 1e-9 relative (rounding only), at SNR 20.
        FitSettings s = FitSettings.defaults(TRAIN);
        T2Fit fit = new T2Fit.Factory(s, FitModel.EPG, false).newKernel();
        EpgSignal signal = new EpgSignal(s);
        int n = TRAIN.echoes();
        double[] g = new double[n];
        double[] d1 = new double[n];
        double[] d2 = new double[n];
        for (long seed : new long[] {11, 12, 13}) {
            Random r = new Random(seed);
            for (int i = 0; i < 40; i++) {
                double t2 = 10 * Math.pow(30, r.nextDouble());
                double b1 = 0.5 + 0.8 * r.nextDouble();
                double[] clean = FitData.decay(TRAIN, 1000, t2, b1);
                for (int k = 0; k < n; k++) {
                    clean[k] *= 1000;
                }
                double[] y = FitData.gaussian(clean, clean[0] / 20, r);
                T2Estimate e = fit.estimate(y, Double.NaN);
                signal.evaluate(e.t2Ms(), e.b1Scale(), g, d1, d2);
                double gy = 0;
                double gg = 0;
                for (int k = 0; k < n; k++) {
                    gy += g[k] * y[k];
                    gg += g[k] * g[k];
                }
                assertEquals(gy / gg, e.amplitude(), 1e-9 * gy / gg,
                        "seed " + seed + " case " + i + ": T2 " + t2 + " B1 " + b1);
            }
        }
    }
}

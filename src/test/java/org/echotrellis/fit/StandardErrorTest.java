package org.echotrellis.fit;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;

import org.echotrellis.epg.CpmgTrain;
import org.junit.jupiter.api.Test;

class StandardErrorTest {
    @Test
    void standardErrorsMatchTheSpreadOverNoiseRealisations() {
        // Cramér–Rao: the linearised covariance s²(JᵀJ)⁻¹ predicts the scatter of the estimates
        // (Seber & Wild 1989, ch. 2). 200 realisations per case; the SD of an SD estimate from 200
        // samples is about 5 %, so the 20 % band is about 4 sigma.
        CpmgTrain train = CpmgTrain.constant(32, 10, 180);
        T2Fit fit = new T2Fit.Factory(FitSettings.defaults(train), FitModel.EPG, false).newKernel();
        double[][] cases = {{60, 0.8}, {120, 0.65}, {35, 0.75}};
        long seed = 500;
        for (double[] c : cases) {
            seed++;
            Random r = new Random(seed);
            double[] clean = FitData.decay(train, 1000, c[0], c[1]);
            int m = 200;
            double sum = 0;
            double sum2 = 0;
            double seSum = 0;
            double bSum = 0;
            double bSum2 = 0;
            double bSeSum = 0;
            for (int i = 0; i < m; i++) {
                T2Estimate e = fit.estimate(FitData.gaussian(clean, 0.01, r), Double.NaN);
                sum += e.t2Ms();
                sum2 += e.t2Ms() * e.t2Ms();
                seSum += e.t2SeMs();
                bSum += e.b1Scale();
                bSum2 += e.b1Scale() * e.b1Scale();
                bSeSum += e.b1Se();
            }
            double sd = Math.sqrt((sum2 - sum * sum / m) / (m - 1));
            double ratio = sd / (seSum / m);
            double bSd = Math.sqrt((bSum2 - bSum * bSum / m) / (m - 1));
            double bRatio = bSd / (bSeSum / m);
            assertTrue(ratio > 0.8 && ratio < 1.2, "T2 " + c[0] + ": spread/SE = " + ratio);
            assertTrue(bRatio > 0.8 && bRatio < 1.2, "B1 " + c[1] + ": spread/SE = " + bRatio);
        }
    }

    @Test
    void withTheRicianModelStandardErrorsMatchTheSpreadWhenLateEchoesSitOnTheNoiseFloor() {
        // Rician magnitudes (Gudbjartsson & Patz 1995) of T2 = 40 ms over 32 x 10 ms: from about
        // echo 12 on the signal is below sigma = 0.02 and the magnitudes' variance falls towards the
        // Rayleigh 0.43 sigma^2 (METHODS §8), so the residual variance underestimates the variance
        // of the echoes that carry the information. Same 20 % band as above (Cramér–Rao with
        // known sigma: cov = sigma^2 (J^T J)^-1, Seber & Wild 1989, ch. 2), 300 realisations,
        // free and fixed B1, three seeds.
        CpmgTrain train = CpmgTrain.constant(32, 10, 180);
        double sigma = 0.02;
        T2Fit fit = new T2Fit.Factory(FitSettings.defaults(train).withNoiseSigma(sigma), FitModel.EPG, false)
                .newKernel();
        double[] clean = FitData.decay(train, 1000, 40, 0.7);
        for (long seed : new long[] {7, 8, 9}) {
            for (double fixed : new double[] {Double.NaN, 0.7}) {
                Random r = new Random(seed);
                int m = 300;
                double sum = 0;
                double sum2 = 0;
                double seSum = 0;
                for (int i = 0; i < m; i++) {
                    T2Estimate e = fit.estimate(FitData.rician(clean, sigma, r), fixed);
                    sum += e.t2Ms();
                    sum2 += e.t2Ms() * e.t2Ms();
                    seSum += e.t2SeMs();
                }
                double ratio = Math.sqrt((sum2 - sum * sum / m) / (m - 1)) / (seSum / m);
                assertTrue(ratio > 0.8 && ratio < 1.2, "seed " + seed + " fixed B1 " + fixed + ": spread/SE = " + ratio);
            }
        }
    }
}

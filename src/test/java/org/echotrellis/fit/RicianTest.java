package org.echotrellis.fit;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.Random;

import org.echotrellis.epg.CpmgTrain;
import org.junit.jupiter.api.Test;

class RicianTest {
    @Test
    void meanMatchesTheClosedForm() {
        // Rayleigh mean at A = 0: sigma*sqrt(pi/2) = 1.2533 sigma (Gudbjartsson & Patz 1995).
        assertEquals(Math.sqrt(Math.PI / 2), Rician.mean(0, 1), 1e-7);
        // E[M]/sigma from the Laguerre form of Gudbjartsson & Patz 1995, evaluated in METHODS §8
        // (to 4 decimals): A/sigma = 0.5, 1, 2, 3, 5, 10.
        double[] a = {0.5, 1, 2, 3, 5, 10};
        double[] want = {1.3304, 1.5486, 2.2724, 3.1726, 5.1011, 10.0501};
        for (int i = 0; i < a.length; i++) {
            assertEquals(want[i], Rician.mean(a[i], 1), 6e-5, "A/sigma = " + a[i]);
        }
        // E[M^2] = A^2 + 2 sigma^2 bounds the mean from above (Jensen); large A: E[M] -> A + sigma^2/(2A).
        assertEquals(200 + 1.0 / 400, Rician.mean(200, 1), 1e-6);
    }

    @Test
    void slopeIsTheDerivativeOfTheMean() {
        for (double nu : new double[] {0.1, 0.7, 2, 5, 12, 40}) {
            double h = 1e-5;
            double fd = (Rician.mean(nu + h, 1.3) - Rician.mean(nu - h, 1.3)) / (2 * h);
            assertEquals(fd, Rician.slope(nu, 1.3), 2e-5, "nu = " + nu);  // A&S polynomials: ~1e-7 relative
        }
    }

    @Test
    void noiseModelRemovesTheNoiseFloorBias() {
        // Late echoes of T2 = 40 ms over 32 x 10 ms fall below sigma = 0.03; plain least squares
        // lengthens T2, the Rician mean model does not (remedy list of METHODS §8).
        CpmgTrain train = CpmgTrain.constant(32, 10, 180);
        FitSettings plain = FitSettings.defaults(train);
        T2Fit a = new T2Fit.Factory(plain, FitModel.EPG, false).newKernel();
        T2Fit b = new T2Fit.Factory(plain.withNoiseSigma(0.03), FitModel.EPG, false).newKernel();
        for (long seed : new long[] {21, 22, 23}) {
            Random r = new Random(seed);
            double[] clean = FitData.decay(train, 1000, 40, 0.8);
            double sa = 0;
            double sb = 0;
            int m = 100;
            for (int i = 0; i < m; i++) {
                double[] y = FitData.rician(clean, 0.03, r);
                sa += a.estimate(y, Double.NaN).t2Ms();
                sb += b.estimate(y, Double.NaN).t2Ms();
            }
            assertTrue(sa / m > 40 * 1.03, "plain fit is lengthened: " + sa / m);
            assertEquals(40, sb / m, 40 * 0.015, "Rician model");
        }
    }
}

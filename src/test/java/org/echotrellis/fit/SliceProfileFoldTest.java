package org.echotrellis.fit;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.junit.jupiter.api.Test;

class SliceProfileFoldTest {

    /** Noise-free slice-profile data: weighted sum over positions of lane trains with the local flips. */
    private static double[] profileData(CpmgTrain train, SliceProfile p, double t2, double b1) {
        int n = train.echoes();
        double[] y = new double[n];
        CpmgEngine eng = new CpmgEngine(1);
        for (int z = 0; z < p.positions(); z++) {
            double[] flips = new double[n];
            java.util.Arrays.fill(flips, train.refocusFlipDeg(0) * p.refocusingFactors()[z] * b1);
            CpmgTrain local = CpmgTrain.of(n, train.echoSpacingMs(), train.excitationFlipDeg() * p.excitationFactors()[z] * b1, flips);
            double[] e = eng.echoes(local, 1000, t2, 1.0);
            for (int k = 0; k < n; k++) {
                y[k] += p.weights()[z] * e[k];
            }
        }
        for (int k = 0; k < n; k++) {
            y[k] = Math.abs(y[k]);
        }
        return y;
    }

    @Test
    void profileFitRecoversB1AboveNominalInsteadOfStoppingAtAFoldThatDoesNotExist() {
        // The fold identity (METHODS §3 [C]: angles a and 360° − a give the same magnitude train)
        // holds per position; with a slice profile each position folds at its own B1 = 180°/(f·α),
        // so the summed train of B1 > 1 is no longer the train of any B1 < 1 (Lebel & Wilman 2010
        // model as in SliceProfileTest; data from the lane engine, noise-free). The fit must recover
        // the true B1 and T2 (tolerance 1e-3 relative), not stop at a fold limit.
        CpmgTrain train = CpmgTrain.constant(32, 10, 180);
        SliceProfile p = SliceProfiles.parse("sinc:4", train, 16, 1.0);
        FitSettings s = FitSettings.defaults(train).withProfile(p);
        T2Fit fit = new T2Fit.Factory(s, FitModel.EPG, false).newKernel();
        for (double b1 : new double[] {1.1, 1.2, 1.3}) {
            T2Estimate e = fit.estimate(profileData(train, p, 70, b1), Double.NaN);
            assertEquals(70, e.t2Ms(), 70 * 1e-3, "T2 at true B1 " + b1);
            assertEquals(b1, e.b1Scale(), 1e-3, "B1 at true B1 " + b1);
        }
    }
}

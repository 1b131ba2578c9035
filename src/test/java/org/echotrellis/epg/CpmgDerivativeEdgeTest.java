package org.echotrellis.epg;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/** Derivative states at the edges the fit reaches: T2 at its default bounds, B1 at the fold and at its bounds. */
class CpmgDerivativeEdgeTest {
    private static final double[] ONE = {1};

    /** Central difference of echo trains, step h (error O(h^2)). */
    private static double[] central(CpmgDerivativeEngine eng, CpmgTrain train, double t1, double t2, double b1,
            boolean wrtT2, double h) {
        int n = train.echoes();
        double[] p = new double[n];
        double[] m = new double[n];
        double[] junk = new double[n];
        eng.run(train, t1, wrtT2 ? t2 + h : t2, wrtT2 ? b1 : b1 + h, ONE, ONE, ONE, 1, p, junk, junk);
        eng.run(train, t1, wrtT2 ? t2 - h : t2, wrtT2 ? b1 : b1 - h, ONE, ONE, ONE, 1, m, junk, junk);
        for (int i = 0; i < n; i++) {
            p[i] = (p[i] - m[i]) / (2 * h);
        }
        return p;
    }

    @Test
    void derivativesMatchCentralDifferencesAtTheBoundsAndAtTheFold() {
        // Central differences (common practice); dT2 with a relative step of 1e-6: truncation error
        // about (n·ESP/T2·1e-6)^2 relative, rounding about 1e-10; checked per echo to 1e-6 relative
        // for dT2 (echoes of T2 = 1 ms fall to ~1e-139, so a tolerance scaled to the first echo would
        // not test them).
        CpmgDerivativeEngine eng = new CpmgDerivativeEngine(1);
        int n = 32;
        for (double refocus : new double[] {180, 150}) {
            CpmgTrain train = CpmgTrain.constant(n, 10, refocus);
            double fold = 180 / refocus;
            for (double t1 : new double[] {1000, Double.POSITIVE_INFINITY}) {
                for (double t2 : new double[] {1, 5000}) {
                    for (double b1 : new double[] {0.3, fold, 1.7}) {
                        double[] e = new double[n];
                        double[] dT = new double[n];
                        double[] dB = new double[n];
                        eng.run(train, t1, t2, b1, ONE, ONE, ONE, 1, e, dT, dB);
                        double[] fT = central(eng, train, t1, t2, b1, true, 1e-6 * t2);
                        double[] fB = central(eng, train, t1, t2, b1, false, 1e-7);
                        double scaleB = 0;
                        for (int i = 0; i < n; i++) {
                            scaleB = Math.max(scaleB, Math.abs(e[i]));
                        }
                        for (int i = 0; i < n; i++) {
                            String at = refocus + "° T1 " + t1 + " T2 " + t2 + " B1 " + b1 + " echo " + (i + 1);
                            assertTrue(Double.isFinite(dT[i]) && Double.isFinite(dB[i]), at);
                            assertEquals(fT[i], dT[i], 1e-6 * Math.abs(dT[i]) + 1e-300, "dT2 " + at);
                            // dB1: step 1e-7. Near the fold the late echoes of short T2 are tiny
                            // next to stimulated terms that grow as (B1 - fold)^2, so larger steps
                            // carry a truncation error well above 1e-6 (at 1e-5: 7e-6 relative, echo 2
                            // at 150°, T2 1 ms); the step's rounding, about 1e-16/1e-7 of the train's
                            // peak, is covered by 1e-10 of the peak added to the 1e-6 relative tolerance.
                            assertEquals(fB[i], dB[i], 1e-6 * Math.abs(dB[i]) + 1e-10 * scaleB, "dB1 " + at);
                        }
                    }
                }
            }
        }
    }

    @Test
    void infiniteT2GivesAFiniteZeroDerivative() {
        // dS/dT2 = S·n·ESP/T2^2 -> 0 as T2 -> infinity (exponential factor e^{-t/T2}; common practice).
        CpmgDerivativeEngine eng = new CpmgDerivativeEngine(1);
        CpmgTrain train = CpmgTrain.constant(16, 10, 160);
        double[] e = new double[16];
        double[] dT = new double[16];
        double[] dB = new double[16];
        eng.run(train, Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY, 0.9, ONE, ONE, ONE, 1, e, dT, dB);
        for (int i = 0; i < 16; i++) {
            assertEquals(0.0, dT[i], 0.0, "echo " + (i + 1));
            assertTrue(Double.isFinite(dB[i]) && Double.isFinite(e[i]), "echo " + (i + 1));
        }
    }
}

package org.echotrellis.epg;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Random;

import org.junit.jupiter.api.Test;

class CpmgDerivativeEngineTest {

    private static double[] ones(int n) {
        double[] a = new double[n];
        java.util.Arrays.fill(a, 1.0);
        return a;
    }

    @Test
    void valuesMatchTheCpmgEngine() {
        CpmgEngine ref = new CpmgEngine(1);
        CpmgDerivativeEngine eng = new CpmgDerivativeEngine(1);
        Random r = new Random(42);
        for (int trial = 0; trial < 40; trial++) {
            int n = 1 + r.nextInt(40);
            double[] flips = new double[n];
            for (int i = 0; i < n; i++) {
                flips[i] = 60 + 120 * r.nextDouble();
            }
            CpmgTrain train = CpmgTrain.of(n, 5 + 10 * r.nextDouble(), 70 + 40 * r.nextDouble(), trial % 2 == 0 ? flips : ones(n));
            if (trial % 2 == 1) {
                train = CpmgTrain.constant(n, 10, 100 + 80 * r.nextDouble());
            }
            double t1 = 300 + 2000 * r.nextDouble();
            double t2 = 10 + 300 * r.nextDouble();
            double b1 = 0.5 + r.nextDouble();
            double[] want = ref.echoes(train, t1, t2, b1);
            double[] e = new double[n];
            eng.run(train, t1, t2, b1, ones(1), ones(1), ones(1), 1, e, new double[n], new double[n]);
            for (int i = 0; i < n; i++) {
                assertEquals(want[i], e[i], 1e-13, "trial " + trial + " echo " + i);  // same arithmetic up to rounding
            }
        }
    }

    @Test
    void derivativesMatchCentralDifferences() {
        // Central differences with step h have error O(h^2); h = 1e-4 relative gives ~1e-8 agreement.
        for (long seed : new long[] {1, 2, 3}) {
            Random r = new Random(seed);
            int lanes = seed == 1 ? 1 : 1 + r.nextInt(5);
            CpmgDerivativeEngine eng = new CpmgDerivativeEngine(lanes);
            int n = 32;
            double[] flips = new double[n];
            for (int i = 0; i < n; i++) {
                flips[i] = 90 + 90 * r.nextDouble();
            }
            CpmgTrain train = CpmgTrain.of(n, 8, 90, flips);
            double[] ef = new double[lanes];
            double[] rf = new double[lanes];
            double[] w = new double[lanes];
            for (int l = 0; l < lanes; l++) {
                ef[l] = 0.4 + 0.6 * r.nextDouble();
                rf[l] = 0.4 + 0.6 * r.nextDouble();
                w[l] = r.nextDouble();
            }
            double t2 = 20 + 200 * r.nextDouble();
            double b1 = 0.6 + 0.6 * r.nextDouble();
            double[] e = new double[n];
            double[] dT = new double[n];
            double[] dB = new double[n];
            eng.run(train, 1000, t2, b1, ef, rf, w, lanes, e, dT, dB);
            double[] p = new double[n];
            double[] m = new double[n];
            double[] junk = new double[n];
            double ht = 1e-4 * t2;
            eng.run(train, 1000, t2 + ht, b1, ef, rf, w, lanes, p, junk, junk);
            eng.run(train, 1000, t2 - ht, b1, ef, rf, w, lanes, m, junk, junk);
            for (int i = 0; i < n; i++) {
                assertEquals((p[i] - m[i]) / (2 * ht), dT[i], 1e-8 * (1 + Math.abs(dT[i])), "dT2 echo " + i);
            }
            double hb = 1e-5;
            eng.run(train, 1000, t2, b1 + hb, ef, rf, w, lanes, p, junk, junk);
            eng.run(train, 1000, t2, b1 - hb, ef, rf, w, lanes, m, junk, junk);
            for (int i = 0; i < n; i++) {
                assertEquals((p[i] - m[i]) / (2 * hb), dB[i], 1e-7 * (1 + Math.abs(dB[i])), "dB1 echo " + i);
            }
        }
    }

    @Test
    void idealRefocusingGivesTheExponentialAndItsDerivative() {
        // METHODS 2b / common practice: ideal 180° CPMG gives S_n = exp(-n ESP/T2),
        // so dS_n/dT2 = S_n n ESP / T2^2; at B1 = 1 the B1 derivative vanishes (symmetry a <-> 360°-a).
        CpmgDerivativeEngine eng = new CpmgDerivativeEngine(1);
        int n = 16;
        double[] e = new double[n];
        double[] dT = new double[n];
        double[] dB = new double[n];
        eng.run(CpmgTrain.constant(n, 10, 180), 1000, 80, 1.0, ones(1), ones(1), ones(1), 1, e, dT, dB);
        for (int i = 0; i < n; i++) {
            double s = Math.exp(-(i + 1) * 10 / 80.0);
            assertEquals(s, e[i], 1e-14);
            assertEquals(s * (i + 1) * 10 / (80.0 * 80.0), dT[i], 1e-15);
            assertEquals(0.0, dB[i], 1e-13);
        }
    }
}

package org.echotrellis.epg;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.Random;

import org.junit.jupiter.api.Test;

/**
 * The one-lane path of {@link SteadyCpmgEngine} (scalars, the steady state's two even-family runs in
 * one pass) against the same trains run as lanes of an eight-lane engine: bit for bit, since both do
 * the same arithmetic in the same order. The lane path itself is checked against closed forms and
 * brute-force isochromats by the acquisition-model tests.
 */
class SteadyCpmgSingleLaneTest {
    @Test
    void oneLaneEqualsEightLanesBitForBit() {
        Random rnd = new Random(20261202L);
        SteadyCpmgEngine one = new SteadyCpmgEngine(1);
        SteadyCpmgEngine eight = new SteadyCpmgEngine(8);
        for (int trial = 0; trial < 60; trial++) {
            int n = 1 + rnd.nextInt(40);
            double esp = 5 + 20 * rnd.nextDouble();
            double[] flips = new double[n];
            for (int i = 0; i < n; i++) {
                flips[i] = trial % 3 == 0 ? 150 : 60 + 120 * rnd.nextDouble();
            }
            CpmgTrain train = CpmgTrain.of(n, esp, 70 + 40 * rnd.nextDouble(), flips);
            int len = SteadyCpmgEngine.factorLength(n);
            double[] pre = factors(rnd, len, trial % 4 == 0);
            double[] post = factors(rnd, len, trial % 4 == 0);
            double[] dz = factors(rnd, 2 * n + 4, trial % 4 == 0);
            double tr = trial % 2 == 0 ? Double.POSITIVE_INFINITY : n * esp + 200 + 3000 * rnd.nextDouble();
            double[] t1 = new double[8];
            double[] t2 = new double[8];
            double[] b1 = new double[8];
            for (int l = 0; l < 8; l++) {
                t1[l] = trial % 5 == 0 ? Double.POSITIVE_INFINITY : 300 + 3000 * rnd.nextDouble();
                t2[l] = 10 + 300 * rnd.nextDouble();
                b1[l] = 0.4 + 1.2 * rnd.nextDouble();
            }
            double[] lanes = new double[8 * n];
            eight.run(train, pre, post, dz, tr, t1, t2, b1, 8, lanes);
            for (int l = 0; l < 8; l++) {
                double[] single = new double[n];
                one.run(train, pre, post, dz, tr, new double[] {t1[l]}, new double[] {t2[l]}, new double[] {b1[l]}, 1,
                        single);
                double[] expected = java.util.Arrays.copyOfRange(lanes, l * n, (l + 1) * n);
                assertArrayEquals(expected, single, 0.0, "trial " + trial + " lane " + l);
            }
        }
    }

    @Test
    void perfectRefocusingWithFullRecoveryDecaysAsExpTeOverT2() {
        // 180° refocusing, no diffusion, TR long: echo n = sin(90°) exp(-n ESP / T2) (Hahn 1950; Carr & Purcell 1954)
        int n = 16;
        double esp = 10;
        double t2 = 80;
        double[] ones = new double[SteadyCpmgEngine.factorLength(n)];
        java.util.Arrays.fill(ones, 1);
        double[] out = new double[n];
        new SteadyCpmgEngine(1).run(CpmgTrain.constant(n, esp, 180), ones, ones, ones, 1e9,
                new double[] {1000}, new double[] {t2}, new double[] {1}, 1, out);
        for (int i = 0; i < n; i++) {
            assertEquals(Math.exp(-(i + 1) * esp / t2), Math.abs(out[i]), 1e-12, "echo " + (i + 1));
        }
    }

    private static double[] factors(Random rnd, int len, boolean none) {
        double[] d = new double[len];
        for (int i = 0; i < len; i++) {
            d[i] = none ? 1 : 0.7 + 0.3 * rnd.nextDouble();
        }
        return d;
    }
}

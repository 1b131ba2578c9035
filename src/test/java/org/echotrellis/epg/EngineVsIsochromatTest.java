package org.echotrellis.epg;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.SplittableRandom;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * The EPG engine against an independent brute-force isochromat Bloch simulation on randomised
 * sequences: random flips, phases, durations, dephasing steps (negative and zero included), T1/T2
 * including infinite. Agreement to 1e-9 (common practice: the EPG is the Fourier series of the
 * isochromat ensemble, Weigel 2015).
 */
class EngineVsIsochromatTest {

    @ParameterizedTest
    @ValueSource(longs = {1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12})
    void randomSequencesAgreeWithBlochIsochromats(long seed) {
        SplittableRandom rnd = new SplittableRandom(seed);
        int events = 6 + rnd.nextInt(30);
        int[] kinds = new int[events];
        double[] a = new double[events];
        double[] b = new double[events];
        int totalDephasing = 0;
        for (int i = 0; i < events; i++) {
            int k = i == 0 ? IsochromatReference.RF : rnd.nextInt(3);
            kinds[i] = k;
            if (k == IsochromatReference.RF) {
                a[i] = rnd.nextDouble(0, 360);
                b[i] = rnd.nextDouble(-360, 360);
            } else if (k == IsochromatReference.INTERVAL) {
                a[i] = rnd.nextDouble(0.1, 20);
                b[i] = rnd.nextInt(-3, 4);
                totalDephasing += Math.abs((int) b[i]);
            }
        }
        kinds[events - 1] = IsochromatReference.ECHO;
        EpgProgram p = rebuild(kinds, a, b);
        double t1 = rnd.nextInt(4) == 0 ? Double.POSITIVE_INFINITY : rnd.nextDouble(100, 3000);
        double t2 = rnd.nextInt(4) == 0 ? Double.POSITIVE_INFINITY : rnd.nextDouble(5, 300);
        double b1 = rnd.nextDouble(0.5, 1.4);
        double[] ref = IsochromatReference.simulate(kinds, a, b, t1, t2, b1, 2 * totalDephasing + 3);
        int lanes = 3;
        GeneralEngine g = new GeneralEngine(lanes);
        double[] re = new double[lanes * p.echoCount()];
        double[] im = new double[lanes * p.echoCount()];
        // lane 1 carries the case; lanes 0 and 2 carry other tissues, to check lane independence
        g.run(p, new double[] {500, t1, 900}, new double[] {50, t2, 80}, new double[] {1.1, b1, 0.7}, lanes, re, im);
        for (int e = 0; e < p.echoCount(); e++) {
            assertEquals(ref[2 * e], re[p.echoCount() + e], 1e-9, "seed " + seed + " echo " + e + " real");
            assertEquals(ref[2 * e + 1], im[p.echoCount() + e], 1e-9, "seed " + seed + " echo " + e + " imag");
        }
    }

    private static EpgProgram rebuild(int[] kinds, double[] a, double[] b) {
        EpgProgram.Builder pb = EpgProgram.builder();
        for (int i = 0; i < kinds.length; i++) {
            switch (kinds[i]) {
                case IsochromatReference.RF -> pb.rf(a[i], b[i]);
                case IsochromatReference.INTERVAL -> pb.interval(a[i], (int) b[i]);
                default -> pb.echo();
            }
        }
        return pb.build();
    }
}

package org.echotrellis.epg;

import static org.junit.jupiter.api.Assertions.assertEquals;

import java.util.SplittableRandom;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/** The engines against published closed forms. */
class ClosedFormTest {
    private static final double INF = Double.POSITIVE_INFINITY;

    /** Ideal CPMG: echo n = exp(-n ESP / T2) (Carr &amp; Purcell 1954; Meiboom &amp; Gill 1958). */
    @Test
    void idealCpmgIsExponential() {
        CpmgEngine fast = new CpmgEngine(4);
        for (double t2 : new double[] {10, 37, 80, 300, 2000}) {
            double[] e = fast.echoes(CpmgTrain.constant(32, 10, 180), 1000, t2, 1.0);
            for (int n = 1; n <= 32; n++) {
                assertEquals(Math.exp(-n * 10 / t2), e[n - 1], 1e-13, "T2 " + t2 + " echo " + n);
            }
        }
        // worked example ESP 10 ms, T2 80 ms (Meiboom & Gill 1958 exponential, values evaluated): 0.882497, 0.778801
        double[] e = fast.echoes(CpmgTrain.constant(4, 10, 180), 1000, 80, 1.0);
        assertEquals(0.882497, e[0], 5e-7);
        assertEquals(0.778801, e[1], 5e-7);
    }

    /**
     * Constant refocusing alpha, 90 degree excitation, no relaxation: echo 1 = sin^2(a/2),
     * echo 2 = sin^4(a/2) + sin^2(a)/2 (Hennig 1988 pathway rules: the spin echo of the spin echo
     * plus the stimulated echo).
     */
    @ParameterizedTest
    @ValueSource(doubles = {30, 60, 90, 120, 150, 170, 180, 200, 270})
    void firstTwoEchoesOfConstantFlipTrain(double alphaDeg) {
        double a = Math.toRadians(alphaDeg);
        double[] e = new CpmgEngine(2).echoes(CpmgTrain.constant(8, 10, alphaDeg), INF, INF, 1.0);
        double s2 = Math.pow(Math.sin(a / 2), 2);
        assertEquals(s2, e[0], 1e-14);
        assertEquals(s2 * s2 + 0.5 * Math.pow(Math.sin(a), 2), e[1], 1e-14);
    }

    /**
     * With relaxation (Hennig 1988): E1 = sin^2(a/2) e^{-ESP/T2}; E2 = sin^4(a/2) e^{-2ESP/T2} +
     * sin^2(a)/2 e^{-ESP/T2} e^{-ESP/T1}: the stimulated echo spends one spacing as Z.
     */
    @Test
    void firstTwoEchoesWithRelaxation() {
        double a = Math.toRadians(120);
        double esp = 10;
        double t1 = 1000;
        double t2 = 100;
        double[] e = new CpmgEngine(1).echoes(CpmgTrain.constant(4, esp, 120), t1, t2, 1.0);
        double s2 = Math.pow(Math.sin(a / 2), 2);
        assertEquals(s2 * Math.exp(-esp / t2), e[0], 1e-14);
        assertEquals(s2 * s2 * Math.exp(-2 * esp / t2) + 0.5 * Math.pow(Math.sin(a), 2) * Math.exp(-esp / t2) * Math.exp(-esp / t1),
                e[1], 1e-14);
    }

    /**
     * Three pulses a1, a2, a3 at 0, tau1, tau1 + tau2 (tau1 &lt; tau2) under a constant gradient,
     * no relaxation (Hahn, Phys Rev 80:580, 1950; Woessner, J Chem Phys 34:2057, 1961):
     * SE12 at 2 tau1 = sin a1 sin^2(a2/2); STE at 2 tau1 + tau2 = sin a1 sin a2 sin a3 / 2;
     * double echo at 2 tau2 = sin a1 sin^2(a2/2) sin^2(a3/2); SE23 at tau1 + 2 tau2 =
     * |cos a1| sin a2 sin^2(a3/2); SE13 at 2(tau1 + tau2) = sin a1 cos^2(a2/2) sin^2(a3/2).
     */
    @ParameterizedTest
    @ValueSource(longs = {11, 12, 13, 14, 15, 16, 17, 18})
    void threePulseEchoes(long seed) {
        SplittableRandom r = new SplittableRandom(seed);
        double a1 = r.nextDouble(10, 170);
        double a2 = r.nextDouble(10, 170);
        double a3 = r.nextDouble(10, 170);
        int tau1 = 2 + r.nextInt(5);
        int tau2 = tau1 * 2 + 1 + r.nextInt(5); // the five echoes at distinct times
        double[] amp = threePulse(a1, a2, a3, tau1, tau2, INF, INF);
        double r1 = Math.toRadians(a1);
        double r2 = Math.toRadians(a2);
        double r3 = Math.toRadians(a3);
        double s22 = Math.pow(Math.sin(r2 / 2), 2);
        double s32 = Math.pow(Math.sin(r3 / 2), 2);
        assertEquals(Math.sin(r1) * s22, amp[2 * tau1], 1e-12, "SE12");
        assertEquals(0.5 * Math.sin(r1) * Math.sin(r2) * Math.sin(r3), amp[2 * tau1 + tau2], 1e-12, "STE");
        assertEquals(Math.sin(r1) * s22 * s32, amp[2 * tau2], 1e-12, "double echo");
        assertEquals(Math.abs(Math.cos(r1)) * Math.sin(r2) * s32, amp[tau1 + 2 * tau2], 1e-12, "SE23");
        assertEquals(Math.sin(r1) * Math.pow(Math.cos(r2 / 2), 2) * s32, amp[2 * (tau1 + tau2)], 1e-12, "SE13");
    }

    /** The stimulated echo with relaxation: x e^{-2 tau1/T2} e^{-tau2/T1}, tau2 the mixing time (Hahn 1950). */
    @Test
    void stimulatedEchoRelaxation() {
        double t1 = 700;
        double t2 = 40;
        int tau1 = 3;
        int tau2 = 11;
        double[] amp = threePulse(90, 90, 90, tau1, tau2, t1, t2);
        assertEquals(0.5 * Math.exp(-2.0 * tau1 / t2) * Math.exp(-(double) tau2 / t1), amp[2 * tau1 + tau2], 1e-12);
    }

    /** Echo magnitude at every integer time 0..2(tau1+tau2), durations in ms = dephasing orders. */
    static double[] threePulse(double a1, double a2, double a3, int tau1, int tau2, double t1, double t2) {
        int end = 2 * (tau1 + tau2);
        EpgProgram.Builder b = EpgProgram.builder().rf(a1, 90).echo();
        for (int t = 1; t <= end; t++) {
            b.interval(1.0, 1);
            if (t == tau1) {
                b.rf(a2, 0);
            }
            if (t == tau1 + tau2) {
                b.rf(a3, 0);
            }
            b.echo();
        }
        EpgProgram p = b.build();
        double[] re = new double[p.echoCount()];
        double[] im = new double[p.echoCount()];
        new GeneralEngine(1).run(p, new double[] {t1}, new double[] {t2}, new double[] {1}, 1, re, im);
        double[] mag = new double[re.length];
        for (int i = 0; i < re.length; i++) {
            mag[i] = Math.hypot(re[i], im[i]);
        }
        return mag;
    }
}

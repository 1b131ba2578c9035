package org.echotrellis.design;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class FlipInverterTest {
    private static final double INF = Double.POSITIVE_INFINITY;

    private static DesignProblem noRelaxation(int echoes, double minFlip) {
        return new DesignProblem("ideal", echoes, 10, 90, INF, INF, 1, minFlip, 180);
    }

    @Test
    void constantHalfMatchesPublishedSchedule() {
        // METHODS §5 check values for the echo-by-echo inversion (Hennig, Weigel & Scheffler,
        // MRM 51:68, 2004; values computed from its explicit formula, no relaxation):
        // 90.00, 53.13 (= 2·atan(1/2)), 43.60, 39.81, 38.26, 37.85, 38.02, 38.45, 38.91, 39.23 deg.
        double[] expected = {90.00, 53.13, 43.60, 39.81, 38.26, 37.85, 38.02, 38.45, 38.91, 39.23};
        DesignProblem p = noRelaxation(12, 0);
        Inversion inv = new FlipInverter().invert(p, new EchoTarget.Constant(0.5).amplitudes(p), new Startup.None());
        double[] flips = inv.flipsDeg();
        for (int i = 0; i < expected.length; i++) {
            assertEquals(expected[i], flips[i], 0.006, "echo " + (i + 1)); // values given to 0.01 deg
        }
        assertEquals(Math.toDegrees(2 * Math.atan(0.5)), flips[1], 1e-9); // closed form 2·atan(1/2)
        assertEquals(0, inv.firstUnreachableEcho());
        assertTrue(inv.maxErrorAfterStartup() < 1e-12); // METHODS §5: achieved = target to 1e-12
        // relative RF energy Σα²/(N·180²) = 0.068 over 12 echoes (METHODS §5)
        assertEquals(0.068, RfExposure.relativeSar(flips), 0.0005);
    }

    @Test
    void constantSevenTenthsMatchesPublishedSchedule() {
        // METHODS §5 check values, constant target 0.7, no relaxation
        double[] expected = {113.58, 74.74, 65.50, 63.61, 64.25, 65.31, 65.74, 65.45};
        DesignProblem p = noRelaxation(10, 0);
        Inversion inv = new FlipInverter().invert(p, new EchoTarget.Constant(0.7).amplitudes(p), new Startup.None());
        double[] flips = inv.flipsDeg();
        for (int i = 0; i < expected.length; i++) {
            assertEquals(expected[i], flips[i], 0.006, "echo " + (i + 1));
        }
        // first angle α1 = 2·arcsin√(S1/sin α_exc) (METHODS §5 step 6)
        assertEquals(Math.toDegrees(2 * Math.asin(Math.sqrt(0.7))), flips[0], 1e-9);
        assertTrue(inv.maxErrorAfterStartup() < 1e-12);
    }

    @org.junit.jupiter.params.ParameterizedTest
    @org.junit.jupiter.params.provider.ValueSource(strings = {"none", "alsop", "ramp:3", "ramp:5"})
    void reachableConstantIsMetAfterStartup(String startup) {
        // issue 6 §5: every echo after the start-up within 1e-6 of the target (with relaxation)
        for (double[] tissue : new double[][] {{1000, 150}, {1400, 220}, {800, 300}}) {
            DesignProblem p = new DesignProblem("t", 24, 5, 90, tissue[0], tissue[1], 1, 0, 180);
            Startup s = Startup.parse(startup);
            Inversion inv = new FlipInverter().invert(p, new EchoTarget.Constant(0.45).amplitudes(p), s);
            assertEquals(0, inv.firstUnreachableEcho());
            double[] pred = inv.predicted();
            for (int i = s.echoes(24); i < 24; i++) {
                assertEquals(0.45, pred[i], 1e-6, startup + " echo " + (i + 1));
            }
            // predicted echoes are the foundation engine's for the same schedule (independent kernel)
            double[] ref = new org.echotrellis.epg.CpmgEngine(1).echoes(
                    org.echotrellis.epg.CpmgTrain.of(24, 5, 90, inv.flipsDeg()), tissue[0], tissue[1], 1);
            for (int i = 0; i < 24; i++) {
                assertEquals(ref[i], pred[i], 1e-12);
            }
        }
    }

    @Test
    void flipsStayWithinBounds() {
        DesignProblem p = new DesignProblem("t", 40, 5, 90, 1000, 60, 1, 30, 150);
        Inversion inv = new FlipInverter().invert(p, new EchoTarget.Decay(200, Double.NaN).amplitudes(p),
                new Startup.Ramp(4));
        for (double f : inv.flipsDeg()) {
            assertTrue(f >= 30 - 1e-9 && f <= 150 + 1e-9, "flip " + f);
        }
    }

    @Test
    void alsopFirstPulseIsNinetyPlusHalfAlpha() {
        // Alsop 1997: first pulse 90° + α/2; with no relaxation and target S∞(90°) the plateau flip is 90°
        DesignProblem p = noRelaxation(10, 0);
        double level = PseudoSteadyState.signal(Math.PI / 2);
        assertEquals(135, FlipInverter.alsopFirstFlipDeg(p, level), 1e-9);
        Inversion inv = new FlipInverter().invert(p, new EchoTarget.Constant(level).amplitudes(p), new Startup.Alsop());
        assertEquals(135, inv.flipsDeg()[0], 1e-9);
        assertEquals(1, inv.startupEchoes());
    }
}

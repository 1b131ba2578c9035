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
}

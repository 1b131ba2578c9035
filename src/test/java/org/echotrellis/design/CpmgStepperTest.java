package org.echotrellis.design;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

class CpmgStepperTest {
    private static final double INF = Double.POSITIVE_INFINITY;

    @Test
    void idealRefocusingGivesExponential() {
        // ideal CPMG: S_n = sin α_exc·exp(−n·ESP/T2) (Carr & Purcell 1954; Meiboom & Gill 1958)
        double[] flips = new double[20];
        java.util.Arrays.fill(flips, 180);
        double[] out = new double[20];
        new CpmgStepper().run(20, 10, 1000, 80, 1, 90, flips, out);
        for (int n = 1; n <= 20; n++) {
            assertEquals(Math.exp(-n * 10 / 80.0), out[n - 1], 1e-14, "echo " + n);
        }
        assertEquals(0.882497, out[0], 1e-6); // METHODS §2b: ESP 10 ms, T2 80 ms
    }

    @Test
    void constantFlipFirstEchoesMatchPathwayClosedForms() {
        // no relaxation: E1 = sin²(α/2), E2 = sin⁴(α/2) + ½ sin²α (Hennig 1988 pathway rules);
        // E3 = (1−x)(x²+2x+3)/4, E4 = (1−x)(5x³+9x²+7x+11)/16, x = cos α (METHODS §2d, symbolic)
        for (double alpha : new double[] {60, 90, 120, 150}) {
            double[] flips = {alpha, alpha, alpha, alpha};
            double[] out = new double[4];
            new CpmgStepper().run(4, 5, INF, INF, 1, 90, flips, out);
            double a = Math.toRadians(alpha);
            double x = Math.cos(a);
            double s2 = Math.pow(Math.sin(a / 2), 2);
            assertEquals(s2, out[0], 1e-14);
            assertEquals(s2 * s2 + 0.5 * Math.pow(Math.sin(a), 2), out[1], 1e-14);
            assertEquals((1 - x) * (x * x + 2 * x + 3) / 4, out[2], 1e-14);
            assertEquals((1 - x) * (5 * x * x * x + 9 * x * x + 7 * x + 11) / 16, out[3], 1e-14);
        }
    }

    @Test
    void secondEchoWithRelaxationMatchesClosedForm() {
        // METHODS §2d with relaxation: α = 120°, ESP 10, T1 1000, T2 100 ms → 0.678628, 0.796474
        double[] out = new double[2];
        new CpmgStepper().run(2, 10, 1000, 100, 1, 90, new double[] {120, 120}, out);
        assertEquals(0.678628, out[0], 1e-6);
        assertEquals(0.796474, out[1], 1e-6);
    }

    @Test
    void statesBeforePulsePredictTheEcho() {
        // the k = 1 formula (METHODS §5 step 2) must equal the echo after actually applying the pulse
        CpmgStepper s = new CpmgStepper();
        double[] flips = {150, 110, 70, 95, 130, 60};
        s.start(flips.length, 6, 900, 70, 0.9, 90);
        for (double f : flips) {
            s.advanceToPulse();
            double predicted = s.echoFor(Math.toRadians(f * 0.9));
            assertEquals(predicted, s.pulseAndEcho(f), 1e-15);
        }
    }
}

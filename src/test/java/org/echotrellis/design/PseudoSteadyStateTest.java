package org.echotrellis.design;

import static org.junit.jupiter.api.Assertions.assertEquals;

import org.junit.jupiter.api.Test;

class PseudoSteadyStateTest {
    @Test
    void ellipticKKnownValues() {
        // K(0) = π/2; K(1/2) = 1.854074677301372 (Abramowitz & Stegun, Table 17.1, m = 0.5)
        assertEquals(Math.PI / 2, PseudoSteadyState.ellipticK(0), 1e-15);
        assertEquals(1.854074677301372, PseudoSteadyState.ellipticK(0.5), 1e-14);
    }

    @Test
    void staticPseudoSteadyStateValues() {
        // S∞ = (2/π)·sin(α/2)·K(cos²(α/2)) (Alsop, MRM 37:176, 1997, from memory); values evaluated
        // from that formula in METHODS §2e: 0.9294 (120°), 0.8346 (90°), 0.6864 (60°)
        assertEquals(0.9294, PseudoSteadyState.signal(Math.toRadians(120)), 5e-5);
        assertEquals(0.8346, PseudoSteadyState.signal(Math.toRadians(90)), 5e-5);
        assertEquals(0.6864, PseudoSteadyState.signal(Math.toRadians(60)), 5e-5);
        assertEquals(1.0, PseudoSteadyState.signal(Math.PI), 1e-15);
    }

    @Test
    void inverseRoundTrips() {
        for (double deg = 5; deg <= 180; deg += 5) {
            double a = Math.toRadians(deg);
            assertEquals(a, PseudoSteadyState.flipFor(PseudoSteadyState.signal(a)), 1e-9, "flip " + deg);
        }
    }
}

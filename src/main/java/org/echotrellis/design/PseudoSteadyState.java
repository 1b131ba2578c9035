package org.echotrellis.design;

import org.apache.commons.math3.analysis.solvers.BrentSolver;

/**
 * The static pseudo-steady state of a CPMG train with constant refocusing flip α and no
 * relaxation (Alsop, "The sensitivity of low flip angle RARE imaging", MRM 37:176, 1997):
 * each isochromat is aligned with the axis of its echo-to-echo rotation, which gives the echo
 * S∞(α) = (2/π)·sin(α/2)·K(m = cos²(α/2)), with K the complete elliptic integral of the first
 * kind in the parameter convention. Used to choose the flip of the Alsop start-up
 * (first pulse 90° + α/2).
 */
final class PseudoSteadyState {
    private PseudoSteadyState() { }

    /**
     * Complete elliptic integral of the first kind by the arithmetic-geometric mean:
     * K(m) = π / (2·AGM(1, √(1 − m))) (Abramowitz &amp; Stegun 17.6).
     *
     * @param m parameter in [0, 1); m = 1 gives +Infinity
     * @return K(m)
     */
    public static double ellipticK(double m) {
        if (m >= 1) {
            return Double.POSITIVE_INFINITY;
        }
        return Math.PI / (2 * agm(1, Math.sqrt(1 - m)));
    }

    private static double agm(double a0, double b0) {
        double a = a0;
        double b = b0;
        for (int i = 0; i < 60 && Math.abs(a - b) > 1e-16 * a; i++) {
            double an = 0.5 * (a + b);
            b = Math.sqrt(a * b);
            a = an;
        }
        return a;
    }

    /**
     * @param flipRad constant refocusing flip in radians, within (0, π]
     * @return the static pseudo-steady-state echo amplitude (M0 = 1)
     */
    public static double signal(double flipRad) {
        if (flipRad <= 0) {
            return 0;
        }
        // with √(1 − m) = sin(α/2): (2/π)·s·K = s / AGM(1, s), exact down to tiny flips
        double s = Math.sin(0.5 * Math.min(flipRad, Math.PI));
        return s / agm(1, s);
    }

    /**
     * Inverse of {@link #signal(double)} on (0, π].
     *
     * @param level desired pseudo-steady-state amplitude; ≥ 1 gives π, ≤ 0 gives 0
     * @return flip in radians
     */
    public static double flipFor(double level) {
        if (level >= 1) {
            return Math.PI;
        }
        if (level <= 0) {
            return 0;
        }
        return new BrentSolver(1e-14, 1e-14).solve(200, a -> signal(a) - level, 1e-12, Math.PI);
    }
}

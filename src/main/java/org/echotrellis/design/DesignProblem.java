package org.echotrellis.design;

import org.echotrellis.Checks;

/**
 * The fixed part of a refocusing design: the echo train (echo count, echo spacing, excitation),
 * the design tissue and the bounds on the nominal refocusing flips. Immutable.
 *
 * @param tissueName label of the design tissue (for reports)
 * @param echoes number of echoes (1 to 4096)
 * @param echoSpacingMs echo spacing in ms
 * @param excitationFlipDeg nominal excitation flip in degrees
 * @param t1Ms design-tissue T1 in ms (may be +Infinity)
 * @param t2Ms design-tissue T2 in ms (may be +Infinity)
 * @param b1Scale transmit scale applied to every flip (1 = nominal)
 * @param minFlipDeg lowest allowed nominal refocusing flip, within [0, 180]
 * @param maxFlipDeg highest allowed nominal refocusing flip, within [minFlipDeg, 180]
 */
public record DesignProblem(String tissueName, int echoes, double echoSpacingMs, double excitationFlipDeg,
                            double t1Ms, double t2Ms, double b1Scale, double minFlipDeg, double maxFlipDeg) {
    /** Largest echo count accepted for a design. */
    public static final int MAX_ECHOES = 4096;

    /**
     * Validates every field; bad values raise {@link org.echotrellis.InputException}.
     *
     * @param tissueName label of the design tissue (for reports)
     * @param echoes number of echoes (1 to 4096)
     * @param echoSpacingMs echo spacing in ms
     * @param excitationFlipDeg nominal excitation flip in degrees
     * @param t1Ms design-tissue T1 in ms (may be +Infinity)
     * @param t2Ms design-tissue T2 in ms (may be +Infinity)
     * @param b1Scale transmit scale applied to every flip (1 = nominal)
     * @param minFlipDeg lowest allowed nominal refocusing flip, within [0, 180]
     * @param maxFlipDeg highest allowed nominal refocusing flip, within [minFlipDeg, 180]
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public DesignProblem {
        Checks.inRange("echoes", echoes, 1, MAX_ECHOES, null);
        Checks.positive("echo_spacing_ms", echoSpacingMs, null);
        Checks.inRange("excitation flip_deg", excitationFlipDeg, 0, 180, null);
        Checks.positiveOrInfinite("t1_ms", t1Ms, null);
        Checks.positiveOrInfinite("t2_ms", t2Ms, null);
        Checks.positive("b1_scale", b1Scale, null);
        Checks.inRange("min_flip_deg", minFlipDeg, 0, 180, null);
        Checks.inRange("max_flip_deg", maxFlipDeg, 0, 180, null);
        Checks.require(minFlipDeg <= maxFlipDeg, "min_flip_deg (" + minFlipDeg
                + ") must not exceed max_flip_deg (" + maxFlipDeg + ")");
        tissueName = tissueName == null ? "design tissue" : tissueName;
    }

    /**
     * @param name label of the tissue (for reports)
     * @param t1 the tissue's T1 in ms (+Infinity allowed)
     * @param t2 the tissue's T2 in ms (+Infinity allowed)
     * @return a copy for another tissue (same train and bounds)
     * @throws org.echotrellis.InputException if the new values break the rules of the constructor
     */
    public DesignProblem withTissue(String name, double t1, double t2) {
        return new DesignProblem(name, echoes, echoSpacingMs, excitationFlipDeg, t1, t2, b1Scale, minFlipDeg, maxFlipDeg);
    }

    /**
     * @param minDeg lowest allowed nominal refocusing flip in degrees, 0 to 180
     * @param maxDeg highest allowed nominal refocusing flip in degrees, {@code minDeg} to 180
     * @return a copy with other flip bounds
     * @throws org.echotrellis.InputException if the new values break the rules of the constructor
     */
    public DesignProblem withFlipBounds(double minDeg, double maxDeg) {
        return new DesignProblem(tissueName, echoes, echoSpacingMs, excitationFlipDeg, t1Ms, t2Ms, b1Scale, minDeg, maxDeg);
    }

    /**
     * @param n echo number, 1-based
     * @return echo time of echo n (1-based) in ms
     */
    public double echoTimeMs(int n) {
        return n * echoSpacingMs;
    }

    /**
     * Echo amplitudes of the same train with ideal 180° refocusing for this tissue:
     * sin α_exc·exp(−n·ESP/T2) at B1 = 1 (Carr &amp; Purcell 1954; Meiboom &amp; Gill 1958).
     *
     * @return a new array of {@link #echoes()} values
     */
    public double[] idealEchoes() {
        double[] out = new double[echoes];
        double s = Math.sin(Math.toRadians(excitationFlipDeg));
        for (int n = 1; n <= echoes; n++) {
            out[n - 1] = s * Math.exp(-n * echoSpacingMs / t2Ms);
        }
        return out;
    }
}

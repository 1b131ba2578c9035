package org.echotrellis.epg;

import java.util.Arrays;
import org.echotrellis.Checks;

/**
 * A multi-echo spin-echo train with CPMG timing: excitation at t = 0, refocusing pulse n at
 * (n &minus; &frac12;)&middot;ESP, echo n at n&middot;ESP, one dephasing order per half echo spacing
 * (Carr &amp; Purcell 1954; Meiboom &amp; Gill 1958). Refocusing flips and phases may vary per pulse.
 *
 * <p>Immutable: arrays are copied on the way in and out.
 *
 * @param echoes number of echoes (= refocusing pulses), 1 to {@link #MAX_ECHOES}
 * @param echoSpacingMs echo spacing ESP in ms
 * @param excitationFlipDeg excitation flip in degrees
 * @param excitationPhaseDeg excitation RF phase in degrees
 * @param refocusFlipsDeg refocusing flip per pulse in degrees (length = echoes)
 * @param refocusPhasesDeg refocusing RF phase per pulse in degrees (length = echoes)
 */
public record CpmgTrain(int echoes, double echoSpacingMs, double excitationFlipDeg, double excitationPhaseDeg,
                        double[] refocusFlipsDeg, double[] refocusPhasesDeg) {

    /** Largest supported echo count. */
    public static final int MAX_ECHOES = 4096;

    /**
     * Validates and copies.
     *
     * @param echoes number of echoes (= refocusing pulses), 1 to {@link #MAX_ECHOES}
     * @param echoSpacingMs echo spacing ESP in ms
     * @param excitationFlipDeg excitation flip in degrees
     * @param excitationPhaseDeg excitation RF phase in degrees
     * @param refocusFlipsDeg refocusing flip per pulse in degrees (length = echoes)
     * @param refocusPhasesDeg refocusing RF phase per pulse in degrees (length = echoes)
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public CpmgTrain {
        Checks.inRange("echoes", echoes, 1, MAX_ECHOES, null);
        Checks.positive("echo_spacing_ms", echoSpacingMs, null);
        Checks.inRange("excitation flip_deg", excitationFlipDeg, 0, 360, null);
        Checks.finite("excitation phase_deg", excitationPhaseDeg, null);
        Checks.require(refocusFlipsDeg != null && refocusFlipsDeg.length == echoes,
                "refocusing flips_deg must have one value per echo (" + echoes + "), got "
                        + (refocusFlipsDeg == null ? 0 : refocusFlipsDeg.length));
        Checks.require(refocusPhasesDeg != null && refocusPhasesDeg.length == echoes,
                "refocusing phases must have one value per echo (" + echoes + "), got "
                        + (refocusPhasesDeg == null ? 0 : refocusPhasesDeg.length));
        refocusFlipsDeg = refocusFlipsDeg.clone();
        refocusPhasesDeg = refocusPhasesDeg.clone();
        for (int i = 0; i < echoes; i++) {
            Checks.inRange("refocusing flip_deg[" + i + "]", refocusFlipsDeg[i], 0, 360, null);
            Checks.finite("refocusing phase_deg[" + i + "]", refocusPhasesDeg[i], null);
        }
    }

    /**
     * A train with 90&deg; excitation at phase 90&deg; and constant refocusing at phase 0&deg;.
     *
     * @param echoes number of echoes
     * @param echoSpacingMs echo spacing in ms
     * @param refocusDeg refocusing flip in degrees
     * @return the train
     */
    public static CpmgTrain constant(int echoes, double echoSpacingMs, double refocusDeg) {
        Checks.inRange("echoes", echoes, 1, MAX_ECHOES, null);
        double[] flips = new double[echoes];
        Arrays.fill(flips, refocusDeg);
        return new CpmgTrain(echoes, echoSpacingMs, 90, 90, flips, new double[echoes]);
    }

    /**
     * A CPMG-phased train (excitation phase 90&deg;, refocusing phase 0&deg;) with one flip per pulse.
     *
     * @param echoes number of echoes
     * @param echoSpacingMs echo spacing in ms
     * @param excitationDeg excitation flip in degrees
     * @param refocusDeg refocusing flips in degrees, one per echo
     * @return the train
     */
    public static CpmgTrain of(int echoes, double echoSpacingMs, double excitationDeg, double[] refocusDeg) {
        return new CpmgTrain(echoes, echoSpacingMs, excitationDeg, 90, refocusDeg, new double[echoes]);
    }

    /**
     * @param flipsDeg refocusing flips in degrees, one per echo, 0 to 360 (copied)
     * @return a copy with other refocusing flips (same phases)
     * @throws org.echotrellis.InputException if the new value breaks the rules of the constructor
     */
    public CpmgTrain withRefocusFlipsDeg(double[] flipsDeg) {
        return new CpmgTrain(echoes, echoSpacingMs, excitationFlipDeg, excitationPhaseDeg, flipsDeg, refocusPhasesDeg);
    }

    /**
     * @param flipDeg excitation flip in degrees, 0 to 360
     * @return a copy with another excitation flip
     * @throws org.echotrellis.InputException if the new value breaks the rules of the constructor
     */
    public CpmgTrain withExcitationFlipDeg(double flipDeg) {
        return new CpmgTrain(echoes, echoSpacingMs, flipDeg, excitationPhaseDeg, refocusFlipsDeg, refocusPhasesDeg);
    }

    /**
     * @param espMs echo spacing ESP in ms, &gt; 0
     * @return a copy with another echo spacing
     * @throws org.echotrellis.InputException if the new value breaks the rules of the constructor
     */
    public CpmgTrain withEchoSpacingMs(double espMs) {
        return new CpmgTrain(echoes, espMs, excitationFlipDeg, excitationPhaseDeg, refocusFlipsDeg, refocusPhasesDeg);
    }

    /**
     * @param i pulse index, 0-based
     * @return refocusing flip of pulse i (0-based) in degrees
     */
    public double refocusFlipDeg(int i) {
        return refocusFlipsDeg[i];
    }

    /**
     * @param i pulse index, 0-based
     * @return refocusing phase of pulse i (0-based) in degrees
     */
    public double refocusPhaseDeg(int i) {
        return refocusPhasesDeg[i];
    }

    /**
     * @return the refocusing flip of every pulse in degrees (a copy)
     */
    @Override
    public double[] refocusFlipsDeg() {
        return refocusFlipsDeg.clone();
    }

    /**
     * @return the refocusing RF phase of every pulse in degrees (a copy)
     */
    @Override
    public double[] refocusPhasesDeg() {
        return refocusPhasesDeg.clone();
    }

    /**
     * @param n echo number, 1-based
     * @return echo time of echo n (1-based) in ms
     */
    public double echoTimeMs(int n) {
        return n * echoSpacingMs;
    }

    /**
     * Whether every refocusing phase equals the excitation phase &plusmn; 90&deg; (the CPMG condition on
     * phases, Meiboom &amp; Gill 1958). Then all states stay real in the rotated frame and the fast path
     * {@link CpmgEngine} applies.
     *
     * @return true if CPMG-phased
     */
    public boolean isCpmgPhased() {
        for (int i = 0; i < echoes; i++) {
            if (refocusSign(i) == 0) {
                return false;
            }
        }
        return true;
    }

    /**
     * Sign of pulse i in the real CPMG frame: +1 if its phase is the excitation phase &minus; 90&deg;,
     * &minus;1 if + 90&deg; (a rotation by &minus;&alpha; about the same axis), 0 if neither.
     */
    int refocusSign(int i) {
        double d = refocusPhasesDeg[i] - excitationPhaseDeg;
        d = d - 360.0 * Math.floor(d / 360.0); // [0, 360)
        if (Math.abs(d - 270.0) < 1e-9) {
            return 1;
        }
        if (Math.abs(d - 90.0) < 1e-9) {
            return -1;
        }
        return 0;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof CpmgTrain t && t.echoes == echoes
                && Double.compare(t.echoSpacingMs, echoSpacingMs) == 0
                && Double.compare(t.excitationFlipDeg, excitationFlipDeg) == 0
                && Double.compare(t.excitationPhaseDeg, excitationPhaseDeg) == 0
                && Arrays.equals(t.refocusFlipsDeg, refocusFlipsDeg)
                && Arrays.equals(t.refocusPhasesDeg, refocusPhasesDeg);
    }

    @Override
    public int hashCode() {
        return 31 * (31 * Integer.hashCode(echoes) + Double.hashCode(echoSpacingMs))
                + Arrays.hashCode(refocusFlipsDeg) + 7 * Arrays.hashCode(refocusPhasesDeg);
    }

    @Override
    public String toString() {
        return "CpmgTrain[echoes=" + echoes + ", esp_ms=" + echoSpacingMs + ", excitation=" + excitationFlipDeg
                + "/" + excitationPhaseDeg + ", refocus=" + Arrays.toString(refocusFlipsDeg) + "]";
    }
}

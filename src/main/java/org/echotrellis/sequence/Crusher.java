package org.echotrellis.sequence;

import org.echotrellis.Checks;

/**
 * The crusher gradient lobes around every refocusing pulse: one rectangular lobe of duration δ right
 * against the pulse on each side, each adding one dephasing order of q cycles per mm. Only diffusion
 * sees their strength (the EPG orders are the same for any q).
 *
 * @param cyclesPerMm q, dephasing of one lobe in cycles per mm (&gt; 0)
 * @param durationMs δ, duration of one lobe in ms (&gt; 0)
 */
public record Crusher(double cyclesPerMm, double durationMs) {

    /**
     * Validates.
     *
     * @param cyclesPerMm q, dephasing of one lobe in cycles per mm (&gt; 0)
     * @param durationMs δ, duration of one lobe in ms (&gt; 0)
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public Crusher {
        Checks.positive("crusher cycles_per_mm", cyclesPerMm, null);
        Checks.positive("crusher duration_ms", durationMs, null);
        Checks.require(Double.isFinite(cyclesPerMm) && Double.isFinite(durationMs), "crusher values must be finite");
    }

    /** @return the wave number of one dephasing order, 2&pi;q, in rad/mm */
    public double waveNumberPerMm() {
        return 2 * Math.PI * cyclesPerMm;
    }
}

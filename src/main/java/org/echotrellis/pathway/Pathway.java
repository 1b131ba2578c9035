package org.echotrellis.pathway;

/**
 * One coherence pathway to an echo: the states it visits (in the notation of {@link StateNotation}),
 * its complex contribution to the echo and the share of the echo it explains.
 *
 * @param states the state sequence, e.g. {@code "Z0 F0 Z-1 F-1"}
 * @param re real part of the contribution (units of M0)
 * @param im imaginary part of the contribution
 * @param share Re(a&middot;conj A)/|A|<sup>2</sup>: the part of echo A this pathway explains (NaN if A vanishes)
 * @param longitudinalIntervals the class m: periods spent as dephased longitudinal magnetization
 */
public record Pathway(String states, double re, double im, double share, int longitudinalIntervals) {
    /** @return |contribution| */
    public double magnitude() {
        return Math.hypot(re, im);
    }
}

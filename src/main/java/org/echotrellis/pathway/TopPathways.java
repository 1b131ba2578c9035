package org.echotrellis.pathway;

import java.util.List;

/**
 * The largest individual pathways of one echo, in decreasing magnitude, and what they leave
 * unexplained.
 *
 * @param echo echo index, 0-based
 * @param echoRe real part of the echo A
 * @param echoIm imaginary part of the echo A
 * @param pathways the pathways found, largest first
 * @param unexplainedRe real part of A minus the listed pathways
 * @param unexplainedIm imaginary part of A minus the listed pathways
 * @param unexplainedShare 1 minus the listed shares: Re(rest&middot;conj A)/|A|<sup>2</sup> (NaN if A vanishes)
 * @param complete true if every pathway above the amplitude threshold was reached within the budget
 */
public record TopPathways(int echo, double echoRe, double echoIm, List<Pathway> pathways,
                          double unexplainedRe, double unexplainedIm, double unexplainedShare,
                          boolean complete) {
    /**
     * Copies the list.
     *
     * @param echo echo index, 0-based
     * @param echoRe real part of the echo A
     * @param echoIm imaginary part of the echo A
     * @param pathways the pathways found, largest first
     * @param unexplainedRe real part of A minus the listed pathways
     * @param unexplainedIm imaginary part of A minus the listed pathways
     * @param unexplainedShare 1 minus the listed shares: Re(rest&middot;conj A)/|A|<sup>2</sup> (NaN if A vanishes)
     * @param complete true if every pathway above the amplitude threshold was reached within the budget
     */
    public TopPathways {
        pathways = List.copyOf(pathways);
    }

    /** @return |A &minus; &Sigma; listed| */
    public double unexplainedMagnitude() {
        return Math.hypot(unexplainedRe, unexplainedIm);
    }
}

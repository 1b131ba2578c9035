package org.echotrellis.fit;

import java.util.Arrays;

/**
 * A slice profile discretised into positions across the slice: per position the factor on the
 * nominal excitation flip, the factor on the nominal refocusing flips, and a weight (receive
 * sensitivity times position spacing; weights sum to 1). The echo model is the weighted sum of
 * EPG trains over positions with the local flips (Lebel &amp; Wilman, Magn Reson Med 64:1005,
 * 2010). Immutable; arrays copied.
 *
 * @param label how the profile was made, e.g. {@code none} or {@code sinc:4}
 * @param excitationFactors factor on the excitation flip per position
 * @param refocusingFactors factor on every refocusing flip per position
 * @param weights weight per position
 */
public record SliceProfile(String label, double[] excitationFactors, double[] refocusingFactors, double[] weights) {

    /** Validates and copies. */
    public SliceProfile {
        if (excitationFactors.length == 0 || excitationFactors.length != refocusingFactors.length
                || weights.length != excitationFactors.length) {
            throw new IllegalArgumentException("slice profile arrays must have one equal, non-zero length");
        }
        excitationFactors = excitationFactors.clone();
        refocusingFactors = refocusingFactors.clone();
        weights = weights.clone();
    }

    /** @return the ideal profile: one position, factors 1 */
    public static SliceProfile none() {
        return new SliceProfile("none", new double[] {1}, new double[] {1}, new double[] {1});
    }

    /** @return number of positions */
    public int positions() {
        return weights.length;
    }

    @Override
    public double[] excitationFactors() {
        return excitationFactors.clone();
    }

    @Override
    public double[] refocusingFactors() {
        return refocusingFactors.clone();
    }

    @Override
    public double[] weights() {
        return weights.clone();
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof SliceProfile s && s.label.equals(label) && Arrays.equals(s.excitationFactors, excitationFactors)
                && Arrays.equals(s.refocusingFactors, refocusingFactors) && Arrays.equals(s.weights, weights);
    }

    @Override
    public int hashCode() {
        return label.hashCode() + 31 * Arrays.hashCode(weights);
    }

    @Override
    public String toString() {
        return "SliceProfile[" + label + ", " + weights.length + " positions]";
    }
}

package org.echotrellis.fit.spectrum;

import org.echotrellis.Checks;
import org.echotrellis.InputException;

/**
 * The refocusing-angle search of the spectrum fit (angle estimation as in Prasloski et al.,
 * "Applications of stimulated echo correction to multicomponent T2 analysis", MRM 67:1803, 2012):
 * {@code count} equally spaced coarse angles bracket the χ² minimum, then a bounded 1-D minimiser
 * refines it continuously. {@code count == 1} means a fixed angle (no search).
 *
 * <p>Our default ({@link #forTrain}): from 0.3 × the nominal refocusing flip α_ref (B1 0.3, the
 * fit's lower B1 bound) to 180° for ideal pulses (α and 360° − α give the same magnitude train) or
 * to 1.4 × α_ref with slice selection (the train is not symmetric about 180° there, METHODS §10),
 * coarse points every {@value #COARSE_STEP_DEG}° at most.
 *
 * @param loDeg smallest angle in degrees, (0, 360]
 * @param hiDeg largest angle in degrees, ≥ loDeg, ≤ 360
 * @param count number of equally spaced coarse angles (1 = fixed angle loDeg, else ≥ 3)
 * @serial exclude
 */
public record RefocusSearch(double loDeg, double hiDeg, int count) implements java.io.Serializable {

    /** Largest spacing of the default coarse angles in degrees. */
    public static final double COARSE_STEP_DEG = 15;

    /**
     * Validates the range.
     *
     * @param loDeg smallest angle in degrees, (0, 360]
     * @param hiDeg largest angle in degrees, ≥ loDeg, ≤ 360
     * @param count number of equally spaced coarse angles (1 = fixed angle loDeg, else ≥ 3)
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public RefocusSearch {
        Checks.inRange("refocus_search_deg LO", loDeg, 1e-6, 360, null);
        Checks.inRange("refocus_search_deg HI", hiDeg, loDeg, 360, null);
        Checks.require(count == 1 || count >= 3,
                "refocus_search_deg COUNT must be ≥ 3 (the minimum is bracketed), got " + count);
        Checks.inRange("refocus_search_deg COUNT", count, 1, 64, null);
        Checks.require(count == 1 || hiDeg > loDeg, "refocus_search_deg needs LO < HI, got "
                + loDeg + ":" + hiDeg);
    }

    /**
     * The default search of a train.
     *
     * @param refDeg nominal refocusing flip α_ref in degrees
     * @param symmetric true for ideal pulses (magnitude trains symmetric about 180°)
     * @return the search
     */
    public static RefocusSearch forTrain(double refDeg, boolean symmetric) {
        double lo = 0.3 * refDeg;
        double hi = symmetric ? Math.max(180, refDeg) : Math.min(360, 1.4 * refDeg);
        hi = Math.min(hi, 360);
        int count = Math.max(3, (int) Math.ceil((hi - lo) / COARSE_STEP_DEG - 1e-9) + 1);
        return new RefocusSearch(lo, hi, Math.min(64, count));
    }

    /**
     * A fixed refocusing angle (no refinement).
     *
     * @param deg the angle in degrees, (0, 180]
     * @return the search of one angle
     */
    public static RefocusSearch fixed(double deg) {
        Checks.inRange("refocus_deg", deg, 1e-6, 360, null);
        return new RefocusSearch(deg, deg, 1);
    }

    /**
     * Parses {@code LO:HI:COUNT}.
     *
     * @param text option value
     * @return the search
     */
    public static RefocusSearch parse(String text) {
        String[] parts = text.split(":", -1);
        Checks.require(parts.length == 3, "refocus_search_deg must be LO:HI:COUNT, got '" + text + "'");
        try {
            return new RefocusSearch(Double.parseDouble(parts[0].trim()), Double.parseDouble(parts[1].trim()),
                    Integer.parseInt(parts[2].trim()));
        } catch (NumberFormatException e) {
            throw new InputException("refocus_search_deg must be LO:HI:COUNT (degrees, degrees, integer), got '"
                    + text + "'", e);
        }
    }

    /** @return true when the angle is fixed */
    public boolean isFixed() {
        return count == 1;
    }

    /**
     * @param k index 0 … count−1
     * @return angle k in degrees
     */
    public double angleDeg(int k) {
        return count == 1 ? loDeg : loDeg + (hiDeg - loDeg) * k / (count - 1);
    }
}

package org.echotrellis.fit.spectrum;

import org.echotrellis.Checks;
import org.echotrellis.InputException;

/**
 * Refocusing angles at which the unregularised fit is evaluated before the χ² minimum is located by
 * interpolation (Prasloski et al., "Applications of stimulated echo correction to multicomponent T2
 * analysis", MRM 67:1803, 2012). {@code count == 1} means a fixed angle (no search).
 *
 * @param loDeg smallest angle in degrees, (0, 180]
 * @param hiDeg largest angle in degrees, ≥ loDeg, ≤ 180
 * @param count number of equally spaced angles (1 = fixed angle loDeg, else ≥ 3)
 */
public record RefocusSearch(double loDeg, double hiDeg, int count) implements java.io.Serializable {

    /** Default search: 8 angles from 50° to 180°. */
    public static final RefocusSearch DEFAULT = new RefocusSearch(50, 180, 8);

    /** Validates the range; angles above 180° are refused because α and 360° − α give identical magnitude trains. */
    public RefocusSearch {
        Checks.inRange("--refocus-search-deg LO", loDeg, 1e-6, 180, null);
        Checks.inRange("--refocus-search-deg HI", hiDeg, loDeg, 180, null);
        Checks.require(count == 1 || count >= 3,
                "--refocus-search-deg COUNT must be ≥ 3 (the minimum is interpolated), got " + count);
        Checks.inRange("--refocus-search-deg COUNT", count, 1, 64, null);
        Checks.require(count == 1 || hiDeg > loDeg, "--refocus-search-deg needs LO < HI, got "
                + loDeg + ":" + hiDeg);
    }

    /**
     * A fixed refocusing angle (no refinement).
     *
     * @param deg the angle in degrees, (0, 180]
     * @return the search of one angle
     */
    public static RefocusSearch fixed(double deg) {
        Checks.inRange("--refocus-deg", deg, 1e-6, 180, null);
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
        Checks.require(parts.length == 3, "--refocus-search-deg must be LO:HI:COUNT, got '" + text + "'");
        try {
            return new RefocusSearch(Double.parseDouble(parts[0].trim()), Double.parseDouble(parts[1].trim()),
                    Integer.parseInt(parts[2].trim()));
        } catch (NumberFormatException e) {
            throw new InputException("--refocus-search-deg must be LO:HI:COUNT (degrees, degrees, integer), got '"
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

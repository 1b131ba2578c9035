package org.echotrellis.design;

import java.util.List;

import org.echotrellis.Checks;

/**
 * SAR limits of the IEC 60601-2-33 operating modes, shown as context next to a design's
 * estimates. Whole-body and head values: J Med Radiat Sci 69:250 (2022), Table 3; partial-body
 * formulas, 6-minute averaging and the 10-second short-term rule: IEC 60601-2-33 ed. 3 (2010)
 * with amendments (from memory).
 *
 * <p>These are the regulator's limits for the scanner, which enforces them with its own SAR
 * monitor; echotrellis only estimates. Estimates only: the scanner's own SAR monitor, local
 * regulations and the responsible MR physicist decide.
 */
public final class IecLimits {
    /** The caution shown with every RF exposure figure. */
    public static final String CAUTION = "Estimates for protocol planning only, not a medical device: the scanner's "
            + "own SAR monitor, local regulations and the responsible MR physicist decide.";

    /**
     * One operating mode.
     *
     * @param mode mode name
     * @param wholeBodyWPerKg whole-body SAR limit (W/kg, 6-min average)
     * @param headWPerKg head SAR limit (W/kg)
     * @param partialBodyRule partial-body limit as text
     * @param note supervision required
     */
    record Mode(String mode, double wholeBodyWPerKg, double headWPerKg, String partialBodyRule, String note) { }

    private IecLimits() { }

    /** @return the normal and first-level controlled operating modes */
    static List<Mode> modes() {
        return List.of(
                new Mode("normal", 2.0, 3.2, "10 - 8·r W/kg (2 to 10)", "no physiological stress expected"),
                new Mode("first level controlled", 4.0, 3.2, "10 - 6·r W/kg (4 to 10)", "medical supervision"));
    }

    /**
     * Partial-body SAR limit for an exposed-mass ratio (IEC 60601-2-33 ed. 3, from memory).
     *
     * @param firstLevel true for the first-level controlled mode, false for normal
     * @param exposedMassRatio r = exposed mass / patient mass, within [0, 1]
     * @return the limit in W/kg
     */
    public static double partialBodyLimitWPerKg(boolean firstLevel, double exposedMassRatio) {
        Checks.inRange("exposed mass ratio", exposedMassRatio, 0, 1, null);
        double v = firstLevel ? 10 - 6 * exposedMassRatio : 10 - 8 * exposedMassRatio;
        return Math.max(firstLevel ? 4 : 2, Math.min(10, v));
    }

    /** @return markdown/plain table of the modes with its sources and the caution */
    public static String table() {
        StringBuilder sb = new StringBuilder();
        sb.append(String.format(java.util.Locale.ROOT, "%-24s %-12s %-10s %-37s %s%n", "IEC 60601-2-33 mode",
                "whole body", "head", "partial body (r = exposed/total mass)", "note"));
        for (Mode m : modes()) {
            sb.append(String.format(java.util.Locale.ROOT, "%-24s %-12s %-10s %-37s %s%n", m.mode(),
                    m.wholeBodyWPerKg() + " W/kg", m.headWPerKg() + " W/kg", m.partialBodyRule(), m.note()));
        }
        sb.append("Averaging over 6 min; over any 10 s at most twice these. Second level: explicit ethical approval.\n");
        sb.append(CAUTION).append('\n');
        return sb.toString();
    }
}

package org.echotrellis.design;

import org.echotrellis.Checks;

/**
 * A reference protocol whose SAR the scanner reported, for scaling an absolute estimate: for the
 * same coil, patient and landmark, SAR scales with the mean RF power Σ∫B1²dt / TR (common
 * practice). Estimates only: the scanner's own SAR monitor, local regulations and the
 * responsible MR physicist decide.
 *
 * @param sarWPerKg SAR reported by the scanner for the reference, in W/kg
 * @param powerUt2 mean RF power measure Σ∫B1²dt / TR of the reference, in µT²
 */
public record SarReference(double sarWPerKg, double powerUt2) {
    /**
     * Validates both values.
     *
     * @param sarWPerKg SAR reported by the scanner for the reference, in W/kg
     * @param powerUt2 mean RF power measure Σ∫B1²dt / TR of the reference, in µT²
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public SarReference {
        Checks.positive("reference_sar_w_per_kg", sarWPerKg, null);
        Checks.positive("reference RF power", powerUt2, null);
    }

    /**
     * @param powerUt2 mean RF power measure of the new schedule
     * @return scaled SAR in W/kg
     */
    public double scale(double powerUt2) {
        return sarWPerKg * powerUt2 / this.powerUt2;
    }
}

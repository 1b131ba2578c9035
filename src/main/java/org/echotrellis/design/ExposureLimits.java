package org.echotrellis.design;

import org.echotrellis.Checks;

/**
 * RF exposure constraints of a design: relative SAR budget (fraction of the all-180° train) and
 * an optional B1+rms limit. These are planning limits chosen by the user, not regulatory ones.
 *
 * @param sarBudget largest allowed relative SAR, within (0, 1]
 * @param b1rmsLimitUt largest allowed B1+rms in µT, or +Infinity for none
 */
public record ExposureLimits(double sarBudget, double b1rmsLimitUt) {
    /**
     * Validates both limits.
     *
     * @param sarBudget largest allowed relative SAR, within (0, 1]
     * @param b1rmsLimitUt largest allowed B1+rms in µT, or +Infinity for none
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public ExposureLimits {
        Checks.require(sarBudget > 0 && sarBudget <= 1, "sar_budget must be within (0, 1] "
                + "(a fraction of the SAR of the all-180° train), got " + sarBudget);
        Checks.positiveOrInfinite("b1rms_limit_ut", b1rmsLimitUt, null);
    }

    /** @return true when a B1+rms limit is set */
    public boolean hasB1rmsLimit() {
        return b1rmsLimitUt != Double.POSITIVE_INFINITY;
    }

    /**
     * @param rf pulse model (must have a TR when a B1+rms limit is set)
     * @param excitationFlipDeg nominal excitation flip
     * @param flipsDeg nominal refocusing flips (not modified)
     * @return true when both limits hold
     */
    public boolean allows(RfExposure rf, double excitationFlipDeg, double[] flipsDeg) {
        if (RfExposure.relativeSar(flipsDeg) > sarBudget * (1 + 1e-12)) {
            return false;
        }
        return !hasB1rmsLimit() || rf.b1rmsUt(excitationFlipDeg, flipsDeg) <= b1rmsLimitUt * (1 + 1e-12);
    }
}

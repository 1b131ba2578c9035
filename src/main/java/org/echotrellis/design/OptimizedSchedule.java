package org.echotrellis.design;

/**
 * Result of a budgeted optimisation, next to the best constant-flip schedule in the same budget.
 * Arrays are copied on the way in and out.
 *
 * @param flipsDeg optimised nominal flips, one per echo (within the limits)
 * @param knotsDeg knot flips before the feasibility scaling
 * @param objective objective value of {@code flipsDeg}
 * @param constantFlipDeg best constant flip within the limits
 * @param constantObjective objective value of the constant schedule
 * @param evaluations objective evaluations used by the optimiser
 */
record OptimizedSchedule(double[] flipsDeg, double[] knotsDeg, double objective, double constantFlipDeg,
                                double constantObjective, int evaluations) {
    /**
     * Copies the arrays.
     *
     * @param flipsDeg optimised nominal flips, one per echo (within the limits)
     * @param knotsDeg knot flips before the feasibility scaling
     * @param objective objective value of {@code flipsDeg}
     * @param constantFlipDeg best constant flip within the limits
     * @param constantObjective objective value of the constant schedule
     * @param evaluations objective evaluations used by the optimiser
     */
    public OptimizedSchedule {
        flipsDeg = flipsDeg.clone();
        knotsDeg = knotsDeg.clone();
    }

    @Override
    public double[] flipsDeg() {
        return flipsDeg.clone();
    }

    @Override
    public double[] knotsDeg() {
        return knotsDeg.clone();
    }

    /** @return objective gain over the best constant schedule (ratio; NaN if the constant gives 0) */
    public double gainOverConstant() {
        return constantObjective == 0 ? Double.NaN : objective / constantObjective;
    }
}

package org.echotrellis.design;

/**
 * Result of a prescribed-signal inversion. Arrays are copied on the way in and out.
 *
 * @param flipsDeg nominal refocusing flip per echo in degrees
 * @param predicted EPG echo of the design tissue per echo (signed, CPMG frame)
 * @param effectiveTarget the target each echo was inverted to (the prescription, blended over
 *                        the start-up; for the Alsop first echo the echo that pulse gives)
 * @param startupEchoes number of start-up echoes
 * @param firstUnreachableEcho first echo (1-based) whose target no flip in the bounds reaches,
 *                             or 0 when all are reached
 * @param unreachableEchoes number of echoes that miss their target
 */
record Inversion(double[] flipsDeg, double[] predicted, double[] effectiveTarget, int startupEchoes,
                        int firstUnreachableEcho, int unreachableEchoes) {
    /**
     * Copies the arrays.
     *
     * @param flipsDeg nominal refocusing flip per echo in degrees
     * @param predicted EPG echo of the design tissue per echo (signed, CPMG frame)
     * @param effectiveTarget the target each echo was inverted to (the prescription, blended over
     *                        the start-up; for the Alsop first echo the echo that pulse gives)
     * @param startupEchoes number of start-up echoes
     * @param firstUnreachableEcho first echo (1-based) whose target no flip in the bounds reaches,
     *                             or 0 when all are reached
     * @param unreachableEchoes number of echoes that miss their target
     */
    public Inversion {
        flipsDeg = flipsDeg.clone();
        predicted = predicted.clone();
        effectiveTarget = effectiveTarget.clone();
    }

    @Override
    public double[] flipsDeg() {
        return flipsDeg.clone();
    }

    @Override
    public double[] predicted() {
        return predicted.clone();
    }

    @Override
    public double[] effectiveTarget() {
        return effectiveTarget.clone();
    }

    /** @return true when every echo meets its target */
    public boolean reachable() {
        return firstUnreachableEcho == 0;
    }

    /** @return largest |predicted − target| over the echoes after the start-up */
    public double maxErrorAfterStartup() {
        double m = 0;
        for (int i = startupEchoes; i < predicted.length; i++) {
            m = Math.max(m, Math.abs(predicted[i] - effectiveTarget[i]));
        }
        return m;
    }
}

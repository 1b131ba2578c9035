package org.echotrellis.io;

/**
 * Per-voxel outcome of a volume job, written as the {@code status} map (uint8). The codes are
 * stable and documented in the README:
 * <ul>
 *   <li>0 {@link #OUTSIDE_MASK}: not processed (mask value 0);</li>
 *   <li>1 {@link #OK}: fitted, all parameters inside their bounds;</li>
 *   <li>2 {@link #HIT_BOUND}: fitted, a parameter ended on a bound (treat the value as a limit);</li>
 *   <li>3 {@link #LOW_SIGNAL}: fitted, but the signal is too weak relative to the noise to trust;</li>
 *   <li>4 {@link #INVALID_INPUT}: not fitted: NaN/Inf echo, all echoes ≤ 0, or an invalid B1 value
 *       (not finite, ≤ 0, or outside the fit's B1 bounds);</li>
 *   <li>5 {@link #NOT_CONVERGED}: the solver stopped at its iteration limit or failed (NaN outputs).</li>
 * </ul>
 */
public enum VoxelStatus {
    /** 0: outside the mask, not processed */
    OUTSIDE_MASK("outside_mask"),
    /** 1: fitted within bounds */
    OK("ok"),
    /** 2: a parameter is on a bound */
    HIT_BOUND("hit_bound"),
    /** 3: signal too weak to trust */
    LOW_SIGNAL("low_signal"),
    /** 4: input values unusable, not fitted */
    INVALID_INPUT("invalid_input"),
    /** 5: iteration limit reached, or the solver failed */
    NOT_CONVERGED("not_converged");

    private final String label;

    VoxelStatus(String label) {
        this.label = label;
    }

    /** @return the code stored in the status map */
    public int code() {
        return ordinal();
    }

    /** @return the snake_case label used in JSON and tables */
    public String label() {
        return label;
    }

    /** @return true if the voxel carries fitted values (OK, HIT_BOUND, LOW_SIGNAL, NOT_CONVERGED) */
    public boolean fitted() {
        return this != OUTSIDE_MASK && this != INVALID_INPUT;
    }

    /**
     * @param code a status code
     * @return the status
     */
    public static VoxelStatus ofCode(int code) {
        return values()[code];
    }

    /** Largest signal magnitude accepted: beyond it squares overflow and a fit is meaningless. */
    public static final double MAX_SIGNAL = 1e100;

    /**
     * @param v a signal value
     * @return whether it can be fitted: finite and within ±{@link #MAX_SIGNAL} (else the voxel or
     *         decay is {@link #INVALID_INPUT})
     */
    public static boolean usable(double v) {
        return Math.abs(v) <= MAX_SIGNAL;
    }
}

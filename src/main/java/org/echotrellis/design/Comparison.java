package org.echotrellis.design;

import org.echotrellis.sequence.Tissue;

/**
 * Predicted echoes of one tissue under a designed schedule, next to the same tissue under the
 * all-180° train. Arrays are copied on the way in and out.
 *
 * @param name tissue name
 * @param t1Ms T1 in ms
 * @param t2Ms T2 in ms
 * @param echoes |echo| per echo under the schedule
 * @param echoes180 |echo| per echo under all-180° refocusing
 * @param echoModel {@link #IDEAL} or {@link #ACQUISITION}: which model gave the echoes
 */
public record Comparison(String name, double t1Ms, double t2Ms, double[] echoes, double[] echoes180, String echoModel) {
    /** Echoes of the ideal-pulse CPMG model the schedule is designed on. */
    public static final String IDEAL = "ideal_pulses";
    /** Echoes of the protocol's acquisition model (slice profile, TR, diffusion). */
    public static final String ACQUISITION = "acquisition";

    /**
     * Copies the arrays.
     *
     * @param name tissue name
     * @param t1Ms T1 in ms
     * @param t2Ms T2 in ms
     * @param echoes |echo| per echo under the schedule
     * @param echoes180 |echo| per echo under all-180° refocusing
     * @param echoModel {@link #IDEAL} or {@link #ACQUISITION}: which model gave the echoes
     */
    public Comparison {
        echoes = echoes.clone();
        echoes180 = echoes180.clone();
    }

    /** @return |echo| per echo under the schedule (a copy) */
    @Override
    public double[] echoes() {
        return echoes.clone();
    }

    /** @return |echo| per echo under all-180° refocusing (a copy) */
    @Override
    public double[] echoes180() {
        return echoes180.clone();
    }

    /**
     * Simulates a tissue under a schedule and under all-180° refocusing.
     *
     * @param problem the train (its tissue is replaced)
     * @param name tissue name
     * @param t1Ms T1
     * @param t2Ms T2
     * @param flipsDeg nominal refocusing flips (not modified)
     * @return the comparison
     */
    public static Comparison of(DesignProblem problem, String name, double t1Ms, double t2Ms, double[] flipsDeg) {
        int n = problem.echoes();
        CpmgStepper s = new CpmgStepper();
        double[] e = new double[n];
        double[] full = new double[n];
        double[] f180 = new double[n];
        java.util.Arrays.fill(f180, 180);
        s.run(n, problem.echoSpacingMs(), t1Ms, t2Ms, problem.b1Scale(), problem.excitationFlipDeg(), flipsDeg, e);
        s.run(n, problem.echoSpacingMs(), t1Ms, t2Ms, problem.b1Scale(), problem.excitationFlipDeg(), f180, full);
        for (int i = 0; i < n; i++) {
            e[i] = Math.abs(e[i]);
            full[i] = Math.abs(full[i]);
        }
        return new Comparison(name, t1Ms, t2Ms, e, full, IDEAL);
    }

    /**
     * The same comparison through the protocol's acquisition model.
     *
     * @param acquired the acquisition model of the protocol
     * @param tissue the tissue (with its diffusivity)
     * @param flipsDeg nominal refocusing flips (not modified)
     * @return the comparison
     */
    public static Comparison acquired(AcquiredEchoes acquired, Tissue tissue, double[] flipsDeg) {
        double[] f180 = new double[flipsDeg.length];
        java.util.Arrays.fill(f180, 180);
        return new Comparison(tissue.name(), tissue.t1Ms(), tissue.t2Ms(), acquired.magnitudes(flipsDeg, tissue),
                acquired.magnitudes(f180, tissue), ACQUISITION);
    }
}

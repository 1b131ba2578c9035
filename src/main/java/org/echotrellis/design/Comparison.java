package org.echotrellis.design;

/**
 * Predicted echoes of one tissue under a designed schedule, next to the same tissue under the
 * all-180° train. Arrays are copied on the way in and out.
 *
 * @param name tissue name
 * @param t1Ms T1 in ms
 * @param t2Ms T2 in ms
 * @param echoes |echo| per echo under the schedule
 * @param echoes180 |echo| per echo under all-180° refocusing
 */
public record Comparison(String name, double t1Ms, double t2Ms, double[] echoes, double[] echoes180) {
    /** Copies the arrays. */
    public Comparison {
        echoes = echoes.clone();
        echoes180 = echoes180.clone();
    }

    @Override
    public double[] echoes() {
        return echoes.clone();
    }

    @Override
    public double[] echoes180() {
        return echoes180.clone();
    }

    /**
     * Simulates a tissue under a schedule and under all-180° refocusing.
     *
     * @param problem the train (its tissue is replaced)
     * @param name tissue name @param t1Ms T1 @param t2Ms T2
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
        return new Comparison(name, t1Ms, t2Ms, e, full);
    }
}

package org.echotrellis.design;

/**
 * Evaluates an {@link Objective} for a schedule with the real CPMG stepper. One instance per
 * thread; buffers are reused (no allocation per evaluation once sized).
 */
public final class ObjectiveEvaluator {
    private final CpmgStepper stepper = new CpmgStepper();
    private double[] echoes = new double[0];
    private final ImageObjectives image = new ImageObjectives();

    /** Creates an evaluator with its own workspace. */
    public ObjectiveEvaluator() { }

    /**
     * @param objective what to compute
     * @param problem train and design tissue
     * @param flipsDeg nominal refocusing flips, one per echo (not modified)
     * @return the objective value (larger is better)
     */
    public double value(Objective objective, DesignProblem problem, double[] flipsDeg) {
        if (objective instanceof Objective.SignalAt s) {
            simulate(problem, problem.t1Ms(), problem.t2Ms(), flipsDeg, s.echo());
            return Math.abs(echoes[s.echo() - 1]);
        }
        if (objective instanceof Objective.MinOver m) {
            simulate(problem, problem.t1Ms(), problem.t2Ms(), flipsDeg, m.to());
            double min = Double.POSITIVE_INFINITY;
            for (int i = m.from() - 1; i < m.to(); i++) {
                min = Math.min(min, Math.abs(echoes[i]));
            }
            return min;
        }
        if (objective instanceof Objective.PsfWidth || objective instanceof Objective.ContrastAtWidth) {
            return image.value(objective, problem, flipsDeg);
        }
        Objective.Contrast c = (Objective.Contrast) objective;
        simulate(problem, c.t1A(), c.t2A(), flipsDeg, c.echo());
        double a = Math.abs(echoes[c.echo() - 1]);
        simulate(problem, c.t1B(), c.t2B(), flipsDeg, c.echo());
        double b = Math.abs(echoes[c.echo() - 1]);
        return Math.abs(a - b);
    }

    /** Simulates the first {@code upTo} echoes (pruning for that length) into the buffer. */
    private void simulate(DesignProblem p, double t1, double t2, double[] flipsDeg, int upTo) {
        if (echoes.length < upTo) {
            echoes = new double[upTo];
        }
        stepper.run(upTo, p.echoSpacingMs(), t1, t2, p.b1Scale(), p.excitationFlipDeg(), flipsDeg, echoes);
    }
}

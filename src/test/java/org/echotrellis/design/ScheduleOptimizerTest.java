package org.echotrellis.design;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

class ScheduleOptimizerTest {
    // white matter at 3 T, T1 1084 ms, T2 69 ms (Stanisz et al., MRM 54:507, 2005; from memory)
    private static final DesignProblem FSE80 = new DesignProblem("white matter", 80, 4.0, 90, 1084, 69, 1, 20, 180);
    private static final RfExposure RF = new RfExposure(PulseShape.sinc(4), 2.0, PulseShape.sinc(4), 2.0, 3000, 10);

    @Test
    void signalAtEffectiveEchoBeatsBestConstantWithinBudget() {
        ExposureLimits limits = new ExposureLimits(0.5, Double.POSITIVE_INFINITY);
        Objective o = new Objective.SignalAt(20);
        OptimizedSchedule r = new ScheduleOptimizer().optimize(FSE80, o, limits, RF, 6, 2000);
        double[] flips = r.flipsDeg();
        // limits met (budget definition Σα²/(N·180²), METHODS §6)
        assertTrue(RfExposure.relativeSar(flips) <= 0.5 * (1 + 1e-12), "relative SAR " + RfExposure.relativeSar(flips));
        // best constant in the budget is at most 180·√0.5 = 127.28°
        assertTrue(r.constantFlipDeg() <= 180 * Math.sqrt(0.5) + 1e-9);
        assertTrue(r.objective() >= r.constantObjective(), r.objective() + " vs " + r.constantObjective());
        // a variable schedule spends RF where it pays (TRAPS, Hennig et al. MRM 49:527, 2003): expect a clear gain
        assertTrue(r.objective() > 1.05 * r.constantObjective(), r.objective() + " vs " + r.constantObjective());
        assertEquals(r.objective(), new ObjectiveEvaluator().value(o, FSE80, flips), 1e-12);
    }
}

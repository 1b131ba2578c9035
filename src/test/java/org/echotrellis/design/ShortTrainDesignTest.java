package org.echotrellis.design;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.sequence.PulseShape;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/** Trains no longer than the start-up: the prescription must still be honoured where it can be. */
class ShortTrainDesignTest {

    @ParameterizedTest
    @ValueSource(ints = {1, 2, 3})
    void rampStartUpLeavesTheLastEchoToThePrescription(int echoes) {
        // like the Alsop start-up (first pulse only, never the whole train), the blended ramp must
        // leave at least the last echo on the prescribed target; 0.5 is reachable at every echo
        // of these short trains (T2 69 ms, ESP 10 ms: the 180° echoes are ≥ 0.74)
        DesignProblem p = new DesignProblem("wm", echoes, 10, 90, 1084, 69, 1.0, 10, 180);
        Inversion inv = new FlipInverter().invert(p, new EchoTarget.Constant(0.5).amplitudes(p), new Startup.Ramp(3));
        assertTrue(inv.startupEchoes() < echoes, "start-up echoes " + inv.startupEchoes());
        assertEquals(0.5, inv.effectiveTarget()[echoes - 1], 0.0);
        assertEquals(0, inv.firstUnreachableEcho());
        // the predicted last echo against an independent EPG simulation of the schedule (Hennig 1988)
        double[] ref = new CpmgEngine(1).echoes(CpmgTrain.of(echoes, 10, 90, inv.flipsDeg()), 1084, 69, 1.0);
        assertEquals(0.5, Math.abs(ref[echoes - 1]), 1e-9);
    }

    @ParameterizedTest
    @ValueSource(ints = {1, 2})
    void budgetedDesignWorksForTheShortestTrains(int echoes) {
        // one echo: the schedule is one flip, so the optimum is the best constant flip; relative SAR
        // α²/180² ≤ 0.5 caps it at 180°·√0.5 = 127.28° (METHODS §6), the largest signal within the budget
        DesignProblem p = new DesignProblem("wm", echoes, 10, 90, 1084, 69, 1.0, 10, 180);
        RfExposure rf = new RfExposure(PulseShape.rect(), 1.0, PulseShape.rect(), 1.0, Double.NaN, 1);
        OptimizedSchedule r = new ScheduleOptimizer().optimize(p, new Objective.SignalAt(echoes),
                new ExposureLimits(0.5, Double.POSITIVE_INFINITY), rf, 6, 500);
        assertEquals(echoes, r.flipsDeg().length);
        assertTrue(RfExposure.relativeSar(r.flipsDeg()) <= 0.5 * (1 + 1e-12));
        assertTrue(r.objective() >= r.constantObjective() - 1e-12);
        if (echoes == 1) {
            assertEquals(180 * Math.sqrt(0.5), r.flipsDeg()[0], 1e-6);
        }
    }
}

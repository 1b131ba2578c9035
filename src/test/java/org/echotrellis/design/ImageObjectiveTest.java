package org.echotrellis.design;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.List;
import org.echotrellis.InputException;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.image.FseImaging;
import org.echotrellis.image.KSpaceOrdering;
import org.echotrellis.image.TissueImage;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.PulseShape;
import org.echotrellis.sequence.Tissue;
import org.junit.jupiter.api.Test;

/** Design objectives that read image figures. */
class ImageObjectiveTest {
    private static final DesignProblem P = new DesignProblem("wm", 16, 6, 90, 1084, 69, 1.0, 10, 180);

    private static double[] all(double v) {
        double[] a = new double[16];
        java.util.Arrays.fill(a, v);
        return a;
    }

    private static double[] times(String name) {
        return switch (name) {
            case "csf" -> new double[] {4300, 1900};
            case "free" -> new double[] {Double.POSITIVE_INFINITY, Double.POSITIVE_INFINITY};
            default -> throw new InputException("unknown tissue " + name);
        };
    }

    @Test
    void parsesAndRefuses() {
        Objective o = Objective.parse("psf:8:64", P, ImageObjectiveTest::times);
        assertEquals("psf:8:64:wm:0.0:0.05", o.spec());
        assertEquals(16, o.lastEcho());
        Objective c = Objective.parse("cnr:8:64:1.5:csf", P, ImageObjectiveTest::times);
        assertEquals("cnr:8:64:1.5:csf:wm", c.spec());
        assertThrows(InputException.class, () -> Objective.parse("psf:8:60", P, ImageObjectiveTest::times));
        assertThrows(InputException.class, () -> Objective.parse("psf:17:64", P, ImageObjectiveTest::times));
        assertThrows(InputException.class, () -> Objective.parse("cnr:8:64:0.5:csf", P, ImageObjectiveTest::times));
        assertThrows(InputException.class, () -> Objective.parse("psf:8:64:nope", P, ImageObjectiveTest::times));
    }

    @Test
    void idealTrainWithoutRelaxationScoresTheDelta() {
        // ideal 180° CPMG, T2 = ∞: flat weights, discrete-delta PSF of FWHM 1 px → 1/FWHM = 1 (common practice)
        Objective o = Objective.parse("psf:8:64:free", P, ImageObjectiveTest::times);
        assertEquals(1, new ObjectiveEvaluator().value(o, P, all(180)), 1e-9);
    }

    @Test
    void valuesAgreeWithTheImageJob() {
        // the evaluator (CPMG stepper + tabulated PSF kernel) against the image job (protocol simulator + transform)
        double[] flips = new double[16];
        for (int i = 0; i < 16; i++) {
            flips[i] = 60 + 7 * i;
        }
        Protocol p = Protocol.ofTrain("t", "", new Tissue("wm", 1084, 69), 1.0, CpmgTrain.of(16, 6, 90, flips), "test");
        List<TissueImage> ti = FseImaging.analyse(p, KSpaceOrdering.linear(64, 16, 8),
                List.of(new Tissue("wm", 1084, 69), new Tissue("csf", 4300, 1900)), Double.NaN).tissues();
        ObjectiveEvaluator ev = new ObjectiveEvaluator();
        double sharp = ev.value(new Objective.PsfWidth(8, 64, 16, "wm", 1084, 69, 0, 1), P, flips);
        assertEquals(1 / ti.get(0).figures().fwhmPx(), sharp, 1e-9);
        double widest = Math.max(ti.get(0).figures().fwhmPx(), ti.get(1).figures().fwhmPx());
        Objective.ContrastAtWidth ok = new Objective.ContrastAtWidth(8, 64, 16, widest + 0.01, "csf", 4300, 1900,
                "wm", 1084, 69);
        assertEquals(Math.abs(ti.get(0).centerSignal() - ti.get(1).centerSignal()), ev.value(ok, P, flips), 1e-9);
        Objective.ContrastAtWidth tight = new Objective.ContrastAtWidth(8, 64, 16, 1, "csf", 4300, 1900, "wm", 1084, 69);
        assertEquals(-(widest - 1), ev.value(tight, P, flips), 1e-9);
        // a signal floor above the centre weight scores below zero
        Objective.PsfWidth floor = new Objective.PsfWidth(8, 64, 16, "wm", 1084, 69, 0.99, 1);
        assertEquals(ti.get(0).centerSignal() / 0.99 - 1, ev.value(floor, P, flips), 1e-9);
    }

    @Test
    void optimisedScheduleBeatsTheBestConstantWithinTheBudget() {
        Objective o = new Objective.PsfWidth(8, 64, 16, "wm", 1084, 69, 0.2, 0.05);
        RfExposure rf = new RfExposure(PulseShape.sinc(4), 2.0, PulseShape.sinc(4), 2.0, 4000, 10);
        ExposureLimits limits = new ExposureLimits(0.5, Double.POSITIVE_INFINITY);
        OptimizedSchedule r = new ScheduleOptimizer().optimize(P, o, limits, rf, 4, 300);
        assertTrue(r.objective() >= r.constantObjective(), r.objective() + " vs " + r.constantObjective());
        assertTrue(RfExposure.relativeSar(r.flipsDeg()) <= 0.5 + 1e-9);
        assertEquals(r.objective(), new ObjectiveEvaluator().value(o, P, r.flipsDeg()), 1e-12);
        assertTrue(r.objective() > 0, "the signal floor and side-lobe limit are met");
    }
}

package org.echotrellis.sequence;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.util.ArrayList;
import java.util.List;
import java.util.Optional;
import org.echotrellis.epg.GeneralEngine;
import org.junit.jupiter.api.Test;

class ProtocolCpmgDetectionTest {

    private static Protocol train(double halfMs, int step) {
        List<Event> ev = new ArrayList<>();
        ev.add(new Event.Rf(90, 90));
        for (double flip : new double[] {160, 130, 170, 120}) {
            ev.add(new Event.Interval(halfMs, step));
            ev.add(new Event.Rf(flip, 0));
            ev.add(new Event.Interval(halfMs, step));
            ev.add(new Event.Echo(""));
        }
        return new Protocol("t", "", new Tissue("", 900, 60), 0.9, ev, Optional.empty(), "api");
    }

    /** Zero-length intervals (allowed by the engine) leave the fast path, instead of failing its ESP > 0 check. */
    @Test
    void zeroDurationPatternRunsOnTheGeneralEngine() {
        Protocol p = train(0, 1);
        assertTrue(p.cpmg().isEmpty());
        EchoTrain t = Simulator.simulate(p);
        double[] re = new double[4];
        double[] im = new double[4];
        new GeneralEngine(1).run(p.program(), new double[] {900}, new double[] {60}, new double[] {0.9}, 1, re, im);
        for (int i = 0; i < 4; i++) {
            assertEquals(re[i], t.re()[i], 0);
            assertEquals(im[i], t.im()[i], 0);
        }
    }

    /** Any one non-zero dephasing step per half spacing is CPMG timing (only |k| scales); the fast path agrees. */
    @Test
    void uniformStepsOfAnySignUseTheFastPath() {
        for (int step : new int[] {1, -1, 2, -3}) {
            Protocol p = train(4.5, step);
            assertTrue(p.cpmg().isPresent(), "step " + step);
            EchoTrain fast = Simulator.simulate(p);
            double[] re = new double[4];
            double[] im = new double[4];
            new GeneralEngine(1).run(p.program(), new double[] {900}, new double[] {60}, new double[] {0.9}, 1, re, im);
            for (int i = 0; i < 4; i++) {
                assertEquals(re[i], fast.re()[i], 1e-12, "step " + step + " echo " + (i + 1));
                assertEquals(im[i], fast.im()[i], 1e-12, "step " + step + " echo " + (i + 1));
            }
        }
    }
}

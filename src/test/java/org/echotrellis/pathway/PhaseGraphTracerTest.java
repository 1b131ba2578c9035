package org.echotrellis.pathway;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import org.junit.jupiter.api.Test;

/** Phase-graph data: which states are drawn, and where. */
class PhaseGraphTracerTest {
    private static final double INF = Double.POSITIVE_INFINITY;

    /** 60-80-100 degree pulses at 0, 4, 14 ms, one order per ms; echoes at 8, 18, 20, 24, 28 ms. */
    private static Schedule threePulse() {
        return new TestTrains().rf(60, 90).interval(4, 4).rf(80, 0).interval(4, 4).echo().interval(6, 6).rf(100, 0)
                .interval(4, 4).echo().interval(2, 2).echo().interval(4, 4).echo().interval(4, 4).echo().schedule();
    }

    @Test
    void threePulseGraphStoresTheFirstSpinEchoPathAsZ4() {
        PhaseGraph g = PhaseGraphTracer.trace(threePulse(), INF, INF, 1.0, 1e-3, 1000, INF);
        assertEquals(3, g.pulses().size());
        assertEquals(5, g.echoes().size());
        double storedFrom = INF;
        double storedTo = 0;
        for (PhaseGraph.Segment s : g.segments()) {
            assertTrue(s.magnitude() >= 1e-3);
            assertTrue(s.endMs() <= 28);
            if (s.longitudinal()) {
                // the only longitudinal state that reaches an echo is Z4, stored at 4 ms and recalled at 14 ms
                assertEquals(4, s.startOrder());
                storedFrom = Math.min(storedFrom, s.startMs());
                storedTo = Math.max(storedTo, s.endMs());
            } else {
                assertEquals(s.startOrder() + (int) Math.round(s.endMs() - s.startMs()), s.endOrder());
            }
        }
        assertEquals(4, storedFrom, 0);
        assertEquals(14, storedTo, 0);
        // stimulated echo amplitude 1/2 sin60 sin80 sin100 (Hahn 1950)
        double ste = 0.5 * Math.sin(Math.toRadians(60)) * Math.pow(Math.sin(Math.toRadians(80)), 2);
        assertEquals(ste, g.echoes().get(1).magnitude(), 1e-12);
    }

    @Test
    void thresholdOrderAndTimeLimitsThinTheGraph() {
        Schedule s = TestTrains.cpmg(32, 10, 120).schedule();
        PhaseGraph all = PhaseGraphTracer.trace(s, 1000, 70, 1.0, 0, 1000, INF);
        PhaseGraph thin = PhaseGraphTracer.trace(s, 1000, 70, 1.0, 1e-2, 4, 100);
        assertTrue(thin.segments().size() < all.segments().size() / 4);
        for (PhaseGraph.Segment seg : thin.segments()) {
            assertTrue(seg.magnitude() >= 1e-2);
            assertTrue(Math.abs(seg.startOrder()) <= 4 && Math.abs(seg.endOrder()) <= 4);
            assertTrue(seg.startMs() < 100);
        }
        assertEquals(10, thin.echoes().size());
        assertFalse(all.segments().isEmpty());
    }
}

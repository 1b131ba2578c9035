package org.echotrellis.pathway;

import java.util.ArrayList;
import java.util.BitSet;
import java.util.List;
import org.echotrellis.Checks;

/**
 * Records the configuration states of a schedule for a phase-graph diagram: a transverse state
 * F<sub>k</sub> moves from order k to k + d over an interval with dephasing step d, a longitudinal state
 * Z<sub>k</sub> keeps its order. The states come from the {@link ClassTracker} (all classes summed), so
 * only states that can still reach an echo are present.
 */
final class PhaseGraphTracer {
    private PhaseGraphTracer() { }

    /**
     * @param s the event list
     * @param t1Ms T1 in ms (+Infinity allowed)
     * @param t2Ms T2 in ms (+Infinity allowed)
     * @param b1 flip-angle scale
     * @param threshold leave out states with |state| below this (units of M0, in [0, 1])
     * @param maxOrder leave out states with |order| above this (&ge; 0)
     * @param untilMs leave out everything after this time (ms, &gt; 0; +Infinity for all)
     * @return the diagram data
     */
    public static PhaseGraph trace(Schedule s, double t1Ms, double t2Ms, double b1, double threshold, int maxOrder,
                                   double untilMs) {
        Checks.inRange("threshold", threshold, 0, 1, null);
        Checks.inRange("max_order", maxOrder, 0, 100_000, null);
        Checks.positiveOrInfinite("until_ms", untilMs, null);
        double[] starts = new double[s.op.length];
        List<PhaseGraph.Pulse> pulses = new ArrayList<>();
        List<PhaseGraph.EchoMark> echoes = new ArrayList<>();
        List<Integer> intervalOps = new ArrayList<>();
        double t = 0;
        for (int i = 0; i < s.op.length; i++) {
            starts[i] = t;
            if (s.op[i] == Schedule.INTERVAL) {
                intervalOps.add(i);
                t += s.value[i];
            } else if (s.op[i] == Schedule.RF && t <= untilMs) {
                pulses.add(new PhaseGraph.Pulse(t, Math.toDegrees(s.value[i] * b1), Math.toDegrees(s.second[i])));
            }
        }
        java.util.Map<Integer, BitSet> reach = reachability(s);
        int kk = s.maxOrder;
        List<PhaseGraph.Segment> segments = new ArrayList<>();
        ClassTracker tracker = new ClassTracker();
        int[] next = {0};
        tracker.listen((tr, window) -> {
            int op = intervalOps.get(next[0]++);
            double t0 = starts[op];
            if (t0 >= untilMs) {
                return;
            }
            double t1 = t0 + s.value[op];
            int d = (int) s.second[op];
            int lim = Math.min(window, maxOrder);
            BitSet live = reach.get(op);
            for (int k = -lim; k <= lim; k++) {
                double f = tr.transverseMagnitude(k);
                if (f >= threshold && f > 0 && Math.abs(k + d) <= maxOrder && live.get(k + kk)) {
                    segments.add(new PhaseGraph.Segment(t0, t1, k, k + d, f, false));
                }
            }
            for (int k = 1; k <= lim; k++) {
                double z = tr.longitudinalMagnitude(k);
                if (z >= threshold && z > 0 && live.get(2 * kk + 1 + k)) {
                    segments.add(new PhaseGraph.Segment(t0, t1, k, k, z, true));
                }
            }
        });
        ClassDecomposition d = tracker.decompose(s, t1Ms, t2Ms, b1);
        for (int e = 0; e < d.echoCount(); e++) {
            if (d.timeMs(e) <= untilMs) {
                echoes.add(new PhaseGraph.EchoMark(d.timeMs(e), d.label(e), d.magnitude(e)));
            }
        }
        return new PhaseGraph(segments, pulses, echoes, threshold, maxOrder);
    }

    /**
     * For every interval, the states at its start from which some later echo can be reached at all
     * (any non-zero pulse may keep, invert or store a state): bit k + K for F<sub>k</sub>, bit
     * 2K + 1 + k for Z<sub>k</sub>, K = the schedule's largest order. A backward pass over the events.
     */
    private static java.util.Map<Integer, BitSet> reachability(Schedule s) {
        int kk = s.maxOrder;
        int zBase = 2 * kk + 1;
        java.util.Map<Integer, BitSet> out = new java.util.HashMap<>();
        BitSet r = new BitSet(zBase + kk + 1);
        for (int i = s.op.length - 1; i >= 0; i--) {
            BitSet b = new BitSet(zBase + kk + 1);
            switch (s.op[i]) {
                case Schedule.ECHO -> {
                    b.or(r);
                    b.set(kk);
                }
                case Schedule.INTERVAL -> {
                    int d = (int) s.second[i];
                    for (int k = -kk; k <= kk; k++) {
                        int m = k + d;
                        if (Math.abs(m) <= kk && r.get(m + kk)) {
                            b.set(k + kk);
                        }
                    }
                    b.or(longitudinalPart(r, zBase, kk));
                    out.put(i, b);
                }
                default -> {
                    for (int k = -kk; k <= kk; k++) {
                        int a = Math.abs(k);
                        boolean f = r.get(k + kk) || r.get(-k + kk) || r.get(zBase + a);
                        if (f) {
                            b.set(k + kk);
                        }
                    }
                    for (int k = 0; k <= kk; k++) {
                        if (r.get(zBase + k) || r.get(k + kk) || r.get(-k + kk)) {
                            b.set(zBase + k);
                        }
                    }
                }
            }
            r = b;
        }
        return out;
    }

    /** The Z part of a reachability set, unchanged over an interval. */
    private static BitSet longitudinalPart(BitSet r, int zBase, int kk) {
        BitSet z = new BitSet(zBase + kk + 1);
        for (int k = 0; k <= kk; k++) {
            if (r.get(zBase + k)) {
                z.set(zBase + k);
            }
        }
        return z;
    }
}

package org.echotrellis.pathway;

import java.util.List;
import org.echotrellis.Checks;
import org.echotrellis.sequence.Event;
import org.echotrellis.sequence.Protocol;

/**
 * Pathway analysis of a protocol with its own tissue and B1 scale: the class decomposition of every
 * echo, the largest pathways of one echo and the phase-graph data. Each call builds its own
 * workspaces, so calls are independent and thread-safe.
 */
public final class PathwayAnalysis {
    private PathwayAnalysis() { }

    /**
     * @param events a protocol's event list
     * @return the schedule the analysis works on
     */
    static Schedule schedule(List<Event> events) {
        Schedule.Builder b = Schedule.builder();
        for (Event e : events) {
            if (e instanceof Event.Rf rf) {
                b.rf(rf.flipDeg(), rf.phaseDeg());
            } else if (e instanceof Event.Interval iv) {
                b.interval(iv.durationMs(), iv.dephasing());
            } else if (e instanceof Event.Echo echo) {
                b.echo(echo.label());
            }
        }
        return b.build();
    }

    /**
     * @param p protocol (tissue T1/T2 and B1 scale taken from it); a slice-selective or steady-state
     *     acquisition is decomposed per slice position and summed ({@link AcquisitionClasses})
     * @return the class decomposition of every echo
     */
    public static ClassDecomposition classes(Protocol p) {
        if (!p.isIdealAcquisition()) {
            return AcquisitionClasses.classes(p);
        }
        return new ClassTracker().decompose(schedule(p.events()), p.tissue().t1Ms(), p.tissue().t2Ms(), p.b1Scale());
    }

    /**
     * @param p protocol
     * @param echo echo number, 1-based
     * @param limits search limits
     * @return the largest pathways of that echo
     */
    public static TopPathways topPathways(Protocol p, int echo, PathwaySearch.Limits limits) {
        return topPathways(p, classes(p), echo, limits);
    }

    /**
     * @param p protocol
     * @param classes its class decomposition ({@link #classes(Protocol)}), which supplies the echo
     * @param echo echo number, 1-based
     * @param limits search limits
     * @return the largest pathways of that echo
     */
    public static TopPathways topPathways(Protocol p, ClassDecomposition classes, int echo,
                                          PathwaySearch.Limits limits) {
        requireIdeal(p, "the largest pathways follow");
        Schedule s = schedule(p.events());
        Checks.require(s.echoCount() > 0, "the protocol has no echoes (" + p.source() + ")");
        Checks.inRange("echo", echo, 1, s.echoCount(), null);
        Checks.require(classes.echoCount() == s.echoCount(), "class decomposition of another protocol");
        return new PathwaySearch().find(s, echo - 1, p.tissue().t1Ms(), p.tissue().t2Ms(), p.b1Scale(), limits,
                classes.echoRe(echo - 1), classes.echoIm(echo - 1));
    }

    private static void requireIdeal(Protocol p, String what) {
        if (!p.isIdealAcquisition()) {
            throw new org.echotrellis.InputException(what + " one isochromat through ideal pulses; "
                    + p.source() + " describes a slice-selective, steady-state or diffusing acquisition (summed over "
                    + "positions): use the class decomposition, or a copy of the protocol without slice, repetition_ms "
                    + "and crusher");
        }
    }

    /**
     * @param p protocol
     * @param threshold leave out states below this magnitude (units of M0)
     * @param maxOrder leave out states above this |order|
     * @param untilMs leave out everything after this time (ms; +Infinity for all)
     * @return the phase-graph data
     */
    public static PhaseGraph phaseGraph(Protocol p, double threshold, int maxOrder, double untilMs) {
        requireIdeal(p, "the phase graph follows");
        return PhaseGraphTracer.trace(schedule(p.events()), p.tissue().t1Ms(), p.tissue().t2Ms(), p.b1Scale(),
                threshold, maxOrder, untilMs);
    }
}

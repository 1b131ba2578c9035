package org.echotrellis.pathway;

import java.util.List;

/**
 * The data of a phase-graph diagram (Hennig, J Magn Reson 78:397, 1988): every configuration state
 * held during every interval, as a line segment in (time, dephasing order) with the state's
 * magnitude, plus the RF pulses and echoes.
 * Only states that can still reach an echo are included, and only those above the tracing threshold.
 *
 * @param segments the state segments, in time order
 * @param pulses the RF pulses
 * @param echoes the echo read-outs
 * @param threshold magnitude below which states were left out (units of M0)
 * @param maxOrder largest |order| included
 */
public record PhaseGraph(List<Segment> segments, List<Pulse> pulses, List<EchoMark> echoes, double threshold,
                         int maxOrder) {
    /**
     * Copies the lists.
     *
     * @param segments the state segments, in time order
     * @param pulses the RF pulses
     * @param echoes the echo read-outs
     * @param threshold magnitude below which states were left out (units of M0)
     * @param maxOrder largest |order| included
     */
    public PhaseGraph {
        segments = List.copyOf(segments);
        pulses = List.copyOf(pulses);
        echoes = List.copyOf(echoes);
    }

    /**
     * One state over one interval.
     *
     * @param startMs interval start
     * @param endMs interval end
     * @param startOrder dephasing order at the start (signed for transverse states, &ge; 0 for longitudinal)
     * @param endOrder dephasing order at the end
     * @param magnitude |state| at the start of the interval (units of M0)
     * @param longitudinal true for Z<sub>k</sub>, false for F<sub>k</sub>
     */
    public record Segment(double startMs, double endMs, int startOrder, int endOrder, double magnitude,
                          boolean longitudinal) { }

    /**
     * @param timeMs pulse time
     * @param flipDeg effective flip (nominal times B1)
     * @param phaseDeg RF phase
     */
    public record Pulse(double timeMs, double flipDeg, double phaseDeg) { }

    /**
     * @param timeMs echo time
     * @param label echo label
     * @param magnitude |echo|
     */
    public record EchoMark(double timeMs, String label, double magnitude) { }
}

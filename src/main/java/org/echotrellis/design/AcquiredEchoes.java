package org.echotrellis.design;

import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.sequence.EchoTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Simulator;
import org.echotrellis.sequence.Tissue;

/**
 * Echoes of a designed schedule as the protocol acquires it: the schedule replaces the protocol's
 * refocusing flips, and the protocol's acquisition (pulse shapes with their slice profiles at the
 * actual B1, repetition time, crushers and the tissue's diffusivity) enters through the one acquisition
 * model ({@link Simulator#simulate(Protocol, double, double, double)}). The schedule itself is found on
 * the ideal-pulse CPMG model; these are the echoes the scanner records with it.
 */
public final class AcquiredEchoes {
    private final Protocol protocol;
    private final CpmgTrain base;

    private AcquiredEchoes(Protocol protocol, CpmgTrain base) {
        this.protocol = protocol;
        this.base = base;
    }

    /**
     * @param protocol the protocol of the design (a CPMG train)
     * @return the predictor, or null when the protocol's acquisition is the ideal-pulse model itself
     *     (its echoes are those of the design model)
     */
    public static AcquiredEchoes forProtocol(Protocol protocol) {
        if (protocol == null || protocol.isIdealAcquisition() || protocol.cpmg().isEmpty()) {
            return null;
        }
        return new AcquiredEchoes(protocol, protocol.cpmg().get());
    }

    /** @return the protocol's tissue (the design tissue, with its diffusivity) */
    public Tissue designTissue() {
        return protocol.tissue();
    }

    /**
     * @param flipsDeg nominal refocusing flips of the schedule (not modified)
     * @param tissue the tissue, with its own diffusivity
     * @return |echo| per echo
     */
    public double[] magnitudes(double[] flipsDeg, Tissue tissue) {
        CpmgTrain t = new CpmgTrain(base.echoes(), base.echoSpacingMs(), base.excitationFlipDeg(),
                base.excitationPhaseDeg(), flipsDeg, base.refocusPhasesDeg());
        Protocol q = Protocol.ofTrain(protocol.name(), protocol.description(), tissue, protocol.b1Scale(), t,
                protocol.source(), protocol.acquisition());
        EchoTrain e = Simulator.simulate(q, tissue.t1Ms(), tissue.t2Ms(), protocol.b1Scale());
        double[] m = new double[t.echoes()];
        for (int i = 0; i < m.length; i++) {
            m[i] = Math.hypot(e.re()[i], e.im()[i]);
        }
        return m;
    }
}

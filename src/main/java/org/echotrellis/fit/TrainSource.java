package org.echotrellis.fit;

import org.echotrellis.sequence.EchoTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Simulator;

/**
 * Echo trains of one acquisition at a fixed T1, as the fitting tables need them: the whole
 * acquisition the protocol describes (pulses, slice profile, repetition time, diffusion) through
 * {@link Simulator#simulate(Protocol, double, double, double)}, rotated into the CPMG frame so that
 * an ideal train is real (the echo phase of a CPMG train is the excitation phase − 90°).
 * Thread-safe (the simulator keeps its engines per thread).
 */
public final class TrainSource {
    private final Protocol protocol;
    private final double t1Ms;
    private final double cos;
    private final double sin;
    private final int echoes;

    /**
     * @param protocol the acquisition
     * @param t1Ms fixed T1 in ms
     */
    public TrainSource(Protocol protocol, double t1Ms) {
        this.protocol = protocol;
        this.t1Ms = t1Ms;
        double psi = protocol.cpmg().map(t -> Math.toRadians(t.excitationPhaseDeg() - 90)).orElse(0.0);
        this.cos = Math.cos(psi);
        this.sin = Math.sin(psi);
        this.echoes = protocol.echoCount();
    }

    /** @return echoes per train */
    public int echoes() {
        return echoes;
    }

    /** @return the fixed T1 in ms */
    public double t1Ms() {
        return t1Ms;
    }

    /** @return the acquisition */
    public Protocol protocol() {
        return protocol;
    }

    /**
     * One train in the CPMG frame.
     *
     * @param t2Ms T2 in ms
     * @param b1 B1 scale
     * @param re receives the in-phase part per echo at [off, off + echoes); modified
     * @param im receives the quadrature part; modified
     * @param off offset into re and im
     */
    public void train(double t2Ms, double b1, double[] re, double[] im, int off) {
        EchoTrain t = Simulator.simulate(protocol, t1Ms, t2Ms, b1);
        double[] r = t.re();
        double[] q = t.im();
        for (int i = 0; i < echoes; i++) {
            re[off + i] = r[i] * cos + q[i] * sin;
            im[off + i] = -r[i] * sin + q[i] * cos;
        }
    }
}

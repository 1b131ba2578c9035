package org.echotrellis.fit;

import org.echotrellis.sequence.AcquisitionModel;
import org.echotrellis.sequence.EchoTrain;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Simulator;

/**
 * Echo trains of one acquisition at a fixed T1, as the fitting tables need them: the whole
 * acquisition the protocol describes (pulses, slice profile, repetition time, diffusion) — the
 * protocol's {@link AcquisitionModel} (built once, lanes of {@value AcquisitionModel#LANES} trains,
 * allocation-free), or {@link Simulator#simulate(Protocol, double, double, double)} for the ideal
 * acquisition — rotated into the CPMG frame so that an ideal train is real (the echo phase of a
 * CPMG train is the excitation phase − 90°). Thread-safe.
 */
public final class TrainSource {
    private final Protocol protocol;
    private final double t1Ms;
    private final double cos;
    private final double sin;
    private final int echoes;
    private final AcquisitionModel model;
    private final ThreadLocal<double[][]> lanes;

    /**
     * @param protocol the acquisition
     * @param t1Ms fixed T1 in ms
     */
    TrainSource(Protocol protocol, double t1Ms) {
        this(protocol, t1Ms, 2.0);
    }

    /**
     * @param protocol the acquisition
     * @param t1Ms fixed T1 in ms
     * @param b1Max largest B1 that will be asked for
     */
    public TrainSource(Protocol protocol, double t1Ms, double b1Max) {
        this.protocol = protocol;
        this.t1Ms = t1Ms;
        double psi = protocol.cpmg().map(t -> Math.toRadians(t.excitationPhaseDeg() - 90)).orElse(0.0);
        this.cos = Math.cos(psi);
        this.sin = Math.sin(psi);
        this.echoes = protocol.echoCount();
        this.model = protocol.isIdealAcquisition() ? null : Simulator.model(protocol, b1Max);
        int n = echoes;
        int l = AcquisitionModel.LANES;
        this.lanes = ThreadLocal.withInitial(() -> new double[][] {new double[l], new double[l], new double[l],
            new double[l * n], new double[l * n]});
    }

    /**
     * Trains at one B1 for several T2 values, {@value AcquisitionModel#LANES} at a time.
     *
     * @param t2Ms T2 values in ms; not modified
     * @param b1 B1 scale
     * @param re receives the in-phase echoes of T2 j at [j·echoes, (j+1)·echoes); modified
     * @param im receives the quadrature parts likewise; modified
     */
    public void row(double[] t2Ms, double b1, double[] re, double[] im) {
        if (model == null) {
            for (int j = 0; j < t2Ms.length; j++) {
                train(t2Ms[j], b1, re, im, j * echoes);
            }
            return;
        }
        double[][] w = lanes.get();
        int lanesN = AcquisitionModel.LANES;
        java.util.Arrays.fill(w[0], t1Ms);
        java.util.Arrays.fill(w[2], b1);
        for (int j0 = 0; j0 < t2Ms.length; j0 += lanesN) {
            int count = Math.min(lanesN, t2Ms.length - j0);
            System.arraycopy(t2Ms, j0, w[1], 0, count);
            model.echoes(w[0], w[1], w[2], count, w[3], w[4]);
            for (int l = 0; l < count; l++) {
                int o = (j0 + l) * echoes;
                for (int i = 0; i < echoes; i++) {
                    double r = w[3][l * echoes + i];
                    double q = w[4][l * echoes + i];
                    re[o + i] = r * cos + q * sin;
                    im[o + i] = -r * sin + q * cos;
                }
            }
        }
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
    void train(double t2Ms, double b1, double[] re, double[] im, int off) {
        EchoTrain t = Simulator.simulate(protocol, t1Ms, t2Ms, b1);
        double[] r = t.re();
        double[] q = t.im();
        for (int i = 0; i < echoes; i++) {
            re[off + i] = r[i] * cos + q[i] * sin;
            im[off + i] = -r[i] * sin + q[i] * cos;
        }
    }
}

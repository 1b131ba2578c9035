package org.echotrellis.fit;

import org.echotrellis.epg.CpmgDerivativeEngine;
import org.echotrellis.epg.CpmgTrain;

/**
 * The EPG echo model of one protocol (train, fixed T1, slice profile) with its derivatives with
 * respect to ln T2 and B1, for one thread. g_n(T2, B1) = &Sigma;_z w_z EPG_n(B1·f_exc(z)·α_exc,
 * B1·f_ref(z)·α_p; T1, T2) with unit M0. Magnitude data are fitted, so the model is |g_n|: in
 * the CPMG frame an echo can change sign (short T2 with strong stimulated echoes), and the
 * derivatives are taken with the same sign.
 */
final class EpgSignal {
    private final CpmgTrain train;
    private final double t1Ms;
    private final double[] exc;
    private final double[] ref;
    private final double[] weight;
    private final CpmgDerivativeEngine engine;

    EpgSignal(FitSettings s) {
        this.train = s.train();
        this.t1Ms = s.t1Ms();
        SliceProfile p = s.profile();
        this.exc = p.excitationFactors();
        this.ref = p.refocusingFactors();
        this.weight = p.weights();
        this.engine = new CpmgDerivativeEngine(p.positions());
    }

    /** @return echoes of the train */
    int echoes() {
        return train.echoes();
    }

    /**
     * @param t2Ms T2 in ms
     * @param b1 B1 scale
     * @param g receives |g_n|; modified
     * @param dLnT2 receives ∂g_n/∂ln T2 = T2·∂g_n/∂T2; modified
     * @param dB1 receives ∂g_n/∂B1; modified
     */
    void evaluate(double t2Ms, double b1, double[] g, double[] dLnT2, double[] dB1) {
        engine.run(train, t1Ms, t2Ms, b1, exc, ref, weight, weight.length, g, dLnT2, dB1);
        int n = train.echoes();
        for (int i = 0; i < n; i++) {
            if (g[i] < 0) {
                g[i] = -g[i];
                dLnT2[i] = -dLnT2[i] * t2Ms;
                dB1[i] = -dB1[i];
            } else {
                dLnT2[i] *= t2Ms;
            }
        }
    }
}

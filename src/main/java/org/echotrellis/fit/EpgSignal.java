package org.echotrellis.fit;

import org.echotrellis.epg.CpmgDerivativeEngine;
import org.echotrellis.epg.CpmgTrain;

/**
 * The echo model of one protocol at fixed T1 with its derivatives with respect to ln T2 and B1, for
 * one thread (extended phase graphs, Weigel 2015; the fitted model of Lebel &amp; Wilman 2010). For the plain CPMG train with instantaneous pulses the exact derivative-carrying EPG
 * engine runs at every evaluation; for any other acquisition (slice profile, repetition time,
 * diffusion) the model is the shared {@link TrainSurface} tabulated once per run, so no pulse is
 * simulated per voxel. Magnitude data are fitted, so the model is |g_n|: in the CPMG frame an echo
 * can change sign (short T2 with strong stimulated echoes), and the derivatives take the same sign.
 */
final class EpgSignal {
    private static final double[] ONE = {1};

    private final CpmgTrain train;
    private final double t1Ms;
    private final CpmgDerivativeEngine engine;
    private final TrainSurface surface;
    private final TrainSurface.Workspace workspace;

    /**
     * @param s settings
     * @param surface the tabulated model, or null for the exact engine (plain CPMG only)
     */
    EpgSignal(FitSettings s, TrainSurface surface) {
        this.train = s.train();
        this.t1Ms = s.t1Ms();
        this.surface = surface;
        this.engine = surface == null ? new CpmgDerivativeEngine(1) : null;
        this.workspace = surface == null ? null : surface.workspace();
    }

    /** Exact engine; settings must describe a plain CPMG acquisition. */
    EpgSignal(FitSettings s) {
        this(s, null);
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
        int n = train.echoes();
        if (surface != null) {
            surface.evaluate(workspace, t2Ms, b1, g, dLnT2, dB1);
            for (int i = 0; i < n; i++) {
                if (g[i] < 0) {
                    g[i] = -g[i];
                    dLnT2[i] = -dLnT2[i];
                    dB1[i] = -dB1[i];
                }
            }
            return;
        }
        engine.run(train, t1Ms, t2Ms, b1, ONE, ONE, ONE, 1, g, dLnT2, dB1);
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

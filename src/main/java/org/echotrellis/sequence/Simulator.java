package org.echotrellis.sequence;

import java.util.Optional;
import org.echotrellis.Checks;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.epg.EpgProgram;
import org.echotrellis.epg.GeneralEngine;

/**
 * Runs a {@link Protocol} through the EPG engine: the real CPMG fast path when the protocol
 * qualifies ({@link Protocol#cpmg()}), the general complex engine otherwise. Thread-safe: engines
 * are kept one per thread.
 */
public final class Simulator {
    private static final ThreadLocal<CpmgEngine> CPMG = ThreadLocal.withInitial(() -> new CpmgEngine(1));
    private static final ThreadLocal<GeneralEngine> GENERAL = ThreadLocal.withInitial(() -> new GeneralEngine(1));

    private Simulator() { }

    /** Simulates with the protocol's own tissue and B1 scale. */
    public static EchoTrain simulate(Protocol p) {
        return simulate(p, p.tissue().t1Ms(), p.tissue().t2Ms(), p.b1Scale());
    }

    /**
     * Simulates one train.
     *
     * @param p the protocol (its events; tissue and B1 are taken from the arguments)
     * @param t1Ms T1 in ms (+Infinity allowed)
     * @param t2Ms T2 in ms (+Infinity allowed)
     * @param b1 flip-angle scale applied to every pulse
     * @return the echoes
     */
    public static EchoTrain simulate(Protocol p, double t1Ms, double t2Ms, double b1) {
        Checks.positiveOrInfinite("t1_ms", t1Ms, null);
        Checks.positiveOrInfinite("t2_ms", t2Ms, null);
        Checks.positive("b1", b1, null);
        Optional<CpmgTrain> cpmg = p.cpmg();
        int n = p.echoCount();
        double[] re = new double[n];
        double[] im = new double[n];
        if (cpmg.isPresent()) {
            CpmgTrain t = cpmg.get();
            double[] v = CPMG.get().echoes(t, t1Ms, t2Ms, b1);
            double psi = Math.toRadians(t.excitationPhaseDeg() - 90.0);
            double c = Math.cos(psi);
            double s = Math.sin(psi);
            for (int i = 0; i < n; i++) {
                re[i] = v[i] * c;
                im[i] = v[i] * s;
            }
        } else {
            EpgProgram prog = p.program();
            GENERAL.get().run(prog, new double[] {t1Ms}, new double[] {t2Ms}, new double[] {b1}, 1, re, im);
        }
        return new EchoTrain(p.echoLabels(), p.echoTimesMs(), re, im);
    }
}

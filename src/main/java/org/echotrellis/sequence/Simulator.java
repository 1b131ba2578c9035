package org.echotrellis.sequence;

import java.util.Optional;
import org.echotrellis.Checks;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.epg.EpgProgram;
import org.echotrellis.epg.GeneralEngine;

/**
 * Runs a {@link Protocol} through the extended-phase-graph engine (Hennig 1988; Weigel 2015): the
 * real CPMG fast path when the protocol qualifies ({@link Protocol#cpmg()}), the general complex
 * engine otherwise; a protocol whose
 * acquisition is not ideal (slice-selective pulses, a repetition time, or diffusion with crushers) runs
 * through its {@link AcquisitionModel} (the whole acquisition: slice integral, steady state, diffusion).
 * Thread-safe: engines are kept one per thread; acquisition models are cached for the last few protocols.
 */
public final class Simulator {
    private static final ThreadLocal<CpmgEngine> CPMG = ThreadLocal.withInitial(() -> new CpmgEngine(1));
    private static final ThreadLocal<GeneralEngine> GENERAL = ThreadLocal.withInitial(() -> new GeneralEngine(1));

    private static final int CACHED_MODELS = 8;
    /** What a model depends on: the train, its acquisition and the tissue's diffusivity (not T1, T2, B1). */
    private record ModelKey(Optional<CpmgTrain> train, Acquisition acquisition, double diffusivityMm2PerS) { }

    private static final java.util.Map<ModelKey, AcquisitionModel> MODELS = new java.util.LinkedHashMap<>(16, 0.75f, true) {
        @Override
        protected boolean removeEldestEntry(java.util.Map.Entry<ModelKey, AcquisitionModel> e) {
            return size() > CACHED_MODELS;
        }
    };

    private Simulator() { }

    /**
     * The acquisition model of a protocol for B1 up to {@code b1}, built once and cached (keyed by the
     * train, the acquisition and the tissue's diffusivity, so copies with another T1 or T2 share it).
     * For many evaluations keep the returned model and call its {@code echoes} or {@code magnitudes}.
     *
     * @param p protocol (shorthand train form)
     * @param b1 largest B1 scale needed
     * @return the model
     */
    public static AcquisitionModel model(Protocol p, double b1) {
        ModelKey key = new ModelKey(p.train(), p.acquisition(), p.tissue().diffusivityMm2PerS());
        synchronized (MODELS) {
            AcquisitionModel m = MODELS.get(key);
            if (m != null && m.b1Max() >= b1) {
                return m;
            }
        }
        AcquisitionModel m = AcquisitionModel.of(p, Math.max(2.0, 1.25 * b1));
        synchronized (MODELS) {
            MODELS.put(key, m);
        }
        return m;
    }

    /**
     * Simulates with the protocol's own tissue and B1 scale.
     *
     * @param p the protocol; its tissue's T1 and T2 and its B1 scale are used
     * @return the echo train of the protocol
     */
    public static EchoTrain simulate(Protocol p) {
        return simulate(p, p.tissue().t1Ms(), p.tissue().t2Ms(), p.b1Scale());
    }

    /**
     * Simulates one train: the echo train of the whole acquisition the protocol describes — for a
     * slice-selective protocol the integral across the slice per unit slice width (FWHM of the
     * excitation profile), converged to 1e-4 of echo 1; with {@code repetition_ms} the steady state; with
     * crushers diffusion at the protocol tissue's diffusivity. Without those keys: the ideal-pulse EPG.
     *
     * @param p the protocol (its events and acquisition; T1, T2 and B1 are taken from the arguments, the
     *     diffusivity from its tissue)
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
        if (!p.isIdealAcquisition()) {
            model(p, b1).echoes(t1Ms, t2Ms, b1, re, im);
        } else if (cpmg.isPresent()) {
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

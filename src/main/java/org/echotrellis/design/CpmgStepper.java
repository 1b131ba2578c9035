package org.echotrellis.design;

import org.echotrellis.Checks;

/**
 * A small real-valued CPMG stepper that exposes the configuration states just before each
 * refocusing pulse, as the echo-by-echo inversion needs them.
 *
 * <p>Conventions follow the extended phase graph of Hennig (J Magn Reson 78:397, 1988) in the
 * notation of Weigel (JMRI 41:266, 2015): states F+_k, F−_k, Z_k with M0 = 1. With excitation
 * about y (phase 90°) and refocusing about x (phase 0°) every F state is real and every Z state
 * purely imaginary; we store z = Z / i, so the refocusing operator is the real matrix
 * <pre>
 *   F+' = cos²(α/2)·F+ + sin²(α/2)·F− + sin α·z
 *   F−' = sin²(α/2)·F+ + cos²(α/2)·F− − sin α·z
 *   z'  = −½ sin α·F+ + ½ sin α·F− + cos α·z
 * </pre>
 * Only the parity class excited by the 90° pulse can reach k = 0 at an echo time (CPMG timing,
 * one dephasing order per half echo spacing), so Z_0, its T1 recovery and the residual
 * cos α_exc are left out exactly: the excitation only scales the train by sin α_exc.
 * States that can no longer reach k = 0 before the last echo are pruned.
 *
 * <p>Use: {@link #start}, then per echo {@link #advanceToPulse()}, read {@link #stateA()},
 * {@link #stateB()}, {@link #stateC()} (the k = 1 states that feed the next echo), then
 * {@link #pulseAndEcho(double)}. One instance per thread; the workspace grows and is reused, no
 * allocation per echo. Cost O(N²) per train of N echoes.
 */
final class CpmgStepper {
    private double[] fp = new double[0];
    private double[] fm = new double[0];
    private double[] z = new double[0];
    private int top;
    private int echoes;
    private int pulses;
    private double e2Half;
    private double e1Half;
    private double b1;

    /** Creates an empty stepper; call {@link #start} before stepping. */
    public CpmgStepper() { }

    /**
     * Resets the state to just after the excitation pulse.
     *
     * @param echoes number of echoes in the train (≥ 1)
     * @param echoSpacingMs echo spacing in ms (> 0)
     * @param t1Ms longitudinal relaxation time in ms (> 0, may be +Infinity)
     * @param t2Ms transverse relaxation time in ms (> 0, may be +Infinity)
     * @param b1Scale multiplies every flip, excitation included (> 0)
     * @param excitationFlipDeg nominal excitation flip in degrees
     */
    public void start(int echoes, double echoSpacingMs, double t1Ms, double t2Ms, double b1Scale,
                      double excitationFlipDeg) {
        Checks.inRange("echoes", echoes, 1, 100_000, null);
        Checks.positive("echo_spacing_ms", echoSpacingMs, null);
        Checks.positiveOrInfinite("t1_ms", t1Ms, null);
        Checks.positiveOrInfinite("t2_ms", t2Ms, null);
        Checks.positive("b1_scale", b1Scale, null);
        int need = 2 * echoes + 3;
        if (fp.length < need) {
            fp = new double[need];
            fm = new double[need];
            z = new double[need];
        } else {
            java.util.Arrays.fill(fp, 0.0);
            java.util.Arrays.fill(fm, 0.0);
            java.util.Arrays.fill(z, 0.0);
        }
        this.echoes = echoes;
        this.pulses = 0;
        this.b1 = b1Scale;
        this.e2Half = Math.exp(-0.5 * echoSpacingMs / t2Ms);
        this.e1Half = Math.exp(-0.5 * echoSpacingMs / t1Ms);
        double s = Math.sin(Math.toRadians(excitationFlipDeg * b1Scale));
        fp[0] = s;
        fm[0] = s;
        top = 0;
    }

    /** Relaxation over half an echo spacing, then one dephasing order: the state just before the next pulse. */
    public void advanceToPulse() {
        relaxAndShift();
    }

    /** @return F+_1 just before the coming pulse (after {@link #advanceToPulse()}) */
    public double stateA() {
        return fp[1];
    }

    /** @return F−_1 just before the coming pulse */
    public double stateB() {
        return fm[1];
    }

    /** @return z_1 = Z_1 / i just before the coming pulse */
    public double stateC() {
        return z[1];
    }

    /** @return E2 over half an echo spacing, the factor between the post-pulse F−_1 and the echo */
    public double halfSpacingE2() {
        return e2Half;
    }

    /** @return the B1 scale set by {@link #start} */
    public double b1Scale() {
        return b1;
    }

    /**
     * The echo that a pulse of the given actual flip would produce, without changing the state
     * (Hennig, Weigel &amp; Scheffler, MRM 51:68, 2004): E2(ESP/2)·[(A+B)/2 + cos α·(B−A)/2 − sin α·C].
     *
     * @param actualFlipRad actual flip (B1 scale already applied) in radians
     * @return the predicted echo amplitude (signed, CPMG frame)
     */
    public double echoFor(double actualFlipRad) {
        double a = fp[1];
        double b = fm[1];
        return e2Half * (0.5 * (a + b) + Math.cos(actualFlipRad) * 0.5 * (b - a) - Math.sin(actualFlipRad) * z[1]);
    }

    /**
     * Applies a refocusing pulse with the given nominal flip (times the B1 scale), relaxes half an
     * echo spacing, shifts one order and returns the echo F+_0.
     *
     * @param nominalFlipDeg nominal refocusing flip in degrees
     * @return signed echo amplitude in the CPMG frame
     */
    public double pulseAndEcho(double nominalFlipDeg) {
        if (pulses >= echoes) {
            throw new IllegalStateException("all " + echoes + " echoes of the train are already done");
        }
        double alpha = Math.toRadians(nominalFlipDeg * b1);
        double ca = Math.cos(alpha);
        double sa = Math.sin(alpha);
        double c2 = 0.5 * (1 + ca);
        double s2 = 0.5 * (1 - ca);
        double hs = 0.5 * sa;
        // excitation-class states sit at odd k at pulse times
        for (int k = 1; k <= top; k += 2) {
            double a = fp[k];
            double b = fm[k];
            double c = z[k];
            fp[k] = c2 * a + s2 * b + sa * c;
            fm[k] = s2 * a + c2 * b - sa * c;
            z[k] = hs * (b - a) + ca * c;
        }
        pulses++;
        int keep = 2 * (echoes - pulses) + 1;
        if (top > keep) {
            for (int k = keep + 1; k <= top; k++) {
                fp[k] = 0;
                fm[k] = 0;
                z[k] = 0;
            }
            top = keep;
        }
        relaxAndShift();
        return fp[0];
    }

    /**
     * Simulates a whole train with the given nominal refocusing flips from a fresh start.
     *
     * @param echoes number of echoes; flipsDeg must hold at least this many values (not modified)
     * @param out receives the signed echoes, out[n] for echo n+1 (modified)
     */
    public void run(int echoes, double echoSpacingMs, double t1Ms, double t2Ms, double b1Scale,
                    double excitationFlipDeg, double[] flipsDeg, double[] out) {
        start(echoes, echoSpacingMs, t1Ms, t2Ms, b1Scale, excitationFlipDeg);
        for (int n = 0; n < echoes; n++) {
            advanceToPulse();
            out[n] = pulseAndEcho(flipsDeg[n]);
        }
    }

    private void relaxAndShift() {
        double e2 = e2Half;
        double e1 = e1Half;
        for (int k = 0; k <= top; k++) {
            fp[k] *= e2;
            fm[k] *= e2;
            z[k] *= e1;
        }
        for (int k = top + 1; k >= 1; k--) {
            fp[k] = fp[k - 1];
        }
        for (int k = 0; k <= top; k++) {
            fm[k] = fm[k + 1];
        }
        fm[top + 1] = 0;
        fp[0] = fm[0];
        top++;
    }
}

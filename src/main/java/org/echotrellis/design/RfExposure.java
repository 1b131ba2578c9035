package org.echotrellis.design;

import org.echotrellis.sequence.PulseShape;

import org.echotrellis.Checks;

/**
 * RF exposure of a spin-echo train: B1 amplitudes, energy, B1+rms and SAR relative to the
 * all-180° train. Estimates for planning only: the scanner's own SAR monitor, local
 * regulations and the responsible MR physicist decide.
 *
 * <p>Physics: a flip α = γ·∫B1(t)dt, so a pulse of duration τ and shape b(t) (peak 1) needs
 * B1,peak = α/(γ·τ·A_f) and deposits ∫B1²dt = B1,peak²·P_f·τ = α²·P_f/(γ²·A_f²·τ). For a fixed
 * shape and duration the energy, and so SAR, scales with α² (SAR ∝ B0²·α²/τ; e.g. Bernstein,
 * King &amp; Zhou 2004, from memory). B1+rms = √((1/T)·∫|B1+(t)|²dt) over the averaging window
 * (McRobbie, Essentials of MRI Safety, 2020), T = {@value #B1RMS_WINDOW_MS} ms; for a periodic sequence
 * with TR below that window this equals the average over one TR, and with a longer TR the worst window
 * holds (at most) one TR's pulses, so the energy of one TR is divided by T instead — an upper bound,
 * exact when the pulses of one TR fit in 10 s. γ/2π = 42.577 MHz/T (CODATA 2014: 42.577 478 92).
 *
 * <p>Relative SAR here counts the refocusing pulses: Σα_i²/(N·180²) for pulses of one shape
 * and duration; {@link #relativeSarWithExcitation} also counts the excitation.
 *
 * @param refocusShape envelope of every refocusing pulse
 * @param refocusMs duration of every refocusing pulse in ms
 * @param excitationShape envelope of the excitation pulse
 * @param excitationMs duration of the excitation pulse in ms
 * @param trMs repetition time in ms, or NaN when unknown (no B1+rms then)
 * @param slices number of trains (e.g. slices) played per TR (≥ 1)
 */
public record RfExposure(PulseShape refocusShape, double refocusMs, PulseShape excitationShape, double excitationMs,
                         double trMs, int slices) {
    /** Proton gyromagnetic ratio γ/2π in Hz/T (CODATA 2014, rounded to 42.577 MHz/T). */
    public static final double GAMMA_BAR_HZ_PER_T = 42.577e6;
    /** Averaging window of B1+rms in ms (10 s; McRobbie 2020, IEC 60601-2-33). */
    public static final double B1RMS_WINDOW_MS = 10_000;

    /**
     * Validates durations, TR and slice count.
     *
     * @param refocusShape envelope of every refocusing pulse
     * @param refocusMs duration of every refocusing pulse in ms
     * @param excitationShape envelope of the excitation pulse
     * @param excitationMs duration of the excitation pulse in ms
     * @param trMs repetition time in ms, or NaN when unknown (no B1+rms then)
     * @param slices number of trains (e.g. slices) played per TR (≥ 1)
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public RfExposure {
        Checks.inRange("pulse_ms", refocusMs, 1e-3, 100, null);
        Checks.inRange("excitation_pulse_ms", excitationMs, 1e-3, 100, null);
        if (!Double.isNaN(trMs)) {
            Checks.positive("tr_ms", trMs, null);
        }
        Checks.inRange("slices", slices, 1, 10_000, null);
    }

    /**
     * @param flipDeg flip in degrees
     * @param shape envelope
     * @param durationMs duration in ms
     * @return B1 peak amplitude in µT
     */
    public static double b1PeakUt(double flipDeg, PulseShape shape, double durationMs) {
        double gamma = 2 * Math.PI * GAMMA_BAR_HZ_PER_T;
        return Math.toRadians(flipDeg) / (gamma * durationMs * 1e-3 * shape.areaFraction()) * 1e6;
    }

    /**
     * @param flipDeg flip angle in degrees
     * @param shape pulse envelope (its area and power fractions)
     * @param durationMs pulse duration in ms
     * @return ∫B1²dt of one pulse in µT²·s
     */
    public static double energyUt2s(double flipDeg, PulseShape shape, double durationMs) {
        double peak = b1PeakUt(flipDeg, shape, durationMs);
        return peak * peak * shape.powerFraction() * durationMs * 1e-3;
    }

    /**
     * Refocusing-train SAR relative to the same train with all 180° pulses of the same shape and
     * duration: Σα_i²/(N·180²).
     *
     * @param flipsDeg refocusing flips (not modified)
     * @return the ratio (1 for the all-180° train)
     */
    public static double relativeSar(double[] flipsDeg) {
        double s = 0;
        for (double a : flipsDeg) {
            s += a * a;
        }
        return s / (flipsDeg.length * 180.0 * 180.0);
    }

    /**
     * @param excitationFlipDeg excitation flip angle in degrees (played with the excitation shape and duration)
     * @param flipsDeg refocusing flip angles in degrees, one per echo (not modified)
     * @return ∫B1²dt of one train (excitation + refocusing) in µT²·s
     */
    public double trainEnergyUt2s(double excitationFlipDeg, double[] flipsDeg) {
        double unit = energyUt2s(180, refocusShape, refocusMs);
        return energyUt2s(excitationFlipDeg, excitationShape, excitationMs)
                + unit * relativeSar(flipsDeg) * flipsDeg.length;
    }

    /**
     * @param excitationFlipDeg excitation flip angle in degrees (played with the excitation shape and duration)
     * @param flipsDeg refocusing flip angles in degrees, one per echo (not modified)
     * @return RF energy of the train, excitation included, relative to the all-180° train
     */
    public double relativeSarWithExcitation(double excitationFlipDeg, double[] flipsDeg) {
        double[] full = new double[flipsDeg.length];
        java.util.Arrays.fill(full, 180);
        return trainEnergyUt2s(excitationFlipDeg, flipsDeg) / trainEnergyUt2s(excitationFlipDeg, full);
    }

    /** @return true when a repetition time is known, so B1+rms can be computed */
    public boolean hasTr() {
        return !Double.isNaN(trMs);
    }

    /**
     * B1+rms with {@link #slices()} trains per TR, excitation included, averaged over one TR or over the
     * 10 s window when TR is longer (the energy of one TR then falls within the worst window).
     *
     * @param excitationFlipDeg excitation flip angle in degrees (played with the excitation shape and duration)
     * @param flipsDeg refocusing flip angles in degrees, one per echo (not modified)
     * @return B1+rms in µT, or NaN when no TR is known
     */
    public double b1rmsUt(double excitationFlipDeg, double[] flipsDeg) {
        if (!hasTr()) {
            return Double.NaN;
        }
        double windowMs = Math.min(trMs, B1RMS_WINDOW_MS);
        return Math.sqrt(slices * trainEnergyUt2s(excitationFlipDeg, flipsDeg) / (windowMs * 1e-3));
    }

    /**
     * @param excitationFlipDeg excitation flip angle in degrees (played with the excitation shape and duration)
     * @param flipsDeg refocusing flip angles in degrees, one per echo (not modified)
     * @return mean RF power measure Σ∫B1²dt / TR in µT² (NaN without TR)
     */
    public double powerUt2(double excitationFlipDeg, double[] flipsDeg) {
        return hasTr() ? slices * trainEnergyUt2s(excitationFlipDeg, flipsDeg) / (trMs * 1e-3) : Double.NaN;
    }

    /**
     * @param newTrMs repetition time in ms, or NaN when unknown
     * @param newSlices trains (e.g. slices) played per TR, ≥ 1
     * @return a copy with another TR and slice count (same pulses)
     * @throws org.echotrellis.InputException if TR is not &gt; 0 or the slice count is outside 1 to 10 000
     */
    public RfExposure withTiming(double newTrMs, int newSlices) {
        return new RfExposure(refocusShape, refocusMs, excitationShape, excitationMs, newTrMs, newSlices);
    }
}

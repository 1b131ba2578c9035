package org.echotrellis.sequence;

import java.util.Optional;
import org.echotrellis.Checks;
import org.echotrellis.epg.CpmgTrain;

/**
 * How the echo train is acquired beyond its flips and timing: the shaped excitation and refocusing
 * pulses, slice selection, the repetition time and the crushers. Together with the {@link Tissue}
 * (including its diffusivity) this is the one acquisition model every command reads.
 *
 * <p>{@link #none()} — no pulse shapes, non-selective, a single train from equilibrium, no crushers —
 * reproduces the ideal-pulse EPG model exactly.
 *
 * @param excitationPulse the excitation envelope and duration, if given
 * @param refocusingPulse the refocusing envelope and duration, if given
 * @param sliceSelective true: the echo is the integral across the slice of the complex signal
 * @param refocusingWidthRatio refocusing slice width over excitation slice width (&gt; 0; 1 if not given)
 * @param repetitionMs repetition time TR in ms; +Infinity means one train from equilibrium
 * @param crusher the crusher lobes around each refocusing pulse, if given
 */
public record Acquisition(Optional<RfPulse> excitationPulse, Optional<RfPulse> refocusingPulse,
                          boolean sliceSelective, double refocusingWidthRatio, double repetitionMs,
                          Optional<Crusher> crusher) {

    /** Smallest and largest accepted refocusing width ratio. */
    public static final double MIN_WIDTH_RATIO = 0.25;
    /** Largest accepted refocusing width ratio. */
    public static final double MAX_WIDTH_RATIO = 10;

    private static final Acquisition NONE = new Acquisition(Optional.empty(), Optional.empty(), false, 1.0,
            Double.POSITIVE_INFINITY, Optional.empty());

    /**
     * Validates.
     *
     * @param excitationPulse the excitation envelope and duration, if given
     * @param refocusingPulse the refocusing envelope and duration, if given
     * @param sliceSelective true: the echo is the integral across the slice of the complex signal
     * @param refocusingWidthRatio refocusing slice width over excitation slice width (&gt; 0; 1 if not given)
     * @param repetitionMs repetition time TR in ms; +Infinity means one train from equilibrium
     * @param crusher the crusher lobes around each refocusing pulse, if given
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public Acquisition {
        excitationPulse = excitationPulse == null ? Optional.empty() : excitationPulse;
        refocusingPulse = refocusingPulse == null ? Optional.empty() : refocusingPulse;
        crusher = crusher == null ? Optional.empty() : crusher;
        Checks.inRange("slice refocusing_width_ratio", refocusingWidthRatio, MIN_WIDTH_RATIO, MAX_WIDTH_RATIO, null);
        Checks.require(repetitionMs > 0, "repetition_ms must be > 0, got " + repetitionMs);
        Checks.require(!sliceSelective || (excitationPulse.isPresent() && refocusingPulse.isPresent()),
                "slice.selective needs a pulse on both excitation and refocusing");
    }

    /** @return the ideal acquisition: hard pulses, no slice, one train from equilibrium, no crushers */
    public static Acquisition none() {
        return NONE;
    }

    /** @return true if TR is given (steady state), false for one train from equilibrium */
    public boolean hasRepetition() {
        return Double.isFinite(repetitionMs);
    }

    /**
     * @param tissue the tissue simulated
     * @return true if the ideal-pulse EPG of the flips alone gives the echoes (no slice integral, no
     *     steady state, no diffusion attenuation)
     */
    public boolean isIdealFor(Tissue tissue) {
        return !sliceSelective && !hasRepetition() && !diffuses(tissue.diffusivityMm2PerS());
    }

    /**
     * @param diffusivityMm2PerS D
     * @return true if diffusion attenuates the echoes (crushers given and D &gt; 0)
     */
    public boolean diffuses(double diffusivityMm2PerS) {
        return crusher.isPresent() && diffusivityMm2PerS > 0;
    }

    /**
     * The settings as written in a protocol file, for JSON outputs: {@code slice}, {@code repetition_ms}
     * (null for one train from equilibrium), {@code excitation_pulse}, {@code refocusing_pulse} and
     * {@code crusher} (null when not given).
     *
     * @return an ordered map of plain values
     */
    public java.util.Map<String, Object> settings() {
        java.util.Map<String, Object> m = new java.util.LinkedHashMap<>();
        java.util.Map<String, Object> slice = new java.util.LinkedHashMap<>();
        slice.put("selective", sliceSelective);
        slice.put("refocusing_width_ratio", refocusingWidthRatio);
        m.put("slice", slice);
        m.put("repetition_ms", hasRepetition() ? repetitionMs : null);
        m.put("excitation_pulse", excitationPulse.map(Acquisition::pulse).orElse(null));
        m.put("refocusing_pulse", refocusingPulse.map(Acquisition::pulse).orElse(null));
        m.put("crusher", crusher.map(c -> {
            java.util.Map<String, Object> x = new java.util.LinkedHashMap<>();
            x.put("cycles_per_mm", c.cyclesPerMm());
            x.put("duration_ms", c.durationMs());
            return (Object) x;
        }).orElse(null));
        return m;
    }

    private static Object pulse(RfPulse p) {
        java.util.Map<String, Object> x = new java.util.LinkedHashMap<>();
        x.put("shape", p.shape());
        x.put("time_bandwidth", Double.isNaN(p.timeBandwidth()) ? null : p.timeBandwidth());
        x.put("duration_ms", p.durationMs());
        x.put("file", p.file().isEmpty() ? null : p.file());
        return x;
    }

    /** @return the refocusing pulse duration τ in ms (0 for a hard pulse) */
    public double refocusingDurationMs() {
        return refocusingPulse.map(RfPulse::durationMs).orElse(0.0);
    }

    /**
     * Checks the timing against a train: TR &gt; echoes&middot;ESP and δ + τ/2 &le; ESP/2.
     *
     * @param train the echo train
     * @return a message naming the violated rule, or empty if the timing fits
     */
    public Optional<String> timingProblem(CpmgTrain train) {
        double trainMs = train.echoes() * train.echoSpacingMs();
        if (hasRepetition() && !(repetitionMs > trainMs)) {
            return Optional.of("repetition_ms must be > echoes x echo_spacing_ms = " + trainMs + " ms, got " + repetitionMs);
        }
        if (crusher.isPresent()) {
            double need = crusher.get().durationMs() + 0.5 * refocusingDurationMs();
            if (need > 0.5 * train.echoSpacingMs() * (1 + 1e-12)) {
                return Optional.of("crusher duration_ms + refocusing pulse duration_ms / 2 = " + need
                        + " ms must be at most echo_spacing_ms / 2 = " + 0.5 * train.echoSpacingMs() + " ms");
            }
        }
        if (excitationPulse.isPresent() && excitationPulse.get().durationMs() > train.echoSpacingMs()) {
            return Optional.of("excitation pulse duration_ms must be at most echo_spacing_ms, got "
                    + excitationPulse.get().durationMs());
        }
        if (refocusingPulse.isPresent() && refocusingPulse.get().durationMs() > train.echoSpacingMs()) {
            return Optional.of("refocusing pulse duration_ms must be at most echo_spacing_ms, got "
                    + refocusingPulse.get().durationMs());
        }
        return Optional.empty();
    }
}

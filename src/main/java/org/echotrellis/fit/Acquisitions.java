package org.echotrellis.fit;

import java.util.LinkedHashMap;
import java.util.Map;

import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.sequence.Protocol;

/**
 * What the fits need to know about a protocol's acquisition beyond its echo train: whether the
 * whole acquisition is the plain CPMG train with instantaneous pulses (then the exact derivative
 * engine runs per evaluation), or has slice selection, a repetition time or diffusion (then the
 * trains are tabulated once per run, {@link TrainSurface}).
 */
public final class Acquisitions {
    private Acquisitions() { }

    /**
     * @param p the protocol
     * @return true if the acquisition is the ideal-pulse CPMG train of {@link Protocol#cpmg()} alone
     */
    public static boolean plainCpmg(Protocol p) {
        return p.cpmg().isPresent() && p.isIdealAcquisition();
    }

    /**
     * @param p the protocol
     * @return true if the echo is the integral across a selected slice
     */
    public static boolean sliceSelective(Protocol p) {
        return p.acquisition().sliceSelective();
    }

    /**
     * The acquisition settings a fit used, for JSON summaries.
     *
     * @param p the protocol
     * @return ordered key/value pairs
     */
    public static Map<String, Object> describe(Protocol p) {
        Map<String, Object> m = new LinkedHashMap<>();
        m.put("protocol", p.name());
        m.put("echoes", p.echoCount());
        p.cpmg().ifPresent((CpmgTrain t) -> {
            m.put("echo_spacing_ms", t.echoSpacingMs());
            m.put("excitation_flip_deg", t.excitationFlipDeg());
            m.put("refocusing_flip_deg", t.refocusFlipDeg(0));
        });
        org.echotrellis.sequence.Acquisition a = p.acquisition();
        m.put("slice_selective", a.sliceSelective());
        a.excitationPulse().ifPresent(x -> m.put("excitation_pulse", x.label()));
        a.refocusingPulse().ifPresent(x -> m.put("refocusing_pulse", x.label()));
        if (a.sliceSelective()) {
            m.put("refocusing_width_ratio", a.refocusingWidthRatio());
        }
        m.put("repetition_ms", a.hasRepetition() ? a.repetitionMs() : null);
        a.crusher().ifPresent(c -> m.put("crusher", Map.of("cycles_per_mm", c.cyclesPerMm(), "duration_ms", c.durationMs())));
        m.put("diffusivity_mm2_per_s", p.tissue().diffusivityMm2PerS());
        m.put("model", plainCpmg(p) ? "ideal-pulse CPMG (exact EPG per evaluation)" : "whole acquisition, tabulated over T2 and B1");
        return m;
    }
}

package org.echotrellis.sequence;

import org.echotrellis.Checks;

/**
 * A tissue for simulation: relaxation times in ms (+Infinity means no relaxation) and the apparent
 * diffusion coefficient.
 *
 * @param name a name (preset name or free text; may be empty)
 * @param t1Ms longitudinal relaxation time T1 in ms
 * @param t2Ms transverse relaxation time T2 in ms
 * @param diffusivityMm2PerS apparent diffusion coefficient D in mm²/s (0 = no diffusion); it acts only
 *     where the protocol has a {@link Crusher}
 */
public record Tissue(String name, double t1Ms, double t2Ms, double diffusivityMm2PerS) {

    /** Largest accepted diffusivity in mm²/s (free water at body temperature is about 0.003). */
    public static final double MAX_DIFFUSIVITY_MM2_PER_S = 0.1;

    /**
     * Validates.
     *
     * @param name a name (preset name or free text; may be empty)
     * @param t1Ms longitudinal relaxation time T1 in ms
     * @param t2Ms transverse relaxation time T2 in ms
     * @param diffusivityMm2PerS apparent diffusion coefficient D in mm²/s (0 = no diffusion); it acts only

     *     where the protocol has a {@link Crusher}
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public Tissue {
        name = name == null ? "" : name;
        Checks.positiveOrInfinite("t1_ms", t1Ms, name);
        Checks.positiveOrInfinite("t2_ms", t2Ms, name);
        Checks.inRange("diffusivity_mm2_per_s", diffusivityMm2PerS, 0, MAX_DIFFUSIVITY_MM2_PER_S, name);
    }

    /**
     * A tissue without diffusion.
     *
     * @param name name
     * @param t1Ms T1 in ms
     * @param t2Ms T2 in ms
     */
    public Tissue(String name, double t1Ms, double t2Ms) {
        this(name, t1Ms, t2Ms, 0.0);
    }

    /**
     * @param t1 T1 in ms, &gt; 0 (+Infinity for no recovery)
     * @return a copy with another T1
     * @throws org.echotrellis.InputException if the value breaks the rules of the constructor
     */
    public Tissue withT1Ms(double t1) {
        return new Tissue(name, t1, t2Ms, diffusivityMm2PerS);
    }

    /**
     * @param t2 T2 in ms, &gt; 0 (+Infinity for no decay)
     * @return a copy with another T2
     * @throws org.echotrellis.InputException if the value breaks the rules of the constructor
     */
    public Tissue withT2Ms(double t2) {
        return new Tissue(name, t1Ms, t2, diffusivityMm2PerS);
    }

    /**
     * @param d apparent diffusion coefficient D in mm²/s, 0 for none
     * @return a copy with another diffusivity in mm²/s
     * @throws org.echotrellis.InputException if the value breaks the rules of the constructor
     */
    public Tissue withDiffusivityMm2PerS(double d) {
        return new Tissue(name, t1Ms, t2Ms, d);
    }
}

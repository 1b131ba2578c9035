package org.echotrellis.sequence;

import org.echotrellis.Checks;

/**
 * A tissue for simulation: relaxation times in ms (+Infinity means no relaxation).
 *
 * @param name a name (preset name or free text; may be empty)
 * @param t1Ms longitudinal relaxation time T1 in ms
 * @param t2Ms transverse relaxation time T2 in ms
 */
public record Tissue(String name, double t1Ms, double t2Ms) {

    /** Validates. */
    public Tissue {
        name = name == null ? "" : name;
        Checks.positiveOrInfinite("t1_ms", t1Ms, name);
        Checks.positiveOrInfinite("t2_ms", t2Ms, name);
    }

    /** @return a copy with another T1 */
    public Tissue withT1Ms(double t1) {
        return new Tissue(name, t1, t2Ms);
    }

    /** @return a copy with another T2 */
    public Tissue withT2Ms(double t2) {
        return new Tissue(name, t1Ms, t2);
    }
}

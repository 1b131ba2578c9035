package org.echotrellis.cli;

import org.echotrellis.InputException;
import org.echotrellis.sequence.Tissue;
import org.echotrellis.sequence.TissuePresets;

/** Parses a tissue option value: a preset name, or NAME:T1_MS:T2_MS (inf for no relaxation). */
final class TissueOption {
    private TissueOption() { }

    /**
     * @param spec option value
     * @param option option name for messages
     * @return the tissue
     */
    static Tissue parse(String spec, String option) {
        String s = spec == null ? "" : spec.trim();
        if (!s.contains(":")) {
            try {
                return TissuePresets.get(s);
            } catch (InputException e) {
                throw new InputException(option + " " + s + ": " + e.getMessage() + "; or give NAME:T1_MS:T2_MS", e);
            }
        }
        String[] p = s.split(":", -1);
        String allowed = option + " " + s + ": expected a preset or NAME:T1_MS:T2_MS with times > 0 (inf allowed)";
        if (p.length != 3 || p[0].isBlank()) {
            throw new InputException(allowed);
        }
        try {
            double t1 = time(p[1]);
            double t2 = time(p[2]);
            if (!(t1 > 0) || !(t2 > 0)) {
                throw new InputException(allowed);
            }
            return new Tissue(p[0].trim(), t1, t2);
        } catch (NumberFormatException e) {
            throw new InputException(allowed, e);
        }
    }

    private static double time(String v) {
        String t = v.trim();
        return t.equalsIgnoreCase("inf") ? Double.POSITIVE_INFINITY : Double.parseDouble(t);
    }
}

package org.echotrellis.cli;

import org.echotrellis.InputException;
import org.echotrellis.sequence.Tissue;
import org.echotrellis.sequence.TissuePresets;

/** A tissue given on the command line: a preset name, or {@code NAME:T1_MS:T2_MS}. */
final class TissueSpec {
    private TissueSpec() { }

    /**
     * @param option option name for messages
     * @param text a preset name or NAME:T1_MS:T2_MS (T1 and T2 &gt; 0, or inf)
     * @return the tissue
     */
    static Tissue parse(String option, String text) {
        String[] parts = text.split(":", -1);
        if (parts.length == 1) {
            try {
                return TissuePresets.get(text);
            } catch (InputException e) {
                throw new InputException(option + ": " + e.getMessage() + "; or give NAME:T1_MS:T2_MS", e);
            }
        }
        if (parts.length != 3 || parts[0].isBlank()) {
            throw new InputException(option + " must be a preset name or NAME:T1_MS:T2_MS, e.g. lesion:1400:120, got '"
                    + text + "'");
        }
        return new Tissue(parts[0].trim(), time(option, "T1_MS", parts[1], text), time(option, "T2_MS", parts[2], text));
    }

    private static double time(String option, String what, String value, String text) {
        String v = value.trim().toLowerCase(java.util.Locale.ROOT);
        double d;
        try {
            d = v.equals("inf") || v.equals("infinity") ? Double.POSITIVE_INFINITY : Double.parseDouble(v);
        } catch (NumberFormatException e) {
            d = Double.NaN;
        }
        if (!(d > 0)) {
            throw new InputException(option + " '" + text + "': " + what + " must be a number > 0 (or inf), got '"
                    + value + "'");
        }
        return d;
    }
}

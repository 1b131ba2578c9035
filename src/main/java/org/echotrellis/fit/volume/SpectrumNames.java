package org.echotrellis.fit.volume;

import java.util.ArrayList;
import java.util.List;
import org.echotrellis.fit.spectrum.FractionWindow;
import org.echotrellis.fit.spectrum.SpectrumFitter;
import org.echotrellis.fit.spectrum.SpectrumOptions;

/** Output names of the spectrum scalars (map file names, CSV columns, summary keys), in slot order. */
public final class SpectrumNames {
    private SpectrumNames() { }

    /**
     * @param o fit options (windows)
     * @return names indexed by the scalar slots of {@link SpectrumFitter}
     */
    public static List<String> scalars(SpectrumOptions o) {
        String[] fixed = new String[6];
        fixed[SpectrumFitter.REFOCUS_DEG] = "refocus_deg";
        fixed[SpectrumFitter.CHI2] = "chi2";
        fixed[SpectrumFitter.CHI2_UNREGULARISED] = "chi2_unregularised";
        fixed[SpectrumFitter.MU] = "regularisation_weight";
        fixed[SpectrumFitter.SNR] = "snr";
        fixed[SpectrumFitter.GM_T2_MS] = "gm_t2_ms";
        List<String> names = new ArrayList<>(List.of(fixed));
        for (FractionWindow w : o.windows()) {
            String tag = tag(w.loMs()) + "_" + tag(w.hiMs()) + "ms";
            names.add("fraction_" + tag);
            names.add("gm_t2_" + tag);
        }
        return names;
    }

    /**
     * @param v a number
     * @return the number as a file-name token: 10 → "10", 12.5 → "12p5"
     */
    static String tag(double v) {
        String s = v == Math.rint(v) ? Long.toString((long) v) : Double.toString(v);
        return s.replace('.', 'p');
    }

    /**
     * @param j bin index
     * @param t2Ms the bin's T2 in ms
     * @return the pipeline output name of bin j (one 3-D map, assembled into spectrum.nii.gz)
     */
    public static String binOutput(int j, double t2Ms) {
        return String.format(java.util.Locale.ROOT, "spectrum_%03d_%s", j, bin(t2Ms));
    }

    /**
     * @param t2Ms the bin's T2 in ms
     * @return the short label of a bin, e.g. "t2_10.00ms"
     */
    public static String bin(double t2Ms) {
        return String.format(java.util.Locale.ROOT, "t2_%.4gms", t2Ms);
    }
}

package org.echotrellis.sequence;

import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import org.echotrellis.InputException;

/**
 * A small table of human tissue relaxation times at 1.5 T and 3 T for {@code tissue: {preset: NAME}}.
 *
 * <p>Sources. Values marked "Stanisz 2005" are the means of G. J. Stanisz et al., "T1, T2 relaxation
 * and magnetization transfer in tissue at 3T", Magn Reson Med 54:507 (2005) (in vitro, 37 &deg;C) —
 * recalled from the literature (from memory), widely reproduced. Values marked "Gold 2004" are in-vivo
 * knee means of G. E. Gold et al., "Musculoskeletal MRI at 3.0 T: relaxation times and image
 * contrast", AJR 183:343 (2004) — from memory, lower confidence. Relaxation times vary with method
 * and subject (Bojorquez et al., Magn Reson Imaging 35:69, 2017); the presets are planning values.
 *
 * <p>CSF and fat: {@code csf_*} are round typical values of cerebrospinal fluid (T1 about 4 s, T2
 * about 2 s; free water near body temperature) and {@code fat_*} of subcutaneous adipose tissue as
 * one mono-exponential component (its methylene resonances really relax with several T2s) — from
 * memory, no single source; use them to show contrast, not to quantify.
 */
public final class TissuePresets {
    private static final Map<String, Tissue> PRESETS = new LinkedHashMap<>();
    private static final Map<String, String> SOURCES = new LinkedHashMap<>();

    static {
        String st = "Stanisz 2005 (from memory)";
        add("white_matter_1p5t", 884, 72, st);
        add("white_matter_3t", 1084, 69, st);
        add("grey_matter_1p5t", 1124, 95, st);
        add("grey_matter_3t", 1820, 99, st);
        add("optic_nerve_3t", 1083, 78, st);
        add("spinal_cord_3t", 993, 78, st);
        add("skeletal_muscle_1p5t", 1008, 44, st);
        add("skeletal_muscle_3t", 1412, 50, st);
        add("heart_1p5t", 1030, 40, st);
        add("heart_3t", 1471, 47, st);
        add("liver_1p5t", 576, 46, st);
        add("liver_3t", 812, 42, st);
        add("kidney_1p5t", 690, 55, st);
        add("kidney_3t", 1194, 56, st);
        add("cartilage_1p5t", 1024, 30, st);
        add("cartilage_3t", 1168, 27, st);
        add("blood_1p5t", 1441, 290, st);
        add("blood_3t", 1932, 275, st);
        String gold = "Gold 2004, in vivo knee (from memory)";
        add("knee_cartilage_1p5t", 1060, 42, gold);
        add("knee_cartilage_3t", 1240, 37, gold);
        add("knee_muscle_3t", 1420, 32, gold);
        add("synovial_fluid_3t", 3620, 767, gold);
        add("marrow_3t", 371, 49, gold);
        add("subcutaneous_fat_3t", 382, 68, gold);
        String typical = "typical value, from memory, no single source";
        add("csf_1p5t", 4000, 2000, typical);
        add("csf_3t", 4200, 2000, typical);
        add("fat_1p5t", 260, 80, typical);
        add("fat_3t", 380, 70, typical);
    }

    private TissuePresets() { }

    private static void add(String name, double t1, double t2, String source) {
        PRESETS.put(name, new Tissue(name, t1, t2));
        SOURCES.put(name, source);
    }

    /**
     * @param name preset name
     * @return the tissue
     * @throws InputException naming the allowed presets if unknown
     */
    public static Tissue get(String name) {
        Tissue t = PRESETS.get(name);
        if (t == null) {
            throw new InputException("unknown tissue preset '" + name + "'; allowed: " + String.join(", ", PRESETS.keySet()));
        }
        return t;
    }

    /** @return preset names in table order */
    public static List<String> names() {
        return List.copyOf(PRESETS.keySet());
    }

    /**
     * @param name preset name
     * @return the source of a preset's values
     * @throws org.echotrellis.InputException if no preset has that name
     */
    public static String source(String name) {
        get(name);
        return SOURCES.get(name);
    }

    /** @return all presets, unmodifiable */
    public static Map<String, Tissue> all() {
        return Collections.unmodifiableMap(PRESETS);
    }
}

package org.echotrellis.fit.volume;

/** The unit of each map a volume analysis writes, for NIfTI {@code descrip} fields and sidecars. */
final class MapUnits {
    private MapUnits() { }

    /**
     * @param name a map name of {@link VolumeAnalysis#mapNames()}
     * @return its unit, e.g. {@code ms}, {@code B1 scale (1 = nominal)}, {@code fraction 0-1}
     */
    public static String unit(String name) {
        if (name.startsWith("fraction_")) {
            return "fraction 0-1";
        }
        if (name.endsWith("ms")) {
            return "ms";
        }
        switch (name) {
            case "b1_scale": return "B1 scale (1 = nominal)";
            case "b1_se": return "B1 scale";
            case "refocus_deg": return "deg";
            case "chi2":
            case "chi2_unregularised": return "signal squared";
            case "snr": return "ratio";
            case "regularisation_weight": return "dimensionless";
            default: return "signal units";
        }
    }
}

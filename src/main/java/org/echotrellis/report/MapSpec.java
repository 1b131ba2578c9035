package org.echotrellis.report;

/**
 * One map of a volume report.
 *
 * @param name output name, e.g. {@code t2_ms}
 * @param title readable title, e.g. "T2"
 * @param unit colour-bar and histogram axis label with unit, e.g. "T2 (ms)"
 * @param rangeGroup maps with the same group share one display range (comparable maps, e.g. EPG
 *        and mono-exponential T2); null for a range of its own
 * @param lower fixed first-colour value, or NaN for the 2nd percentile of the group
 * @param upper fixed last-colour value, or NaN for the 98th percentile of the group
 */
public record MapSpec(String name, String title, String unit, String rangeGroup, double lower, double upper) {
    /**
     * A map with a display range from its own (or its group's) 2nd–98th percentiles.
     *
     * @param name output name
     * @param title title
     * @param unit label with unit
     * @param rangeGroup shared-range group or null
     * @return the spec
     */
    public static MapSpec of(String name, String title, String unit, String rangeGroup) {
        return new MapSpec(name, title, unit, rangeGroup, Double.NaN, Double.NaN);
    }

    /** @return the key of the display range: the group, or the map's own name */
    String rangeKey() {
        return rangeGroup != null ? rangeGroup : "map:" + name;
    }
}

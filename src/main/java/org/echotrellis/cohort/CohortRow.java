package org.echotrellis.cohort;

import java.io.Serializable;
import java.util.ArrayList;
import java.util.List;

import org.echotrellis.io.RegionStatistics;

/**
 * One row of the cohort table: one map of one collection (subject, session, acquisition, run)
 * summarised inside one region.
 *
 * @param subject participant label (without {@code sub-})
 * @param session session label, empty if the dataset has none
 * @param acquisition {@code acq} label, empty if none
 * @param run {@code run} label, empty if none
 * @param map map name as in the derivative file name (e.g. {@code T2map})
 * @param units unit of the map values as written (e.g. {@code s})
 * @param stats the statistics of the region
 * @serial exclude
 */
public record CohortRow(String subject, String session, String acquisition, String run, String map, String units,
                        RegionStatistics stats) implements Serializable {
    private static final long serialVersionUID = 1L;

    /** Column names of the cohort table, in order. */
    public static final List<String> COLUMNS = List.of("subject", "session", "acquisition", "run", "map", "units",
            "label", "voxels", "mean", "sd", "p5", "p25", "p50", "p75", "p95");

    /** @return the values in {@link #COLUMNS} order (numbers as Long/Double, NaN kept) */
    public List<Object> values() {
        RegionStatistics s = stats;
        List<Object> v = new ArrayList<>(COLUMNS.size());
        v.add(subject);
        v.add(session);
        v.add(acquisition);
        v.add(run);
        v.add(map);
        v.add(units);
        v.add(s.region());
        v.add(s.voxels());
        v.add(s.mean());
        v.add(s.sd());
        v.add(s.p5());
        v.add(s.p25());
        v.add(s.p50());
        v.add(s.p75());
        v.add(s.p95());
        return v;
    }

    /**
     * Parses the values written by {@link CsvText#row} for a row of this table.
     *
     * @param f the fields in {@link #COLUMNS} order
     * @return the row
     */
    static CohortRow parse(List<String> f) {
        if (f.size() != COLUMNS.size()) {
            throw new IllegalArgumentException("expected " + COLUMNS.size() + " fields, got " + f.size());
        }
        RegionStatistics s = new RegionStatistics(f.get(6), Long.parseLong(f.get(7)), num(f.get(8)), num(f.get(9)),
                num(f.get(10)), num(f.get(11)), num(f.get(12)), num(f.get(13)), num(f.get(14)));
        return new CohortRow(f.get(0), f.get(1), f.get(2), f.get(3), f.get(4), f.get(5), s);
    }

    private static double num(String s) {
        return s.isEmpty() ? Double.NaN : Double.parseDouble(s);
    }
}

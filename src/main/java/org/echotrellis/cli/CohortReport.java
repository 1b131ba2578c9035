package org.echotrellis.cli;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;
import org.echotrellis.cohort.CohortFailure;
import org.echotrellis.cohort.CohortResult;
import org.echotrellis.cohort.CohortRow;
import org.echotrellis.io.RegionStatistics;
import org.echotrellis.report.Report;

/**
 * The sections of a cohort's HTML report: headline numbers, the distribution of subject medians per
 * map and label across the cohort, the cohort table as written, and the failures.
 */
final class CohortReport {
    private CohortReport() { }

    static void sections(Report page, CohortResult r) {
        page.section("Cohort").paragraph(String.format(Locale.ROOT,
                "%d subject/session units processed, %d skipped (complete from an earlier run), %d failed; "
                        + "%d voxels in %.1f s (%.0f voxels/s); %d table rows.",
                r.processed(), r.skipped(), r.failures().size(), r.voxels(), r.seconds(), r.voxelsPerSecond(),
                r.rows().size()));
        Map<String, List<Double>> medians = new TreeMap<>();
        for (CohortRow row : r.rows()) {
            if (row.stats().voxels() > 0) {
                medians.computeIfAbsent(row.map() + " (" + row.units() + "), region " + row.stats().region(),
                        k -> new ArrayList<>()).add(row.stats().p50());
            }
        }
        List<List<Object>> across = new ArrayList<>();
        for (Map.Entry<String, List<Double>> e : medians.entrySet()) {
            double[] v = e.getValue().stream().mapToDouble(Double::doubleValue).sorted().toArray();
            RegionStatistics st = RegionStatistics.of(e.getKey(), v);
            across.add(Arrays.asList(e.getKey(), st.voxels(), num(st.p50()), num(st.p5()) + " – " + num(st.p95()),
                    num(v[0]) + " – " + num(v[v.length - 1])));
        }
        page.section("Across subjects").table("Subject medians per map and region: their median, 5–95th "
                        + "percentiles and range across the cohort",
                List.of("map, region", "subjects", "median of medians", "5–95th percentile", "range"), across);
        List<List<Object>> rows = new ArrayList<>();
        for (CohortRow row : r.rows()) {
            RegionStatistics s = row.stats();
            rows.add(Arrays.asList(row.subject(), row.session(), row.acquisition(), row.run(), row.map(), row.units(),
                    s.region(), s.voxels(), num(s.mean()), num(s.sd()), num(s.p5()), num(s.p25()), num(s.p50()),
                    num(s.p75()), num(s.p95())));
        }
        page.section("Cohort table").table("One row per subject, session, label and map (as in cohort-table.csv)",
                List.of("subject", "session", "acq", "run", "map", "units", "region", "voxels", "mean", "sd", "p5",
                        "p25", "p50", "p75", "p95"), rows);
        List<List<Object>> fails = new ArrayList<>();
        for (CohortFailure f : r.failures()) {
            fails.add(Arrays.asList(f.subject(), f.session(), f.stage(), f.message()));
        }
        page.section("Failures").table(fails.isEmpty() ? "No unit failed" : "Units that failed (as in cohort-failures.csv)",
                List.of("subject", "session", "stage", "message"), fails);
    }

    private static String num(double v) {
        return Double.isNaN(v) ? "-" : String.format(Locale.ROOT, "%.4g", v);
    }
}

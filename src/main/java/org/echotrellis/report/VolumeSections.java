package org.echotrellis.report;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.HashMap;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.RunSummary;
import org.echotrellis.io.VolumeResult;
import org.echotrellis.io.VoxelStatus;
import org.echotrellis.plot.HistogramChart;
import org.jfree.chart.JFreeChart;

/**
 * The report sections every volume command shares: headline numbers (voxels per status, run time,
 * voxels/s, median and quartiles of chosen maps), montages of every slice of each map with a
 * colour bar ({@link Montage}), and histograms of each map over the fitted voxels. Display ranges
 * are the 2nd–98th percentiles over fitted voxels of all maps in a range group (from a stride
 * sample of at most {@value #RANGE_SAMPLE} values per map), so comparable maps share colours.
 */
public final class VolumeSections {
    /** Values per map used for display-range percentiles. */
    static final int RANGE_SAMPLE = 200_000;
    /** Histogram bins. */
    static final int BINS = 60;
    /** Whether each status code carries fitted values ({@link VoxelStatus#fitted()}), by code. */
    private static final boolean[] FITTED = new boolean[256];

    static {
        for (VoxelStatus s : VoxelStatus.values()) {
            FITTED[s.code()] = s.fitted();
        }
    }

    private VolumeSections() { }

    /**
     * Adds "Headline numbers": status counts, run time, throughput and per headline map the median
     * and quartiles over fitted voxels (exact).
     *
     * @param r the report
     * @param res the volume result
     * @param headline maps to summarise
     * @return the section (callers may add more facts)
     */
    public static Section headline(Report r, VolumeResult res, List<MapSpec> headline) {
        Section s = r.section("Headline numbers");
        Map<String, Object> f = new LinkedHashMap<>();
        NiftiHeader h = res.mapHeader();
        f.put("grid (x × y × z)", h.size(1) + " × " + h.size(2) + " × " + h.size(3));
        f.put("voxels in the mask", res.processed());
        f.put("run time (s)", res.seconds());
        f.put("voxels per second", res.voxelsPerSecond());
        byte[] status = res.status();
        for (MapSpec m : headline) {
            float[] v = fitted(res.map(m.name()), status);
            Arrays.parallelSort(v);
            double[] d = new double[v.length];
            for (int i = 0; i < v.length; i++) {
                d[i] = v[i];
            }
            f.put("median " + m.unit(), RunSummary.percentile(d, 50));
            f.put("interquartile range " + m.unit(), String.format(Locale.ROOT, "%s – %s",
                    Html.num(RunSummary.percentile(d, 25)), Html.num(RunSummary.percentile(d, 75))));
        }
        s.facts(f);
        List<List<?>> rows = new ArrayList<>();
        long total = status.length;
        long[] counts = new long[256];
        for (byte b : status) {
            counts[b & 0xff]++;
        }
        for (VoxelStatus st : VoxelStatus.values()) {
            long n = counts[st.code()];
            rows.add(List.of(st.code(), st.label(), n, total > 0 ? 100.0 * n / total : Double.NaN));
        }
        s.table("Voxels per status", List.of("code", "status", "voxels", "% of grid"), rows);
        return s;
    }

    /**
     * Display ranges per range group.
     *
     * @param res the volume result
     * @param maps the maps
     * @return {lower, upper} per map name
     */
    public static Map<String, double[]> ranges(VolumeResult res, List<MapSpec> maps) {
        byte[] status = res.status();
        Map<String, List<float[]>> samples = new HashMap<>();
        for (MapSpec m : maps) {
            samples.computeIfAbsent(m.rangeKey(), k -> new ArrayList<>()).add(sample(res.map(m.name()), status));
        }
        Map<String, double[]> groupRange = new HashMap<>();
        samples.forEach((k, list) -> {
            int n = 0;
            for (float[] a : list) {
                n += a.length;
            }
            float[] all = new float[n];
            int o = 0;
            for (float[] a : list) {
                System.arraycopy(a, 0, all, o, a.length);
                o += a.length;
            }
            Arrays.sort(all);
            groupRange.put(k, n == 0 ? new double[] {0, 1}
                    : new double[] {all[(int) Math.round(0.02 * (n - 1))], all[(int) Math.round(0.98 * (n - 1))]});
        });
        Map<String, double[]> out = new LinkedHashMap<>();
        for (MapSpec m : maps) {
            double[] g = groupRange.get(m.rangeKey());
            out.put(m.name(), new double[] {Double.isNaN(m.lower()) ? g[0] : m.lower(), Double.isNaN(m.upper()) ? g[1] : m.upper()});
        }
        return out;
    }

    /**
     * Adds "Maps": one montage of every slice per map, with its colour bar.
     *
     * @param r the report
     * @param res the volume result
     * @param maps the maps, in order
     * @param ranges display ranges from {@link #ranges}
     */
    public static void montages(Report r, VolumeResult res, List<MapSpec> maps, Map<String, double[]> ranges) {
        Section s = r.section("Maps, every slice");
        NiftiHeader h = res.mapHeader();
        s.paragraph(String.format(Locale.ROOT, "Slices z = 0 … %d, y upwards; voxels outside the mask or without a "
                + "fit are dark grey. Maps in the same range group share one colour range (2nd–98th percentile of "
                + "the fitted voxels unless stated).", h.size(3) - 1));
        Montage montage = Montage.forGrid(h.size(1), h.size(2), h.size(3), maps.size());
        for (MapSpec m : maps) {
            double[] range = ranges.get(m.name());
            montage.add(s.subsection(m.title()), res.map(m.name()), m, range[0], range[1]);
        }
    }

    /**
     * Adds one montage with its colour bar to a section, for maps that are not in a {@link VolumeResult}.
     *
     * @param s the section
     * @param map the 3-D map, x fastest (not modified); NaN is drawn dark grey
     * @param nx x size
     * @param ny y size
     * @param nz slices
     * @param spec title and unit
     * @param lower first-colour value
     * @param upper last-colour value
     * @param mapsInReport montages planned in the whole report (for the pixel budget)
     */
    public static void montage(Section s, float[] map, int nx, int ny, int nz, MapSpec spec, double lower, double upper,
            int mapsInReport) {
        Montage.forGrid(nx, ny, nz, mapsInReport).add(s, map, spec, lower, upper);
    }

    /**
     * Adds "Histograms": each map over the fitted voxels, on its display range.
     *
     * @param r the report
     * @param res the volume result
     * @param maps the maps
     * @param ranges display ranges from {@link #ranges}
     */
    public static void histograms(Report r, VolumeResult res, List<MapSpec> maps, Map<String, double[]> ranges) {
        Section s = r.section("Histograms inside the mask");
        s.paragraph("Fitted voxels only, from the 0.1st to the 99.9th percentile (at least the colour range of the "
                + "map); values beyond are counted in the first or last bin.");
        byte[] status = res.status();
        List<JFreeChart> charts = new ArrayList<>();
        List<String> alts = new ArrayList<>();
        for (MapSpec m : maps) {
            float[] v = fitted(res.map(m.name()), status);
            double[] range = ranges.get(m.name());
            float[] sorted = sample(v);
            Arrays.sort(sorted);
            double lo = range[0];
            double hi = range[1];
            if (sorted.length > 0) {
                lo = Math.min(lo, sorted[(int) Math.round(0.001 * (sorted.length - 1))]);
                hi = Math.max(hi, sorted[(int) Math.round(0.999 * (sorted.length - 1))]);
            }
            hi = hi > lo ? hi : lo + 1;
            long[] c = HistogramChart.counts(v, lo, hi, BINS);
            long finite = v.length;
            String sub = String.format(Locale.ROOT, "%d voxels, range %s – %s", finite, Html.num(lo), Html.num(hi));
            charts.add(HistogramChart.chart(m.title(), sub, m.unit(), lo, hi, c));
            alts.add("Histogram of " + m.title() + " over " + finite + " fitted voxels");
        }
        s.charts(charts, alts, 640, 300);
    }

    /**
     * @param code a status code
     * @return whether the voxel carries fitted values
     */
    static boolean fitted(byte code) {
        return FITTED[code & 0xff];
    }

    /** Finite values at fitted voxels. */
    static float[] fitted(float[] map, byte[] status) {
        float[] v = new float[map.length];
        int n = 0;
        for (int i = 0; i < map.length; i++) {
            if (FITTED[status[i] & 0xff] && Float.isFinite(map[i])) {
                v[n++] = map[i];
            }
        }
        return Arrays.copyOf(v, n);
    }

    private static float[] sample(float[] map, byte[] status) {
        return sample(fitted(map, status));
    }

    /** @return at most {@link #RANGE_SAMPLE} values taken with an even stride (a copy when shorter) */
    private static float[] sample(float[] v) {
        if (v.length <= RANGE_SAMPLE) {
            return v.clone();
        }
        float[] s = new float[RANGE_SAMPLE];
        double step = (double) v.length / RANGE_SAMPLE;
        for (int i = 0; i < RANGE_SAMPLE; i++) {
            s[i] = v[(int) (i * step)];
        }
        return s;
    }
}

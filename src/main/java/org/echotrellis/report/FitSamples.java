package org.echotrellis.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import java.util.Optional;
import org.echotrellis.fit.T2Estimate;
import org.echotrellis.fit.T2Fit;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.NiftiImage;
import org.echotrellis.io.NiftiInput;
import org.echotrellis.io.VolumeResult;
import org.echotrellis.plot.LineChart;
import org.jfree.chart.JFreeChart;

/**
 * The "Sample decays" section of a T2-fit report: the measured decays and fitted curves of three
 * typical voxels (T2 nearest the 10th, 50th and 90th percentiles of the OK voxels) and of the three
 * voxels with the largest residual relative to their amplitude. Only the slices holding these
 * voxels are read again; each is fitted again with the run's settings to draw its curve.
 */
final class FitSamples {
    /** Worst-residual voxels shown. */
    static final int WORST = 3;

    private FitSamples() { }

    /**
     * @param r the report
     * @param res the fit result (maps t2_ms, amplitude, residual_rms)
     * @param in the open echo series the result came from
     * @param b1Map the B1 map used, if any
     * @param factory the run's fit factory (settings incl. noise σ)
     */
    public static void add(Report r, VolumeResult res, NiftiInput in, Optional<NiftiImage> b1Map, T2Fit.Factory factory) {
        byte[] status = res.status();
        List<VoxelPicks.Pick> picks = new ArrayList<>(VoxelPicks.typical(res.map("t2_ms"), status, new double[] {10, 50, 90}));
        float[] amp = res.map("amplitude");
        float[] rel = res.map("residual_rms");
        for (int i = 0; i < rel.length; i++) {
            rel[i] = amp[i] > 0 ? rel[i] / amp[i] : Float.NaN;
        }
        picks.addAll(VoxelPicks.worst(rel, status, WORST, "largest residual / amplitude"));
        Section s = r.section("Sample decays and fitted curves");
        if (picks.isEmpty()) {
            s.paragraph("No fitted voxels to show.");
            return;
        }
        NiftiHeader h = in.header();
        int nx = h.size(1);
        int ny = h.size(2);
        int echoes = h.volumes();
        double[] slab = new double[nx * ny * echoes];
        double[] times = new double[echoes];
        for (int e = 0; e < echoes; e++) {
            times[e] = factory.settings().train().echoTimeMs(e + 1);
        }
        T2Fit fit = factory.newKernel();
        List<List<?>> rows = new ArrayList<>();
        List<JFreeChart> charts = new ArrayList<>();
        List<String> alts = new ArrayList<>();
        int loaded = -1;
        for (VoxelPicks.Pick p : picks) {
            int z = p.index() / (nx * ny);
            int inSlice = p.index() - z * nx * ny;
            if (z != loaded) {
                in.readSlab(z, 1, slab);
                loaded = z;
            }
            double[] decay = new double[echoes];
            System.arraycopy(slab, inSlice * echoes, decay, 0, echoes);
            double b1 = b1Map.map(m -> m.get(p.index())).orElse(Double.NaN);
            T2Estimate est = fit.estimate(decay, b1);
            double[][] curves = fit.curves(est);
            String where = String.format(Locale.ROOT, "voxel (%d, %d, %d)", inSlice % nx, inSlice / nx, z);
            LineChart c = LineChart.create(where + ": " + p.role(), "echo time (ms)", "signal (data units)")
                    .subtitle(String.format(Locale.ROOT, "T2 = %s ms, B1 = %s, residual rms = %s, status %s",
                            Html.num(est.t2Ms()), Html.num(est.b1Scale()), Html.num(est.residualRms()), est.status().label()))
                    .add("measured", times, decay, LineChart.Look.MARKERS);
            if (finite(curves[0])) {
                c.add("EPG fit", times, curves[0], LineChart.Look.LINE);
            }
            if (finite(curves[1])) {
                c.add("mono-exponential fit", times, curves[1], LineChart.Look.DASHED);
            }
            charts.add(c.build());
            alts.add("Decay of " + where + " (" + p.role() + ") with the fitted curve");
            rows.add(List.of(p.role(), inSlice % nx, inSlice / nx, z, est.t2Ms(), est.b1Scale(), est.amplitude(),
                    est.residualRms(), est.status().label()));
        }
        s.charts(charts, alts, 640, 340);
        s.table("Voxels shown", List.of("why", "x", "y", "z", "T2 (ms)", "B1", "amplitude", "residual rms", "status"), rows);
    }

    private static boolean finite(double[] v) {
        for (double x : v) {
            if (!Double.isFinite(x)) {
                return false;
            }
        }
        return v.length > 0;
    }
}

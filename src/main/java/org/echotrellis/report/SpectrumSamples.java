package org.echotrellis.report;

import java.util.ArrayList;
import java.util.List;
import java.util.Locale;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.VolumeResult;
import org.echotrellis.plot.SpectrumPlot;

/**
 * The "Spectra" section of a T2-spectrum report: the mean spectrum over the fitted voxels and the
 * spectra of three typical voxels (by a chosen map, nearest its 10th, 50th and 90th percentiles)
 * and of the two voxels with the largest misfit.
 */
public final class SpectrumSamples {
    private SpectrumSamples() { }

    /**
     * @param r the report
     * @param res the spectrum result
     * @param t2Ms bin centres in ms
     * @param binNames output name of each bin's map, same order
     * @param typicalBy map used to choose typical voxels, e.g. a geometric-mean T2
     * @param worstBy map whose largest values mark the worst voxels, e.g. the misfit χ²
     * @param windowsMs shaded T2 windows as {lo, hi} pairs
     */
    public static void add(Report r, VolumeResult res, double[] t2Ms, List<String> binNames, String typicalBy,
            String worstBy, List<double[]> windowsMs) {
        Section s = r.section("Spectra");
        byte[] status = res.status();
        int bins = t2Ms.length;
        double[] mean = new double[bins];
        long n = 0;
        float[][] maps = new float[bins][];
        for (int j = 0; j < bins; j++) {
            maps[j] = res.map(binNames.get(j));
        }
        for (int i = 0; i < status.length; i++) {
            if (VolumeSections.fitted(status[i]) && Float.isFinite(maps[0][i])) {
                n++;
                for (int j = 0; j < bins; j++) {
                    mean[j] += maps[j][i];
                }
            }
        }
        for (int j = 0; j < bins; j++) {
            mean[j] = n > 0 ? mean[j] / n : Double.NaN;
        }
        s.chart(SpectrumPlot.chart("Mean spectrum", n + " fitted voxels", t2Ms, List.of("mean of fitted voxels"),
                List.of(mean), windowsMs), 720, 380, "Mean T2 spectrum over " + n + " fitted voxels");
        List<VoxelPicks.Pick> picks = new ArrayList<>(VoxelPicks.typical(res.map(typicalBy), status, new double[] {10, 50, 90}));
        picks.addAll(VoxelPicks.worst(res.map(worstBy), status, 2, "largest " + worstBy));
        if (picks.isEmpty()) {
            return;
        }
        NiftiHeader h = res.mapHeader();
        int nx = h.size(1);
        int ny = h.size(2);
        List<String> names = new ArrayList<>();
        List<double[]> amps = new ArrayList<>();
        for (VoxelPicks.Pick p : picks) {
            int v = p.index();
            double[] a = new double[bins];
            for (int j = 0; j < bins; j++) {
                a[j] = maps[j][v];
            }
            names.add(String.format(Locale.ROOT, "(%d, %d, %d) %s", v % nx, (v / nx) % ny, v / (nx * ny), p.role()));
            amps.add(a);
        }
        s.chart(SpectrumPlot.chart("Voxel spectra", "typical voxels by " + typicalBy + "; worst by " + worstBy, t2Ms,
                names, amps, windowsMs), 720, 420, "T2 spectra of " + picks.size() + " sample voxels: " + String.join("; ", names));
    }
}

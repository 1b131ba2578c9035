package org.echotrellis.io;

import java.io.Serializable;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.TreeMap;

import org.echotrellis.InputException;

/**
 * Summary statistics of one map inside one region (a label of a segmentation, or the whole mask):
 * voxel count, mean, sample standard deviation and the 5th, 25th, 50th, 75th and 95th percentiles
 * over voxels that carry a fitted value ({@link VoxelStatus#fitted()}) that is finite. Percentiles
 * interpolate linearly between closest ranks ({@link RunSummary#percentile}, common practice).
 *
 * @param region the label value as text, or {@link #WHOLE_MASK}
 * @param voxels voxels summarised
 * @param mean arithmetic mean (NaN for no voxels)
 * @param sd sample standard deviation, n − 1 in the denominator (NaN for fewer than two voxels)
 * @param p5 5th percentile
 * @param p25 25th percentile
 * @param p50 median
 * @param p75 75th percentile
 * @param p95 95th percentile
 * @serial exclude
 */
public record RegionStatistics(String region, long voxels, double mean, double sd, double p5, double p25, double p50,
                               double p75, double p95) implements Serializable {
    private static final long serialVersionUID = 1L;

    /** Region name used when no label image is given. */
    public static final String WHOLE_MASK = "mask";

    /**
     * Statistics of sorted values.
     *
     * @param region region name
     * @param sorted values in ascending order (not modified)
     * @return the statistics
     */
    public static RegionStatistics of(String region, double[] sorted) {
        int n = sorted.length;
        double sum = 0;
        for (double x : sorted) {
            sum += x;
        }
        double mean = n > 0 ? sum / n : Double.NaN;
        // two-pass variance: no cancellation from a large mean (common practice)
        double ss = 0;
        for (double x : sorted) {
            ss += (x - mean) * (x - mean);
        }
        double sd = n > 1 ? Math.sqrt(ss / (n - 1)) : Double.NaN;
        return new RegionStatistics(region, n, mean, sd, RunSummary.percentile(sorted, 5),
                RunSummary.percentile(sorted, 25), RunSummary.percentile(sorted, 50),
                RunSummary.percentile(sorted, 75), RunSummary.percentile(sorted, 95));
    }

    /**
     * Statistics of one map per region: one entry for the whole mask without labels, else one per
     * label value &gt; 0 in ascending order (label 0 and NaN are background).
     *
     * @param map the map values per voxel (not modified)
     * @param status status code per voxel ({@link VoxelStatus#code()}; not modified)
     * @param labels label value per voxel on the same grid, or null; values must be whole numbers
     * @param labelSource names the label image in messages
     * @return statistics per region
     * @throws InputException if the grids differ or a label is not a whole number
     */
    public static List<RegionStatistics> perRegion(float[] map, byte[] status, float[] labels, String labelSource) {
        if (status.length != map.length || (labels != null && labels.length != map.length)) {
            throw new InputException(labelSource + ": " + (labels == null ? status.length : labels.length)
                    + " voxels, but the maps have " + map.length + " (the label image must be on the data grid)");
        }
        if (labels == null) {
            return List.of(of(WHOLE_MASK, fittedValues(map, status, null, 0)));
        }
        TreeMap<Integer, Integer> counts = new TreeMap<>();
        for (int i = 0; i < labels.length; i++) {
            float l = labels[i];
            if (Float.isNaN(l) || l == 0) {
                continue;
            }
            if (l != Math.rint(l) || Math.abs(l) > Integer.MAX_VALUE) {
                throw new InputException(labelSource + ": label value " + l + " at voxel " + i
                        + " is not a whole number (a segmentation holds integer labels)");
            }
            counts.merge((int) l, 1, Integer::sum);
        }
        List<RegionStatistics> out = new ArrayList<>(counts.size());
        for (int label : counts.keySet()) {
            out.add(of(Integer.toString(label), fittedValues(map, status, labels, label)));
        }
        return out;
    }

    /** Sorted finite values of fitted voxels, restricted to one label when labels are given. */
    private static double[] fittedValues(float[] map, byte[] status, float[] labels, int label) {
        double[] v = new double[map.length];
        int n = 0;
        for (int i = 0; i < map.length; i++) {
            if ((labels == null || labels[i] == label) && VoxelStatus.ofCode(status[i]).fitted()
                    && Float.isFinite(map[i])) {
                v[n++] = map[i];
            }
        }
        v = Arrays.copyOf(v, n);
        Arrays.sort(v);
        return v;
    }
}

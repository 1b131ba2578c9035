package org.echotrellis.report;

import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import org.echotrellis.io.VoxelStatus;

/**
 * Chooses the few voxels a report shows in detail, in one pass each: typical voxels (status OK,
 * value nearest to given percentiles of a map) and the worst voxels (largest score among fitted
 * voxels). Percentiles come from a stride sample of at most {@value VolumeSections#RANGE_SAMPLE} values.
 */
final class VoxelPicks {
    private VoxelPicks() { }

    /** A chosen voxel and why. */
    record Pick(int index, String role) { }

    /**
     * @param map the map (not modified)
     * @param status status codes
     * @param percentiles e.g. {25, 50, 75}
     * @return one OK voxel per percentile (nearest value), without repeats
     */
    static List<Pick> typical(float[] map, byte[] status, double[] percentiles) {
        float[] ok = new float[map.length];
        int n = 0;
        int stride = Math.max(1, map.length / (4 * VolumeSections.RANGE_SAMPLE));
        for (int i = 0; i < map.length; i += stride) {
            if (status[i] == VoxelStatus.OK.code() && Float.isFinite(map[i])) {
                ok[n++] = map[i];
            }
        }
        List<Pick> picks = new ArrayList<>();
        if (n == 0) {
            return picks;
        }
        float[] sorted = Arrays.copyOf(ok, n);
        Arrays.sort(sorted);
        for (double p : percentiles) {
            double target = sorted[(int) Math.round(p / 100 * (n - 1))];
            int best = -1;
            double gap = Double.POSITIVE_INFINITY;
            for (int i = 0; i < map.length; i++) {
                if (status[i] == VoxelStatus.OK.code() && Math.abs(map[i] - target) < gap && !taken(picks, i)) {
                    gap = Math.abs(map[i] - target);
                    best = i;
                }
            }
            if (best >= 0) {
                picks.add(new Pick(best, "typical (near the " + (int) p + "th percentile)"));
            }
        }
        return picks;
    }

    /**
     * @param score score per voxel, larger is worse (not modified)
     * @param status status codes
     * @param count how many
     * @param role label of the picks
     * @return the fitted voxels with the largest finite scores, worst first
     */
    static List<Pick> worst(float[] score, byte[] status, int count, String role) {
        int[] idx = new int[count];
        float[] val = new float[count];
        Arrays.fill(idx, -1);
        Arrays.fill(val, Float.NEGATIVE_INFINITY);
        for (int i = 0; i < score.length; i++) {
            float s = score[i];
            if (Float.isFinite(s) && s > val[count - 1] && VolumeSections.fitted(status[i])) {
                int k = count - 1;
                while (k > 0 && val[k - 1] < s) {
                    val[k] = val[k - 1];
                    idx[k] = idx[k - 1];
                    k--;
                }
                val[k] = s;
                idx[k] = i;
            }
        }
        List<Pick> picks = new ArrayList<>();
        for (int i : idx) {
            if (i >= 0) {
                picks.add(new Pick(i, role));
            }
        }
        return picks;
    }

    private static boolean taken(List<Pick> picks, int i) {
        for (Pick p : picks) {
            if (p.index() == i) {
                return true;
            }
        }
        return false;
    }
}

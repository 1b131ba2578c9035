package org.echotrellis.io;

import java.nio.file.Path;
import java.util.Map;

import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.databind.node.ObjectNode;

/**
 * Writes {@code summary.json} for a volume job: the settings given by the caller, voxel counts per
 * status, run time, voxels per second, and per map the count, mean and the 5th, 25th, 50th, 75th
 * and 95th percentiles over fitted voxels. Non-finite numbers are written as {@code null}.
 */
public final class RunSummary {
    /** Percentiles reported per map. */
    static final int[] PERCENTILES = {5, 25, 50, 75, 95};

    private RunSummary() { }

    /**
     * Percentile by linear interpolation between closest ranks (common practice).
     *
     * @param sorted values in ascending order (not modified)
     * @param p percentile 0..100
     * @return the percentile, NaN for no values
     */
    public static double percentile(double[] sorted, double p) {
        if (sorted.length == 0) {
            return Double.NaN;
        }
        double pos = p / 100.0 * (sorted.length - 1);
        int lo = (int) Math.floor(pos);
        int hi = Math.min(sorted.length - 1, lo + 1);
        return sorted[lo] + (pos - lo) * (sorted[hi] - sorted[lo]);
    }

    /**
     * Builds the summary as a JSON tree.
     *
     * @param result the job's result
     * @param settings caller's settings (model, protocol, options), written first under "settings"
     * @return the JSON object
     */
    public static ObjectNode build(VolumeResult result, Map<String, ?> settings) {
        ObjectNode root = Json.MAPPER.createObjectNode();
        root.set("settings", Json.MAPPER.valueToTree(settings));
        root.put("voxels_total", result.status().length);
        root.put("voxels_processed", result.processed());
        ObjectNode counts = root.putObject("status_counts");
        result.statusCounts().forEach((s, n) -> counts.put(s.label(), n));
        putNumber(root, "run_seconds", result.seconds());
        putNumber(root, "voxels_per_second", result.voxelsPerSecond());
        ObjectNode maps = root.putObject("maps");
        for (String name : result.names()) {
            double[] v = result.fittedValues(name);
            ObjectNode m = maps.putObject(name);
            m.put("count", v.length);
            double sum = 0;
            for (double x : v) {
                sum += x;
            }
            putNumber(m, "mean", v.length > 0 ? sum / v.length : Double.NaN);
            for (int p : PERCENTILES) {
                putNumber(m, "p" + p, percentile(v, p));
            }
        }
        return root;
    }

    /**
     * Writes the summary atomically.
     *
     * @param file target, e.g. {@code DIR/summary.json}
     * @param result the job's result
     * @param settings caller's settings
     * @param force overwrite an existing file
     */
    public static void write(Path file, VolumeResult result, Map<String, ?> settings, boolean force) {
        try {
            AtomicFiles.writeString(file, Json.MAPPER.writeValueAsString(build(result, settings)) + "\n", force);
        } catch (JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }

    static void putNumber(ObjectNode node, String key, double v) {
        if (Double.isFinite(v)) {
            node.put(key, v);
        } else {
            node.putNull(key);
        }
    }
}

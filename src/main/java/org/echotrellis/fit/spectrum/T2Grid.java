package org.echotrellis.fit.spectrum;

import org.echotrellis.Checks;

/**
 * Log-spaced T2 grid: {@code T2_j = min·(max/min)^(j/(bins−1))}, j = 0 … bins−1, the usual grid of
 * multi-component T2 analysis (Whittall &amp; MacKay, J Magn Reson 84:134, 1989).
 *
 * @param minMs shortest T2 in ms (first bin)
 * @param maxMs longest T2 in ms (last bin)
 * @param bins number of grid points (≥ 2)
 */
public record T2Grid(double minMs, double maxMs, int bins) implements java.io.Serializable {

    /** Largest grid accepted; the solver workspaces are sized n², so this bounds memory. */
    public static final int MAX_BINS = 400;

    /** Default grid: 40 bins from 10 ms to 2000 ms. */
    public static final T2Grid DEFAULT = new T2Grid(10, 2000, 40);

    /** Validates the grid; messages name the command-line options. */
    public T2Grid {
        Checks.positive("--t2-min-ms", minMs, null);
        Checks.positive("--t2-max-ms", maxMs, null);
        Checks.require(maxMs > minMs,
                "--t2-max-ms must be > --t2-min-ms (" + minMs + " ms), got " + maxMs);
        Checks.inRange("--t2-bins", bins, 2, MAX_BINS, null);
    }

    /** @return a new array of the grid T2 values in ms, ascending */
    public double[] t2Ms() {
        double[] t = new double[bins];
        for (int j = 0; j < bins; j++) {
            t[j] = t2Ms(j);
        }
        return t;
    }

    /**
     * @param j bin index, 0 … bins−1
     * @return T2 of bin j in ms (the end points are exactly min and max)
     */
    public double t2Ms(int j) {
        if (j == 0) {
            return minMs;
        }
        if (j == bins - 1) {
            return maxMs;
        }
        return minMs * Math.pow(maxMs / minMs, j / (double) (bins - 1));
    }

    /** @return ratio between neighbouring bins, (max/min)^(1/(bins−1)) */
    public double binRatio() {
        return Math.pow(maxMs / minMs, 1.0 / (bins - 1));
    }
}

package org.echotrellis.fit.spectrum;

import org.echotrellis.Checks;

/**
 * Log-spaced T2 grid: {@code T2_j = min·(max/min)^(j/(bins−1))}, j = 0 … bins−1, the usual grid of
 * multi-component T2 analysis (Whittall &amp; MacKay, J Magn Reson 84:134, 1989).
 *
 * <p>Our default grid is derived from the echo times ({@link #forEchoTimes}): the shortest T2 is
 * the first echo time (such a component keeps e^(−1) ≈ 37 % at echo 1 and 14 % at echo 2, so two
 * echoes see it clearly; shorter ones are seen by one echo only, and their amplitude extrapolated to
 * t = 0 grows fast with noise), the
 * longest {@value #LONGEST_PER_LAST_ECHO} × the last echo time (such a component loses only 22 % over
 * the train; longer ones cannot be told from it at SNR of a few hundred and are pooled there), and
 * {@value #BINS_PER_DECADE} bins per decade (neighbours 17 % apart, finer than the factor of about
 * two that NNLS resolves at such SNR; common practice, from memory).
 *
 * @param minMs shortest T2 in ms (first bin)
 * @param maxMs longest T2 in ms (last bin)
 * @param bins number of grid points (≥ 2)
 * @serial exclude
 */
public record T2Grid(double minMs, double maxMs, int bins) implements java.io.Serializable {

    /** Largest grid accepted; the solver workspaces are sized n², so this bounds memory. */
    public static final int MAX_BINS = 400;

    /** Shortest T2 of the default grid per first echo time. */
    public static final double SHORTEST_PER_FIRST_ECHO = 1.0;
    /** Longest T2 of the default grid per last echo time. */
    public static final double LONGEST_PER_LAST_ECHO = 4;
    /** Bins per decade of the default grid. */
    public static final int BINS_PER_DECADE = 15;

    /**
     * The default grid of a train.
     *
     * @param firstEchoMs first echo time in ms
     * @param lastEchoMs last echo time in ms
     * @return the grid
     */
    public static T2Grid forEchoTimes(double firstEchoMs, double lastEchoMs) {
        double lo = SHORTEST_PER_FIRST_ECHO * firstEchoMs;
        double hi = LONGEST_PER_LAST_ECHO * Math.max(lastEchoMs, firstEchoMs);
        int bins = (int) Math.ceil(BINS_PER_DECADE * Math.log10(hi / lo) - 1e-9) + 1;
        return new T2Grid(lo, hi, Math.max(2, Math.min(MAX_BINS, bins)));
    }

    /**
     * Validates the grid; messages name the parameters by their keys ({@code t2_min_ms}, ...).
     *
     * @param minMs shortest T2 in ms (first bin)
     * @param maxMs longest T2 in ms (last bin)
     * @param bins number of grid points (≥ 2)
     * @throws org.echotrellis.InputException if a value is not allowed; the message names it, its value and what is allowed
     */
    public T2Grid {
        Checks.positive("t2_min_ms", minMs, null);
        Checks.positive("t2_max_ms", maxMs, null);
        Checks.require(maxMs > minMs,
                "t2_max_ms must be > t2_min_ms (" + minMs + " ms), got " + maxMs);
        Checks.inRange("t2_bins", bins, 2, MAX_BINS, null);
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

package org.echotrellis.io;

import java.util.List;

/**
 * Decay curves read from a CSV table: one echo time per row, one named decay per column,
 * immutable (arrays copied in and out).
 *
 * @param source file name for messages
 * @param names column names of the decays (header row, without the echo-time column)
 * @param echoTimesMs echo times in ms, strictly increasing
 * @param decays decays[c][n] = value of decay c at echo n
 */
public record DecayTable(String source, List<String> names, double[] echoTimesMs, double[][] decays) {

    /**
     * Copies.
     *
     * @param source file name for messages
     * @param names column names of the decays (header row, without the echo-time column)
     * @param echoTimesMs echo times in ms, strictly increasing
     * @param decays decays[c][n] = value of decay c at echo n
     */
    public DecayTable {
        names = List.copyOf(names);
        echoTimesMs = echoTimesMs.clone();
        decays = deepCopy(decays);
    }

    /** @return number of echoes (rows) */
    public int echoes() {
        return echoTimesMs.length;
    }

    /** @return number of decays (columns after the first) */
    public int count() {
        return names.size();
    }

    /**
     * @param c column index, 0-based among the decays
     * @return a copy of decay c
     */
    public double[] decay(int c) {
        return decays[c].clone();
    }

    /** @return echo times in ms, strictly increasing (a copy) */
    @Override
    public double[] echoTimesMs() {
        return echoTimesMs.clone();
    }

    /** @return decays[c][n] = value of decay c at echo n (a deep copy) */
    @Override
    public double[][] decays() {
        return deepCopy(decays);
    }

    private static double[][] deepCopy(double[][] a) {
        double[][] c = new double[a.length][];
        for (int i = 0; i < a.length; i++) {
            c[i] = a[i].clone();
        }
        return c;
    }
}

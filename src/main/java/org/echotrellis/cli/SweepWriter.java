package org.echotrellis.cli;

import java.io.IOException;
import java.io.Writer;
import java.util.Arrays;
import java.util.Locale;
import java.util.function.LongConsumer;
import org.echotrellis.sequence.Protocol;
import org.echotrellis.sequence.Sweep;

/**
 * Writes the {@code --sweep} CSV ({@code t1_ms,t2_ms,b1,echo_1,...,echo_N}, one row per grid point)
 * while the grid is simulated, one chunk of points at a time, so memory stays bounded by
 * {@link #CHUNK_VALUES} echo values however large the grid (the whole dictionary is never held).
 */
final class SweepWriter {
    /** Echo magnitudes simulated and held per chunk (32 MB of doubles). */
    static final int CHUNK_VALUES = 4_000_000;

    private SweepWriter() { }

    /**
     * @param echoes echoes per point
     * @return points per chunk: a whole number of engine lane blocks, at most {@link #CHUNK_VALUES} values
     */
    static int chunkPoints(int echoes) {
        int blocks = Math.max(1, CHUNK_VALUES / Math.max(1, echoes) / Sweep.LANES);
        return blocks * Sweep.LANES;
    }

    /**
     * Simulates the grid chunk by chunk and writes the CSV.
     *
     * @param p the protocol
     * @param grid the grid points
     * @param threads worker threads
     * @param chunkPoints points per chunk (&ge; 1)
     * @param w receives the CSV; not closed
     * @param progress receives the number of points done so far
     * @throws IOException if writing fails
     */
    static void write(Protocol p, SweepGrid grid, int threads, int chunkPoints, Writer w, LongConsumer progress)
            throws IOException {
        int n = p.echoCount();
        StringBuilder sb = new StringBuilder(32 + 8 * n);
        sb.append("t1_ms,t2_ms,b1");
        for (int e = 1; e <= n; e++) {
            sb.append(",echo_").append(e);
        }
        sb.append('\n');
        w.write(sb.toString());
        double[] t1 = grid.t1Ms();
        double[] t2 = grid.t2Ms();
        double[] b1 = grid.b1();
        for (int from = 0; from < grid.size(); from += chunkPoints) {
            int to = Math.min(grid.size(), from + chunkPoints);
            long done = from;
            double[][] mags = Sweep.magnitudes(p, Arrays.copyOfRange(t1, from, to), Arrays.copyOfRange(t2, from, to),
                    Arrays.copyOfRange(b1, from, to), threads, d -> progress.accept(done + d));
            sb.setLength(0);
            for (int i = 0; i < mags.length; i++) {
                sb.append(t1[from + i]).append(',').append(t2[from + i]).append(',').append(b1[from + i]);
                for (int e = 0; e < n; e++) {
                    sb.append(',').append(String.format(Locale.ROOT, "%.9g", mags[i][e]));
                }
                sb.append('\n');
            }
            w.write(sb.toString());
        }
        w.flush();
    }
}

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
 * {@link #CHUNK_BYTES} however large the grid (the whole dictionary is never held, the grid is
 * kept as its axes, and rows are formatted one at a time).
 */
final class SweepWriter {
    /** Heap held per chunk: magnitudes (8 bytes per echo plus a row header) and the point parameters. */
    static final long CHUNK_BYTES = 16L << 20;

    private SweepWriter() { }

    /**
     * @param echoes echoes per point
     * @return points per chunk: a whole number of engine lane blocks, at most {@link #CHUNK_BYTES}
     */
    static int chunkPoints(int echoes) {
        long perPoint = 8L * Math.max(1, echoes) + 16 + 3 * 8;
        long blocks = Math.max(1, CHUNK_BYTES / perPoint / Sweep.LANES);
        return (int) (blocks * Sweep.LANES);
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
        int chunk = Math.min(chunkPoints, grid.size());
        double[] t1 = new double[chunk];
        double[] t2 = new double[chunk];
        double[] b1 = new double[chunk];
        for (int from = 0; from < grid.size(); from += chunkPoints) {
            int to = Math.min(grid.size(), from + chunkPoints);
            int m = to - from;
            grid.fill(from, to, t1, t2, b1);
            long done = from;
            double[][] mags = Sweep.magnitudes(p, m == chunk ? t1 : Arrays.copyOf(t1, m), m == chunk ? t2 : Arrays.copyOf(t2, m),
                    m == chunk ? b1 : Arrays.copyOf(b1, m), threads, d -> progress.accept(done + d));
            for (int i = 0; i < m; i++) {
                sb.setLength(0);
                sb.append(t1[i]).append(',').append(t2[i]).append(',').append(b1[i]);
                for (int e = 0; e < n; e++) {
                    sb.append(',').append(String.format(Locale.ROOT, "%.9g", mags[i][e]));
                }
                sb.append('\n');
                w.write(sb.toString());
                mags[i] = null;  // release rows as they are written
            }
        }
        w.flush();
    }
}

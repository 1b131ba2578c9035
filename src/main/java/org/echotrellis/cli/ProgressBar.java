package org.echotrellis.cli;

import java.io.PrintWriter;
import java.util.Locale;
import java.util.concurrent.atomic.AtomicLong;

/**
 * A one-line progress bar on stderr: items done, percentage, rate and time left. Updates at most
 * every 200 ms; thread-safe; silent when quiet.
 */
final class ProgressBar implements AutoCloseable {
    private final PrintWriter err;
    private final String what;
    private final long total;
    private final boolean quiet;
    private final long startNs = System.nanoTime();
    private final AtomicLong lastPrintNs = new AtomicLong();
    private final AtomicLong maxDone = new AtomicLong();
    private volatile boolean printed;
    private boolean finished;

    /**
     * @param err where to print
     * @param what unit name ("voxels", "points")
     * @param total number of items
     * @param quiet print nothing if true
     */
    public ProgressBar(PrintWriter err, String what, long total, boolean quiet) {
        this.err = err;
        this.what = what;
        this.total = Math.max(1, total);
        this.quiet = quiet;
    }

    /**
     * Reports that {@code done} items are finished, from any thread. Reports may arrive out of order:
     * the bar shows the largest count seen, and the final state (all items) is always drawn.
     */
    public void update(long done) {
        if (quiet) {
            return;
        }
        long seen = maxDone.accumulateAndGet(done, Math::max);
        long now = System.nanoTime();
        if (seen < total) {
            long last = lastPrintNs.get();
            if (now - last < 200_000_000L || !lastPrintNs.compareAndSet(last, now)) {
                return;
            }
        }
        synchronized (this) {
            if (finished) {
                return;
            }
            long shown = maxDone.get();
            finished = shown >= total;
            double secs = (now - startNs) / 1e9;
            double rate = shown / Math.max(secs, 1e-9);
            double left = rate > 0 ? (total - shown) / rate : Double.NaN;
            int width = 28;
            int fill = (int) Math.round(width * (double) shown / total);
            String bar = "#".repeat(Math.min(width, fill)) + ".".repeat(Math.max(0, width - fill));
            err.printf(Locale.ROOT, "\r[%s] %d/%d %s (%3.0f%%) %.0f %s/s, %s left ", bar, shown, total, what,
                    100.0 * shown / total, rate, what, Double.isNaN(left) ? "?" : String.format(Locale.ROOT, "%.0f s", left));
            err.flush();
            printed = true;
        }
    }

    /** Ends the line. */
    @Override
    public void close() {
        if (!quiet && printed) {
            err.println();
            err.flush();
        }
    }
}

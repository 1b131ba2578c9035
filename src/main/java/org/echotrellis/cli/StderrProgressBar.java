package org.echotrellis.cli;

import java.io.PrintWriter;
import java.util.Locale;

import org.echotrellis.io.ProgressReporter;

/**
 * A one-line progress bar on stderr: percentage, units done of total, rate and estimated time
 * left, redrawn with a carriage return at most every 200 ms. Thread-safe.
 */
public final class StderrProgressBar implements ProgressReporter {
    private static final long MIN_INTERVAL_NS = 200_000_000L;
    private static final int WIDTH = 30;

    private final PrintWriter err;
    private String task = "";
    private long total;
    private long startNs;
    private long lastNs;
    private long last;
    private boolean drawn;

    /** @param err the stream to draw on (the command's stderr) */
    public StderrProgressBar(PrintWriter err) {
        this.err = err;
    }

    /**
     * @param err stderr of the command
     * @param quiet true to silence
     * @return a bar, or {@link ProgressReporter#NONE} when quiet
     */
    public static ProgressReporter of(PrintWriter err, boolean quiet) {
        return quiet ? ProgressReporter.NONE : new StderrProgressBar(err);
    }

    @Override
    public synchronized void start(String label, long units) {
        this.task = label;
        this.total = Math.max(0, units);
        this.startNs = System.nanoTime();
        this.lastNs = startNs - MIN_INTERVAL_NS;
        this.last = 0;
    }

    @Override
    public synchronized void advance(long done) {
        long now = System.nanoTime();
        last = Math.max(last, done);
        if (now - lastNs >= MIN_INTERVAL_NS) {
            lastNs = now;
            draw(now);
        }
    }

    @Override
    public synchronized void finish() {
        draw(System.nanoTime());
        if (drawn) {
            err.println();
            err.flush();
        }
    }

    /**
     * @param done units done
     * @param units total units
     * @param seconds elapsed seconds
     * @param label task label
     * @return the bar text (without carriage return)
     */
    static String line(long done, long units, double seconds, String label) {
        double frac = units > 0 ? Math.min(1.0, (double) done / units) : 1.0;
        int fill = (int) Math.round(frac * WIDTH);
        double rate = seconds > 0 ? done / seconds : 0;
        String eta = rate > 0 && done < units ? String.format(Locale.ROOT, "%.0f s left", (units - done) / rate) : "";
        return String.format(Locale.ROOT, "[%s%s] %3.0f%% %d/%d %s, %.0f/s %s", "#".repeat(fill), ".".repeat(WIDTH - fill),
                100 * frac, done, units, label, rate, eta).stripTrailing();
    }

    private void draw(long now) {
        err.print("\r" + line(last, total, (now - startNs) * 1e-9, task));
        err.flush();
        drawn = true;
    }
}

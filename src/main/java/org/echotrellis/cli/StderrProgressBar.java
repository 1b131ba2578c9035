package org.echotrellis.cli;

import java.io.PrintWriter;

import org.echotrellis.io.ProgressReporter;

/**
 * The {@link ProgressReporter} of the volume commands: draws the command line's {@link ProgressBar}
 * on stderr (units done, percentage, rate, time left). Thread-safe.
 */
public final class StderrProgressBar implements ProgressReporter {
    private final PrintWriter err;
    private final boolean quiet;
    private volatile ProgressBar bar;

    /**
     * @param err the command's stderr
     * @param quiet print nothing if true ({@code --quiet})
     */
    public StderrProgressBar(PrintWriter err, boolean quiet) {
        this.err = err;
        this.quiet = quiet;
    }

    @Override
    public synchronized void start(String task, long total) {
        bar = new ProgressBar(err, task, total, quiet);
    }

    @Override
    public void advance(long done) {
        ProgressBar b = bar;
        if (b != null) {
            b.update(done);
        }
    }

    @Override
    public synchronized void finish() {
        if (bar != null) {
            bar.close();
            bar = null;
        }
    }
}

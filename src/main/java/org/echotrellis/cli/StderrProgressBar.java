package org.echotrellis.cli;

import java.io.PrintWriter;

import org.echotrellis.io.ProgressReporter;

/**
 * The {@link ProgressReporter} of the volume commands: draws the command line's {@link ProgressBar}
 * on stderr (units done, percentage, rate, time left). Thread-safe.
 */
final class StderrProgressBar implements ProgressReporter {
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

    /**
     * A bar that draws only when stderr is a terminal and {@code --quiet} is not given, so progress
     * never fills log files or pipes.
     *
     * @param err the command's stderr
     * @param quiet {@code --quiet}
     * @return the reporter
     */
    public static StderrProgressBar onTerminal(PrintWriter err, boolean quiet) {
        return new StderrProgressBar(err, quiet || !Terminal.stderrIsTerminal());
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

package org.echotrellis.io;

/**
 * Receives progress of long work. {@link #advance(long)} may be called from several threads at
 * once; implementations must be thread-safe and cheap (throttle their own output).
 */
public interface ProgressReporter {
    /** A reporter that ignores everything. */
    ProgressReporter NONE = new ProgressReporter() {
        @Override
        public void start(String task, long total) { }

        @Override
        public void advance(long done) { }

        @Override
        public void finish() { }
    };

    /**
     * @param task short label
     * @param total number of units (voxels) that will be done
     */
    void start(String task, long total);

    /** @param done units finished so far (monotone) */
    void advance(long done);

    /** The work has ended. */
    void finish();
}

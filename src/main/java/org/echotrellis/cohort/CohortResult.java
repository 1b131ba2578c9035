package org.echotrellis.cohort;

import java.util.List;

/**
 * The outcome of a cohort run.
 *
 * @param rows every table row written (finished earlier and now), sorted
 * @param failures subjects/sessions that failed in this run
 * @param processed subjects/sessions processed successfully in this run
 * @param skipped subjects/sessions skipped because their complete outputs existed
 * @param voxels voxels processed in this run
 * @param seconds wall time of the processing stage (discovery to collected results)
 */
public record CohortResult(List<CohortRow> rows, List<CohortFailure> failures, int processed, int skipped, long voxels,
                           double seconds) {
    /** Exit code of the {@code cohort} command when at least one subject failed. */
    public static final int EXIT_SUBJECTS_FAILED = 3;

    /**
     * Copies the lists.
     *
     * @param rows every table row written (finished earlier and now), sorted
     * @param failures subjects/sessions that failed in this run

     * @param processed subjects/sessions processed successfully in this run

     * @param skipped subjects/sessions skipped because their complete outputs existed

     * @param voxels voxels processed in this run
     * @param seconds wall time of the processing stage (discovery to collected results)
     */
    public CohortResult {
        rows = List.copyOf(rows);
        failures = List.copyOf(failures);
    }

    /** @return voxels per second of this run's processing */
    public double voxelsPerSecond() {
        return seconds > 0 ? voxels / seconds : Double.NaN;
    }
}

package org.echotrellis.cohort;

import java.io.Serializable;
import java.util.List;

/**
 * What one subject/session task returns to the driver: its table rows, or its failure.
 *
 * @param subject participant label
 * @param session session label, empty if none
 * @param rows table rows (empty on failure)
 * @param failure the failure, or null on success
 * @param voxels voxels processed (inside the masks, all collections and analyses)
 * @param seconds wall time of the task
 */
record UnitOutcome(String subject, String session, List<CohortRow> rows, CohortFailure failure, long voxels,
                   double seconds) implements Serializable {
    private static final long serialVersionUID = 1L;

    UnitOutcome {
        rows = List.copyOf(rows);
    }

    /** @return true if the subject failed */
    boolean failed() {
        return failure != null;
    }
}

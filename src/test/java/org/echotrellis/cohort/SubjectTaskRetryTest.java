package org.echotrellis.cohort;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertNull;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.util.List;

import org.echotrellis.fit.volume.FitOptions;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A task that Spark runs again (its executor was lost after the unit was published, before the
 * driver got the result) takes the published outputs instead of failing on them; with force it
 * redoes the unit. Runs the task directly, without Spark.
 */
class SubjectTaskRetryTest {
    @TempDir
    Path dir;

    private CohortRequest request(boolean force) {
        return new CohortRequest(dir.resolve("bids").toString(), dir.resolve("out").toString(), List.of(),
                FitOptions.DEFAULT, null, null, null, Float.NaN, null, force, 1, "echotrellis cohort (test)");
    }

    @Test
    void aRetriedTaskReturnsThePublishedRowsAndLeavesTheFilesAlone() throws Exception {
        new SyntheticCohort(dir.resolve("bids"), 4, 3, 1).subject("07", null, 7);
        SubjectUnit unit = new SubjectUnit("07", "");
        UnitOutcome first = SubjectTask.run(request(false), unit);
        assertNull(first.failure(), () -> first.failure().message());
        assertFalse(first.rows().isEmpty());
        Path t2 = dir.resolve("out/sub-07/anat/sub-07_T2map.nii.gz");
        FileTime published = Files.getLastModifiedTime(t2);

        UnitOutcome retry = SubjectTask.run(request(false), unit);
        assertNull(retry.failure(), () -> retry.failure().message());
        assertEquals(first.rows(), retry.rows(), "the rows read back from the unit's statistics file");
        assertEquals(published, Files.getLastModifiedTime(t2), "published outputs untouched");

        Thread.sleep(1100);  // beyond a coarse file-time resolution
        UnitOutcome forced = SubjectTask.run(request(true), unit);
        assertNull(forced.failure(), () -> forced.failure().message());
        assertEquals(first.rows(), forced.rows(), "the same data give the same rows");
        assertTrue(Files.getLastModifiedTime(t2).compareTo(published) > 0, "force redoes and republishes the unit");
    }
}

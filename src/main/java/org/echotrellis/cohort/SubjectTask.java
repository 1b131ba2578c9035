package org.echotrellis.cohort;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.util.ArrayList;
import java.util.List;

import org.apache.hadoop.fs.Path;
import org.echotrellis.InputException;

/**
 * The work of one subject/session on an executor: reads its multi-echo collections, runs the
 * requested analyses, writes the BIDS derivatives into a local scratch directory, summarises the
 * written maps per region, writes the unit's statistics file last, and publishes the directory to
 * the output dataset in one rename ({@link Storage#publish}). Any failure becomes the unit's {@link CohortFailure}; the scratch
 * directory is always removed.
 *
 * <p>Memory: the echo files are joined into a temporary 4-D file slice by slice; the volume
 * pipeline holds two slabs of that series plus the float output maps of one analysis at a time;
 * maps are written and dropped before the next analysis starts.
 */
final class SubjectTask {
    private SubjectTask() { }

    /**
     * Runs one unit. Never throws for the unit's data: failures are returned.
     *
     * @param request the cohort settings
     * @param unit the subject/session
     * @return rows or the failure
     */
    static UnitOutcome run(CohortRequest request, SubjectUnit unit) {
        long t0 = System.nanoTime();
        String[] stage = {"read"};
        java.nio.file.Path scratch = null;
        try {
            Path outRoot = Storage.path(request.outputDir());
            Path stats = unit.statsFile(outRoot);
            if (!request.force() && Storage.exists(stats)) {
                // an earlier attempt of this task finished the unit before its executor was lost: Spark's
                // retry takes the published outputs instead of failing on them
                return new UnitOutcome(unit.subject(), unit.session(), readStats(stats), null, 0, seconds(t0));
            }
            scratch = Files.createTempDirectory("echotrellis-cohort-");
            java.nio.file.Path root = UnitAnalyses.localDataset(request, unit, scratch.resolve("in"));
            java.nio.file.Path out = scratch.resolve("out");
            java.nio.file.Path unitDir = Files.createDirectories(out.resolve(unit.relativeDir()));
            List<CohortRow> rows = new ArrayList<>();
            long voxels = UnitAnalyses.process(request, unit, root, out, stage, rows);
            stage[0] = "write";
            rows.sort(CohortJob.ROW_ORDER);
            StringBuilder sb = new StringBuilder(CsvText.row(CohortRow.COLUMNS));
            for (CohortRow r : rows) {
                sb.append(CsvText.row(r.values()));
            }
            // written last: its presence marks the unit's outputs complete
            Files.writeString(unitDir.resolve(unit.statsName()), sb.toString());
            Storage.publish(unitDir, unit.outputDir(outRoot), request.force());
            return new UnitOutcome(unit.subject(), unit.session(), rows, null, voxels, seconds(t0));
        } catch (InputException e) {
            return failure(unit, stage[0], e.getMessage(), t0);
        } catch (RuntimeException | IOException | OutOfMemoryError | StackOverflowError e) {
            // one subject never stops the cohort: anything it throws is its own failure
            return failure(unit, stage[0], e.getClass().getSimpleName() + (e.getMessage() == null ? "" : ": "
                    + e.getMessage()), t0);
        } finally {
            Storage.deleteLocal(scratch);
        }
    }

    /**
     * Reads a unit's statistics file (of an earlier run).
     *
     * @param stats the file
     * @return its rows
     */
    static List<CohortRow> readStats(Path stats) {
        List<List<String>> t = CsvText.parse(Storage.readText(stats));
        List<CohortRow> rows = new ArrayList<>();
        for (int i = 1; i < t.size(); i++) {
            try {
                rows.add(CohortRow.parse(t.get(i)));
            } catch (IllegalArgumentException e) {
                throw new UncheckedIOException(new IOException(stats + " line " + (i + 1) + ": " + e.getMessage()
                        + " (remove the subject's directory, or redo it with force)"));
            }
        }
        return rows;
    }

    private static UnitOutcome failure(SubjectUnit unit, String stage, String message, long t0) {
        return new UnitOutcome(unit.subject(), unit.session(), List.of(),
                new CohortFailure(unit.subject(), unit.session(), stage, message), 0, seconds(t0));
    }

    private static double seconds(long t0) {
        return (System.nanoTime() - t0) * 1e-9;
    }
}

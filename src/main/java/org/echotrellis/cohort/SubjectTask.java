package org.echotrellis.cohort;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.nio.file.Files;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.concurrent.ConcurrentHashMap;

import org.apache.hadoop.fs.Path;
import org.echotrellis.InputException;
import org.echotrellis.fit.volume.VolumeAnalysis;
import org.echotrellis.fit.volume.VolumeRequest;

/**
 * The work of one subject/session on an executor: reads its multi-echo collections, runs the
 * requested analyses, writes the BIDS derivatives into a local scratch directory, summarises the
 * written maps per region, writes the unit's statistics file last, and publishes the directory to
 * the output dataset in one rename. Any failure becomes the unit's {@link CohortFailure}; the scratch
 * directory is always removed.
 *
 * <p>Memory: the volume pipeline holds two slabs of the series (bounded by
 * {@link CohortRequest#slabValues()}) plus the float output maps of one analysis at a time; maps are
 * written and dropped before the next analysis starts. The analyses themselves (start dictionary,
 * basis cache) are built once per executor JVM and shared by its tasks, since they depend only on the
 * protocol and settings.
 */
final class SubjectTask {
    /** Analyses built on this executor, by request; small (one per distinct protocol/settings). */
    private static final Map<VolumeRequest, VolumeAnalysis> ANALYSES = new ConcurrentHashMap<>();
    private static final int MAX_CACHED = 16;

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
            scratch = Files.createTempDirectory("echotrellis-cohort-");
            Path outRoot = Storage.path(request.outputDir());
            java.nio.file.Path root = UnitAnalyses.localDataset(request, unit, scratch.resolve("in"));
            java.nio.file.Path out = scratch.resolve("out");
            java.nio.file.Path unitDir = out.resolve(unit.relativeDir());
            Files.createDirectories(unitDir);
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
     * The analysis of a request, built once per executor.
     *
     * @param request the serialisable request
     * @return the analysis (thread-safe, shared)
     */
    static VolumeAnalysis analysis(VolumeRequest request) {
        VolumeAnalysis a = ANALYSES.get(request);
        if (a == null) {
            if (ANALYSES.size() >= MAX_CACHED) {
                ANALYSES.clear();
            }
            a = request.analysis();
            ANALYSES.put(request, a);
        }
        return a;
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
                        + " (remove the subject's directory, or rerun with --force)"));
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

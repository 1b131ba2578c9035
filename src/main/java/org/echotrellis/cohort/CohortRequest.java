package org.echotrellis.cohort;

import java.io.Serializable;
import java.util.List;

import org.apache.hadoop.fs.Path;
import org.echotrellis.fit.spectrum.SpectrumChoices;
import org.echotrellis.fit.volume.FitOptions;
import org.echotrellis.sequence.ProtocolText;

/**
 * A cohort run as plain serialisable values, shipped to every task: where to read and write, which
 * analyses with which settings, and how to summarise. Heavy objects (analyses, kernels, workspaces)
 * are built from it on the executors.
 *
 * @param bidsDir the BIDS dataset (local path or URI)
 * @param outputDir the derivatives dataset (local path or URI)
 * @param participants subject labels to process; empty for all
 * @param fit the fit settings, or null for no fit
 * @param spectrum the spectrum settings, or null for no spectrum
 * @param protocol a protocol file supplying what sidecars cannot, or null
 * @param mask {@code mask} (each collection's {@code _mask} in its {@code anat/} folder), a mask-image
 *        pattern with {@code {sub}}/{@code {ses}} placeholders, or null to fit every voxel
 * @param outsideMask value of the written maps outside the mask (NaN, or 0 for tools that dislike NaN)
 * @param labels {@code dseg}, a label-image pattern, or null for whole-mask rows
 * @param force redo units whose outputs exist
 * @param threadsPerTask worker threads of one task's volume pipeline (the cores a task holds)
 * @param commandLine the command line, for the derivatives' provenance
 * @serial exclude
 */
public record CohortRequest(String bidsDir, String outputDir, List<String> participants, FitOptions fit,
                            SpectrumChoices spectrum, ProtocolText protocol, String mask, float outsideMask,
                            String labels, boolean force,
                            int threadsPerTask, String commandLine) implements Serializable {
    private static final long serialVersionUID = 2L;

    /**
     * Copies the list; checks that at least one analysis is requested.
     *
     * @param bidsDir the BIDS dataset (local path or URI)
     * @param outputDir the derivatives dataset (local path or URI)
     * @param participants subject labels to process; empty for all
     * @param fit the fit settings, or null for no fit
     * @param spectrum the spectrum settings, or null for no spectrum
     * @param protocol a protocol file supplying what sidecars cannot, or null
     * @param mask {@code mask} (each collection's {@code _mask} in its {@code anat/} folder), a mask-image
     *        pattern with {@code {sub}}/{@code {ses}} placeholders, or null to fit every voxel
     * @param outsideMask value of the written maps outside the mask (NaN, or 0 for tools that dislike NaN)
     * @param labels {@code dseg}, a label-image pattern, or null for whole-mask rows
     * @param force redo units whose outputs exist
     * @param threadsPerTask worker threads of one task's volume pipeline (the cores a task holds)
     * @param commandLine the command line, for the derivatives' provenance
     * @throws IllegalArgumentException if neither fit nor spectrum settings are given, or
     *         {@code threadsPerTask} is below 1
     */
    public CohortRequest {
        participants = List.copyOf(participants);
        if (fit == null && spectrum == null) {
            throw new IllegalArgumentException("a cohort request needs fit or spectrum settings");
        }
        if (threadsPerTask < 1) {
            throw new IllegalArgumentException("threadsPerTask must be >= 1");
        }
    }

    /** @return the subject/session units of the dataset, filtered by participant */
    List<SubjectUnit> discover() {
        return Units.list(Storage.path(bidsDir), participants);
    }

    /**
     * Creates the output dataset and its description if absent.
     *
     * @param out the output directory
     */
    void prepareOutput(Path out) {
        UnitAnalyses.describe(out, commandLine);
    }
}

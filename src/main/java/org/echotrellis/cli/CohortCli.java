package org.echotrellis.cli;

import java.io.PrintWriter;
import java.util.List;
import java.util.Locale;

import org.echotrellis.InputException;
import org.echotrellis.cohort.CohortFailure;
import org.echotrellis.cohort.CohortJob;
import org.echotrellis.cohort.CohortRequest;
import org.echotrellis.cohort.CohortResult;
import org.echotrellis.cohort.CohortSpark;
import org.echotrellis.fit.spectrum.SpectrumChoices;
import org.echotrellis.fit.volume.FitOptions;
import org.echotrellis.sequence.ProtocolText;

/**
 * The part of {@code cohort} that touches Spark-dependent classes; loaded only after
 * {@link CohortCommand} has found Spark on the class path.
 */
final class CohortCli {
    private CohortCli() { }

    static int run(CohortCommand c, PrintWriter out, PrintWriter err) {
        String analysis = c.analysis.analysis.name();
        if (c.labels != null && !c.labels.equals("dseg") && c.labels.isBlank()) {
            throw new InputException("--labels must be 'dseg' or a file pattern below BIDS_DIR, got an empty value");
        }
        FitOptions fit = c.analysis.fit().orElse(null);
        // a cohort's protocols are read per subject: each resolves the choices left open
        SpectrumChoices spectrum = c.analysis.spectrum().orElse(null);
        ProtocolText protocol = c.analysis.protocolText().orElse(null);
        String mask = c.analysis.maskChoice();
        float outside = c.analysis.outsideMaskValue();
        c.report.begin(c.spec, c.force);
        try (CohortSpark spark = CohortSpark.open(c.master)) {
            int taskCpus = spark.session().sparkContext().getConf().getInt("spark.task.cpus", 1);
            CohortRequest request = new CohortRequest(c.bidsDir, c.outputDir, c.participants, fit, spectrum, protocol,
                    mask, outside, c.labels, c.force, taskCpus, CliChecks.commandLine(c.spec));
            CohortResult r = CohortJob.run(spark.session(), request, err);
            out.printf(Locale.ROOT, "cohort: %d processed, %d skipped (complete earlier), %d failed; %d table rows; "
                    + "%d voxels in %.1f s (%.0f voxels/s)%n", r.processed(), r.skipped(), r.failures().size(),
                    r.rows().size(), r.voxels(), r.seconds(), r.voxelsPerSecond());
            for (CohortFailure f : r.failures()) {
                err.printf("cohort: failed sub-%s%s at %s: %s%n", f.subject(),
                        f.session().isEmpty() ? "" : " ses-" + f.session(), f.stage(),
                        CliChecks.optionNames(CliChecks.forCommandLine(f.message()), CliChecks.DATASET_KEYS));
            }
            out.flush();
            err.flush();
            c.report.settings(new java.util.LinkedHashMap<>(java.util.Map.of("analysis", analysis,
                    "mask", mask == null ? "every voxel" : mask, "labels", c.labels == null ? "whole mask" : c.labels)));
            c.report.write("cohort: " + c.bidsDir, c.force, page -> CohortReport.sections(page, r));
            return r.failures().isEmpty() ? 0 : CohortResult.EXIT_SUBJECTS_FAILED;
        }
    }
}

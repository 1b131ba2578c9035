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
        String analysis = c.analysisName();
        if (!List.of("fit", "spectrum", "both").contains(analysis)) {
            throw new InputException("--analysis must be fit, spectrum or both, got " + c.analysis);
        }
        if (c.labels != null && !c.labels.equals("dseg") && c.labels.isBlank()) {
            throw new InputException("--labels must be 'dseg' or a file pattern below BIDS_DIR, got an empty value");
        }
        FitOptions fit = CliChecks.asOptions(() -> FitOptions.DEFAULT.withT1Ms(CliChecks.t1OrProtocol(c.t1Ms))
                .withT2BoundsMs(c.t2MinMs, c.t2MaxMs).withB1Bounds(c.b1Min, c.b1Max));
        // a cohort's protocols are read per subject: each takes its own spectrum defaults
        SpectrumChoices spectrum = new SpectrumChoices(CliChecks.t1OrProtocol(c.t1Ms), List.of());
        ProtocolText protocol = c.protocol == null ? null : ProtocolText.read(c.protocol);
        if (protocol != null) {
            protocol.parse();
        }
        c.report.begin(c.spec, c.force);
        try (CohortSpark spark = CohortSpark.open(c.master)) {
            int taskCpus = spark.session().sparkContext().getConf().getInt("spark.task.cpus", 1);
            CohortRequest request = new CohortRequest(c.bidsDir, c.outputDir, c.participants,
                    analysis.equals("spectrum") ? null : fit, analysis.equals("fit") ? null : spectrum, protocol,
                    c.labels, c.force,
                    taskCpus, "echotrellis " + String.join(" ",
                            c.spec.commandLine().getParseResult().originalArgs()));
            CohortResult r = CohortJob.run(spark.session(), request, err);
            out.printf(Locale.ROOT, "cohort: %d processed, %d skipped (complete earlier), %d failed; %d table rows; "
                    + "%d voxels in %.1f s (%.0f voxels/s)%n", r.processed(), r.skipped(), r.failures().size(),
                    r.rows().size(), r.voxels(), r.seconds(), r.voxelsPerSecond());
            for (CohortFailure f : r.failures()) {
                err.printf("cohort: failed sub-%s%s at %s: %s%n", f.subject(),
                        f.session().isEmpty() ? "" : " ses-" + f.session(), f.stage(),
                        CliChecks.optionNames(CliChecks.forCommandLine(f.message()), "t1_ms"));
            }
            out.flush();
            err.flush();
            c.report.settings(new java.util.LinkedHashMap<>(java.util.Map.of("analysis", analysis,
                    "labels", c.labels == null ? "whole mask" : c.labels)));
            c.report.write("cohort: " + c.bidsDir, c.force, page -> CohortReport.sections(page, r));
            return r.failures().isEmpty() ? 0 : CohortResult.EXIT_SUBJECTS_FAILED;
        }
    }
}

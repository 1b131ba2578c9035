package org.echotrellis.cli;

import java.io.PrintWriter;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;

import org.echotrellis.InputException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/**
 * {@code cohort}: every subject/session of a BIDS dataset as one Apache Spark task; BIDS derivatives
 * per subject, one cohort table of map statistics per region, a failures table. Spark must be on the
 * class path (spark-submit or the cohort jar); this class loads no Spark class before checking.
 */
@Command(name = "cohort", mixinStandardHelpOptions = true,
        description = {"Fit T2 (and/or T2 spectra) for every subject/session of a BIDS dataset on Apache Spark: one "
                + "task per subject/session, BIDS derivatives written atomically per subject/session, and "
                + "OUTPUT_DIR/cohort-table.csv + cohort-table.parquet (one row per subject, session, label and map: "
                + "voxels, mean, sd, 5/25/50/75/95th percentiles) and cohort-failures.csv. Statistics cover the fitted "
                + "voxels inside --mask (every fitted voxel without one).",
            "A rerun skips subjects/sessions whose outputs are complete (--force redoes them). BIDS_DIR and "
                + "OUTPUT_DIR may be local paths or file://, hdfs:// or s3a:// URIs.",
            "Exit codes: 0 all done, 3 finished but some subjects/sessions failed (see cohort-failures.csv), "
                + "2 bad input or no Spark, 1 internal error."},
        footer = {"", "Examples:",
            "  java -jar target/echotrellis-cohort.jar cohort bids/ derivatives/echotrellis \\",
            "      --protocol sequences/brain-mwi-32.yaml --analysis both \\",
            "      --mask mask --labels dseg",
            "  spark-submit --class org.echotrellis.cli.Main target/echotrellis.jar cohort \\",
            "      hdfs:///study/bids hdfs:///study/derivatives/echotrellis --analysis fit",
            "", "Research tool, not a medical device."})
final class CohortCommand implements Callable<Integer> {
    /** A class of Spark's SQL module: its absence means Spark was not supplied. */
    static final String SPARK_PROBE = "org.apache.spark.sql.SparkSession";

    @Mixin
    CommonOptions common;

    @Mixin
    ReportOption report;

    @Spec
    CommandSpec spec;

    @Parameters(index = "0", paramLabel = "BIDS_DIR", description = "BIDS dataset (path or URI).")
    String bidsDir;

    @Parameters(index = "1", paramLabel = "OUTPUT_DIR", description = "Derivatives dataset to write (path or URI).")
    String outputDir;

    @Option(names = "--participant-label", paramLabel = "L", arity = "1..*",
            description = "Subjects to process (without 'sub-'); default: all.")
    List<String> participants = new ArrayList<>();

    @Mixin
    DatasetOptions analysis;

    @Option(names = "--labels", paramLabel = "dseg|PATTERN",
            description = "Per-subject label image for the table: 'dseg' (the subject/session's *_dseg.nii[.gz] in anat/) "
                    + "or a path below BIDS_DIR with {sub} and {ses} placeholders. Default: one row for the whole mask.")
    String labels;

    @Option(names = "--master", paramLabel = "URL",
            description = "Spark master, e.g. local[4] (default: the submission's, else local[*] on all cores).")
    String master;

    @Option(names = "--force", description = "Redo subjects/sessions whose outputs exist.")
    boolean force;

    @Override
    public Integer call() {
        try {
            Class.forName(SPARK_PROBE, false, CohortCommand.class.getClassLoader());
        } catch (ClassNotFoundException e) {
            throw new InputException("cohort needs Apache Spark on the class path, and this jar does not bundle it: "
                    + "run it with spark-submit --class org.echotrellis.cli.Main target/echotrellis.jar cohort ..., or "
                    + "build the embedded bundle with mvn -B -q -Pcohort package -DskipTests and run "
                    + "java -jar target/echotrellis-cohort.jar cohort ...");
        }
        PrintWriter out = spec.commandLine().getOut();
        PrintWriter err = spec.commandLine().getErr();
        return CohortCli.run(this, out, err);
    }
}

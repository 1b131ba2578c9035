package org.echotrellis.cohort;

import java.io.PrintWriter;
import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.ExecutionException;
import java.util.concurrent.TimeUnit;
import java.util.concurrent.TimeoutException;

import org.apache.hadoop.fs.Path;
import org.apache.spark.api.java.JavaFutureAction;
import org.apache.spark.api.java.JavaRDD;
import org.apache.spark.api.java.JavaSparkContext;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.util.LongAccumulator;

/**
 * The cohort job on the driver: finds the subject/session units of the dataset, skips those whose
 * complete outputs exist (unless forced), runs the others as one Spark task each (one partition per
 * unit, so Spark's scheduler spreads them over the executors and retries a task whose executor is
 * lost), reports progress on stderr, and writes the cohort table and the failures. A unit's bad data
 * never fails the job: the task returns it as a failure.
 */
public final class CohortJob {
    private CohortJob() { }

    /**
     * Runs the cohort.
     *
     * @param spark the session
     * @param request what to process and how
     * @param err progress and notes (one line per change)
     * @return rows, failures and counts
     */
    public static CohortResult run(SparkSession spark, CohortRequest request, PrintWriter err) {
        long t0 = System.nanoTime();
        Path out = Storage.path(request.outputDir());
        List<SubjectUnit> units = request.discover();
        List<CohortRow> rows = new ArrayList<>();
        List<SubjectUnit> pending = new ArrayList<>();
        int skipped = 0;
        for (SubjectUnit u : units) {
            Path stats = u.statsFile(out);
            if (!request.force() && Storage.exists(stats)) {
                rows.addAll(SubjectTask.readStats(stats));
                skipped++;
            } else {
                pending.add(u);
            }
        }
        request.prepareOutput(out);
        err.printf(Locale.ROOT, "cohort: %d subject/session units; %d finished earlier (skipped), %d to process%n",
                units.size(), skipped, pending.size());
        err.flush();
        List<UnitOutcome> outcomes = pending.isEmpty() ? List.of() : process(spark, request, pending, err);
        List<CohortFailure> failures = new ArrayList<>();
        long voxels = 0;
        int processed = 0;
        for (UnitOutcome o : outcomes) {
            if (o.failed()) {
                failures.add(o.failure());
            } else {
                rows.addAll(o.rows());
                processed++;
                voxels += o.voxels();
            }
        }
        rows.sort(ROW_ORDER);
        failures.sort(Comparator.comparing(CohortFailure::subject).thenComparing(CohortFailure::session));
        double seconds = (System.nanoTime() - t0) * 1e-9;
        CohortTables.write(spark, out, rows, failures);
        return new CohortResult(rows, failures, processed, skipped, voxels, seconds);
    }

    /** Table order: subject, session, acquisition, run, map, then labels numerically. */
    static final Comparator<CohortRow> ROW_ORDER = Comparator.comparing(CohortRow::subject)
            .thenComparing(CohortRow::session).thenComparing(CohortRow::acquisition).thenComparing(CohortRow::run)
            .thenComparing(CohortRow::map)
            .thenComparing(r -> r.stats().region(), Comparator.comparingLong(CohortJob::labelKey)
                    .thenComparing(Comparator.naturalOrder()));

    private static long labelKey(String region) {
        try {
            return Long.parseLong(region);
        } catch (NumberFormatException e) {
            return Long.MIN_VALUE;
        }
    }

    private static List<UnitOutcome> process(SparkSession spark, CohortRequest request, List<SubjectUnit> pending,
            PrintWriter err) {
        JavaSparkContext jsc = JavaSparkContext.fromSparkContext(spark.sparkContext());
        LongAccumulator done = jsc.sc().longAccumulator("cohort units done");
        LongAccumulator failed = jsc.sc().longAccumulator("cohort units failed");
        JavaRDD<SubjectUnit> rdd = jsc.parallelize(pending, pending.size());
        CohortRequest r = request;
        JavaFutureAction<List<UnitOutcome>> action = rdd.map(u -> {
            UnitOutcome o = SubjectTask.run(r, u);
            (o.failed() ? failed : done).add(1);
            return o;
        }).collectAsync();
        int total = pending.size();
        long shown = -1;
        while (true) {
            try {
                List<UnitOutcome> result = action.get(1, TimeUnit.SECONDS);
                report(err, done.value(), failed.value(), total);
                return result;
            } catch (TimeoutException e) {
                long d = done.value();
                long f = failed.value();
                if (d * (total + 1) + f != shown) {
                    shown = d * (total + 1) + f;
                    report(err, d, f, total);
                }
            } catch (InterruptedException e) {
                action.cancel(true);
                Thread.currentThread().interrupt();
                throw new IllegalStateException("cohort job interrupted", e);
            } catch (ExecutionException e) {
                throw new IllegalStateException("Spark job failed: " + e.getCause().getMessage(), e.getCause());
            }
        }
    }

    private static void report(PrintWriter err, long done, long failed, int total) {
        err.printf(Locale.ROOT, "cohort: %d done, %d failed, %d remaining%n", done, failed, total - done - failed);
        err.flush();
    }
}

package org.echotrellis.cohort;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.util.ArrayList;
import java.util.List;
import java.util.UUID;

import org.apache.hadoop.fs.FileSystem;
import org.apache.hadoop.fs.Path;
import org.apache.spark.sql.Row;
import org.apache.spark.sql.RowFactory;
import org.apache.spark.sql.SaveMode;
import org.apache.spark.sql.SparkSession;
import org.apache.spark.sql.types.DataTypes;
import org.apache.spark.sql.types.StructField;
import org.apache.spark.sql.types.StructType;

/**
 * Writes the cohort outputs {@code cohort-table.csv}, {@code cohort-table.parquet} (a Parquet
 * dataset directory, one part file) and {@code cohort-failures.csv} in the output directory. Each
 * is written under a hidden temporary name and renamed into place, replacing the previous run's.
 */
final class CohortTables {
    /** File names relied on by scripts. */
    static final String TABLE_CSV = "cohort-table.csv";
    static final String TABLE_PARQUET = "cohort-table.parquet";
    static final String FAILURES_CSV = "cohort-failures.csv";

    private CohortTables() { }

    /** Parquet/Spark schema of the cohort table: text columns, then voxels (long), then doubles. */
    static StructType schema() {
        List<StructField> f = new ArrayList<>();
        for (String c : CohortRow.COLUMNS) {
            int i = CohortRow.COLUMNS.indexOf(c);
            f.add(DataTypes.createStructField(c, i < 7 ? DataTypes.StringType
                    : i == 7 ? DataTypes.LongType : DataTypes.DoubleType, i >= 8));
        }
        return DataTypes.createStructType(f);
    }

    /**
     * @param rows rows (sorted by the caller)
     * @return the CSV text with header
     */
    static String csv(List<CohortRow> rows) {
        StringBuilder sb = new StringBuilder(CsvText.row(CohortRow.COLUMNS));
        for (CohortRow r : rows) {
            sb.append(CsvText.row(r.values()));
        }
        return sb.toString();
    }

    /**
     * Writes all three outputs.
     *
     * @param spark the session (for Parquet)
     * @param outDir the output directory
     * @param rows table rows, in the order to write
     * @param failures failed subjects
     */
    static void write(SparkSession spark, Path outDir, List<CohortRow> rows, List<CohortFailure> failures) {
        Storage.writeText(new Path(outDir, TABLE_CSV), csv(rows));
        StringBuilder fb = new StringBuilder(CsvText.row(CohortFailure.COLUMNS));
        for (CohortFailure f : failures) {
            fb.append(CsvText.row(f.values()));
        }
        Storage.writeText(new Path(outDir, FAILURES_CSV), fb.toString());
        writeParquet(spark, outDir, rows);
    }

    private static void writeParquet(SparkSession spark, Path outDir, List<CohortRow> rows) {
        List<Row> data = new ArrayList<>(rows.size());
        for (CohortRow r : rows) {
            List<Object> v = r.values();
            for (int i = 8; i < v.size(); i++) {
                if (!Double.isFinite((Double) v.get(i))) {
                    v.set(i, null);
                }
            }
            data.add(RowFactory.create(v.toArray()));
        }
        Path target = new Path(outDir, TABLE_PARQUET);
        Path tmp = new Path(outDir, "." + TABLE_PARQUET + ".tmp-" + UUID.randomUUID());
        spark.createDataFrame(data, schema()).coalesce(1).write().mode(SaveMode.ErrorIfExists).parquet(tmp.toString());
        FileSystem fs = Storage.fs(target);
        try {
            Storage.replace(fs, tmp, target);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write " + target + ": " + e.getMessage(), e);
        }
    }
}

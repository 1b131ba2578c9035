package org.echotrellis.cohort;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;

import org.apache.spark.sql.Row;
import org.echotrellis.io.RegionStatistics;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class CohortTablesTest {
    @TempDir
    Path dir;

    private static final List<CohortRow> ROWS = List.of(
            new CohortRow("01", "", "", "", "T2map", "s", RegionStatistics.of("mask", new double[] {0.05, 0.07, 0.08})),
            new CohortRow("a,\"b\"", "pre", "fast", "2", "M0map", "arbitrary",
                    RegionStatistics.of("3", new double[] {2.5})));

    @Test
    void csvRoundTripsQuotesAndNaN() throws Exception {
        CohortTables.write(SharedSpark.get(), Storage.path(dir.toString()), ROWS, List.of(
                new CohortFailure("02", "", "read", "sub-02_echo-1_MESE.nii.gz: truncated\nsecond line")));
        List<List<String>> t = CsvText.parse(Files.readString(dir.resolve(CohortTables.TABLE_CSV)));
        assertEquals(CohortRow.COLUMNS, t.get(0));
        assertEquals(ROWS.get(0), CohortRow.parse(t.get(1)));
        // one voxel: the sample sd is undefined, written empty, read back as NaN
        assertEquals(ROWS.get(1).toString(), CohortRow.parse(t.get(2)).toString());
        assertTrue(Double.isNaN(CohortRow.parse(t.get(2)).stats().sd()));
        List<List<String>> f = CsvText.parse(Files.readString(dir.resolve(CohortTables.FAILURES_CSV)));
        assertEquals(List.of("02", "", "read", "sub-02_echo-1_MESE.nii.gz: truncated"), f.get(1));
    }

    @Test
    void parquetHoldsTheSameRows() throws Exception {
        CohortTables.write(SharedSpark.get(), Storage.path(dir.toString()), ROWS, List.of());
        List<Row> back = SharedSpark.get().read().parquet(dir.resolve(CohortTables.TABLE_PARQUET).toString())
                .orderBy("map").collectAsList();
        assertEquals(2, back.size());
        Row m0 = back.get(0);
        assertEquals("a,\"b\"", m0.getString(0));
        assertEquals(1L, m0.getLong(7));
        assertTrue(m0.isNullAt(9));   // sd of one voxel: null in Parquet
        Row t2 = back.get(1);
        assertEquals(0.07, t2.getDouble(10 + 2), 1e-15);    // p50 of {0.05, 0.07, 0.08}
        assertEquals(Math.sqrt(0.00046666666666666666 / 2), t2.getDouble(9), 1e-15);   // sd, n - 1: squares 0.0004667
        try (var files = Files.list(dir)) {
            assertTrue(files.noneMatch(p -> p.getFileName().toString().startsWith(".")), "no temporary left");
        }
    }
}

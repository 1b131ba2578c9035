package org.echotrellis.cohort;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.io.PrintWriter;
import java.io.StringWriter;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.attribute.FileTime;
import java.security.MessageDigest;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.HexFormat;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;
import java.util.stream.Stream;

import org.apache.spark.sql.Row;
import org.echotrellis.cli.Main;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiImage;
import org.junit.jupiter.api.BeforeAll;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;
import picocli.CommandLine;

/**
 * The cohort job end to end in Spark local mode: four invented subjects (one with a session, one
 * with a label image, one with a corrupt echo file; a brain mask each under derivatives/) → table rows of the three good ones whose
 * statistics match values recomputed here from the written maps, the failure listed, exit 3; a
 * rerun after repairing the bad subject leaves the finished subjects' files untouched.
 */
class CohortCommandTest {
    @TempDir
    static Path dir;
    static Path bids;
    static float[] labels;
    static float[] mask;

    @BeforeAll
    static void buildCohort() throws IOException {
        bids = dir.resolve("bids");
        SyntheticCohort c = new SyntheticCohort(bids, 6, 5, 2);
        c.subject("01", null, 11);
        c.subject("02", "pre", 12);
        c.subject("03", null, 13);
        labels = c.labels("03", null);
        for (String sub : List.of("01", "02", "03", "04")) {
            mask = c.mask(sub);
        }
        Path bad = c.subject("04", null, 14);
        Files.write(bad.resolve("sub-04_echo-3_MESE.nii.gz"), new byte[] {0x1f, (byte) 0x8b, 8, 0, 1, 2, 3});
        SharedSpark.get();
    }

    private record Run(int code, String out, String err) { }

    private static Run cohort(String... extra) {
        List<String> a = new ArrayList<>(List.of("cohort", bids.toString(), dir.resolve("out").toString(),
                "--master", "local[2]", "--labels", "dseg", "--mask", "derivatives/masks/sub-{sub}_mask.nii.gz"));
        a.addAll(List.of(extra));
        CommandLine cl = Main.newCommandLine();
        StringWriter out = new StringWriter();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(out, true));
        cl.setErr(new PrintWriter(err, true));
        int code = cl.execute(a.toArray(new String[0]));
        return new Run(code, out.toString(), err.toString());
    }

    @Test
    void cohortTableFailuresAndResume() throws Exception {
        Path out = dir.resolve("out");
        Path html = dir.resolve("cohort-report.html");
        Run first = cohort("--report", html.toString());
        assertEquals(CohortResult.EXIT_SUBJECTS_FAILED, first.code(), first.err());
        assertTrue(first.err().contains("1 failed"), first.err());
        String page = Files.readString(html);
        assertTrue(page.contains("Across subjects") && page.contains("Cohort table"), "report sections");
        assertTrue(page.contains("sub-04_echo-3_MESE.nii.gz"), "the failure is listed in the report");

        List<List<String>> fails = CsvText.parse(Files.readString(out.resolve("cohort-failures.csv")));
        assertEquals(2, fails.size(), fails.toString());
        assertEquals(List.of("04", "", "analysis"), fails.get(1).subList(0, 3));
        assertTrue(fails.get(1).get(3).contains("sub-04_echo-3_MESE.nii.gz"), fails.get(1).get(3));
        assertFalse(Files.exists(out.resolve("sub-04")), "a failed subject publishes nothing");

        List<CohortRow> rows = table(out);
        Map<String, List<CohortRow>> bySubject = new TreeMap<>();
        for (CohortRow r : rows) {
            bySubject.computeIfAbsent(r.subject() + "/" + r.session(), k -> new ArrayList<>()).add(r);
        }
        assertEquals(List.of("01/", "02/pre", "03/"), new ArrayList<>(bySubject.keySet()));
        for (CohortRow r : rows) {
            checkAgainstWrittenMap(out, r);
        }
        // sub-03 has a segmentation: rows per label 1 and 2, no whole-mask row; the others one per map
        assertTrue(bySubject.get("03/").stream().allMatch(r -> List.of("1", "2").contains(r.stats().region())));
        assertTrue(bySubject.get("01/").stream().allMatch(r -> r.stats().region().equals("mask")));
        assertTrue(rows.stream().anyMatch(r -> r.map().equals("T2map")), "T2 map summarised");

        // the Parquet table holds the same rows
        List<Row> pq = SharedSpark.get().read().parquet(out.resolve("cohort-table.parquet").toString()).collectAsList();
        assertEquals(rows.size(), pq.size());

        // rerun after repairing sub-04: the three finished subjects are skipped, their files untouched
        Map<Path, String> before = fingerprints(out, "sub-01", "sub-02", "sub-03");
        try (Stream<Path> old = Files.walk(bids.resolve("sub-04"))) {
            for (Path f : old.sorted(java.util.Comparator.reverseOrder()).toList()) {
                Files.delete(f);
            }
        }
        new SyntheticCohort(bids, 6, 5, 2).subject("04", null, 14);
        Run second = cohort();
        assertEquals(0, second.code(), second.err());
        assertTrue(second.err().contains("3 finished earlier (skipped), 1 to process"), second.err());
        assertEquals(before, fingerprints(out, "sub-01", "sub-02", "sub-03"));
        List<CohortRow> all = table(out);
        assertTrue(all.containsAll(rows), "earlier rows kept in the table");
        assertTrue(all.stream().anyMatch(r -> r.subject().equals("04")));
        assertEquals(1, CsvText.parse(Files.readString(out.resolve("cohort-failures.csv"))).size());
    }

    @Test
    void remoteStorageIsReadAndWrittenThroughTheFileSystemApi() throws Exception {
        // farfs:// is the local disk seen as a remote store (FarFileSystem): units are copied to the
        // executor's scratch, outputs published by copy and rename, tables written through Hadoop
        Path far = dir.resolve("far");
        SyntheticCohort c = new SyntheticCohort(far.resolve("bids"), 6, 5, 2);
        c.subject("11", null, 21);
        c.subject("12", "pre", 22);
        c.labels("12", "pre");
        c.mask("11");
        c.mask("12");
        String in = FarFileSystem.SCHEME + "://" + far.resolve("bids").toAbsolutePath();
        String outUri = FarFileSystem.SCHEME + "://" + far.resolve("out").toAbsolutePath();
        CommandLine cl = Main.newCommandLine();
        StringWriter err = new StringWriter();
        cl.setOut(new PrintWriter(new StringWriter(), true));
        cl.setErr(new PrintWriter(err, true));
        int code = cl.execute("cohort", in, outUri, "--master", "local[2]", "--labels", "dseg",
                "--mask", "derivatives/masks/sub-{sub}_mask.nii.gz");
        assertEquals(0, code, err.toString());
        Path out = far.resolve("out");
        List<CohortRow> rows = table(out);
        assertEquals(List.of("11", "12"), rows.stream().map(CohortRow::subject).distinct().sorted().toList());
        assertTrue(rows.stream().filter(r -> r.subject().equals("12")).allMatch(r -> List.of("1", "2")
                .contains(r.stats().region())), "the session's label image was fetched with the unit");
        NiftiImage status = Nifti.read(out.resolve("sub-11/anat/sub-11_desc-fitstatus_dseg.nii.gz"));
        for (int i = 0; i < status.size(); i++) {
            assertEquals(mask[i] == 0, status.get(i) == 0, "the mask pattern was fetched: voxel " + i);
        }
        assertTrue(Files.isRegularFile(out.resolve("sub-12/ses-pre/anat/sub-12_ses-pre_T2map.nii.gz")));
        assertTrue(Files.isRegularFile(out.resolve("dataset_description.json")));
        try (Stream<Path> files = Files.walk(out)) {
            assertTrue(files.noneMatch(f -> f.getFileName().toString().contains(".tmp-")), "no temporaries left");
        }
        assertEquals(rows.size(), SharedSpark.get().read().parquet(out.resolve("cohort-table.parquet").toString()).count());
    }

    private static List<CohortRow> table(Path out) throws IOException {
        List<List<String>> t = CsvText.parse(Files.readString(out.resolve("cohort-table.csv")));
        assertEquals(CohortRow.COLUMNS, t.get(0));
        List<CohortRow> rows = new ArrayList<>();
        for (List<String> f : t.subList(1, t.size())) {
            rows.add(CohortRow.parse(f));
        }
        return rows;
    }

    /**
     * Recomputes a row from the derivative files: values of the map at voxels whose status code is
     * 1, 2, 3 or 5 (fitted) and finite, inside the label; mean, sd (n − 1) and percentiles by linear
     * interpolation between closest ranks, written out here independently of the job's code.
     */
    private static void checkAgainstWrittenMap(Path out, CohortRow r) {
        Path anat = out.resolve("sub-" + r.subject()).resolve(r.session().isEmpty() ? "" : "ses-" + r.session())
                .resolve("anat");
        String prefix = "sub-" + r.subject() + (r.session().isEmpty() ? "" : "_ses-" + r.session());
        NiftiImage map = Nifti.read(anat.resolve(prefix + "_" + r.map() + ".nii.gz"));
        NiftiImage status = Nifti.read(anat.resolve(statusFile(prefix)));
        List<Double> v = new ArrayList<>();
        for (int i = 0; i < map.header().voxelsPerVolume(); i++) {
            int s = (int) status.get(i);
            if (mask[i] == 0) {
                assertEquals(0, s, "outside the mask: status outside_mask");
                assertTrue(Double.isNaN(map.get(i)), "outside the mask: NaN by default");
            }
            boolean inLabel = r.stats().region().equals("mask") || labels[i] == Float.parseFloat(r.stats().region());
            if (inLabel && (s == 1 || s == 2 || s == 3 || s == 5) && Double.isFinite(map.get(i))) {
                v.add(map.get(i));
            }
        }
        double[] x = v.stream().mapToDouble(Double::doubleValue).sorted().toArray();
        assertEquals(x.length, r.stats().voxels(), r.toString());
        assertTrue(x.length > 0, r.toString());
        double mean = Arrays.stream(x).sum() / x.length;
        double ss = 0;
        for (double d : x) {
            ss += (d - mean) * (d - mean);
        }
        double tol = 1e-9 * Math.max(1, Math.abs(mean));
        assertEquals(mean, r.stats().mean(), tol, r.toString());
        if (x.length > 1) {
            assertEquals(Math.sqrt(ss / (x.length - 1)), r.stats().sd(), tol, r.toString());
        }
        double[] want = {r.stats().p5(), r.stats().p25(), r.stats().p50(), r.stats().p75(), r.stats().p95()};
        int[] ps = {5, 25, 50, 75, 95};
        for (int k = 0; k < ps.length; k++) {
            double h = (x.length - 1) * ps[k] / 100.0;   // closest-rank interpolation (common practice)
            int lo = (int) h;
            double p = lo + 1 < x.length ? x[lo] + (h - lo) * (x[lo + 1] - x[lo]) : x[lo];
            assertEquals(p, want[k], tol, r + " p" + ps[k]);
        }
    }

    private static String statusFile(String prefix) {
        return prefix + "_desc-fitstatus_dseg.nii.gz";
    }

    private static Map<Path, String> fingerprints(Path out, String... subs) throws Exception {
        Map<Path, String> m = new TreeMap<>();
        for (String s : subs) {
            try (Stream<Path> files = Files.walk(out.resolve(s))) {
                for (Path f : files.filter(Files::isRegularFile).toList()) {
                    FileTime t = Files.getLastModifiedTime(f);
                    byte[] h = MessageDigest.getInstance("SHA-256").digest(Files.readAllBytes(f));
                    m.put(f, t + " " + HexFormat.of().formatHex(h));
                }
            }
        }
        assertFalse(m.isEmpty());
        return m;
    }
}

package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;

import com.fasterxml.jackson.databind.JsonNode;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.io.Json;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiDatatype;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.NiftiImage;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * A synthetic BIDS dataset built here (two subjects, one with a session, one file and sidecar per
 * echo, a B1 map in percent under fmap/) through {@code bids} into a derivatives dataset.
 */
class BidsCommandTest {
    private static final int NX = 8;
    private static final int NY = 8;
    private static final int NZ = 2;
    private static final int NV = NX * NY * NZ;
    private static final int ECHOES = 24;
    private static final double ESP_MS = 10;
    private static final double[] AFFINE = {2, 0, 0, -7, 0, 2, 0, -7, 0, 0, 4, -2};
    private static final CpmgTrain TRAIN = CpmgTrain.constant(ECHOES, ESP_MS, 180);

    @TempDir
    Path dir;

    private static double t2Ms(int v) {
        return 50 + 0.5 * v;
    }

    private static double b1(int v) {
        return 0.8 + 0.002 * v;
    }

    /** Echo k of voxel v: MWF 15 % at T2 = 20 ms plus 85 % at t2Ms(v) (spectrum subject), or t2Ms(v) alone. */
    private static double[][] decays(boolean twoPools) {
        CpmgEngine engine = new CpmgEngine(1);
        double[][] d = new double[NV][];
        for (int v = 0; v < NV; v++) {
            double[] slow = engine.echoes(TRAIN, 1000, t2Ms(v), b1(v));
            double[] fast = engine.echoes(TRAIN, 1000, 20, b1(v));
            d[v] = new double[ECHOES];
            for (int k = 0; k < ECHOES; k++) {
                d[v][k] = 1000 * (twoPools ? 0.85 * Math.abs(slow[k]) + 0.15 * Math.abs(fast[k]) : Math.abs(slow[k]));
            }
        }
        return d;
    }

    private void subject(Path root, String sub, String ses, String extra, boolean twoPools) throws IOException {
        Path base = root.resolve("sub-" + sub);
        String prefix = "sub-" + sub;
        if (ses != null) {
            base = base.resolve("ses-" + ses);
            prefix += "_ses-" + ses;
        }
        Path anat = Files.createDirectories(base.resolve("anat"));
        double[][] d = decays(twoPools);
        NiftiHeader h = NiftiHeader.create(NiftiDatatype.FLOAT32, NX, NY, NZ).withAffine(AFFINE, 1);
        for (int k = 0; k < ECHOES; k++) {
            double[] vol = new double[NV];
            for (int v = 0; v < NV; v++) {
                vol[v] = d[v][k];
            }
            String stem = prefix + extra + "_echo-" + (k + 1) + "_MESE";
            Nifti.write(anat.resolve(stem + ".nii.gz"), h, vol, false);
            Files.writeString(anat.resolve(stem + ".json"),
                    String.format(Locale.ROOT, "{\"EchoTime\": %.4f}%n", (k + 1) * ESP_MS / 1000));
        }
        Path fmap = Files.createDirectories(base.resolve("fmap"));
        double[] b1 = new double[NV];
        for (int v = 0; v < NV; v++) {
            b1[v] = 100 * b1(v);
        }
        Nifti.write(fmap.resolve(prefix + "_TB1map.nii.gz"), h, b1, false);
        Files.writeString(fmap.resolve(prefix + "_TB1map.json"), "{\"Units\": \"percent\"}\n");
    }

    private Path dataset() throws IOException {
        Path root = Files.createDirectories(dir.resolve("study"));
        Files.writeString(root.resolve("dataset_description.json"), "{\"Name\": \"invented study\", \"BIDSVersion\": \"1.9.0\"}\n");
        // inheritance: the top-level sidecar applies to every MESE file unless a closer one overrides
        Files.writeString(root.resolve("MESE.json"),
                "{\"RepetitionTime\": 3.0, \"FlipAngle\": 90, \"RefocusingFlipAngle\": 150}\n");
        subject(root, "01", null, "", false);
        subject(root, "02", "1", "_acq-fast_run-1", true);
        // a closer sidecar overrides the top-level refocusing flip for subject 01
        Files.writeString(root.resolve("sub-01").resolve("sub-01_MESE.json"), "{\"RefocusingFlipAngle\": 180}\n");
        Files.writeString(root.resolve("sub-02").resolve("sub-02_MESE.json"), "{\"RefocusingFlipAngle\": 180}\n");
        return root;
    }

    @Test
    void aCollectionsRefusedSettingIsNamedByItsOption() throws IOException {
        Path root = dataset();
        Path out = dir.resolve("derivatives-window");
        // the window is checked against each collection's T2 grid (from its echo times), so per collection
        CliRun r = CliRun.of("bids", root.toString(), out.toString(), "participant", "--analysis", "spectrum",
                "--participant-label", "01", "--fraction-window-ms", "0.001:0.002", "--quiet");
        assertEquals(2, r.code(), r.err());
        assertTrue(r.err().contains("sub-01: --fraction-window-ms 0.001:0.002 starts below the T2 grid"), r.err());
    }

    @Test
    void reportListsEveryCollectionWithTheMedianT2OfItsMap() throws IOException {
        Path root = dataset();
        Path out = dir.resolve("derivatives-report");
        Path html = dir.resolve("bids-report.html");
        CliRun r = CliRun.of("bids", root.toString(), out.toString(), "participant", "--analysis", "fit",
                "--threads", "2", "--quiet", "--report", html.toString());
        assertEquals(0, r.code(), r.err());
        String page = Files.readString(html);
        assertTrue(page.contains("Collections and their T2 maps"), "table caption");
        double[] t2 = java.util.Arrays.stream(Nifti.read(out.resolve("sub-01/anat/sub-01_T2map.nii.gz")).values())
                .filter(Double::isFinite).map(x -> 1000 * x).sorted().toArray();
        // median recomputed from the written map (linear interpolation between closest ranks, common practice)
        double pos = 0.5 * (t2.length - 1);
        int lo = (int) Math.floor(pos);
        double median = t2[lo] + (pos - lo) * (t2[Math.min(lo + 1, t2.length - 1)] - t2[lo]);
        assertTrue(page.contains(String.format(java.util.Locale.ROOT, "%.1f [", median)), "median T2 " + median);
        assertTrue(page.contains("sub-01"), "collection label");
        assertFalse(page.contains("<script src") || page.contains("http://") && page.contains("<link"), "self-contained");
    }

    @Test
    void datasetGivesDerivativesInSecondsAndPercentWithSidecars() throws IOException {
        Path root = dataset();
        Path out = dir.resolve("derivatives");
        CliRun r = CliRun.of("bids", root.toString(), out.toString(), "participant", "--analysis", "both",
                "--threads", "2", "--quiet");
        assertEquals(0, r.code(), r.err());
        JsonNode desc = Json.MAPPER.readTree(out.resolve("dataset_description.json").toFile());
        assertEquals("derivative", desc.get("DatasetType").asText());
        JsonNode by = desc.get("GeneratedBy").get(0);
        assertEquals("echotrellis", by.get("Name").asText());
        assertTrue(by.get("CommandLine").asText().startsWith("echotrellis bids "), by.toString());
        assertTrue(by.has("Version"));

        Path a1 = out.resolve("sub-01/anat");
        NiftiImage t2 = Nifti.read(a1.resolve("sub-01_T2map.nii.gz"));
        assertArrayEquals(AFFINE, t2.header().affine(), 1e-6);  // geometry of the input copied
        for (int v = 0; v < NV; v++) {
            // T2map in seconds (BIDS); noise-free single-pool decays: within 3 % of the truth (issue floor)
            assertEquals(t2Ms(v) / 1000, t2.get(v), 0.03 * t2Ms(v) / 1000, "voxel " + v);
        }
        NiftiImage b1 = Nifti.read(a1.resolve("sub-01_desc-epgfit_TB1map.nii.gz"));
        assertEquals(100 * b1(10), b1.get(10), 0.5);  // B1 fixed from the percent map, written in percent
        JsonNode side = Json.MAPPER.readTree(a1.resolve("sub-01_T2map.json").toFile());
        assertEquals("s", side.get("Units").asText());
        assertTrue(side.get("Sources").get(0).asText().startsWith("bids:raw:sub-01/anat/sub-01_echo-1_MESE"));
        assertEquals(3.0, side.get("AcquisitionSettings").get("RepetitionTime").asDouble());
        assertEquals(180, side.get("AcquisitionSettings").get("RefocusingFlipAngle").asDouble());  // closer sidecar wins
        for (String f : new String[] {"sub-01_M0map.nii.gz", "sub-01_M0map.json", "sub-01_desc-fitstatus_dseg.nii.gz",
            "sub-01_desc-fitstatus_dseg.json", "sub-01_MWFmap.json", "sub-01_desc-fit_summary.json"}) {
            assertTrue(Files.isRegularFile(a1.resolve(f)), f);
        }
        JsonNode summary = Json.MAPPER.readTree(a1.resolve("sub-01_desc-fit_summary.json").toFile());
        JsonNode prov = summary.get("settings").get("provenance");
        assertEquals(ECHOES + 1, prov.get("inputs_sha256").size());  // every echo file and the B1 map
        assertTrue(prov.get("protocol").asText().contains("repetition_ms"));

        Path a2 = out.resolve("sub-02/ses-1/anat");
        String p2 = "sub-02_ses-1_acq-fast_run-1";
        NiftiImage mwf = Nifti.read(a2.resolve(p2 + "_MWFmap.nii.gz"));
        double sum = 0;
        for (int v = 0; v < NV; v++) {
            sum += mwf.get(v);
        }
        // two pools, 15 % at T2 = 20 ms inside the 10-40 ms window: MWF in percent
        assertEquals(15, sum / NV, 3.0);
        assertTrue(Files.isRegularFile(a2.resolve(p2 + "_T2map.nii.gz")));
        assertEquals("percent", Json.MAPPER.readTree(a2.resolve(p2 + "_MWFmap.json").toFile()).get("Units").asText());
    }

    @Test
    void maskLimitsTheFitAndEachAnalysisIsItsOwnOutputSet() throws IOException {
        Path root = dataset();
        // a brain mask beside sub-01's series (BIDS suffix _mask with a desc entity): the first slice only
        double[] m = new double[NV];
        for (int v = 0; v < NX * NY; v++) {
            m[v] = 1;
        }
        Nifti.write(root.resolve("sub-01/anat/sub-01_desc-brain_mask.nii.gz"),
                NiftiHeader.create(NiftiDatatype.UINT8, NX, NY, NZ).withAffine(AFFINE, 1), m, false);
        Path out = dir.resolve("derivatives-mask");
        CliRun fit = CliRun.of("bids", root.toString(), out.toString(), "participant", "--participant-label", "01",
                "--mask", "mask", "--outside-mask-value", "0", "--threads", "2", "--quiet");
        assertEquals(0, fit.code(), fit.err());
        Path a1 = out.resolve("sub-01/anat");
        NiftiImage t2 = Nifti.read(a1.resolve("sub-01_T2map.nii.gz"));
        NiftiImage status = Nifti.read(a1.resolve("sub-01_desc-fitstatus_dseg.nii.gz"));
        for (int v = 0; v < NV; v++) {
            if (v < NX * NY) {
                assertEquals(t2Ms(v) / 1000, t2.get(v), 0.03 * t2Ms(v) / 1000, "voxel " + v);
            } else {
                assertEquals(0, t2.get(v), "outside the mask: the chosen fill value");
                assertEquals(0, status.get(v), "status outside_mask");
            }
        }
        JsonNode side = Json.MAPPER.readTree(a1.resolve("sub-01_T2map.json").toFile());
        assertTrue(side.get("Sources").toString().contains("bids:raw:sub-01/anat/sub-01_desc-brain_mask.nii.gz"),
                side.get("Sources").toString());

        // the spectrum of the same collection is a set of its own: the fit's files stay
        CliRun spectrum = CliRun.of("bids", root.toString(), out.toString(), "participant", "--participant-label", "01",
                "--mask", "mask", "--analysis", "spectrum", "--threads", "2", "--quiet");
        assertEquals(0, spectrum.code(), spectrum.err());
        assertTrue(Files.isRegularFile(a1.resolve("sub-01_MWFmap.nii.gz")));
        assertTrue(Files.isRegularFile(a1.resolve("sub-01_desc-epgfit_TB1map.nii.gz")));
        // a mono-exponential refit replaces the fit set as a whole: its B1 map of the earlier run goes
        CliRun mono = CliRun.of("bids", root.toString(), out.toString(), "participant", "--participant-label", "01",
                "--mask", "mask", "--model", "mono", "--force", "--threads", "2", "--quiet");
        assertEquals(0, mono.code(), mono.err());
        assertFalse(Files.exists(a1.resolve("sub-01_desc-epgfit_TB1map.nii.gz")), "stale file of the fit set removed");
        assertFalse(Files.exists(a1.resolve("sub-01_desc-epgfit_TB1map.json")));
        assertTrue(Files.isRegularFile(a1.resolve("sub-01_MWFmap.nii.gz")), "the spectrum set is untouched");
        try (var files = Files.list(a1)) {
            assertTrue(files.noneMatch(f -> f.getFileName().toString().startsWith(".echotrellis-staging")), "no staging left");
        }

        // a collection without the requested mask fails, naming what was looked for; others go on
        CliRun missing = CliRun.of("bids", root.toString(), dir.resolve("derivatives-missing").toString(), "participant",
                "--mask", "mask", "--threads", "2", "--quiet");
        assertEquals(2, missing.code(), missing.err());
        assertTrue(missing.err().contains("sub-02 ses-1") && missing.err().contains("_mask.nii[.gz]"), missing.err());
        assertTrue(Files.isRegularFile(dir.resolve("derivatives-missing/sub-01/anat/sub-01_T2map.nii.gz")));
    }

    @Test
    void disagreeingProtocolIsRefusedNamingBothAndOtherSubjectsGoOn() throws IOException {
        Path root = dataset();
        Files.writeString(root.resolve("sub-02").resolve("ses-1").resolve("anat")
                .resolve("sub-02_ses-1_acq-fast_run-1_echo-3_MESE.json"), "{\"EchoTime\": 0.0305}\n");
        Path out = dir.resolve("derivatives");
        Path protocol = dir.resolve("p.yaml");
        Files.writeString(protocol, "name: invented\ntrain:\n  echoes: 24\n  echo_spacing_ms: 10\n  refocusing:\n    flip_deg: 160\n");
        CliRun r = CliRun.of("bids", root.toString(), out.toString(), "participant", "--protocol", protocol.toString(),
                "--participant-label", "01", "--quiet");
        assertEquals(2, r.code(), r.out());
        assertTrue(r.err().contains("RefocusingFlipAngle") && r.err().contains("p.yaml"), r.err());
        CliRun uneven = CliRun.of("bids", root.toString(), out.toString(), "participant", "--quiet", "--force",
                "--participant-label", "sub-02");
        assertEquals(2, uneven.code(), uneven.out());
        assertTrue(uneven.err().contains("not evenly spaced") && uneven.err().contains("30.5"), uneven.err());
    }

    @Test
    void fitChecksASeriesAgainstItsSidecarAndTakesAPercentB1Map() throws IOException {
        double[][] d = decays(false);
        double[] series = new double[NV * ECHOES];
        double[] b1 = new double[NV];
        for (int v = 0; v < NV; v++) {
            b1[v] = 100 * b1(v);
            for (int k = 0; k < ECHOES; k++) {
                series[k * NV + v] = d[v][k];
            }
        }
        Path s = dir.resolve("series.nii.gz");
        Nifti.write(s, NiftiHeader.create(NiftiDatatype.FLOAT32, NX, NY, NZ, ECHOES).withAffine(AFFINE, 1), series, false);
        Path b = dir.resolve("b1.nii.gz");
        Nifti.write(b, NiftiHeader.create(NiftiDatatype.FLOAT32, NX, NY, NZ).withAffine(AFFINE, 1), b1, false);
        Path protocol = dir.resolve("p.yaml");
        Files.writeString(protocol, "name: invented\ntrain:\n  echoes: 24\n  echo_spacing_ms: 10\n  refocusing:\n    flip_deg: 180\n");
        StringBuilder te = new StringBuilder();
        for (int k = 1; k <= ECHOES; k++) {
            te.append(k > 1 ? ", " : "").append(String.format(Locale.ROOT, "%.3f", k * 0.011));
        }
        Files.writeString(dir.resolve("series.json"), "{\"EchoTime\": [" + te + "]}\n");
        Path out = dir.resolve("fit");
        CliRun wrong = CliRun.of("fit", s.toString(), "--protocol", protocol.toString(), "--out", out.toString(), "--quiet");
        assertEquals(2, wrong.code(), wrong.err());
        assertTrue(wrong.err().contains("series.json") && wrong.err().contains("EchoTime"), wrong.err());
        te.setLength(0);
        for (int k = 1; k <= ECHOES; k++) {
            te.append(k > 1 ? ", " : "").append(String.format(Locale.ROOT, "%.3f", k * 0.010));
        }
        Files.writeString(dir.resolve("series.json"), "{\"EchoTime\": [" + te + "]}\n");
        CliRun ok = CliRun.of("fit", s.toString(), "--protocol", protocol.toString(), "--out", out.toString(), "--quiet",
                "--b1-map", b.toString(), "--b1-map-units", "percent", "--threads", "2");
        assertEquals(0, ok.code(), ok.err());
        NiftiImage fitted = Nifti.read(out.resolve("b1_scale.nii.gz"));
        assertEquals(b1(7), fitted.get(7), 1e-6);  // the percent map became the flip-angle scale
        assertEquals(t2Ms(7), Nifti.read(out.resolve("t2_ms.nii.gz")).get(7), 1e-3 * t2Ms(7));
        JsonNode prov = Json.MAPPER.readTree(out.resolve("summary.json").toFile()).get("settings").get("provenance");
        assertTrue(prov.get("command_line").asText().startsWith("echotrellis fit "), prov.toString());
        assertEquals(java.util.HexFormat.of().formatHex(sha256(s)), prov.get("inputs_sha256").get(s.toString()).asText());
        assertEquals(Files.readString(protocol), prov.get("protocol").asText());
    }

    @Test
    void spectrumTakesAB1MapInPercentOrAsAScale() throws IOException {
        double[][] d = decays(true);
        double[] series = new double[NV * ECHOES];
        double[] scale = new double[NV];
        double[] percent = new double[NV];
        for (int v = 0; v < NV; v++) {
            scale[v] = b1(v);
            percent[v] = 100 * b1(v);
            for (int k = 0; k < ECHOES; k++) {
                series[k * NV + v] = d[v][k];
            }
        }
        Path s = dir.resolve("series.nii.gz");
        Nifti.write(s, NiftiHeader.create(NiftiDatatype.FLOAT32, NX, NY, NZ, ECHOES).withAffine(AFFINE, 1), series, false);
        NiftiHeader h = NiftiHeader.create(NiftiDatatype.FLOAT32, NX, NY, NZ).withAffine(AFFINE, 1);
        Nifti.write(dir.resolve("b1-scale.nii.gz"), h, scale, false);
        Nifti.write(dir.resolve("b1-percent.nii.gz"), h, percent, false);
        Path protocol = dir.resolve("p.yaml");
        Files.writeString(protocol, "name: invented\ntrain:\n  echoes: 24\n  echo_spacing_ms: 10\n  refocusing:\n    flip_deg: 180\n");
        CliRun asScale = CliRun.of("spectrum", s.toString(), "--protocol", protocol.toString(), "--out",
                dir.resolve("scale").toString(), "--b1-map", dir.resolve("b1-scale.nii.gz").toString(), "--quiet",
                "--threads", "2");
        assertEquals(0, asScale.code(), asScale.err());
        CliRun asPercent = CliRun.of("spectrum", s.toString(), "--protocol", protocol.toString(), "--out",
                dir.resolve("percent").toString(), "--b1-map", dir.resolve("b1-percent.nii.gz").toString(),
                "--b1-map-units", "percent", "--quiet", "--threads", "2");
        assertEquals(0, asPercent.code(), asPercent.err());
        String map;
        try (var files = Files.list(dir.resolve("scale"))) {
            map = files.map(f -> f.getFileName().toString()).filter(n -> n.startsWith("fraction_") && n.endsWith(".nii.gz"))
                    .findFirst().orElseThrow();
        }
        NiftiImage a = Nifti.read(dir.resolve("scale").resolve(map));
        NiftiImage b = Nifti.read(dir.resolve("percent").resolve(map));
        double sum = 0;
        for (int v = 0; v < NV; v++) {
            assertEquals(a.get(v), b.get(v), 1e-6, "percent map / 100 = the scale map: voxel " + v);
            sum += a.get(v);
        }
        // two pools, 15 % at T2 = 20 ms, refocusing angles fixed by the map (no search)
        assertEquals(0.15, sum / NV, 0.03);
    }

    private static byte[] sha256(Path f) throws IOException {
        try {
            return java.security.MessageDigest.getInstance("SHA-256").digest(Files.readAllBytes(f));
        } catch (java.security.NoSuchAlgorithmException e) {
            throw new IllegalStateException(e);
        }
    }
}

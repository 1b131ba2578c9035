package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.Locale;
import java.util.SplittableRandom;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.io.Json;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiDatatype;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.NiftiImage;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The {@code spectrum} command end to end: contracts of the outputs and refusal of bad input. */
class SpectrumCommandTest {
    static final String PROTOCOL = "sequences/brain-mwi-32.yaml";

    @TempDir
    Path tmp;

    /** A two-pool decay (our own values): 15 % at 20 ms + 85 % at 80 ms, refocusing 160°, light noise. */
    static double[] twoPool(SplittableRandom rnd, double sigma) {
        CpmgEngine e = new CpmgEngine(1);
        CpmgTrain t = CpmgTrain.constant(32, 10, 160);
        double[] a = e.echoes(t, 1000, 20, 1);
        double[] b = e.echoes(t, 1000, 80, 1);
        double[] y = new double[32];
        for (int i = 0; i < 32; i++) {
            y[i] = Math.hypot(0.15 * Math.abs(a[i]) + 0.85 * Math.abs(b[i]) + sigma * g(rnd), sigma * g(rnd));
        }
        return y;
    }

    static double g(SplittableRandom r) {
        return Math.sqrt(-2 * Math.log(1 - r.nextDouble())) * Math.cos(2 * Math.PI * r.nextDouble());
    }

    private Path table() throws Exception {
        SplittableRandom rnd = new SplittableRandom(7);
        double[] a = twoPool(rnd, 1e-3);
        double[] b = twoPool(rnd, 1e-3);
        StringBuilder sb = new StringBuilder("te_ms,voxel_a,voxel_b\n");
        for (int i = 0; i < 32; i++) {
            sb.append(String.format(Locale.ROOT, "%d,%.8f,%.8f%n", 10 * (i + 1), a[i], b[i]));
        }
        Path f = tmp.resolve("decays.csv");
        Files.writeString(f, sb.toString());
        return f;
    }

    @Test
    void tableJsonContractAndFiles() throws Exception {
        Path out = tmp.resolve("out");
        CliRun r = CliRun.of("spectrum", table().toString(), "--protocol", PROTOCOL, "--format", "json",
                "--out", out.toString());
        assertEquals(0, r.code(), r.err());
        JsonNode spectra = Json.MAPPER.readTree(r.out()).get("spectra");
        assertEquals(2, spectra.size());
        JsonNode prov = Json.MAPPER.readTree(r.out()).get("provenance");  // on stdout as in every JSON output
        assertTrue(prov.get("command_line").asText().startsWith("echotrellis spectrum "), String.valueOf(prov));
        JsonNode s = spectra.get(0);
        assertEquals("voxel_a", s.get("name").asText());
        // default grid from the protocol: 10 ms (first echo) to 4 × 320 ms, 15 bins per decade → 33 bins
        assertEquals(33, s.get("t2_ms").size());
        assertEquals(33, s.get("amplitude").size());
        assertEquals(10, s.get("t2_ms").get(0).asDouble(), 1e-12);
        assertEquals(1280.0, s.get("t2_ms").get(32).asDouble(), 1e-9);
        // refocusing 160° simulated; refinement of Prasloski et al. 2012 should find it (±3°, issue criterion)
        assertEquals(160, s.get("refocus_deg").asDouble(), 3);
        assertTrue(s.get("chi2").asDouble() > 0);
        JsonNode w = s.get("fractions").get(0);
        assertEquals(10, w.get("lo_ms").asDouble(), 0);
        assertEquals(40, w.get("hi_ms").asDouble(), 0);
        // contract check only (accuracy is SpectrumAccuracyTest's): one noisy decay, loose tolerance
        assertEquals(0.15, w.get("fraction").asDouble(), 0.05);
        assertTrue(s.get("gm_t2_ms").asDouble() > 40 && s.get("gm_t2_ms").asDouble() < 80);
        for (String f : new String[] {"spectra.csv", "spectra.json", "spectrum.png", "spectrum.svg"}) {
            assertTrue(Files.size(out.resolve(f)) > 500, f);
        }
        CliRun again = CliRun.of("spectrum", tmp.resolve("decays.csv").toString(), "--protocol", PROTOCOL,
                "--out", out.toString());
        assertEquals(2, again.code());
        assertTrue(again.err().contains("--force"), again.err());
    }

    @Test
    void tableCsvAndText() throws Exception {
        Path t = table();
        CliRun c = CliRun.of("spectrum", t.toString(), "--protocol", PROTOCOL, "--format", "csv",
                "--fraction-window-ms", "10:40", "--fraction-window-ms", "40:200", "--regularisation", "cross-validation");
        assertEquals(0, c.code(), c.err());
        String[] lines = c.out().split("\n");
        assertEquals(3, lines.length);
        assertTrue(lines[0].startsWith("name,status,refocus_deg,chi2,chi2_unregularised,regularisation_weight,snr,"
                + "gm_t2_ms,fraction_10_40ms,gm_t2_10_40ms,fraction_40_200ms,gm_t2_40_200ms,t2_10.00ms,t2_11.64ms"), lines[0]);
        assertEquals(2 + 6 + 2 * 2 + 33, lines[1].split(",").length);
        CliRun x = CliRun.of("spectrum", t.toString(), "--protocol", PROTOCOL, "--refocus-deg", "160",
                "--regularisation", "none");
        assertEquals(0, x.code(), x.err());
        assertTrue(x.out().contains("voxel_b") && x.out().contains("160.00"), x.out());
    }

    @Test
    void imageOutputs() throws Exception {
        int nx = 4;
        int ny = 3;
        int nz = 2;
        int n = nx * ny * nz;
        double[] data = new double[n * 32];
        SplittableRandom rnd = new SplittableRandom(99);
        for (int v = 0; v < n; v++) {
            double[] y = twoPool(rnd, 2e-3);
            for (int e = 0; e < 32; e++) {
                data[v + n * e] = 1000 * y[e];          // x fastest, echo slowest; arbitrary signal scale
            }
        }
        data[5 + n * 3] = Double.NaN;                    // one voxel with a NaN echo: status invalid
        Path img = tmp.resolve("slab.nii.gz");
        Nifti.write(img, NiftiHeader.create(NiftiDatatype.FLOAT32, nx, ny, nz, 32), data, false);
        double[] mask = new double[n];
        java.util.Arrays.fill(mask, 1);
        mask[0] = 0;
        Path m = tmp.resolve("mask.nii.gz");
        Nifti.write(m, NiftiHeader.create(NiftiDatatype.UINT8, nx, ny, nz), mask, false);
        Path out = tmp.resolve("maps");
        // the decays were made with T1 1000 ms (the protocol's tissue has another T1)
        CliRun r = CliRun.of("spectrum", img.toString(), "--protocol", PROTOCOL, "--mask", m.toString(),
                "--out", out.toString(), "--threads", "2", "--quiet", "--t1-ms", "1000");
        assertEquals(0, r.code(), r.err());
        NiftiImage spec = Nifti.read(out.resolve("spectrum.nii.gz"));
        assertEquals(4, spec.header().rank());
        assertEquals(33, spec.header().size(4));
        assertEquals(nx, spec.header().size(1));
        NiftiImage frac = Nifti.read(out.resolve("fraction_10_40ms.nii.gz"));
        NiftiImage angle = Nifti.read(out.resolve("refocus_deg.nii.gz"));
        NiftiImage status = Nifti.read(out.resolve("status.nii.gz"));
        assertEquals(0, status.get(0), 0);                // outside mask
        assertEquals(4, status.get(5), 0);                // invalid input
        for (int v = 1; v < n; v++) {
            if (v == 5) {
                continue;
            }
            assertEquals(1, status.get(v), 0, "voxel " + v);
            assertEquals(0.15, frac.get(v), 0.05, "fraction voxel " + v);
            assertEquals(160, angle.get(v), 4, "angle voxel " + v);
            double sum = 0;
            for (int j = 0; j < 33; j++) {
                sum += spec.get(v + n * j);
            }
            // amplitudes in data units: Σ s ≈ extrapolated signal at t = 0, here 1000 (sin 90° = 1)
            assertEquals(1000, sum, 30, "spectrum sum voxel " + v);
        }
        long before = Files.getLastModifiedTime(out.resolve("spectrum.nii.gz")).toMillis();
        CliRun again = CliRun.of("spectrum", img.toString(), "--protocol", PROTOCOL, "--out", out.toString(), "--quiet");
        assertEquals(2, again.code());
        assertTrue(again.err().contains("exists; use --force"), again.err());
        assertEquals(before, Files.getLastModifiedTime(out.resolve("spectrum.nii.gz")).toMillis());
        CliRun forced = CliRun.of("spectrum", img.toString(), "--protocol", PROTOCOL, "--out", out.toString(),
                "--mask", m.toString(), "--quiet", "--force", "--refocus-deg", "160");
        assertEquals(0, forced.code(), forced.err());
        CliRun wrongEchoes = CliRun.of("spectrum", img.toString(), "--protocol", "sequences/knee-t2-16.yaml",
                "--out", tmp.resolve("knee").toString(), "--quiet");
        assertEquals(2, wrongEchoes.code());
        assertTrue(wrongEchoes.err().contains("echoes"), wrongEchoes.err());
        JsonNode summary = Json.MAPPER.readTree(out.resolve("summary.json").toFile());
        assertEquals(23, summary.get("voxels_processed").asInt());
        assertEquals(33, summary.get("settings").get("t2_ms").size());
        for (String f : new String[] {"fraction_10_40ms.png", "refocus_deg.png", "gm_t2_ms.png", "snr.png"}) {
            assertTrue(Files.size(out.resolve(f)) > 1000, f);
        }
    }

    @Test
    void badInputIsRefusedNamingTheOption() throws Exception {
        String t = table().toString();
        String[][] cases = {
            {"--fraction-window-ms", "5:40", "--fraction-window-ms"},
            {"--fraction-window-ms", "40:10", "--fraction-window-ms"},
            {"--fraction-window-ms", "10:3000", "--fraction-window-ms"},
            {"--fraction-window-ms", "abc", "--fraction-window-ms"},
            {"--t2-bins", "1", "--t2-bins"},
            {"--t2-min-ms", "-3", "--t2-min-ms"},
            {"--regularisation", "lasso", "--regularisation"},
            {"--misfit-increase", "0.9", "--misfit-increase"},
            {"--refocus-search-deg", "50:400:8", "--refocus-search-deg"},
            {"--refocus-search-deg", "50:180", "--refocus-search-deg"},
            {"--refocus-deg", "0", "--refocus-deg"},
        };
        for (String[] c : cases) {
            CliRun r = CliRun.of("spectrum", t, "--protocol", PROTOCOL, c[0], c[1]);
            assertEquals(2, r.code(), String.join(" ", c) + ": " + r.err());
            assertTrue(r.err().contains(c[2]), String.join(" ", c) + ": " + r.err());
            assertEquals(1, r.err().strip().split("\n").length, "one line: " + r.err());
        }
        CliRun both = CliRun.of("spectrum", t, "--protocol", PROTOCOL, "--refocus-deg", "150",
                "--refocus-search-deg", "50:180:8");
        assertEquals(2, both.code());
        CliRun echoes = CliRun.of("spectrum", t, "--protocol", "sequences/knee-t2-16.yaml");
        assertEquals(2, echoes.code());
        assertTrue(echoes.err().contains("echoes"), echoes.err());
        Path img = tmp.resolve("x.nii");
        Nifti.write(img, NiftiHeader.create(NiftiDatatype.FLOAT32, 2, 2, 1, 32), new double[128], false);
        CliRun noOut = CliRun.of("spectrum", img.toString(), "--protocol", PROTOCOL);
        assertEquals(2, noOut.code());
        assertTrue(noOut.err().contains("--out"), noOut.err());
        CliRun ext = CliRun.of("spectrum", tmp.resolve("decays.txt").toString(), "--protocol", PROTOCOL);
        assertEquals(2, ext.code());
    }

    @Test
    void helpShowsExample() {
        CliRun r = CliRun.of("spectrum", "--help");
        assertEquals(0, r.code());
        assertTrue(r.out().contains("Example") && r.out().contains("--fraction-window-ms"), r.out());
    }
}

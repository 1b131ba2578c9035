package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
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
import org.echotrellis.io.VoxelStatus;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class FitCommandTest {
    private static final String PROTOCOL = "sequences/brain-mwi-32.yaml";  // 32 echoes, ESP 10 ms, 180°
    private static final CpmgTrain TRAIN = CpmgTrain.constant(32, 10, 180);

    @TempDir
    Path dir;

    private static double[] decay(double t2, double b1, double amp) {
        double[] e = new CpmgEngine(1).echoes(TRAIN, 1000, t2, b1);
        for (int i = 0; i < e.length; i++) {
            e[i] = amp * Math.abs(e[i]);
        }
        return e;
    }

    private Path csv() throws IOException {
        double[] a = decay(60, 0.8, 1000);
        double[] b = decay(110, 0.65, 500);
        StringBuilder sb = new StringBuilder("echo_time_ms,left,right\n");
        for (int i = 0; i < 32; i++) {
            sb.append(String.format(Locale.ROOT, "%.1f,%.9g,%.9g%n", 10.0 * (i + 1), a[i], b[i]));
        }
        Path f = dir.resolve("decays.csv");
        Files.writeString(f, sb.toString());
        return f;
    }

    @Test
    void decayTableGivesJsonAndAPlot() throws IOException {
        Path out = dir.resolve("out");
        // the decays were made with T1 1000 ms; the protocol's tissue has another T1, so it is given
        CliRun r = CliRun.of("fit", csv().toString(), "--protocol", PROTOCOL, "--format", "json", "--out", out.toString(),
                "--t1-ms", "1000");
        assertEquals(0, r.code(), r.err());
        JsonNode fits = Json.MAPPER.readTree(r.out()).get("fits");
        assertEquals(2, fits.size());
        assertEquals("left", fits.get(0).get("name").asText());
        assertEquals(60, fits.get(0).get("t2_ms").asDouble(), 60 * 1e-4);   // noise-free decay from the engine
        assertEquals(0.8, fits.get(0).get("b1_scale").asDouble(), 1e-4);
        assertEquals(1000, fits.get(0).get("amplitude").asDouble(), 1000 * 1e-4);
        assertEquals(110, fits.get(1).get("t2_ms").asDouble(), 110 * 1e-4);
        assertEquals("ok", fits.get(1).get("status").asText());
        assertTrue(fits.get(1).get("mono_t2_ms").asDouble() > 110 * 1.1, "mono is biased at B1 0.65");
        for (String key : new String[] {"t2_se_ms", "residual_rms"}) {
            assertTrue(fits.get(0).has(key), key);
        }
        assertTrue(Files.size(out.resolve("decays-fit.png")) > 1000);
        assertTrue(Files.readString(out.resolve("decays-fit.svg")).contains("<svg"));
        CliRun table = CliRun.of("fit", csv().toString(), "--protocol", PROTOCOL, "--out", out.toString(), "--force");
        assertEquals(0, table.code(), table.err());
        assertTrue(table.out().startsWith("name"), table.out());
        assertTrue(table.out().contains("left"));
    }

    @Test
    void volumeGivesMapsStatusPreviewsAndSummary() throws IOException {
        int nx = 6;
        int ny = 5;
        int nz = 2;
        int nv = nx * ny * nz;
        double[] data = new double[nv * 32];
        double[] mask = new double[nv];
        for (int v = 0; v < nv; v++) {
            mask[v] = v % 7 == 0 ? 0 : 1;
            double[] e = decay(40 + v, 0.6 + 0.005 * v, 100);
            for (int k = 0; k < 32; k++) {
                data[k * nv + v] = e[k];
            }
        }
        int nanVoxel = 3;
        data[5 * nv + nanVoxel] = Double.NaN;
        int zeroVoxel = 4;
        for (int k = 0; k < 32; k++) {
            data[k * nv + zeroVoxel] = 0;
        }
        Path series = dir.resolve("series.nii.gz");
        Nifti.write(series, NiftiHeader.create(NiftiDatatype.FLOAT32, nx, ny, nz, 32), data, false);
        Path maskFile = dir.resolve("mask.nii");
        Nifti.write(maskFile, NiftiHeader.create(NiftiDatatype.UINT8, nx, ny, nz), mask, false);
        Path out = dir.resolve("maps");
        CliRun r = CliRun.of("fit", series.toString(), "--protocol", PROTOCOL, "--mask", maskFile.toString(),
                "--out", out.toString(), "--compare-mono", "--threads", "2", "--quiet", "--t1-ms", "1000");
        assertEquals(0, r.code(), r.err());
        assertEquals("", r.err());
        NiftiImage t2 = Nifti.read(out.resolve("t2_ms.nii.gz"));
        NiftiImage status = Nifti.read(out.resolve("status.nii.gz"));
        assertEquals(3, t2.header().rank());
        for (int v = 0; v < nv; v++) {
            int code = (int) status.get(v);
            if (mask[v] == 0) {
                assertEquals(VoxelStatus.OUTSIDE_MASK.code(), code);
            } else if (v == nanVoxel || v == zeroVoxel) {
                assertEquals(VoxelStatus.INVALID_INPUT.code(), code, "voxel " + v);
            } else {
                assertEquals(VoxelStatus.OK.code(), code, "voxel " + v);
                assertEquals(40 + v, t2.get(v), (40 + v) * 1e-4);  // float32 map of a noise-free fit
            }
        }
        for (String f : new String[] {"t2_se_ms", "b1_scale", "b1_se", "amplitude", "residual_rms", "mono_t2_ms"}) {
            assertTrue(Files.exists(out.resolve(f + ".nii.gz")), f);
        }
        for (String f : new String[] {"t2_ms.png", "mono_t2_ms.png", "b1_scale.png", "status.png"}) {
            assertTrue(Files.size(out.resolve(f)) > 1000, f);
        }
        JsonNode s = Json.MAPPER.readTree(out.resolve("summary.json").toFile());
        assertEquals(2, s.get("status_counts").get("invalid_input").asInt());
        assertTrue(s.get("voxels_per_second").asDouble() > 0);
        assertTrue(s.get("maps").get("t2_ms").has("p50"));
        assertEquals("epg", s.get("settings").get("model").asText());

        CliRun again = CliRun.of("fit", series.toString(), "--protocol", PROTOCOL, "--out", out.toString(), "--quiet");
        assertEquals(2, again.code());
        assertTrue(again.err().contains("exists; use --force"), again.err());
        assertEquals(1, again.err().strip().split("\n").length, again.err());
    }

    @Test
    void b1MapFixesB1AndAutoNoiseUsesTheBackground() throws IOException {
        int nx = 8;
        int nv = nx * nx;
        double[] data = new double[nv * 32];
        double[] mask = new double[nv];
        double[] b1 = new double[nv];
        java.util.Random r = new java.util.Random(31);
        for (int v = 0; v < nv; v++) {
            boolean inside = v % nx >= 2 && v % nx < 6;
            mask[v] = inside ? 1 : 0;
            b1[v] = 0.6 + 0.3 * (v % nx) / nx;
            double[] e = inside ? decay(70, b1[v], 100) : new double[32];
            for (int k = 0; k < 32; k++) {
                data[k * nv + v] = Math.hypot(e[k] + 0.5 * r.nextGaussian(), 0.5 * r.nextGaussian());
            }
        }
        Path series = dir.resolve("b.nii");
        Nifti.write(series, NiftiHeader.create(NiftiDatatype.FLOAT32, nx, nx, 1, 32), data, false);
        Path maskFile = dir.resolve("bm.nii");
        Nifti.write(maskFile, NiftiHeader.create(NiftiDatatype.UINT8, nx, nx, 1), mask, false);
        Path b1File = dir.resolve("b1.nii");
        Nifti.write(b1File, NiftiHeader.create(NiftiDatatype.FLOAT32, nx, nx, 1), b1, false);
        Path out = dir.resolve("bmaps");
        CliRun run = CliRun.of("fit", series.toString(), "--protocol", PROTOCOL, "--mask", maskFile.toString(),
                "--b1-map", b1File.toString(), "--noise-sigma", "auto", "--out", out.toString(), "--quiet");
        assertEquals(0, run.code(), run.err());
        NiftiImage b1Out = Nifti.read(out.resolve("b1_scale.nii.gz"));
        NiftiImage t2 = Nifti.read(out.resolve("t2_ms.nii.gz"));
        JsonNode s = Json.MAPPER.readTree(out.resolve("summary.json").toFile());
        // background of pure Rician noise: sigma = sqrt(mean M^2 / 2) (Gudbjartsson & Patz 1995)
        assertEquals(0.5, s.get("settings").get("noise_sigma").asDouble(), 0.05);
        for (int v = 0; v < nv; v++) {
            if (mask[v] == 1) {
                assertEquals((float) b1[v], b1Out.get(v), 1e-6);
                assertEquals(70, t2.get(v), 70 * 0.05);  // SNR 200 on the first echo: within about 3 SE
            }
        }
    }

    @Test
    void badInputGivesOneLineAndExitCode2() throws IOException {
        Path series = dir.resolve("s.nii");
        Nifti.write(series, NiftiHeader.create(NiftiDatatype.INT16, 2, 2, 1, 16), new double[64], false);
        Path otherMask = dir.resolve("m.nii");
        Nifti.write(otherMask, NiftiHeader.create(NiftiDatatype.UINT8, 3, 2, 1), new double[6], false);
        Path truncated = dir.resolve("t.nii");
        Files.write(truncated, java.util.Arrays.copyOf(Files.readAllBytes(series), 360));
        String[][] cases = {
            {"fit", series.toString(), "--protocol", PROTOCOL, "--out", dir.resolve("a").toString()},        // 16 echoes vs 32
            {"fit", truncated.toString(), "--protocol", PROTOCOL, "--out", dir.resolve("b").toString()},
            {"fit", csv().toString(), "--protocol", PROTOCOL, "--noise-sigma", "auto"},
            {"fit", csv().toString(), "--protocol", PROTOCOL, "--noise-sigma", "-1"},
            {"fit", csv().toString(), "--protocol", PROTOCOL, "--t1-ms", "-5"},
            {"fit", csv().toString(), "--protocol", PROTOCOL, "--t2-min-ms", "50", "--t2-max-ms", "40"},
            {"fit", csv().toString(), "--protocol", "sequences/cp-phase-error-16.yaml"},
        };
        for (String[] c : cases) {
            CliRun r = CliRun.of(c);
            assertEquals(2, r.code(), String.join(" ", c) + " -> " + r.err());
            assertTrue(r.err().startsWith("echotrellis: "), r.err());
            assertEquals(1, r.err().strip().split("\n").length, r.err());
        }
        Path s32 = dir.resolve("s32.nii");
        Nifti.write(s32, NiftiHeader.create(NiftiDatatype.INT16, 2, 2, 1, 32), new double[128], false);
        CliRun r = CliRun.of("fit", s32.toString(), "--protocol", PROTOCOL, "--mask", otherMask.toString(), "--quiet",
                "--out", dir.resolve("c").toString());
        assertEquals(2, r.code());
        assertTrue(r.err().contains("--mask") && r.err().contains("does not match"), r.err());
    }

    @Test
    void helpShowsAnExample() {
        CliRun r = CliRun.of("fit", "--help");
        assertEquals(0, r.code());
        assertTrue(r.out().contains("echotrellis.jar fit sequences/brain-mwi-32-decays.csv"), r.out());
        for (String line : r.out().split("\\R")) {
            assertTrue(line.length() <= 80, "help line longer than 80: " + line);
        }
        assertTrue(r.out().contains("T1 is the protocol tissue's"), r.out());
    }
}

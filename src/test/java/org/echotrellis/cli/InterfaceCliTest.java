package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;

import com.fasterxml.jackson.databind.JsonNode;
import javax.imageio.ImageIO;
import org.echotrellis.epg.CpmgEngine;
import org.echotrellis.epg.CpmgTrain;
import org.echotrellis.io.Json;
import org.echotrellis.io.Nifti;
import org.echotrellis.io.NiftiDatatype;
import org.echotrellis.io.NiftiHeader;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Command-line behaviour of the interface points: usage, number forms, tissues, figures, design limits. */
class InterfaceCliTest {
    private static final String KNEE = "sequences/knee-t2-16.yaml";

    @TempDir
    Path dir;

    @Test
    void noCommandPrintsTheUsageAndFails() {
        CliRun r = CliRun.of();
        assertEquals(2, r.code());
        assertEquals("", r.out());
        assertTrue(r.err().startsWith("echotrellis: no command given"), r.err());
        assertTrue(r.err().contains("Usage: echotrellis"), r.err());
    }

    @Test
    void infinityIsAcceptedAsInTheProtocolFiles() {
        CliRun r = CliRun.of("simulate", KNEE, "--t2-ms", "inf", "--t1-ms", "INF");
        assertEquals(0, r.code(), r.err());
        assertTrue(r.out().contains("T1 inf ms, T2 inf ms"), r.out());
        CliRun bad = CliRun.of("simulate", KNEE, "--t2-ms", "forever");
        assertEquals(2, bad.code());
        assertTrue(bad.err().contains("'forever' is not a number"), bad.err());
    }

    @Test
    void tablesShowNoNegativeZero() {
        // the CP (not CPMG) train of this file alternates the echo sign: the phases are 0 and 180
        CliRun sim = CliRun.of("simulate", "sequences/cp-phase-error-16.yaml");
        assertEquals(0, sim.code(), sim.err());
        assertFalse(sim.out().matches("(?s).*-0\\.0+(?![0-9]).*"), sim.out());
        assertTrue(sim.out().contains("     0.000"), sim.out());
        CliRun path = CliRun.of("pathways", "sequences/cp-phase-error-16.yaml", "--echo", "3");
        assertEquals(0, path.code(), path.err());
        assertFalse(path.out().matches("(?s).*-0\\.0+(?![0-9]).*"), path.out());
        assertFalse(path.out().contains("-180.000"), path.out());
        assertEquals(" 0.000  1.5", Tables.noNegativeZero("-0.000  1.5"));
        assertEquals("-0.001  0.000e+00", Tables.noNegativeZero("-0.001  0.000e+00"));
    }

    @Test
    void plotTissuesTakePresetsAndExplicitTimesAndTheLegendNamesThem() throws IOException {
        Path svg = dir.resolve("t.svg");
        CliRun r = CliRun.of("simulate", KNEE, "--plot", svg.toString(), "--plot-tissue", "csf_3t,lesion:1400:120,fat_3t");
        assertEquals(0, r.code(), r.err());
        String text = Files.readString(svg);
        assertTrue(text.contains("lesion (T1 1400, T2 120 ms), B1 1.00"), "explicit tissue in the legend");
        assertTrue(text.contains("csf_3t (T1 4200, T2 2000 ms)"), "preset in the legend");
        assertTrue(text.contains("knee_cartilage_3t (T1 1240, T2 37 ms), B1 1.00"), "the protocol's tissue by name");
        assertFalse(text.contains("EPG, B1"), "no anonymous legend entries");
        for (String bad : new String[] {"lesion:1400", "lesion:abc:120", ":1400:120", "lesion:1400:-3", "nosuch"}) {
            CliRun b = CliRun.of("simulate", KNEE, "--plot", dir.resolve("b.png").toString(), "--plot-tissue", bad);
            assertEquals(2, b.code(), bad);
            assertEquals(1, b.err().strip().lines().count(), b.err());
            assertTrue(b.err().contains("--plot-tissue"), b.err());
        }
    }

    @Test
    void refocusingFlipOptionChangesOnlyTheRefocusingPulses() throws IOException {
        Path p150 = dir.resolve("knee150.yaml");
        Files.writeString(p150, Files.readString(Path.of(KNEE)).replace("refocusing: {flip_deg: 180", "refocusing: {flip_deg: 150"));
        CliRun viaOption = CliRun.of("simulate", KNEE, "--refocusing-flip-deg", "150", "--format", "csv");
        CliRun viaFile = CliRun.of("simulate", p150.toString(), "--format", "csv");
        assertEquals(0, viaOption.code(), viaOption.err());
        assertEquals(viaFile.out(), viaOption.out());
        // --b1 scales the excitation too: B1 150/180 is not the same train
        CliRun viaB1 = CliRun.of("simulate", KNEE, "--b1", String.valueOf(150.0 / 180), "--format", "csv");
        assertFalse(viaB1.out().equals(viaOption.out()));
        // the reference: the engine with excitation 90° and constant 150° refocusing (independent of the CLI)
        double[] e = new CpmgEngine(1).echoes(CpmgTrain.constant(16, 9, 150), 1240, 37, 1);
        String second = viaOption.out().lines().skip(2).findFirst().orElseThrow();
        assertEquals(Math.abs(e[1]), Double.parseDouble(second.split(",")[3]), 1e-12);
        CliRun schedule = CliRun.of("simulate", "sequences/fse-variable-1p5t.yaml", "--refocusing-flip-deg", "120");
        assertEquals(2, schedule.code());
        assertTrue(schedule.err().contains("schedule"), schedule.err());
        CliRun range = CliRun.of("simulate", KNEE, "--refocusing-flip-deg", "0");
        assertEquals(2, range.code());
    }

    @Test
    void plotScaleMagnifiesFiguresAndIsChecked() throws IOException {
        Path png = dir.resolve("s.png");
        CliRun r = CliRun.of("simulate", KNEE, "--plot", png.toString(), "--plot-scale", "2");
        assertEquals(0, r.code(), r.err());
        assertEquals(1800, ImageIO.read(png.toFile()).getWidth());
        Path svg = dir.resolve("s.svg");
        assertEquals(0, CliRun.of("simulate", KNEE, "--plot", svg.toString(), "--plot-scale", "1.5").code());
        assertTrue(Files.readString(svg).contains("width=\"1350\""));
        CliRun bad = CliRun.of("simulate", KNEE, "--plot", dir.resolve("x.png").toString(), "--plot-scale", "50");
        assertEquals(2, bad.code());
        assertTrue(bad.err().contains("--plot-scale must be within [0.25, 8], got 50"), bad.err());
        assertFalse(Files.exists(dir.resolve("x.png")));
    }

    @Test
    void sweepsDrawNoProgressIntoNonTerminals() {
        CliRun r = CliRun.of("simulate", KNEE, "--sweep", "t2_ms=10:100:50");
        assertEquals(0, r.code(), r.err());
        assertEquals("", r.err(), "no progress bar when stderr is not a terminal");
    }

    @Test
    void volumeFitHonoursJsonSharedRangesAndWritesEveryPreviewTwice() throws IOException {
        int nx = 5;
        int ny = 4;
        int nv = nx * ny;
        CpmgTrain train = CpmgTrain.constant(32, 10, 180);
        double[] data = new double[nv * 32];
        for (int v = 0; v < nv; v++) {
            double[] e = new CpmgEngine(1).echoes(train, 1000, 50 + 3 * v, 0.6 + 0.01 * v);
            for (int k = 0; k < 32; k++) {
                data[k * nv + v] = 100 * Math.abs(e[k]);
            }
        }
        Path series = dir.resolve("s.nii.gz");
        Nifti.write(series, NiftiHeader.create(NiftiDatatype.FLOAT32, nx, ny, 1, 32), data, false);
        Path out = dir.resolve("maps");
        CliRun r = CliRun.of("fit", series.toString(), "--protocol", "sequences/brain-mwi-32.yaml", "--out",
                out.toString(), "--compare-mono", "--format", "json", "--display-range", "40:200", "--quiet");
        assertEquals(0, r.code(), r.err());
        JsonNode j = Json.MAPPER.readTree(r.out());
        assertEquals(nv, j.get("voxels_processed").asInt());
        assertTrue(j.get("maps").has("t2_ms"));
        for (String m : new String[] {"t2_ms", "mono_t2_ms", "b1_scale", "amplitude", "status"}) {
            assertTrue(Files.size(out.resolve(m + ".png")) > 1000, m);
            assertTrue(Files.readString(out.resolve(m + ".svg")).contains("<svg"), m);
        }
        String status = Files.readString(out.resolve("status.svg"));
        assertTrue(status.contains("hit bound") && status.contains("outside mask") && status.contains("ok"),
                "the status legend names the codes");
        CliRun bad = CliRun.of("fit", series.toString(), "--protocol", "sequences/brain-mwi-32.yaml", "--out",
                dir.resolve("m2").toString(), "--display-range", "200:40");
        assertEquals(2, bad.code());
        assertTrue(bad.err().contains("--display-range must be LO:HI"), bad.err());
    }

    @Test
    void volumeSpectrumPrintsItsSummaryAsJsonAndWritesSvgPreviews() throws IOException {
        int nv = 4;
        CpmgTrain train = CpmgTrain.constant(32, 10, 180);
        double[] data = new double[nv * 32];
        for (int v = 0; v < nv; v++) {
            double[] fast = new CpmgEngine(1).echoes(train, 1000, 20, 0.9);
            double[] slow = new CpmgEngine(1).echoes(train, 1000, 80 + 5 * v, 0.9);
            for (int k = 0; k < 32; k++) {
                data[k * nv + v] = 100 * Math.abs(0.15 * fast[k] + 0.85 * slow[k]);
            }
        }
        Path series = dir.resolve("sp.nii");
        Nifti.write(series, NiftiHeader.create(NiftiDatatype.FLOAT32, 2, 2, 1, 32), data, false);
        Path out = dir.resolve("sp");
        CliRun r = CliRun.of("spectrum", series.toString(), "--protocol", "sequences/brain-mwi-32.yaml", "--out",
                out.toString(), "--format", "json", "--quiet");
        assertEquals(0, r.code(), r.err());
        JsonNode j = Json.MAPPER.readTree(r.out());
        assertEquals(nv, j.get("voxels_processed").asInt());
        try (java.util.stream.Stream<Path> files = Files.list(out)) {
            long svg = files.filter(f -> f.toString().endsWith(".svg")).count();
            assertTrue(svg >= 3, "map previews as SVG: " + svg);
        }
    }

    @Test
    void designOverTheLimitsFailsUnlessAskedAndTheFileRecordsTheLimits() throws IOException {
        String[] base = {"design", "--protocol", "sequences/fse-variable-1p5t.yaml", "--target", "constant:0.4",
            "--sar-budget", "0.1"};
        CliRun r = CliRun.of(base);
        assertEquals(2, r.code());
        assertEquals("", r.out());
        assertTrue(r.err().contains("exceeds the limits") && r.err().contains("largest factor of the target reachable"
                + " within them is 0."), r.err());
        Path out = dir.resolve("d");
        String[] keep = java.util.stream.Stream.concat(java.util.Arrays.stream(base),
                java.util.stream.Stream.of("--keep-over-limits", "--out", out.toString(), "--quiet")).toArray(String[]::new);
        CliRun k = CliRun.of(keep);
        assertEquals(0, k.code(), k.err());
        String yaml = Files.readString(out.resolve("schedule.yaml"));
        assertTrue(yaml.contains("# Designed for: relative-SAR budget 0.1"), yaml);
        assertTrue(yaml.contains("LIMITS EXCEEDED"), yaml);
        CliRun free = CliRun.of("design", "--protocol", "sequences/brain-fse-80-3t.yaml", "--objective", "signal:10",
                "--sar-budget", "0.9", "--max-evaluations", "200", "--quiet");
        assertEquals(0, free.code(), free.err());
        assertTrue(free.out().contains("The SAR budget is not binding"), free.out());
    }

    @Test
    void shippedExampleTableRunsAsTheHelpSays() {
        CliRun r = CliRun.of("fit", "sequences/brain-mwi-32-decays.csv", "--protocol", "sequences/brain-mwi-32.yaml",
                "--format", "json", "--out", dir.resolve("f").toString());
        assertEquals(0, r.code(), r.err());
        assertTrue(r.out().contains("\"wm_like\""), r.out());
    }
}

package org.echotrellis.cli;

import static org.echotrellis.cli.Adversarial.KNEE;
import static org.echotrellis.cli.Adversarial.image;
import static org.echotrellis.cli.Adversarial.noLeftovers;
import static org.echotrellis.cli.Adversarial.refused;
import static org.echotrellis.cli.Adversarial.series;
import static org.echotrellis.cli.Adversarial.snapshot;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.ByteArrayOutputStream;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.zip.GZIPOutputStream;
import org.echotrellis.io.NiftiDatatype;
import org.echotrellis.io.NiftiHeader;
import org.echotrellis.io.OutputSet;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Issue 10 §1, §2 and §4, cases that write: each asserts the exit code, one line without a stack
 * trace naming the culprit, that no input changed and that no partial or mixed output set remains.
 */
class AdversarialOutputsTest {
    @TempDir
    Path dir;

    @Test
    void aForcedRerunNeverMixesTwoRunsOutputs() throws Exception {
        Path s = series(dir.resolve("s.nii"), 3, 2);
        Path out = dir.resolve("maps");
        CliRun first = CliRun.of("fit", s.toString(), "--protocol", KNEE, "--out", out.toString(), "--compare-mono",
                "--quiet", "--threads", "1");
        assertEquals(0, first.code(), first.err());
        assertTrue(Files.exists(out.resolve("mono_t2_ms.nii.gz")));
        CliRun second = CliRun.of("fit", s.toString(), "--protocol", KNEE, "--out", out.toString(), "--force",
                "--quiet", "--threads", "1");
        assertEquals(0, second.code(), second.err());
        assertFalse(Files.exists(out.resolve("mono_t2_ms.nii.gz")), "output of the first run left beside the second");
        assertFalse(Files.exists(out.resolve("mono_t2_ms.png")));
        assertTrue(Files.readString(out.resolve(OutputSet.MANIFEST)).contains("summary.json"));
        noLeftovers(dir);
    }

    @Test
    void aSeriesInsideItsOwnOutputIsNeverOverwritten() throws Exception {
        Path out = Files.createDirectories(dir.resolve("o"));
        Path s = series(out.resolve("spectrum.nii.gz"), 2, 2);
        List<String> before = snapshot(dir);
        CliRun r = CliRun.of("spectrum", s.toString(), "--protocol", KNEE, "--out", out.toString(), "--force", "--quiet");
        refused(r, 2, s.toString(), "input of this run");
        assertEquals(before, snapshot(dir));
    }

    @Test
    void aMaskNamedLikeAnOutputIsNeverOverwritten() throws Exception {
        Path s = series(dir.resolve("s.nii"), 2, 2);
        Path out = Files.createDirectories(dir.resolve("o"));
        Path mask = image(out.resolve("status.nii.gz"), 1, 2, 2, 1);
        List<String> before = snapshot(dir);
        CliRun r = CliRun.of("fit", s.toString(), "--protocol", KNEE, "--mask", mask.toString(), "--out", out.toString(),
                "--force", "--quiet");
        refused(r, 2, mask.toString(), "input of this run");
        assertEquals(before, snapshot(dir));
    }

    @Test
    void devicesAndLinksAreNeverReplaced() throws Exception {
        CliRun dev = CliRun.of("simulate", KNEE, "--sweep", "t2_ms=10:50:3", "--out", "/dev/null", "--force", "--quiet");
        refused(dev, 2, "/dev/null", "not a regular file");
        assertFalse(Files.isRegularFile(Path.of("/dev/null")));
        Path target = Files.writeString(dir.resolve("precious.csv"), "keep");
        Path link = Files.createSymbolicLink(dir.resolve("dict.csv"), target);
        CliRun ln = CliRun.of("simulate", KNEE, "--sweep", "t2_ms=10:50:3", "--out", link.toString(), "--force", "--quiet");
        refused(ln, 2, link.toString(), "symbolic link");
        assertEquals("keep", Files.readString(target));
        assertTrue(Files.isSymbolicLink(link));
    }

    @Test
    void theProtocolIsNeverTheOutput() throws Exception {
        Path protocol = Files.copy(Path.of(KNEE), dir.resolve("knee.yaml"));
        List<String> before = snapshot(dir);
        CliRun r = CliRun.of("simulate", protocol.toString(), "--sweep", "t2_ms=10:50:3", "--out", protocol.toString(),
                "--force", "--quiet");
        refused(r, 2, protocol.toString(), "input of this run");
        assertEquals(before, snapshot(dir));
    }

    @Test
    void theDemoLeavesAUsersOwnFileAlone() throws Exception {
        Path out = Files.createDirectories(dir.resolve("mine"));
        Files.writeString(out.resolve("summary.md"), "my notes");
        List<String> before = snapshot(dir);
        CliRun r = CliRun.of("demo", "--out", out.toString(), "--quiet");
        refused(r, 2, out.resolve("summary.md").toString(), "--force");
        assertEquals(before, snapshot(dir));
    }

    @Test
    void anUnwritableOutputFailsBeforeAnyFittingWithTheSystemsReason() throws Exception {
        Path s = series(dir.resolve("s.nii"), 2, 2);
        // /proc does not accept new directories, even for root
        Path out = Path.of("/proc/echotrellis-out");
        assumeTrue(Files.isDirectory(Path.of("/proc")) && !Files.exists(out));
        CliRun r = CliRun.of("fit", s.toString(), "--protocol", KNEE, "--out", out.toString(), "--quiet");
        refused(r, 3, out.toString());
        assertTrue(r.err().contains("cannot create the output directory"), r.err());
        assertEquals("", r.out(), "nothing fitted");
    }

    @Test
    void aReadOnlyOutputSaysPermissionDenied() throws Exception {
        assumeTrue(!"root".equals(System.getProperty("user.name")), "root may write anywhere");
        Path s = series(dir.resolve("s.nii"), 2, 2);
        Path out = Files.createDirectories(dir.resolve("ro"));
        Files.setPosixFilePermissions(out, java.nio.file.attribute.PosixFilePermissions.fromString("r-xr-xr-x"));
        CliRun r = CliRun.of("spectrum", s.toString(), "--protocol", KNEE, "--out", out.toString(), "--quiet");
        refused(r, 3, out.toString(), "permission denied");
    }

    @Test
    void aMaskBombIsRefusedByItsHeaderBeforeInflating() throws Exception {
        Path s = series(dir.resolve("s.nii"), 2, 2);
        // the header declares 2048 x 1024 x 100 bytes; the data stop after 1 KB: only the header is read
        Path small = dir.resolve("small.nii");
        org.echotrellis.io.Nifti.write(small, NiftiHeader.create(NiftiDatatype.UINT8, 1, 1, 1), new double[1], false);
        java.nio.ByteBuffer h = java.nio.ByteBuffer.wrap(Files.readAllBytes(small), 0, 352)
                .order(java.nio.ByteOrder.LITTLE_ENDIAN);
        assertEquals(348, h.getInt(0));
        h.putShort(42, (short) 2048).putShort(44, (short) 1024).putShort(46, (short) 100);
        ByteArrayOutputStream gz = new ByteArrayOutputStream();
        try (GZIPOutputStream z = new GZIPOutputStream(gz)) {
            z.write(h.array(), 0, 352);
            z.write(new byte[1024]);
        }
        Path mask = Files.write(dir.resolve("mask.nii.gz"), gz.toByteArray());
        CliRun r = CliRun.of("fit", s.toString(), "--protocol", KNEE, "--mask", mask.toString(),
                "--out", dir.resolve("o").toString(), "--quiet");
        refused(r, 2, mask.toString(), "2048x1024x100", "2x2x1");
        CliRun b1 = CliRun.of("fit", s.toString(), "--protocol", KNEE, "--b1-map", image(dir.resolve("b1.nii"), 1, 3, 2, 1)
                .toString(), "--out", dir.resolve("o").toString(), "--quiet");
        refused(b1, 2, "--b1-map", "3x2x1", "2x2x1");
        assertFalse(Files.exists(dir.resolve("o")), "refused before the output directory was made");
    }

    @Test
    void staleInflatedCopiesOfKilledRunsAreRemoved() throws Exception {
        Path tmp = Path.of(System.getProperty("java.io.tmpdir"));
        Path stale = Files.writeString(tmp.resolve("echotrellis-inflated-2147483000-1.nii"), "left by kill -9");
        Path s = series(dir.resolve("s.nii.gz"), 2, 2);
        CliRun r = CliRun.of("fit", s.toString(), "--protocol", KNEE, "--out", dir.resolve("o").toString(), "--quiet");
        assertEquals(0, r.code(), r.err());
        assertFalse(Files.exists(stale));
    }

    @Test
    void aB1MapInPercentIsExit2WithAHintAndWritesNothing() throws Exception {
        Path s = series(dir.resolve("s.nii"), 2, 2);
        Path b1 = image(dir.resolve("b1-percent.nii"), 90, 2, 2, 1);
        Path out = dir.resolve("o");
        CliRun r = CliRun.of("fit", s.toString(), "--protocol", KNEE, "--b1-map", b1.toString(), "--out", out.toString(),
                "--quiet");
        refused(r, 2, "no voxel could be fitted", "values look like percent; this option takes scale factors");
        assertFalse(Files.exists(out.resolve("summary.json")));
        noLeftovers(dir);
    }

    @Test
    void decayTablePlotsOnlyWhenAskedForAndRerunsNeverFail() throws Exception {
        StringBuilder csv = new StringBuilder("te_ms");
        int cols = 40;
        for (int c = 0; c < cols; c++) {
            csv.append(",d").append(c);
        }
        csv.append('\n');
        for (int k = 1; k <= 16; k++) {
            csv.append(9.0 * k);
            for (int c = 0; c < cols; c++) {
                String v = c == 7 ? (k % 2 == 0 ? "1.8e308" : "-1.7e308") : String.valueOf(1000 * Math.exp(-9.0 * k / (20 + c)));
                csv.append(',').append(v);
            }
            csv.append('\n');
        }
        Path table = Files.writeString(dir.resolve("decays.csv"), csv);
        Path cwd = Path.of("").toAbsolutePath();
        for (int run = 0; run < 2; run++) {
            CliRun r = CliRun.of("fit", table.toString(), "--protocol", KNEE, "--format", "json");
            assertEquals(0, r.code(), r.err());
            assertTrue(r.out().contains("\"invalid_input\""), "the ±1.8e308 decay is marked, the rest fitted");
        }
        assertFalse(Files.exists(cwd.resolve("t2-fit")), "no plot nobody asked for");
        Path plot = dir.resolve("fits.png");
        CliRun withPlot = CliRun.of("fit", table.toString(), "--protocol", KNEE, "--plot", plot.toString());
        assertEquals(0, withPlot.code(), withPlot.err());
        assertTrue(Files.size(plot) > 1000);
        noLeftovers(dir);
    }
}

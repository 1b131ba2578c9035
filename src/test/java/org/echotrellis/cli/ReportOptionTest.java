package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** --report: path checks before any work or output, and the run information in the page. */
class ReportOptionTest {
    @TempDir
    Path dir;

    @Test
    void wrongExtensionIsRefusedBeforeAnyOutput() {
        CliRun r = CliRun.of("simulate", "sequences/knee-t2-16.yaml", "--report", dir.resolve("r.pdf").toString());
        assertEquals(2, r.code());
        assertEquals("", r.out(), "nothing printed before the refusal");
        assertTrue(r.err().contains("--report") && r.err().contains(".html"), r.err());
    }

    @Test
    void existingReportNeedsForce() throws Exception {
        Path html = Files.writeString(dir.resolve("r.html"), "keep");
        CliRun r = CliRun.of("design", "--protocol", "sequences/fse-variable-1p5t.yaml", "--target", "constant:0.4",
                "--quiet", "--report", html.toString());
        assertEquals(2, r.code());
        assertEquals("", r.out());
        assertEquals("keep", Files.readString(html), "input untouched");
        CliRun forced = CliRun.of("design", "--protocol", "sequences/fse-variable-1p5t.yaml", "--target", "constant:0.4",
                "--quiet", "--force", "--report", html.toString());
        assertEquals(0, forced.code(), forced.err());
        assertTrue(forced.err().startsWith("report: wrote"), forced.err());
    }

    @Test
    void pageNamesTheCommandLineSettingsAndInputs() throws Exception {
        Path html = dir.resolve("sim.html");
        CliRun r = CliRun.of("simulate", "sequences/knee-t2-16.yaml", "--b1", "0.8", "--report", html.toString());
        assertEquals(0, r.code(), r.err());
        String page = Files.readString(html);
        assertTrue(page.contains("echotrellis simulate sequences/knee-t2-16.yaml --b1 0.8 --report"), "command line");
        assertTrue(page.contains("echo spacing (ms)"), "acquisition settings");
        // the protocol is an input with its checksum; the report itself is not
        assertTrue(page.contains("<td>FILE</td><td>sequences/knee-t2-16.yaml</td>"), "protocol listed");
        assertFalse(page.contains("<td>--report</td>"), "the report is not an input");
        assertTrue(page.contains("name: knee-t2-16"), "protocol text shown");
    }

    @Test
    void imageReportHoldsItsFigures() throws Exception {
        Path html = dir.resolve("image.html");
        CliRun r = CliRun.of("image", "sequences/brain-fse-t2-3t.yaml", "--phase-lines", "64", "--report", html.toString());
        assertEquals(0, r.code(), r.err());
        String page = Files.readString(html);
        assertTrue(page.contains("Image figures") && page.contains("Point-spread function per tissue"), "sections");
    }
}

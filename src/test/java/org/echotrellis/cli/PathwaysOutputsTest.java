package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class PathwaysOutputsTest {
    private static final String KNEE = "sequences/knee-t2-16.yaml";

    @Test
    void existingPictureIsRefusedBeforeAnyOutput(@TempDir Path dir) throws Exception {
        Path png = dir.resolve("classes.png");
        Files.writeString(png, "kept");
        CliRun r = CliRun.of("pathways", KNEE, "--plot", png.toString());
        assertEquals(2, r.code(), r.err());
        assertTrue(r.err().contains("--force"), r.err());
        assertEquals("", r.out());                       // nothing printed for a run that fails
        assertEquals("kept", Files.readString(png));
    }

    @Test
    void plotAndDiagramOnOnePathAreRefused(@TempDir Path dir) {
        Path same = dir.resolve("both.png");
        CliRun r = CliRun.of("pathways", KNEE, "--plot", same.toString(), "--diagram", same.toString());
        assertEquals(2, r.code(), r.err());
        assertEquals(1, r.err().trim().split("\n").length, r.err());
        assertTrue(r.err().contains("--plot") && r.err().contains("--diagram"), r.err());
        assertFalse(Files.exists(same));
    }
}

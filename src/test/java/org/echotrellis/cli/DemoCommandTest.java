package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class DemoCommandTest {
    @TempDir
    Path tmp;

    /** An output directory that cannot be created is a user error: one line, exit 2, no work done. */
    @Test
    void uncreatableOutputDirectoryIsAnInputError() throws Exception {
        Path file = Files.writeString(tmp.resolve("a-file"), "x");
        CliRun r = CliRun.of("demo", "--out", file.resolve("sub").toString(), "--quiet");
        assertEquals(2, r.code(), r.err());
        assertTrue(r.err().startsWith("echotrellis: --out " + file.resolve("sub")), r.err());
        assertEquals(1, r.err().strip().lines().count(), r.err());
        assertEquals("", r.out());
    }
}

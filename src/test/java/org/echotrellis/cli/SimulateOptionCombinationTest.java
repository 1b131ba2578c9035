package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** Options that would be silently ignored are refused with one line and exit code 2. */
class SimulateOptionCombinationTest {
    @TempDir
    Path tmp;

    @Test
    void outWithoutSweepIsRefused() {
        Path out = tmp.resolve("echoes.csv");
        CliRun r = CliRun.of("simulate", "sequences/knee-t2-16.yaml", "--format", "csv", "--out", out.toString());
        assertEquals(2, r.code(), r.err());
        assertTrue(r.err().startsWith("echotrellis: --out"), r.err());
        assertEquals("", r.out());
        assertFalse(Files.exists(out));
    }

    @Test
    void singleTrainOptionsWithSweepAreRefused() {
        String[][] extras = {{"--format", "json"}, {"--plot", tmp.resolve("p.png").toString()}, {"--plot-b1", "0.8"},
            {"--plot-tissue", "blood_3t"}};
        for (String[] extra : extras) {
            CliRun r = CliRun.of("simulate", "sequences/knee-t2-16.yaml", "--sweep", "t2_ms=20:40:3", "--quiet",
                    extra[0], extra[1]);
            assertEquals(2, r.code(), extra[0] + ": " + r.err());
            assertTrue(r.err().startsWith("echotrellis: " + extra[0] + " "), r.err());
            assertEquals(1, r.err().strip().lines().count(), r.err());
            assertEquals("", r.out());
        }
        assertFalse(Files.exists(tmp.resolve("p.png")));
    }

    /** A plot path that cannot be written is refused before any output, not after the table. */
    @Test
    void badPlotPathsAreRefusedBeforeAnyOutput() throws Exception {
        Path existing = Files.writeString(tmp.resolve("old.png"), "x");
        String[] paths = {existing.toString(), "/", tmp.resolve("p.gif").toString()};
        for (String path : paths) {
            CliRun r = CliRun.of("simulate", "sequences/knee-t2-16.yaml", "--plot", path);
            assertEquals(2, r.code(), path + ": " + r.err());
            assertEquals(1, r.err().strip().lines().count(), r.err());
            assertEquals("", r.out(), path);
        }
        assertEquals("x", Files.readString(existing));
    }

    /** Extra plot curves are checked before any output, and need --plot. */
    @Test
    void extraCurvesAreCheckedFirstAndNeedAPlot() {
        String png = tmp.resolve("q.png").toString();
        String[][] cases = {{"--plot", png, "--plot-b1", "-1"}, {"--plot", png, "--plot-tissue", "no_such_tissue"},
            {"--plot-b1", "0.8"}, {"--plot-tissue", "blood_3t"}};
        for (String[] c : cases) {
            String[] args = new String[2 + c.length];
            args[0] = "simulate";
            args[1] = "sequences/knee-t2-16.yaml";
            System.arraycopy(c, 0, args, 2, c.length);
            CliRun r = CliRun.of(args);
            assertEquals(2, r.code(), String.join(" ", c) + ": " + r.err());
            assertEquals(1, r.err().strip().lines().count(), r.err());
            assertEquals("", r.out(), String.join(" ", c));
            assertTrue(r.err().startsWith("echotrellis: " + c[c.length - 2]), r.err());
        }
        assertFalse(Files.exists(tmp.resolve("q.png")));
    }
}

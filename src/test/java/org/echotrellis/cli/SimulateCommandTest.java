package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import java.nio.file.Files;
import java.nio.file.Path;
import org.echotrellis.io.Json;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class SimulateCommandTest {
    @TempDir
    Path tmp;

    @Test
    void jsonContract() throws Exception {
        CliRun r = CliRun.of("simulate", "sequences/knee-t2-16.yaml", "--format", "json", "--t2-ms", "50", "--b1", "1");
        assertEquals(0, r.code(), r.err());
        JsonNode root = Json.MAPPER.readTree(r.out());
        JsonNode echoes = root.get("echoes");
        assertEquals(16, echoes.size());
        JsonNode e3 = echoes.get(2);
        assertEquals(3, e3.get("index").asInt());
        assertEquals(27.0, e3.get("time_ms").asDouble(), 1e-12);
        // perfect refocusing: exp(-TE/T2) (Meiboom & Gill 1958)
        assertEquals(Math.exp(-27.0 / 50), e3.get("magnitude").asDouble(), 1e-12);
        for (String k : new String[] {"label", "phase_deg", "real", "imag"}) {
            assertTrue(e3.has(k), k);
        }
    }

    @Test
    void tableAndCsvAndPlot() throws Exception {
        CliRun t = CliRun.of("simulate", "sequences/three-pulse-stimulated.yaml");
        assertEquals(0, t.code(), t.err());
        assertTrue(t.out().contains("stimulated echo"), t.out());
        CliRun c = CliRun.of("simulate", "sequences/cp-phase-error-16.yaml", "--format", "csv",
                "--plot", tmp.resolve("cp.svg").toString(), "--plot-b1", "0.9", "--plot-tissue", "liver_3t");
        assertEquals(0, c.code(), c.err());
        String[] lines = c.out().split("\n");
        assertEquals("index,label,time_ms,magnitude,phase_deg,real,imag", lines[0]);
        assertEquals(17, lines.length);
        String svg = Files.readString(tmp.resolve("cp.svg"));
        assertTrue(svg.contains("<svg") && svg.length() > 5000);
        assertTrue(svg.contains("liver_3t"), "tissue series in the legend");
    }

    @Test
    void sweepWritesOneRowPerPointMatchingSingleRuns() throws Exception {
        Path out = tmp.resolve("dict.csv");
        CliRun r = CliRun.of("simulate", "sequences/brain-mwi-32.yaml", "--sweep", "t2_ms=20:200:7",
                "--sweep", "b1=0.6:1.0:3", "--out", out.toString(), "--quiet", "--threads", "2");
        assertEquals(0, r.code(), r.err());
        var lines = Files.readAllLines(out);
        assertEquals(1 + 21, lines.size());
        assertTrue(lines.get(0).startsWith("t1_ms,t2_ms,b1,echo_1,"));
        String[] row = lines.get(5).split(",");
        double t2 = Double.parseDouble(row[1]);
        double b1 = Double.parseDouble(row[2]);
        CliRun single = CliRun.of("simulate", "sequences/brain-mwi-32.yaml", "--format", "csv", "--t2-ms", Double.toString(t2),
                "--b1", Double.toString(b1));
        String[] echo5 = single.out().split("\n")[5].split(",");
        assertEquals(Double.parseDouble(echo5[3]), Double.parseDouble(row[3 + 4]), 1e-8);
        // refuses to overwrite without --force
        CliRun again = CliRun.of("simulate", "sequences/brain-mwi-32.yaml", "--sweep", "t2_ms=20:200:7", "--out", out.toString(), "--quiet");
        assertEquals(2, again.code());
        assertTrue(again.err().contains("exists; use --force"), again.err());
    }

    @Test
    void badInputGivesOneLineAndExitCode2() {
        CliRun missing = CliRun.of("simulate", "nope.yaml");
        assertEquals(2, missing.code());
        assertEquals(1, missing.err().trim().split("\n").length, missing.err());
        assertFalse(missing.err().contains("Exception"), missing.err());
        CliRun badOpt = CliRun.of("simulate", "sequences/knee-t2-16.yaml", "--b1", "-1");
        assertEquals(2, badOpt.code());
        assertTrue(badOpt.err().contains("--b1 must be within (0, 5], got -1.0"), badOpt.err());
        CliRun badSweep = CliRun.of("simulate", "sequences/knee-t2-16.yaml", "--sweep", "t3=1:2:3");
        assertEquals(2, badSweep.code());
        assertTrue(badSweep.err().contains("NAME must be one of t1_ms, t2_ms, b1"), badSweep.err());
        CliRun usage = CliRun.of("simulate", "--no-such-option");
        assertEquals(2, usage.code());
        CliRun plot = CliRun.of("simulate", "sequences/knee-t2-16.yaml", "--plot", tmp.resolve("x.gif").toString());
        assertEquals(2, plot.code());
        assertTrue(plot.err().contains("must end in .png or .svg"), plot.err());
        CliRun debug = CliRun.of("simulate", "nope.yaml", "--debug");
        assertEquals(2, debug.code());
        assertTrue(debug.err().contains("InputException"), "stack trace with --debug");
    }

    @Test
    void everyCommandHasHelpWithExample() {
        for (String cmd : new String[] {"simulate", "demo"}) {
            CliRun h = CliRun.of(cmd, "--help");
            assertEquals(0, h.code());
            assertTrue(h.out().contains("Example"), cmd);
        }
        CliRun root = CliRun.of("--help");
        assertTrue(root.out().contains("simulate"));
    }
}

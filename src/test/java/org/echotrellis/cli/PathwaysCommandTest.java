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

/** The {@code pathways} command: output contract, pictures and bad input. */
class PathwaysCommandTest {
    private static final String KNEE = "sequences/knee-t2-16.yaml";
    private static final String THREE = "sequences/three-pulse-stimulated.yaml";

    @Test
    void jsonContractClassesAddUpToEachEcho() throws Exception {
        CliRun r = CliRun.of("pathways", KNEE, "--b1", "0.8", "--format", "json", "--echo", "4", "--top", "5");
        assertEquals(0, r.code(), r.err());
        JsonNode root = Json.MAPPER.readTree(r.out());
        JsonNode echoes = root.get("echoes");
        assertEquals(16, echoes.size());
        for (JsonNode e : echoes) {
            double re = 0;
            double im = 0;
            for (JsonNode c : e.get("classes")) {
                re += c.get("real").asDouble();
                im += c.get("imag").asDouble();
                assertTrue(c.has("longitudinal_intervals") && c.has("magnitude"));
            }
            assertEquals(e.get("real").asDouble(), re, 1e-12);
            assertEquals(e.get("imag").asDouble(), im, 1e-12);
            assertTrue(e.get("stimulated_share").isNumber());
        }
        assertEquals(1, echoes.get(0).get("index").asInt());
        // echo 1 of a CPMG train is a pure spin echo (Hennig 1988)
        assertEquals(0.0, echoes.get(0).get("stimulated_share").asDouble(), 1e-12);
        assertTrue(echoes.get(3).get("stimulated_share").asDouble() > 0.1);
        JsonNode top = root.get("top_pathways");
        assertEquals(5, top.size());
        double share = root.get("unexplained").asDouble();
        for (JsonNode p : top) {
            share += p.get("share").asDouble();
            assertFalse(p.get("states").asText().isEmpty());
        }
        assertEquals(1.0, share, 1e-9);
        assertEquals(5, echoes.get(3).get("top_pathways").size());
    }

    @Test
    void threePulseStimulatedEchoIsAllStimulated() throws Exception {
        CliRun r = CliRun.of("pathways", THREE, "--format", "json");
        assertEquals(0, r.code(), r.err());
        JsonNode echoes = Json.MAPPER.readTree(r.out()).get("echoes");
        // Hahn 1950 / Woessner 1961: the stimulated echo (label "stimulated echo") is entirely class 1
        assertEquals("stimulated echo", echoes.get(1).get("label").asText());
        assertEquals(1.0, echoes.get(1).get("stimulated_share").asDouble(), 1e-12);
        assertEquals(0.0, echoes.get(0).get("stimulated_share").asDouble(), 1e-12);
    }

    @Test
    void idealTrainHasNoStimulatedShareInTheTable() {
        CliRun r = CliRun.of("pathways", KNEE, "--echo", "3", "--top", "2");
        assertEquals(0, r.code(), r.err());
        assertTrue(r.out().contains("stim_share"));
        assertTrue(r.out().contains("Z0 F0 F-1*3"), r.out());
        assertTrue(r.out().contains("unexplained by the listed pathways"));
    }

    @Test
    void csvHasOneRowPerEchoAndAPathwayBlock() {
        CliRun r = CliRun.of("pathways", KNEE, "--b1", "0.9", "--format", "csv", "--echo", "4", "--top", "3");
        assertEquals(0, r.code(), r.err());
        String[] blocks = r.out().split("\n\n");
        assertEquals(2, blocks.length);
        assertEquals(17, blocks[0].split("\n").length);
        assertTrue(blocks[0].startsWith("index,time_ms,real,imag,magnitude,stimulated_share,class_0_real"));
        assertEquals(5, blocks[1].trim().split("\n").length);
    }

    @Test
    void writesBothPicturesAndRefusesToOverwrite(@TempDir Path dir) throws Exception {
        Path png = dir.resolve("classes.png");
        Path svg = dir.resolve("graph.svg");
        CliRun r = CliRun.of("pathways", KNEE, "--b1", "0.8", "--plot", png.toString(), "--diagram", svg.toString(),
                "--diagram-threshold", "0.01", "--diagram-max-order", "6", "--diagram-scale", "log");
        assertEquals(0, r.code(), r.err());
        byte[] head = Files.readAllBytes(png);
        assertEquals((byte) 0x89, head[0]);
        assertEquals('P', head[1]);
        assertTrue(Files.size(png) > 10_000);
        String text = Files.readString(svg);
        assertTrue(text.contains("<svg"));
        CliRun again = CliRun.of("pathways", KNEE, "--plot", png.toString());
        assertEquals(2, again.code());
        assertTrue(again.err().contains("--force"), again.err());
    }

    @Test
    void badInputGivesOneLineAndExitCodeTwo() {
        CliRun outOfRange = CliRun.of("pathways", KNEE, "--echo", "17");
        assertEquals(2, outOfRange.code());
        assertTrue(outOfRange.err().contains("[1, 16]"), outOfRange.err());
        assertEquals(1, outOfRange.err().trim().split("\n").length);
        CliRun noEcho = CliRun.of("pathways", KNEE, "--top", "3");
        assertEquals(2, noEcho.code());
        assertTrue(noEcho.err().contains("--echo"));
        CliRun badThreshold = CliRun.of("pathways", KNEE, "--diagram-threshold", "2");
        assertEquals(2, badThreshold.code());
        CliRun badScale = CliRun.of("pathways", KNEE, "--diagram", "x.png", "--diagram-scale", "cubic");
        assertEquals(2, badScale.code());
        CliRun missing = CliRun.of("pathways", "no-such-file.yaml");
        assertEquals(2, missing.code());
        CliRun badB1 = CliRun.of("pathways", KNEE, "--b1", "-1");
        assertEquals(2, badB1.code());
    }

    @Test
    void helpShowsAnExample() {
        CliRun r = CliRun.of("pathways", "--help");
        assertEquals(0, r.code());
        assertTrue(r.out().contains("echotrellis.jar pathways sequences/knee-t2-16.yaml"));
    }
}

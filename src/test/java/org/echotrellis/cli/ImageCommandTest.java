package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import java.awt.image.BufferedImage;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import javax.imageio.ImageIO;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/** The {@code image} command through the command line, output captured. */
class ImageCommandTest {
    private static final String PROTOCOL = "sequences/brain-fse-t2-3t.yaml";

    @TempDir
    Path tmp;

    private static List<String> keys(JsonNode n) {
        List<String> k = new ArrayList<>();
        for (Iterator<String> it = n.fieldNames(); it.hasNext(); ) {
            k.add(it.next());
        }
        return k;
    }

    @Test
    void jsonHasExactlyTheContractKeys() throws Exception {
        CliRun r = CliRun.of("image", PROTOCOL, "--phase-lines", "64", "--tissue", "white_matter_3t",
                "--tissue", "csf:4300:1900", "--noise-sd", "0.02", "--format", "json");
        assertEquals(0, r.code(), r.err());
        JsonNode root = new ObjectMapper().readTree(r.out());
        // the contract keys, then the provenance block every JSON output carries (as simulate and pathways do)
        assertEquals(List.of("tissues", "pairs", "provenance"), keys(root));
        assertTrue(root.get("provenance").get("command_line").asText().startsWith("echotrellis image "));
        JsonNode t = root.get("tissues").get(0);
        assertEquals(List.of("name", "effective_te_ms", "center_signal", "psf_fwhm_px", "psf_peak", "psf_sidelobe",
                "weights"), keys(t));
        assertEquals("white_matter_3t", t.get("name").asText());
        assertEquals(64, t.get("weights").size());
        // linear without --center-echo, 32 echoes, S = 2: line 32 is in segment 16, echo 17 at 6 ms spacing
        assertEquals(17 * 6.0, t.get("effective_te_ms").asDouble(), 1e-9);
        JsonNode pair = root.get("pairs").get(0);
        assertEquals(List.of("a", "b", "contrast", "cnr"), keys(pair));
        assertEquals("csf", pair.get("b").asText());
        double contrast = pair.get("contrast").asDouble();
        assertEquals(t.get("center_signal").asDouble() - root.get("tissues").get(1).get("center_signal").asDouble(),
                contrast, 1e-12);
        assertEquals(Math.abs(contrast) / 0.02, pair.get("cnr").asDouble(), 1e-9);
    }

    @Test
    void withoutNoiseTheCnrIsNull() throws Exception {
        CliRun r = CliRun.of("image", PROTOCOL, "--phase-lines", "32", "--tissue", "white_matter_3t",
                "--tissue", "grey_matter_3t", "--format", "json");
        assertEquals(0, r.code(), r.err());
        assertTrue(new ObjectMapper().readTree(r.out()).get("pairs").get(0).get("cnr").isNull());
    }

    @Test
    void tableNamesTheOrderingAndTissues() {
        CliRun r = CliRun.of("image", PROTOCOL, "--phase-lines", "96", "--ordering", "centric");
        assertEquals(0, r.code(), r.err());
        assertTrue(r.out().contains("centric"), r.out());
        assertTrue(r.out().contains("csf"), r.out());          // the protocol's tissue by default
        assertTrue(r.out().contains(" 6.00 "), r.out());       // centric: effective TE = first echo, 6 ms
    }

    @Test
    void plotWritesThreeChartsAndRefusesToOverwrite() throws Exception {
        Path plot = tmp.resolve("brain.png");
        CliRun r = CliRun.of("image", PROTOCOL, "--phase-lines", "32", "--center-echo", "8", "--tissue",
                "white_matter_3t", "--tissue", "csf:4300:1900", "--noise-sd", "0.01", "--plot", plot.toString());
        assertEquals(0, r.code(), r.err());
        for (String c : List.of("weights", "psf", "phantom")) {
            BufferedImage img = ImageIO.read(tmp.resolve("brain-" + c + ".png").toFile());
            assertTrue(img.getWidth() > 300 && img.getHeight() > 200, c);
        }
        CliRun again = CliRun.of("image", PROTOCOL, "--phase-lines", "32", "--plot", plot.toString());
        assertEquals(2, again.code());
        assertTrue(again.err().contains("exists; use --force"), again.err());
        assertEquals("", again.out(), "nothing printed before the refusal");
    }

    @Test
    void outWritesJsonAndBothFormats() throws Exception {
        Path dir = tmp.resolve("run");
        CliRun r = CliRun.of("image", PROTOCOL, "--phase-lines", "32", "--out", dir.toString());
        assertEquals(0, r.code(), r.err());
        assertTrue(Files.size(dir.resolve("image.json")) > 100);
        for (String c : List.of("weights", "psf", "phantom")) {
            assertTrue(Files.size(dir.resolve(c + ".png")) > 1000, c);
            assertTrue(Files.readString(dir.resolve(c + ".svg")).contains("<svg"), c);
        }
    }

    @Test
    void outRefusesAnExistingSetAndAFile() throws Exception {
        Path dir = Files.createDirectories(tmp.resolve("taken"));
        Files.writeString(dir.resolve("image.json"), "earlier run");
        CliRun r = CliRun.of("image", PROTOCOL, "--phase-lines", "32", "--out", dir.toString());
        assertEquals(2, r.code(), r.err());
        assertEquals("", r.out(), "refused before any work");
        assertEquals("earlier run", Files.readString(dir.resolve("image.json")));
        assertFalse(Files.exists(dir.resolve("psf.png")), "no partial output set");
        Path file = Files.writeString(tmp.resolve("plain-file"), "x");
        CliRun f = CliRun.of("image", PROTOCOL, "--phase-lines", "32", "--out", file.toString());
        assertEquals(2, f.code(), f.err());
        assertEquals(1, f.err().strip().lines().count(), f.err());
    }

    @Test
    void labelImagePhantomFromPng() throws Exception {
        BufferedImage img = new BufferedImage(40, 40, BufferedImage.TYPE_BYTE_GRAY);
        for (int y = 10; y < 30; y++) {
            for (int x = 10; x < 30; x++) {
                img.getRaster().setSample(x, y, 0, x < 20 ? 1 : 2);
            }
        }
        Path png = tmp.resolve("labels.png");
        ImageIO.write(img, "png", png.toFile());
        CliRun r = CliRun.of("image", PROTOCOL, "--phase-lines", "32", "--tissue", "white_matter_3t",
                "--tissue", "grey_matter_3t", "--phantom", png.toString(), "--label", "1=white_matter_3t",
                "--label", "2=grey_matter_3t", "--plot", tmp.resolve("p.svg").toString());
        assertEquals(0, r.code(), r.err());
        assertTrue(r.err().contains("label values [0]"), r.err());   // the background has no tissue
        assertTrue(Files.readString(tmp.resolve("p-phantom.svg")).contains("<svg"));
    }

    @Test
    void badInputIsOneLineAndExitTwo() throws Exception {
        BufferedImage colour = new BufferedImage(4, 4, BufferedImage.TYPE_INT_RGB);
        colour.setRGB(1, 1, 0xff0000);
        Path png = tmp.resolve("colour.png");
        ImageIO.write(colour, "png", png.toFile());
        String[][] cases = {
            {"--phase-lines", "100"},
            {"--phase-lines", "64", "--ordering", "centric", "--center-echo", "3"},
            {"--phase-lines", "64", "--center-echo", "33"},
            {"--phase-lines", "64", "--tissue", "nonsense"},
            {"--phase-lines", "64", "--tissue", "x:100"},
            {"--phase-lines", "64", "--tissue", "x:-1:50"},
            {"--phase-lines", "64", "--noise-sd", "-1"},
            {"--phase-lines", "64", "--label", "1=csf", "--plot", tmp.resolve("a.png").toString()},
            {"--phase-lines", "64", "--phantom", png.toString(), "--plot", tmp.resolve("b.png").toString()},
            {"--phase-lines", "64", "--phantom", png.toString(), "--label", "1=csf", "--plot", tmp.resolve("c.png").toString()},
            {"--phase-lines", "64", "--phantom", png.toString(), "--label", "1=wm", "--plot", tmp.resolve("d.png").toString()},
            {"--phase-lines", "64", "--plot", tmp.resolve("e.gif").toString()},
            {"--phase-lines", "64", "--seed", "3"},
            {"--phase-lines", "64", "--plot", tmp.resolve("f.png").toString(), "--out", tmp.resolve("g").toString()},
        };
        for (String[] c : cases) {
            String[] args = new String[c.length + 2];
            args[0] = "image";
            args[1] = PROTOCOL;
            System.arraycopy(c, 0, args, 2, c.length);
            CliRun r = CliRun.of(args);
            assertEquals(2, r.code(), String.join(" ", c) + ": " + r.err());
            assertEquals(1, r.err().strip().lines().count(), r.err());
            assertFalse(r.err().contains("Exception"), r.err());
        }
    }

    @Test
    void helpHasARunnableExample() {
        CliRun r = CliRun.of("image", "--help");
        assertEquals(0, r.code());
        assertTrue(r.out().contains("echotrellis.jar image sequences/brain-fse-t2-3t.yaml \\\n      --phase-lines 256"), r.out());
        assertTrue(r.out().contains("--center-echo"), r.out());
    }
}

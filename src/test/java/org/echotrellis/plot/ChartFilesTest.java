package org.echotrellis.plot;

import static org.junit.jupiter.api.Assertions.assertArrayEquals;
import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.awt.image.BufferedImage;
import java.nio.file.Files;
import java.nio.file.Path;
import javax.imageio.ImageIO;
import org.echotrellis.InputException;
import org.echotrellis.sequence.ProtocolReader;
import org.echotrellis.sequence.Simulator;
import org.jfree.chart.JFreeChart;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

class ChartFilesTest {
    @TempDir
    Path tmp;

    private static JFreeChart chart() {
        var p = ProtocolReader.readBuiltIn("knee-t2-16.yaml");
        return EchoPlot.create("test").train("B1 0.8", Simulator.simulate(p, 1240, 37, 0.8)).ideal(37, 1, 144).build();
    }

    @Test
    void pngIsValidImageOfRequestedSize() throws Exception {
        Path f = tmp.resolve("a.png");
        ChartFiles.write(chart(), f, 640, 400, false);
        BufferedImage img = ImageIO.read(f.toFile());
        assertEquals(640, img.getWidth());
        assertEquals(400, img.getHeight());
    }

    @Test
    void svgIsDeterministicAndWellFormed() throws Exception {
        Path a = tmp.resolve("a.svg");
        Path b = tmp.resolve("b.svg");
        ChartFiles.write(chart(), a, 640, 400, false);
        ChartFiles.write(chart(), b, 640, 400, false);
        assertArrayEquals(Files.readAllBytes(a), Files.readAllBytes(b));
        var dbf = javax.xml.parsers.DocumentBuilderFactory.newInstance();
        dbf.setFeature("http://apache.org/xml/features/nonvalidating/load-external-dtd", false);
        var doc = dbf.newDocumentBuilder().parse(a.toFile());
        assertEquals("svg", doc.getDocumentElement().getNodeName());
        assertTrue(Files.size(a) > 5000);
    }

    @Test
    void neverOverwritesWithoutForce() throws Exception {
        Path f = tmp.resolve("a.png");
        ChartFiles.write(chart(), f, 300, 200, false);
        assertThrows(InputException.class, () -> ChartFiles.write(chart(), f, 300, 200, false));
        ChartFiles.write(chart(), f, 300, 200, true);
        try (var s = Files.list(tmp)) {
            assertEquals(1, s.count(), "no temporary files left behind");
        }
    }
}

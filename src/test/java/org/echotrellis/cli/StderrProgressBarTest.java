package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;

import org.junit.jupiter.api.Test;

class StderrProgressBarTest {
    @Test
    void lineShowsFractionRateAndTimeLeft() {
        String s = StderrProgressBar.line(250, 1000, 2.0, "voxels");
        assertEquals("[########......................]  25% 250/1000 voxels, 125/s 6 s left", s);
        assertTrue(StderrProgressBar.line(1000, 1000, 2.0, "voxels").contains("100%"));
    }

    @Test
    void drawsOnFinishAndEndsTheLine() {
        StringWriter w = new StringWriter();
        StderrProgressBar bar = new StderrProgressBar(new PrintWriter(w));
        bar.start("voxels", 10);
        bar.advance(10);
        bar.finish();
        assertTrue(w.toString().startsWith("\r["), w.toString());
        assertTrue(w.toString().endsWith(System.lineSeparator()));
    }
}

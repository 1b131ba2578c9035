package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;

import org.junit.jupiter.api.Test;

class StderrProgressBarTest {
    @Test
    void drawsTheFinalStateAndEndsTheLine() {
        StringWriter w = new StringWriter();
        StderrProgressBar bar = new StderrProgressBar(new PrintWriter(w), false);
        bar.start("voxels", 10);
        bar.advance(10);
        bar.finish();
        assertTrue(w.toString().startsWith("\r["), w.toString());
        assertTrue(w.toString().contains("10/10 voxels"), w.toString());
        assertTrue(w.toString().endsWith(System.lineSeparator()));
    }

    @Test
    void quietPrintsNothing() {
        StringWriter w = new StringWriter();
        StderrProgressBar bar = new StderrProgressBar(new PrintWriter(w), true);
        bar.start("voxels", 10);
        bar.advance(10);
        bar.finish();
        assertEquals("", w.toString());
    }
}

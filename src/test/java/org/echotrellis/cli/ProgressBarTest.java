package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.PrintWriter;
import java.io.StringWriter;
import org.junit.jupiter.api.Test;

class ProgressBarTest {

    /** Worker threads report out of order; a late, smaller count never moves the bar back. */
    @Test
    void aLateSmallerCountDoesNotMoveTheBarBack() throws Exception {
        StringWriter w = new StringWriter();
        try (ProgressBar bar = new ProgressBar(new PrintWriter(w), "points", 10, false)) {
            bar.update(10);
            Thread.sleep(250); // past the 200 ms throttle
            bar.update(6);
        }
        String s = w.toString();
        String last = s.substring(s.lastIndexOf('\r'));
        assertTrue(last.contains("10/10 points"), s);
    }
}

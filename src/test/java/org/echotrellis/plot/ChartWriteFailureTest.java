package org.echotrellis.plot;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.io.ByteArrayOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import org.junit.jupiter.api.Test;

/**
 * Issue 10 §2: a full disk while writing a PNG gives the system's reason, not "I/O error writing PNG
 * file!" plus a stack trace printed by the image encoder; charts never fail on finite extremes.
 */
class ChartWriteFailureTest {
    @Test
    void aFullDiskSurfacesAsTheStreamsOwnError() throws Exception {
        OutputStream full = new OutputStream() {
            @Override
            public void write(int b) throws IOException {
                throw new IOException("No space left on device");
            }

            @Override
            public void write(byte[] b, int off, int len) throws IOException {
                throw new IOException("No space left on device");
            }
        };
        var chart = LineChart.create("t", "x", "y").add("a", new double[] {1, 2}, new double[] {1, 2}, LineChart.Look.LINE)
                .build();
        PrintStream saved = System.err;
        ByteArrayOutputStream captured = new ByteArrayOutputStream();
        System.setErr(new PrintStream(captured, true, StandardCharsets.UTF_8));
        try {
            IOException e = assertThrows(IOException.class, () -> ChartFiles.writeTo(full, chart, 300, 200, false));
            assertEquals("No space left on device", e.getMessage());
        } finally {
            System.setErr(saved);
        }
        assertEquals("", captured.toString(StandardCharsets.UTF_8), "nothing printed behind our back");
    }

    @Test
    void finiteExtremesDoNotBreakACharts() throws Exception {
        var chart = LineChart.create("t", "x", "y").add("huge", new double[] {1, 2, 3},
                new double[] {1.7e308, -1.7e308, 0.5}, LineChart.Look.MARKERS).build();
        ByteArrayOutputStream png = new ByteArrayOutputStream();
        ChartFiles.writeTo(png, chart, 300, 200, false);
        assertTrue(png.size() > 500);
    }
}

package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assumptions.assumeTrue;

import java.io.ByteArrayOutputStream;
import java.io.FileOutputStream;
import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import org.junit.jupiter.api.Test;

/**
 * Issue 10 §1.1: a failed write on standard output or error (full disk, closed pipe, /dev/full)
 * ends the run with one line and exit code 3 instead of exit 0 with truncated output.
 */
class WriteFailureExitTest {
    /** Accepts {@code limit} bytes, then fails as a full disk does. */
    static final class FullDisk extends OutputStream {
        private final int limit;
        private int written;

        FullDisk(int limit) {
            this.limit = limit;
        }

        @Override
        public void write(int b) throws IOException {
            if (++written > limit) {
                throw new IOException("No space left on device");
            }
        }
    }

    private static String run(OutputStream out, ByteArrayOutputStream err, int[] code, String... args) {
        code[0] = Main.run(Main.newCommandLine(), out, err, args);
        return err.toString(StandardCharsets.UTF_8);
    }

    @Test
    void sweepOntoAFullStdoutFailsWithExit3() {
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int[] code = new int[1];
        String msg = run(new FullDisk(10_000), err, code, "simulate", "sequences/knee-t2-16.yaml", "--quiet",
                "--sweep", "t2_ms=10:500:200", "--sweep", "b1=0.5:1:10");
        assertEquals(3, code[0], msg);
        assertEquals(1, msg.strip().lines().count(), msg);
        assertTrue(msg.contains("standard output") && msg.contains("No space left on device"), msg);
        assertFalse(msg.contains("\tat "), msg);
    }

    @Test
    void jsonOntoAClosedPipeFailsWithExit3() throws IOException {
        OutputStream closedPipe = new OutputStream() {
            @Override
            public void write(int b) throws IOException {
                throw new IOException("Broken pipe");
            }
        };
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int[] code = new int[1];
        String msg = run(closedPipe, err, code, "simulate", "sequences/knee-t2-16.yaml", "--format", "json");
        assertEquals(3, code[0], msg);
        assertTrue(msg.contains("Broken pipe"), msg);
    }

    @Test
    void devFullAsStdoutFailsWithExit3() throws IOException {
        Path full = Path.of("/dev/full");
        assumeTrue(Files.isWritable(full), "no /dev/full on this system");
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int[] code = new int[1];
        try (FileOutputStream out = new FileOutputStream(full.toFile())) {
            String msg = run(out, err, code, "simulate", "sequences/knee-t2-16.yaml");
            assertEquals(3, code[0], msg);
            assertTrue(msg.startsWith("echotrellis: cannot write to standard output: "), msg);
        }
    }

    @Test
    void helpOntoAFullStdoutFailsWithExit3() {
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int[] code = new int[1];
        String msg = run(new FullDisk(100), err, code, "fit", "--help");
        assertEquals(3, code[0], msg);
        assertEquals(1, msg.strip().lines().count(), msg);
    }

    @Test
    void failingStderrStillGivesExit3() {
        int[] code = new int[1];
        code[0] = Main.run(Main.newCommandLine(), new FullDisk(0), new FullDisk(0),
                new String[] {"simulate", "sequences/knee-t2-16.yaml"});
        assertEquals(3, code[0]);
    }

    @Test
    void successfulRunsStillExit0() {
        ByteArrayOutputStream out = new ByteArrayOutputStream();
        ByteArrayOutputStream err = new ByteArrayOutputStream();
        int code = Main.run(Main.newCommandLine(), out, err, new String[] {"simulate", "sequences/knee-t2-16.yaml"});
        assertEquals(0, code, err.toString(StandardCharsets.UTF_8));
        assertTrue(out.toString(StandardCharsets.UTF_8).contains("echo"));
    }
}

package org.echotrellis.cli;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertTrue;

import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.api.io.TempDir;

/**
 * Issue 10 §2: a {@code --sweep} needs bounded heap whatever the grid size. A forked JVM with a
 * 64 MB heap writes a 250 000-point sweep (before the chunk bound this grid was one chunk holding
 * about 20 MB of magnitudes plus the whole chunk as text, 29 MB, copied while growing and once more).
 */
class SweepMemoryTest {
    @TempDir
    Path dir;

    @Test
    void aLargeSweepRunsIn64MegabytesOfHeap() throws Exception {
        Path csv = dir.resolve("dict.csv");
        Path log = dir.resolve("log.txt");
        Process p = new ProcessBuilder(Path.of(System.getProperty("java.home"), "bin", "java").toString(),
                "-Xmx64m", "-XX:+UseSerialGC", "-Djava.awt.headless=true", "-cp", System.getProperty("java.class.path"),
                Main.class.getName(), "simulate", "sequences/muscle-t2-8.json", "--quiet", "--threads", "2",
                "--sweep", "t2_ms=10:500:2500", "--sweep", "b1=0.5:1.2:100", "--out", csv.toString())
                .redirectErrorStream(true).redirectOutput(log.toFile()).start();
        assertTrue(p.waitFor(120, TimeUnit.SECONDS), "sweep did not finish");
        String out = Files.readString(log, StandardCharsets.UTF_8);
        assertEquals(0, p.exitValue(), out);
        List<String> head;
        long rows;
        try (var lines = Files.lines(csv)) {
            rows = lines.count();
        }
        assertEquals(1 + 250_000, rows);
        try (var lines = Files.lines(csv)) {
            head = lines.limit(2).toList();
        }
        assertTrue(head.get(0).startsWith("t1_ms,t2_ms,b1,echo_1,"), head.get(0));
        assertEquals(3 + 8, head.get(1).split(",").length, head.get(1));
    }
}
